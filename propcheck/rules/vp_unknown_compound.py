"""A vapor-pressure point names a compound that is not in ``compounds``.

What it checks
    Every ``vapor_pressure.compound_id`` and ``boiling_points.compound_id``
    exists in ``compounds`` (among the rows that were kept). A boiling
    temperature at a stated pressure is a point of the same curve.

Why it matters
    Orphan points belong to nothing: a renamed or deleted compound, or a typo
    in the id. They cannot be checked against any constants and are rejected
    from the checks.

Method
    Referential integrity (foreign key) test.

Parameters
    None.

Example finding
    ``vapor_pressure row 212: compound_id LPC-0099 is not in compounds``

References
    1. README, 'Usage' (rows that cannot be checked: a point for an unknown compound).
"""

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-unknown-compound",
    title="Vapor-pressure point for a compound not in compounds",
    severity="error",
    stage="schema",
    method="referential integrity vapor_pressure -> compounds",
    reference="README, 'Usage' (rows that cannot be checked)",
)
