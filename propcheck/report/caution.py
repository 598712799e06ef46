"""The caution every human-readable report carries."""

CAUTION = (
    "propcheck screens property data for inconsistencies; it does not certify them. "
    "Its results support, and never replace, the review of a qualified engineer. "
    "A clean report does not make data fit for safety-critical use such as relief, "
    "flare and vent sizing or flammability assessments: such data must come from "
    "documented, validated sources, be used within each correlation's stated range, "
    "and be reviewed under the applicable local codes, standards and licensed practice."
)
