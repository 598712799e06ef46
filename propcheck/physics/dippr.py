"""DIPPR equation 101 for vapor pressure, in canonical units."""

from __future__ import annotations

import numpy as np

__all__ = ["dippr101"]


def dippr101(t, c1, c2, c3, c4, c5):
    """DIPPR equation 101, ``p = exp(c1 + c2/T + c3 ln T + c4 T^c5)``.

    Parameters
    ----------
    t : array_like
        Temperature [K].
    c1, c2, c3, c4, c5 : array_like
        Coefficients for p in Pa and T in K.

    Returns
    -------
    p : ndarray
        Vapor pressure [Pa].

    Examples
    --------
    Water, Perry's Handbook 8th ed. Table 2-8 (C1 73.649, C2 -7258.2,
    C3 -7.3037, C4 4.1653e-6, C5 2), at the IAPWS-95 normal boiling point
    373.124 K: 101.17 kPa, 0.16 % below 1 atm (101.325 kPa) [computed].

    >>> round(float(dippr101(373.124, 73.649, -7258.2, -7.3037, 4.1653e-6, 2)) / 1000, 2)
    101.17

    References
    ----------
    .. [1] D. W. Green, R. H. Perry (eds.), Perry's Chemical Engineers'
       Handbook, 8th ed., McGraw-Hill (2007), Table 2-8.
    """
    t = np.asarray(t, dtype=float)
    with np.errstate(over="ignore", invalid="ignore", divide="ignore"):
        return np.exp(c1 + c2 / t + c3 * np.log(t) + c4 * t**c5)
