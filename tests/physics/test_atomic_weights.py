"""Molar masses from formulas against IUPAC 2021 standard atomic weights."""

from __future__ import annotations

import pytest

from propcheck.physics.atomic_weights import molar_mass, parse_formula
from tests.published_constants import _ROWS


@pytest.mark.parametrize("row", _ROWS, ids=[r[0] for r in _ROWS])
def test_molar_mass_matches_iupac_2021(row):
    # M column of tests/published_constants.py: IUPAC 2021 conventional weights, 3 decimals
    # (Prohaska et al., Pure Appl. Chem. 94, 573 (2022))
    name, _, formula, _, m = row[:5]
    assert float(molar_mass([formula])[0]) == pytest.approx(m, abs=0.0015)


def test_water_against_iapws():
    # IAPWS-95 M = 18.015268 g/mol; abridged weights give 18.015 (IUPAC 2021)
    assert float(molar_mass(["H2O"])[0]) == pytest.approx(18.015268, abs=0.001)


@pytest.mark.parametrize("text", ["", "C6H1x", "Xx2", "C6(H14", "C6H14)", "6CH"])
def test_unparsable(text):
    assert parse_formula(text) is None


def test_parentheses_and_counts():
    # n-hexane written condensed, CH3(CH2)4CH3 = C6H14 (common practice)
    assert parse_formula("CH3(CH2)4CH3") == {"C": 6, "H": 14}
