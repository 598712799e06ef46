"""A CAS Registry Number is not written in the registry's format.

What it checks
    ``cas`` matches ``NNNNNNN-NN-N``: two to seven digits, a hyphen, two
    digits, a hyphen and one check digit.

Why it matters
    A CAS number is the key other databases know a compound by; a malformed
    one (hyphens lost, a letter typed in, a 10-digit placeholder) cannot be
    looked up or cross-checked.

Method
    Regular expression ``^[0-9]{2,7}-[0-9]{2}-[0-9]$`` on the trimmed text.

Parameters
    None.

Example finding
    n-Hexane (110-54-3) without its hyphens:
    ``compounds.csv row 6, column cas: '110543' is not a CAS Registry Number (NNNNNNN-NN-N)``

References
    1. CAS, "Check Digit Verification of CAS Registry Numbers", cas.org.
"""

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="cas-malformed",
    title="CAS Registry Number not in NNNNNNN-NN-N form",
    severity="error",
    stage="schema",
    method="format ^[0-9]{2,7}-[0-9]{2}-[0-9]$",
    reference="CAS, Check Digit Verification of CAS Registry Numbers",
)
