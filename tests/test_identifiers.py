"""CAS Registry Number format and check digit."""

from __future__ import annotations

import pandas as pd
from hypothesis import given
from hypothesis import strategies as st

from propcheck.identifiers import cas_check_digit, cas_check_digit_ok, cas_format_ok

# CAS numbers from references: water 7732-18-5, methane 74-82-8, n-hexane 110-54-3, carbon dioxide
# 124-38-9, ammonia 7664-41-7 (cas.org; NIST Chemistry WebBook).
PUBLISHED = ["7732-18-5", "74-82-8", "110-54-3", "124-38-9", "7664-41-7", "107-07-3"]


def test_worked_example():
    # cas.org: 107-07-3 -> (1*7 + 2*0 + 3*7 + 4*0 + 5*1) mod 10 = 33 mod 10 = 3
    assert cas_check_digit("107-07") == 3


def test_published_numbers_pass():
    series = pd.Series(PUBLISHED)
    assert cas_format_ok(series).all()
    assert cas_check_digit_ok(series).all()


def test_wrong_digit_fails_and_missing_passes():
    series = pd.Series(["7732-18-4", None, "7732-18-5"])
    assert cas_check_digit_ok(series).tolist() == [False, True, True]


@given(st.integers(min_value=10, max_value=9_999_999), st.integers(min_value=0, max_value=99))
def test_vectorised_check_agrees_with_the_rule(first, second):
    body = f"{first}-{second:02d}"
    good = f"{body}-{cas_check_digit(body)}"
    bad = f"{body}-{(cas_check_digit(body) + 1) % 10}"
    assert cas_check_digit_ok(pd.Series([good, bad])).tolist() == [True, False]
