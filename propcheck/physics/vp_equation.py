"""Evaluate stored vapor-pressure equations with their declared units, vectorised over rows.

Forms (coefficients as published, T in the equation's unit unless noted):

* ``antoine``: log_base p = a - b / (T + c)
* ``clausius_clapeyron``: log_base p = a - b / T
* ``antoine_extended`` (Poling et al. 5th ed., App. A): log10 p = a - b/(T + c)
  + 0.43429 x^n + e x^8 + f x^12, x = max(0, (T_K - t0 - 273.15) / eq_tc)
* ``wagner_25_5``: ln(p/eq_pc) = (eq_tc/T_K)(a tau + b tau^1.5 + c tau^2.5 + d tau^5)
* ``wagner_3_6``: ln(p/eq_pc) = (eq_tc/T_K)(a tau + b tau^1.5 + c tau^3 + d tau^6)

with tau = 1 - T_K/eq_tc; p in ``p_unit``.

References
----------
.. [1] C. Antoine, C. R. Acad. Sci. 107, 681 (1888).
.. [2] W. Wagner, Cryogenics 13, 470 (1973); D. Ambrose, J. Chem. Thermodyn. 18, 45 (1986).
.. [3] B. E. Poling, J. M. Prausnitz, J. P. O'Connell, The Properties of Gases and Liquids, 5th ed. (2001), App. A.
"""

from __future__ import annotations

import numpy as np

__all__ = ["FORMS", "T_SHIFT", "equation_ln_p"]

FORMS = ("antoine", "clausius_clapeyron", "antoine_extended", "wagner_25_5", "wagner_3_6")
T_SHIFT = {"K": 0.0, "degC": 273.15}  # T_K = T + shift (exact: common practice)
LN_BASE = {"10": np.log(10.0), "e": 1.0}


def equation_ln_p(form, t_k, a, b, c, d, e, f, n, t0, eq_tc, eq_pc, t_shift, ln_base, ln_p_scale):
    """ln(p / Pa) of stored equations at absolute temperatures ``t_k`` [K].

    All arguments broadcast; ``form`` is an array of form names; ``t_shift``
    converts the equation's T unit to K; ``ln_base`` is ln(10) or 1;
    ``ln_p_scale`` is ln of the factor from ``p_unit`` to Pa. Returns NaN
    where the equation is undefined (T + C <= 0, T above eq_tc for Wagner).
    """
    form = np.asarray(form, dtype=object)
    t_k = np.asarray(t_k, dtype=float)
    tt = t_k - t_shift
    out = np.full(np.broadcast(form, t_k).shape, np.nan)
    with np.errstate(all="ignore"):
        denom = tt + np.nan_to_num(c)
        antoine = ln_base * (a - b / denom)
        out = np.where((form == "antoine") & (denom > 0), antoine, out)
        out = np.where((form == "clausius_clapeyron") & (tt > 0), ln_base * (a - b / tt), out)
        x = np.maximum(0.0, (t_k - np.nan_to_num(t0) - 273.15) / eq_tc)
        ext = np.log(10.0) * (a - b / denom + 0.43429 * x ** np.nan_to_num(n) + np.nan_to_num(e) * x**8
                              + np.nan_to_num(f) * x**12)
        out = np.where((form == "antoine_extended") & (denom > 0), ext, out)
        tau = 1.0 - t_k / eq_tc
        w25 = np.log(eq_pc) + (a * tau + b * tau**1.5 + c * tau**2.5 + d * tau**5) * eq_tc / t_k
        w36 = np.log(eq_pc) + (a * tau + b * tau**1.5 + c * tau**3 + d * tau**6) * eq_tc / t_k
        out = np.where((form == "wagner_25_5") & (tau >= 0), w25, out)
        out = np.where((form == "wagner_3_6") & (tau >= 0), w36, out)
    return out + ln_p_scale
