"""Consensus of independent sources and z-scores against it.

Compilations carry errors of their own, so no single one is taken as truth.
Per key (a compound and property, or a compound and temperature):

1. the median of all source values;
2. a source *stands apart* when at least three sources are present and it
   lies more than ``outlier_z`` of its own standard uncertainty from that
   median; it is named, and left out of the consensus;
3. the consensus is the median of the remaining sources; its uncertainty is
   ``sqrt(u_med^2 + s^2)``: the median stated uncertainty combined with the
   sample standard deviation ``s`` of the remaining sources, so that sources
   that disagree among themselves widen the tolerance.

The database value is then judged by ``z = |d| / sqrt(u_db^2 + u_c^2)``
(GUM combined standard uncertainty, JCGM 100:2008).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

__all__ = ["consensus", "z_score"]


def z_score(difference, u1, u2):
    """``|d| / sqrt(u1^2 + u2^2)``; inf where both uncertainties are zero.

    Examples
    --------
    n-hexane Tc, IUPAC 507.6 K vs the Thol 2019 EOS 507.82 K, with the
    pack's default u of 1 K + 0.2 % each (common practice): z about 0.08.

    >>> u = 1.0 + 0.002 * 507.7
    >>> round(float(z_score(507.82 - 507.6, u, u)), 2)
    0.08
    """
    d = np.abs(np.asarray(difference, dtype=float))
    u = np.sqrt(np.asarray(u1, dtype=float) ** 2 + np.asarray(u2, dtype=float) ** 2)
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(u > 0, d / u, np.where(d > 0, np.inf, 0.0))


def consensus(long: pd.DataFrame, keys: list[str], outlier_z: float = 5.0) -> tuple[pd.DataFrame, pd.Series]:
    """Consensus per key of a long table with ``value`` and ``uncertainty`` (filled, > 0).

    Returns
    -------
    summary : DataFrame
        One row per key: ``consensus``, ``u_consensus``, ``n_sources``,
        ``n_kept``, ``spread`` (sample std of the kept sources, 0 for one).
    apart : Series of bool
        Aligned with ``long``: the source stands apart from the others.
    """
    grouped = long.groupby(keys, sort=False)["value"]
    median = grouped.transform("median")
    n = grouped.transform("size")
    apart = (n >= 3) & ((long["value"] - median).abs() > outlier_z * long["uncertainty"])
    # never drop every source of a key: if all stand apart, keep them all
    all_apart = apart.groupby([long[k] for k in keys], sort=False).transform("all")
    apart = apart & ~all_apart
    kept = long[~apart]
    summary = kept.groupby(keys, sort=False).agg(
        consensus=("value", "median"),
        u_median=("uncertainty", "median"),
        spread=("value", "std"),
        n_kept=("value", "size"),
    )
    summary["spread"] = summary["spread"].fillna(0.0)
    summary["u_consensus"] = np.sqrt(summary["u_median"] ** 2 + summary["spread"] ** 2)
    summary["n_sources"] = long.groupby(keys, sort=False).size()
    return summary.reset_index(), apart
