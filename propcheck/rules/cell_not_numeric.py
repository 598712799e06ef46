"""A numeric cell holds text that is not a number.

What it checks
    Every cell of a numeric column (``tc``, ``pc``, ``t``, ``p`` ...) parses as
    a finite number, after the mapping's decimal separator is applied.

Why it matters
    A value such as ``507.6 K``, ``n/a`` or ``1,2e5`` in a numeric column is
    silently read as missing by most tools, and the compound then escapes
    every later check. propcheck keeps the cell out of the calculations and
    reports it here instead.

Method
    Text is trimmed; an empty cell is missing (not a finding). Anything else
    must parse as a floating-point number that is neither NaN nor infinite.
    With a ``;`` delimiter (or ``[csv] decimal = ","``) a decimal comma is
    accepted. A vapor-pressure row whose ``t`` or ``p`` does not parse is
    rejected from the checks and counted as rejected in ``summary.md``.

Parameters
    None.

Example finding
    n-Hexane's tc (IUPAC) entered with its unit:
    ``compounds.csv row 6, column tc: '507.6 K' is not a number`` with
    suggestion ``a number with a unit ('K'): store the number alone and
    declare the unit in the mapping file``

References
    1. README, 'Usage' (canonical columns and units; a cell that does not parse).
"""

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="cell-not-numeric",
    title="Numeric cell does not hold a number",
    severity="error",
    stage="load",
    method="parse as IEEE 754 double after trimming; decimal comma with ';' delimiter",
    reference="README, 'Usage' (canonical columns and units)",
)
