"""A CAS Registry Number fails its check digit.

What it checks
    The last digit of a well-formed CAS number equals the weighted digit sum
    of the other digits modulo 10.

Why it matters
    A wrong check digit almost always means a mistyped or transposed digit:
    the number then names no compound, or a different one.

Method
    CAS check-digit rule: number the digits before the check digit from the
    right, starting at 1; multiply each by its position; the sum modulo 10
    is the check digit. Worked example from CAS: 107-07-3 gives
    (1x7 + 2x0 + 3x7 + 4x0 + 5x1) mod 10 = 33 mod 10 = 3.

Parameters
    None.

Example finding
    n-Hexane (110-54-3, CAS Registry) with two digits transposed:
    ``compounds.csv row 6, column cas: 110-45-3 fails its check digit
    (digits before it give 2)`` with suggestion ``transposed digits? the
    name gives CAS 110-54-3``

References
    1. CAS, "Check Digit Verification of CAS Registry Numbers", cas.org.
"""

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="cas-check-digit",
    title="CAS Registry Number fails its check digit",
    severity="error",
    stage="schema",
    method="CAS check digit: sum of digit x position from the right, modulo 10",
    reference="CAS, Check Digit Verification of CAS Registry Numbers",
)
