"""Unit-slip recognition against exact conversion factors (SI brochure 2019; NIST SP 811 App. B)."""

from __future__ import annotations

import numpy as np
import pytest

from propcheck.physics.unit_slips import pressure_slip, temperature_slip

# 1 atm = 101325 Pa exactly; 1 mmHg = 133.322387415 Pa; 1 psi = 6894.757293168 Pa (NIST SP 811 App. B).


@pytest.mark.parametrize(
    ("factor", "text"),
    [(1e-3, "kPa"), (1e-5, "bar"), (1e-6, "MPa"), (1 / 101325.0, "atm"), (1 / 133.322387415, "mmHg"),
     (1 / 6894.757293168, "psi")],
)
def test_pressure_slips(factor, text):
    p = 101325.0  # 1 atm
    found, corrected = pressure_slip([p * factor], [p])
    assert text in found[0]
    assert corrected[0] == pytest.approx(p)


def test_no_slip_for_a_small_error():
    found, corrected = pressure_slip([101325.0 * 1.08], [101325.0])
    assert found[0] == "" and np.isnan(corrected[0])


@pytest.mark.parametrize(
    ("stored", "text"),
    [(68.72, "degC"), (155.696, "degF"), (615.366, "degR")],  # 341.87 K (n-hexane Tb, CRC) in degC, degF, degR
)
def test_temperature_slips(stored, text):
    found, corrected = temperature_slip([stored], [341.87])
    assert text in found[0]
    assert corrected[0] == pytest.approx(341.87, abs=1e-3)


def test_small_error_near_575_k_is_no_degf_slip():
    """Near 575 K degF read as K is almost the identity: a 15 K error there must not be called a degF slip."""
    # toluene tc 591.75 K (IUPAC, Tsonopoulos & Ambrose 1995) stored 15 K high; (606.75 + 459.67)/1.8 = 592.46 K
    text, fixed = temperature_slip([606.75], [591.75])
    assert text[0] == "" and np.isnan(fixed[0])
    # a real degF slip still is one: n-hexane tb 341.87 K (CRC Handbook 95th ed.) = 155.696 degF (exact conversion)
    text, fixed = temperature_slip([155.696], [341.87])
    assert text[0] == "degF entered as K?" and fixed[0] == pytest.approx(341.87, abs=1e-3)
