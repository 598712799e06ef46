"""Two rows of ``compounds`` share one ``compound_id``.

What it checks
    ``compound_id`` is unique in ``compounds``.

Why it matters
    Vapor-pressure points, baselines and waivers find a compound by its id;
    with two rows under one id nobody can tell which constants the points
    belong to. The first row is kept and checked; every later row with the
    same id is rejected and reported here.

Method
    Uniqueness check on the trimmed id (pandera ``unique``).

Parameters
    None.

Example finding
    n-Heptane's row given n-hexane's id P06:
    ``compounds.csv row 7, column compound_id: compound_id P06 is used
    again (first at row 6, 'n-hexane'); this row is not checked``

References
    1. README, 'Usage' (rows that cannot be checked: a duplicate id).
"""

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="duplicate-compound-id",
    title="compound_id used by more than one row",
    severity="error",
    stage="schema",
    method="uniqueness of the key column",
    reference="README, 'Usage' (rows that cannot be checked)",
)
