"""Vapor-pressure correlations in canonical units (T in K, p in Pa).

Published forms only; every function accepts numpy arrays and broadcasts.
"""

from __future__ import annotations

import numpy as np

__all__ = [
    "ambrose_walton_psat",
    "antoine",
    "clausius_clapeyron",
    "lee_kesler_f0_f1",
    "lee_kesler_psat",
    "omega_from_psat",
    "wagner_25_5",
    "wagner_3_6",
]

P_ATM = 101325.0  # Pa, standard atmosphere (exact, common practice)


def clausius_clapeyron(t, a, b):
    """Two-constant Clausius-Clapeyron form, ``ln p = a - b / T``.

    Parameters
    ----------
    t : array_like
        Temperature [K].
    a, b : array_like
        Constants for p in Pa (``b`` in K).

    Returns
    -------
    p : ndarray
        Vapor pressure [Pa].
    """
    return np.exp(a - b / np.asarray(t, dtype=float))


def antoine(t, a, b, c, base: float = 10.0):
    """Antoine equation, ``log_base p = a - b / (T + c)``.

    Returns 0 where ``T + c <= 0`` (outside any meaningful range), as the
    chemicals library does.

    Parameters
    ----------
    t : array_like
        Temperature [K].
    a, b, c : array_like
        Coefficients for p in Pa and T in K.
    base : float
        Logarithm base of the coefficients (10 or e).

    Examples
    --------
    n-hexane, Poling et al. 5th ed. Antoine set as carried by chemicals
    (A 9.00139, B 1170.875, C -48.833, Pa, K): about 101 kPa at 341.87 K.

    >>> round(float(antoine(341.87, 9.00139, 1170.875, -48.833)) / 1000, 1)
    101.2

    References
    ----------
    .. [1] C. Antoine, C. R. Acad. Sci. 107, 681 (1888).
    """
    t = np.asarray(t, dtype=float)
    denom = t + c
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        p = np.power(base, a - b / denom)
    return np.where(denom > 0, p, 0.0)


def _tau(t, tc):
    return 1.0 - np.asarray(t, dtype=float) / tc


def wagner_25_5(t, tc, pc, a, b, c, d):
    """Wagner equation, 2.5-5 form: ``ln(p/pc) = (tc/T)(a tau + b tau^1.5 + c tau^2.5 + d tau^5)``.

    ``tau = 1 - T/tc``; the coefficients are valid only with the tc and pc
    they were fitted with.

    References
    ----------
    .. [1] D. Ambrose, J. Chem. Thermodyn. 18, 45 (1986); Poling et al. (2001) eq. 7-3.3.
    """
    tau = _tau(t, tc)
    with np.errstate(invalid="ignore"):  # NaN above tc, where the form has no meaning
        return pc * np.exp((a * tau + b * tau**1.5 + c * tau**2.5 + d * tau**5) * tc / np.asarray(t, dtype=float))


def wagner_3_6(t, tc, pc, a, b, c, d):
    """Wagner equation, original 3-6 form: ``ln(p/pc) = (tc/T)(a tau + b tau^1.5 + c tau^3 + d tau^6)``.

    References
    ----------
    .. [1] W. Wagner, Cryogenics 13, 470 (1973); J. McGarry, Ind. Eng. Chem. Process Des. Dev. 22, 313 (1983).
    """
    tau = _tau(t, tc)
    with np.errstate(invalid="ignore"):  # NaN above tc, where the form has no meaning
        return pc * np.exp((a * tau + b * tau**1.5 + c * tau**3 + d * tau**6) * tc / np.asarray(t, dtype=float))


def lee_kesler_psat(t, tc, pc, omega):
    """Lee-Kesler corresponding-states vapor pressure.

    ``ln(p/pc) = f0 + omega f1`` with
    ``f0 = 5.92714 - 6.09648/Tr - 1.28862 ln Tr + 0.169347 Tr^6`` and
    ``f1 = 15.2518 - 15.6875/Tr - 13.4721 ln Tr + 0.43577 Tr^6``.

    Examples
    --------
    At Tr = 0.7 the form returns omega by Pitzer's definition (f0 = f1 = -ln 10
    to four digits): n-hexane, tc 507.6 K, pc 3.025 MPa, omega 0.300.

    >>> p = lee_kesler_psat(0.7 * 507.6, 507.6, 3.025e6, 0.300)
    >>> round(float(-np.log10(p / 3.025e6) - 1), 3)
    0.3

    References
    ----------
    .. [1] B. I. Lee, M. G. Kesler, AIChE J. 21, 510 (1975).
    """
    f0, f1 = lee_kesler_f0_f1(np.asarray(t, dtype=float) / tc)
    return pc * np.exp(f0 + omega * f1)


def lee_kesler_f0_f1(tr):
    """The simple-fluid and correction terms f0(Tr), f1(Tr) of Lee and Kesler (1975)."""
    f0 = 5.92714 - 6.09648 / tr - 1.28862 * np.log(tr) + 0.169347 * tr**6
    f1 = 15.2518 - 15.6875 / tr - 13.4721 * np.log(tr) + 0.43577 * tr**6
    return f0, f1


def ambrose_walton_psat(t, tc, pc, omega):
    """Ambrose-Walton corresponding-states vapor pressure.

    ``ln(p/pc) = (f0 + omega f1 + omega^2 f2) / Tr``, ``tau = 1 - Tr``, with
    ``f0 = -5.97616 tau + 1.29874 tau^1.5 - 0.60394 tau^2.5 - 1.06841 tau^5``,
    ``f1 = -5.03365 tau + 1.11505 tau^1.5 - 5.41217 tau^2.5 - 7.46628 tau^5``,
    ``f2 = -0.64771 tau + 2.41539 tau^1.5 - 4.26979 tau^2.5 + 3.25259 tau^5``.

    References
    ----------
    .. [1] D. Ambrose, J. Walton, Pure Appl. Chem. 61, 1395 (1989).
    """
    tr = np.asarray(t, dtype=float) / tc
    tau = 1.0 - tr
    f0 = -5.97616 * tau + 1.29874 * tau**1.5 - 0.60394 * tau**2.5 - 1.06841 * tau**5
    f1 = -5.03365 * tau + 1.11505 * tau**1.5 - 5.41217 * tau**2.5 - 7.46628 * tau**5
    f2 = -0.64771 * tau + 2.41539 * tau**1.5 - 4.26979 * tau**2.5 + 3.25259 * tau**5
    return pc * np.exp((f0 + omega * f1 + omega**2 * f2) / tr)


def omega_from_psat(psat_at_07tc, pc):
    """Pitzer's acentric factor, ``omega = -log10(p(0.7 tc) / pc) - 1``.

    References
    ----------
    .. [1] K. S. Pitzer et al., J. Am. Chem. Soc. 77, 3433 (1955).
    """
    return -np.log10(np.asarray(psat_at_07tc, dtype=float) / pc) - 1.0
