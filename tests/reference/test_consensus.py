"""Consensus and z-scores (propcheck.reference.consensus)."""

from __future__ import annotations

import numpy as np
import pandas as pd
import pytest

from propcheck.reference.consensus import consensus, z_score


def test_z_score_is_gum_combination():
    # JCGM 100:2008: independent uncertainties add in quadrature; 3-4-5 triangle (common practice)
    assert float(z_score(10.0, 3.0, 4.0)) == pytest.approx(2.0)
    assert float(z_score(0.0, 0.0, 0.0)) == 0.0
    assert np.isinf(float(z_score(1.0, 0.0, 0.0)))


def test_source_with_a_slip_stands_apart_and_leaves_the_consensus():
    # nitrogen Pc [Pa]: Span & Wagner 2000 EOS 3.3958e6, Mathews 1972 3.3944e6, PSRK rev. 4 3.3944e6
    # (as carried by chemicals 1.5.2 / CoolProp 8.0.0); the fourth is the EOS value read as kPa (x1000): a slip.
    long = pd.DataFrame({
        "key": 1, "property": "pc",
        "source": ["EOS", "Mathews", "PSRK", "slipped"],
        "value": [3.3958e6, 3.3944e6, 3.3944e6, 3.3958e9],
    })
    long["uncertainty"] = 0.02 * long["value"]
    summary, apart = consensus(long, ["key", "property"])
    assert list(apart) == [False, False, False, True]
    row = summary.iloc[0]
    assert row["consensus"] == pytest.approx(3.3944e6)
    assert row["n_sources"] == 4 and row["n_kept"] == 3


def test_two_disagreeing_sources_widen_the_tolerance():
    # methanol Pc: IUPAC Part 4 (Gude & Teja, J. Chem. Eng. Data 40, 1025 (1995)) 8.084 MPa
    # vs the de Reuck 1993 reference EOS in CoolProp 8.0.0, 8.216 MPa
    long = pd.DataFrame({"key": 1, "property": "pc", "source": ["IUPAC", "EOS"], "value": [8.084e6, 8.216e6]})
    long["uncertainty"] = 0.02 * long["value"]
    summary, apart = consensus(long, ["key", "property"])
    assert not apart.any()  # two sources: neither can be called the odd one out
    row = summary.iloc[0]
    assert row["consensus"] == pytest.approx(8.15e6)
    assert row["u_consensus"] > row["u_median"]  # their spread counts in the tolerance
