"""One CAS Registry Number appears under two or more compound ids.

What it checks
    Each CAS number occurs in one row of ``compounds`` only.

Why it matters
    One substance stored twice drifts apart when one copy is corrected and
    the other is not; or one of the rows carries the wrong CAS number and
    will be cross-checked against another compound's reference data.

Method
    Duplicate test on the trimmed CAS text; every row of a shared CAS is
    reported and names the other ids.

Parameters
    None.

Example finding
    Toluene (108-88-3) given benzene's 71-43-2 (CAS Registry):
    ``compounds.csv row 15, column cas: 71-43-2 is also the CAS of P14 (benzene)``
    (and the same on benzene's row, naming P15)

References
    1. CAS Registry: one number per substance (cas.org).
"""

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="cas-shared-by-ids",
    title="Same CAS Registry Number under two compound ids",
    severity="error",
    stage="schema",
    method="uniqueness of CAS across compound ids",
    reference="CAS Registry: one number per substance",
)
