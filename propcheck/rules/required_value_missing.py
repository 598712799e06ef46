"""A required value is empty.

What it checks
    ``compound_id`` and ``name`` in ``compounds``; ``compound_id``, ``t`` and
    ``p`` in ``vapor_pressure``. (A whole missing column is a usage error,
    exit 2, not a finding.)

Why it matters
    A compound without an id cannot be referenced by its vapor-pressure data,
    baselines or waivers; a point without a temperature or a pressure says
    nothing. Such rows are rejected from the checks and counted in
    ``summary.md``; a compound without a name is still checked.

Method
    Null test after trimming whitespace. Cells already reported by
    ``cell-not-numeric`` are not reported twice.

Parameters
    None.

Example finding
    n-Hexane's row with the name left out:
    ``compounds.csv row 6, column name: required value name is empty``

References
    1. README, 'Usage' (rows that cannot be checked) and 'The rule pack'
       (required: compound_id and name; a point's compound_id, t and p).
"""

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="required-value-missing",
    title="Required value is empty",
    severity="error",
    stage="schema",
    method="not-null check on the required columns (compound_id, name; a point's compound_id, t, p)",
    reference="README, 'Usage' and 'The rule pack' (required values)",
)
