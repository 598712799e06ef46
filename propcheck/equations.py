"""The stored vapor-pressure equations of a run, with their declared units resolved (cached)."""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.load.units import affine_to_canonical
from propcheck.physics.vp_equation import FORMS, LN_BASE, T_SHIFT, equation_ln_p

__all__ = ["equations", "ln_p_of"]

_SQL = """
SELECT e._row AS e_row, e.*, coalesce(e.log_base, '10') AS base,
       c.tc, c.pc, c.tm, c.tb, c.omega, c.source AS c_source
FROM vp_equations e JOIN compounds c USING (compound_id)
ORDER BY e.compound_id, e._row
"""


def _p_scale(unit: str) -> float:
    try:
        scale, offset = affine_to_canonical(unit, "Pa")
    except ValueError:
        return np.nan
    return scale if offset == 0 else np.nan


def equations(db) -> pd.DataFrame | None:
    """One row per stored equation with ``problem`` naming why it cannot be evaluated ('' if it can)."""
    if "equations" not in db.cache:
        db.cache["equations"] = _load(db) if db.has("vp_equations") else None
    return db.cache["equations"]


def _load(db) -> pd.DataFrame | None:
    eq = db.df(_SQL)
    if eq.empty:
        return None
    eq["form"] = eq["form"].str.strip().str.lower()
    eq["base"] = eq["base"].astype(str).str.strip().str.lower().replace({"ln": "e", "log10": "10", "log": "10"})
    eq["p_scale"] = [_p_scale(u) for u in eq["p_unit"]]
    eq["t_shift"] = eq["t_unit"].map(T_SHIFT)
    eq["ln_base"] = eq["base"].map(LN_BASE)
    wagner = eq["form"].str.startswith("wagner") | (eq["form"] == "antoine_extended")
    problem = np.full(len(eq), "", dtype=object)
    problem = np.where(eq["ln_base"].isna(), f"log_base must be 10 or e", problem)
    problem = np.where(eq["t_shift"].isna(), "t_unit must be K or degC", problem)
    problem = np.where(eq["p_scale"].isna(), "p_unit is not a pressure unit pint knows", problem)
    problem = np.where(wagner & (eq["eq_tc"].isna() | (eq["form"].str.startswith("wagner") & eq["eq_pc"].isna())),
                       "this form needs eq_tc (and eq_pc for Wagner)", problem)
    problem = np.where(~eq["form"].isin(FORMS), f"form must be one of {', '.join(FORMS)}", problem)
    problem = np.where(eq["tmin"] >= eq["tmax"], "tmin is not below tmax", problem)
    eq["problem"] = problem
    eq["tmin_k"] = eq["tmin"] + eq["t_shift"].fillna(0.0)
    eq["tmax_k"] = eq["tmax"] + eq["t_shift"].fillna(0.0)
    return eq


def ln_p_of(eq: pd.DataFrame, t_k, rows=None, *, t_shift=None, ln_base=None, p_scale=None):
    """ln(p/Pa) of equations ``rows`` (default all) at ``t_k``, optionally with other units than declared.

    ``t_k`` has shape (rows,) or (rows, m); the unit overrides broadcast the same way.
    """
    sel = eq if rows is None else eq.iloc[rows]

    def col(name):
        v = sel[name].to_numpy(dtype=float)
        return v if np.ndim(t_k) < 2 else v[:, None]

    form = sel["form"].to_numpy(dtype=object)
    form = form if np.ndim(t_k) < 2 else form[:, None]
    shift = col("t_shift") if t_shift is None else t_shift
    base = col("ln_base") if ln_base is None else ln_base
    scale = col("p_scale") if p_scale is None else p_scale
    eq_pc_pa = col("eq_pc")  # in p_unit, like p itself
    return equation_ln_p(form, t_k, col("a"), col("b"), col("c"), col("d"), col("e"), col("f"), col("n"), col("t0"),
                         col("eq_tc"), eq_pc_pa, np.nan_to_num(shift), base, np.log(scale))
