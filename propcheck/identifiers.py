"""CAS Registry Numbers: format and check digit, vectorised over a column; lookup in the offline identifier database."""

from __future__ import annotations

import numpy as np
import pandas as pd

__all__ = ["CAS_PATTERN", "cas_check_digit", "cas_format_ok", "cas_check_digit_ok", "lookup_chemical"]

CAS_PATTERN = r"^[0-9]{2,7}-[0-9]{2}-[0-9]$"


def cas_check_digit(body: str) -> int:
    """Return the CAS check digit for the digits before it.

    The digits are numbered from the right starting at 1; the check digit is
    the sum of digit x number, modulo 10.

    Examples
    --------
    CAS worked example, 107-07-3 (cas.org, Check Digit Verification):

    >>> cas_check_digit("107-07")
    3
    """
    digits = [int(c) for c in body if c.isdigit()]
    return sum(i * d for i, d in enumerate(reversed(digits), start=1)) % 10


def cas_format_ok(cas: pd.Series) -> pd.Series:
    """True where ``cas`` is missing or matches NNNNNNN-NN-N."""
    text = cas.astype("object")
    ok = text.isna() | text.astype(str).str.fullmatch(CAS_PATTERN)
    return ok.astype(bool)


def cas_check_digit_ok(cas: pd.Series) -> pd.Series:
    """True where ``cas`` is missing, malformed (another rule's job) or has the right check digit."""
    result = pd.Series(True, index=cas.index)
    text = cas.astype("object")
    formed = text.notna() & text.astype(str).str.fullmatch(CAS_PATTERN).fillna(False).astype(bool)
    if not formed.any():
        return result
    digits = text[formed].astype(str).str.replace("-", "", regex=False)
    body = digits.str[:-1].str.zfill(9)
    arr = np.frombuffer("".join(body).encode("ascii"), dtype=np.uint8).reshape(-1, 9) - ord("0")
    weights = np.arange(9, 0, -1)
    expected = (arr * weights).sum(axis=1) % 10
    actual = digits.str[-1].astype(int).to_numpy()
    result.loc[formed[formed].index] = expected == actual
    return result


def lookup_chemical(text):
    """The identifier database's record for a CAS or a name (``chemicals.identifiers``, offline), or None if unknown."""
    if text is None or not str(text).strip():
        return None
    from chemicals.identifiers import search_chemical  # loads the database on first use

    try:
        return search_chemical(str(text).strip())
    except Exception:  # unknown to the database
        return None
