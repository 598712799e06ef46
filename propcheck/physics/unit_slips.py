"""Recognise the usual unit slips from an observed and an expected value.

A pressure slip multiplies the value by a fixed factor (a value in kPa
stored as Pa reads 1000x too small); a temperature slip is affine (a value
in degC stored as K reads 273.15 K too low). Both functions work on arrays
and return, per element, a short text and the corrected value (or an empty
text and NaN when no slip explains the difference).
"""

from __future__ import annotations

import numpy as np

__all__ = ["PRESSURE_SLIPS", "TEMPERATURE_SLIPS", "pressure_slip", "temperature_slip", "transposed_digit_variants"]

# observed/expected ratio -> what happened. Factors exact by definition (SI
# brochure 2019; 1 atm = 101325 Pa; mmHg 133.322387415 Pa; psi 6894.757 Pa).
PRESSURE_SLIPS: tuple[tuple[float, str], ...] = (
    (1e-3, "kPa entered as Pa"),
    (1e-5, "bar entered as Pa"),
    (1e-6, "MPa entered as Pa"),
    (1 / 101325.0, "atm entered as Pa"),
    (1 / 133.322387415, "mmHg entered as Pa"),
    (1 / 6894.757293168, "psi entered as Pa"),
    (1e-2, "hPa (mbar) entered as Pa"),
    (1e3, "Pa entered as kPa, or converted twice"),
    (10.0, "bar/MPa mix-up"),
    (0.1, "MPa/bar mix-up"),
)

# corrected = f(observed) for a temperature stored in the wrong scale.
TEMPERATURE_SLIPS: tuple[tuple[str, object], ...] = (
    ("degC entered as K", lambda t: t + 273.15),
    ("degF entered as K", lambda t: (t + 459.67) / 1.8),
    ("degR entered as K", lambda t: t / 1.8),
)


def pressure_slip(observed, expected, rel_tol: float = 0.25):
    """Name the factor slip that maps ``expected`` to ``observed``.

    Parameters
    ----------
    observed, expected : array_like
        Pressures [Pa].
    rel_tol : float
        Accepted relative misfit of the ratio to the slip factor.

    Returns
    -------
    text : ndarray of str
        e.g. ``"value is 0.001x: kPa entered as Pa?"``; empty where none fits.
    corrected : ndarray of float
        ``observed / factor`` where a slip fits, else NaN.

    Examples
    --------
    >>> text, fixed = pressure_slip([101.325], [101325.0])
    >>> str(text[0]), float(fixed[0])
    ('value is 0.001x: kPa entered as Pa?', 101325.0)
    """
    obs = np.atleast_1d(np.asarray(observed, dtype=float))
    exp = np.atleast_1d(np.asarray(expected, dtype=float))
    with np.errstate(divide="ignore", invalid="ignore"):
        log_ratio = np.log(obs / exp)
    text = np.full(obs.shape, "", dtype=object)
    corrected = np.full(obs.shape, np.nan)
    best = np.full(obs.shape, np.inf)
    for factor, what in PRESSURE_SLIPS:
        misfit = np.abs(log_ratio - np.log(factor))
        hit = (misfit < np.log1p(rel_tol)) & (misfit < best)
        best = np.where(hit, misfit, best)
        text[hit] = f"value is {factor:.3g}x: {what}?"
        corrected = np.where(hit, obs / factor, corrected)
    return text, corrected


def temperature_slip(observed, expected, abs_tol: float = 3.0):
    """Name the temperature-scale slip that maps ``observed`` back to ``expected``.

    Parameters
    ----------
    observed, expected : array_like
        Temperatures [K]; ``expected`` may be a plausible value from other data.
    abs_tol : float
        Accepted misfit [K] of the corrected value.

    A scale slip is named only when undoing it moves the value by more than
    ten times ``abs_tol`` and 5 % of the expected value: near 575 K degF and
    K nearly coincide, and a small error there is no degF slip.

    Examples
    --------
    n-hexane normal boiling point 341.87 K (CRC Handbook) stored in degC:

    >>> text, fixed = temperature_slip([68.72], [341.87])
    >>> str(text[0]), round(float(fixed[0]), 2)
    ('degC entered as K?', 341.87)
    """
    obs = np.atleast_1d(np.asarray(observed, dtype=float))
    exp = np.atleast_1d(np.asarray(expected, dtype=float))
    text = np.full(obs.shape, "", dtype=object)
    corrected = np.full(obs.shape, np.nan)
    best = np.full(obs.shape, np.inf)
    for what, convert in TEMPERATURE_SLIPS:
        fixed = convert(obs)
        misfit = np.abs(fixed - exp)
        moved = np.abs(fixed - obs) > np.maximum(10.0 * abs_tol, 0.05 * np.abs(exp))
        hit = (misfit < abs_tol) & (misfit < best) & moved
        best = np.where(hit, misfit, best)
        text[hit] = f"{what}?"
        corrected = np.where(hit, fixed, corrected)
    return text, corrected


def transposed_digit_variants(value: float) -> list[float]:
    """Values obtained by swapping two adjacent digits of ``value`` as written.

    Examples
    --------
    Benzene Tc 562.05 K (IUPAC) typed as 526.05:

    >>> 562.05 in transposed_digit_variants(526.05)
    True
    """
    text = format(float(value), ".10g")
    out = []
    for i in range(len(text) - 1):
        a, b = text[i], text[i + 1]
        if a.isdigit() and b.isdigit() and a != b:
            swapped = text[:i] + b + a + text[i + 2:]
            try:
                out.append(float(swapped))
            except ValueError:
                continue
    return out
