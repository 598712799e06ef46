"""Data behind the report's plots, built once from the run (no drawing here).

Per flagged compound: its vapor-pressure points, the fitted curve the rules
judged it by (:func:`propcheck.curves.curves`, the run's cached fit: Wagner,
Riedel, Antoine or Clausius-Clapeyron, chosen per compound) sampled from its
lowest point below tc on to the critical point (beyond its last point only
while it stays near the points, tb and the critical point: a free fit
extrapolated to tc may run off, and must not stretch the axis), the normal
boiling point at 101.325 kPa, the critical point, the points a finding names and the
corrected value where a rule diagnosed a slip. Per family: tc, tb and pc
against molar mass with the members a finding names.

References
----------
.. [1] B. E. Poling, J. M. Prausnitz, J. P. O'Connell, The Properties of Gases and
   Liquids, 5th ed., McGraw-Hill (2001), ch. 7 (the vapor-pressure forms of
   :mod:`propcheck.physics.vp_fit`).
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field

import numpy as np
import pandas as pd

from propcheck.curves import curves
from propcheck.database import Database
from propcheck.physics.vapor_pressure import P_ATM

__all__ = ["CompoundPanel", "FamilyPanel", "build_compound_panels", "build_family_panels", "corrected_value"]

_CORRECTED = re.compile(r"corrected(?:\s+[a-z_]+)?\s+([-+]?\d[\d.]*(?:[eE][-+]?\d+)?)")


def corrected_value(suggestion) -> float | None:
    """The number after ``corrected`` in a rule's suggestion (a diagnosed slip), else None.

    >>> corrected_value("value is 1000x: kPa entered as Pa? corrected 101325 Pa")
    101325.0
    >>> corrected_value("tb and tc swapped?") is None
    True
    """
    if not isinstance(suggestion, str):
        return None
    match = _CORRECTED.search(suggestion)
    return float(match.group(1)) if match else None


@dataclass
class CompoundPanel:
    """Everything the ln p vs 1/T panel of one compound shows."""

    compound_id: str
    name: str
    n_findings: int
    rules: list[str]
    t: np.ndarray  # K, all points
    p: np.ndarray  # Pa
    flagged: np.ndarray  # bool per point: a finding names it
    curve_t: np.ndarray  # K, where the run's fitted curve is drawn (empty: no fitted curve)
    curve_ln_p: np.ndarray  # ln(p / Pa) of that curve at curve_t
    curve_label: str  # Curves.describe(), e.g. "Riedel fit of 8 points (robust)"; "" without a curve
    tb: float | None
    tc: float | None
    pc: float | None
    corrections: list[tuple[str, float, float, float]] = field(default_factory=list)  # column, t, observed, corrected


@dataclass
class FamilyPanel:
    """tc, tb and pc against molar mass for the members of one family."""

    family: str
    compound_id: np.ndarray
    molar_mass: np.ndarray
    values: dict[str, np.ndarray]  # tc, tb, pc
    flagged: dict[str, np.ndarray]  # per column: bool, a finding names this member and column
    n_flagged: int


CURVE_SAMPLES = 120  # temperatures per drawn curve, evenly spaced in 1/T
# Beyond its last point the curve is drawn while ln p stays within the span of the panel's
# points and anchors (tb at 101.325 kPa, the critical point) widened by this share of the
# span (at least 1, a factor e in p): the axis then shows at most twice what the data span.
CURVE_MARGIN = 0.5


def _run_curves(db: Database, compounds: list[str], t: np.ndarray, p: np.ndarray, group: np.ndarray,
                tc: np.ndarray, anchors: np.ndarray | None = None) -> tuple[np.ndarray, np.ndarray, list[str]]:
    """The run's fitted curve of each compound, sampled over its points below tc and on to tc.

    ``anchors`` (len(compounds), k): ln p of the anchored points the panel
    shows (NaN where none). Beyond the last point the curve stops where it
    first leaves the span of the points and anchors by more than
    ``CURVE_MARGIN`` of it.

    Returns temperatures and ln p, both (len(compounds), CURVE_SAMPLES) with
    NaN rows where the run has no curve, and the curve's description ("" if none).
    """
    n = len(compounds)
    t_curve = np.full((n, CURVE_SAMPLES), np.nan)
    ln_curve = np.full((n, CURVE_SAMPLES), np.nan)
    labels = [""] * n
    cv = curves(db)  # the object the rules used (cached on db), computed here if no rule asked for it
    if cv is None or len(t) == 0:
        return t_curve, ln_curve, labels
    # the span of the points the run fitted (t > 0, p > 0, below tc), extended to tc
    with np.errstate(invalid="ignore"):
        usable = (t > 0) & (p > 0) & ~(t >= tc[group])
    lo = np.full(n, np.inf)
    hi = np.full(n, -np.inf)
    np.minimum.at(lo, group[usable], t[usable])
    np.maximum.at(hi, group[usable], t[usable])
    last = hi.copy()  # the last fitted point: the curve is extrapolated beyond it
    hi = np.where(np.isfinite(tc) & (tc > hi), tc, hi)
    where = cv.index()
    g = np.array([where.get(cid, -1) for cid in compounds])  # loop over the capped panels only
    has = (g >= 0) & np.isfinite(lo) & (hi > lo)
    if not has.any():
        return t_curve, ln_curve, labels
    frac = np.linspace(0.0, 1.0, CURVE_SAMPLES)
    tt = 1.0 / (1.0 / lo[has, None] + frac * (1.0 / hi[has, None] - 1.0 / lo[has, None]))
    tt[:, 0], tt[:, -1] = lo[has], hi[has]  # exact ends: the reduced Wagner form is NaN a rounding error past tc
    ln_p = cv.fit.ln_p(tt, g[has, None])
    y_lo, y_hi = _ln_p_span(t, p, group, n, anchors)
    margin = np.maximum(CURVE_MARGIN * (y_hi - y_lo), 1.0)[has, None]
    with np.errstate(invalid="ignore"):
        off = (tt > last[has, None]) & ((ln_p < y_lo[has, None] - margin) | (ln_p > y_hi[has, None] + margin))
    ln_p = np.where(np.cumsum(off, axis=1) > 0, np.nan, ln_p)  # from where it first runs off on
    drawn = np.isfinite(ln_p).any(axis=1)  # form 'none' (too few points) evaluates to NaN everywhere
    rows = np.nonzero(has)[0][drawn]
    t_curve[rows], ln_curve[rows] = tt[drawn], ln_p[drawn]
    for i in rows:
        labels[i] = cv.describe(g[i])
    return t_curve, ln_curve, labels


def _ln_p_span(t: np.ndarray, p: np.ndarray, group: np.ndarray, n: int,
               anchors: np.ndarray | None) -> tuple[np.ndarray, np.ndarray]:
    """Lowest and highest ln p of each compound's drawn points and anchors (NaN where none)."""
    lo = np.full(n, np.inf)
    hi = np.full(n, -np.inf)
    with np.errstate(invalid="ignore", divide="ignore"):
        shown = (t > 0) & (p > 0) & np.isfinite(p)
        ln = np.log(p[shown])
    np.minimum.at(lo, group[shown], ln)
    np.maximum.at(hi, group[shown], ln)
    if anchors is not None and anchors.size:
        lo = np.minimum(lo, np.where(np.isfinite(anchors), anchors, np.inf).min(axis=1))
        hi = np.maximum(hi, np.where(np.isfinite(anchors), anchors, -np.inf).max(axis=1))
    return np.where(np.isfinite(lo), lo, np.nan), np.where(np.isfinite(hi), hi, np.nan)


def build_compound_panels(db: Database, findings: pd.DataFrame, compounds: list[str]) -> list[CompoundPanel]:
    """Panels for ``compounds`` (already chosen and ordered, worst first)."""
    if not compounds:
        return []
    index = {cid: i for i, cid in enumerate(compounds)}
    db.con.register("_panel_ids", pd.DataFrame({"compound_id": compounds}))
    try:
        info = db.df(
            "SELECT c.compound_id, any_value(c.name) AS name, any_value(c.tb) AS tb, any_value(c.tc) AS tc, "
            "any_value(c.pc) AS pc FROM compounds c JOIN _panel_ids USING (compound_id) GROUP BY 1"
        ).set_index("compound_id")
        if db.has("vapor_pressure"):
            points = db.df(
                "SELECT v.compound_id, v.t, v.p FROM vapor_pressure v JOIN _panel_ids USING (compound_id) "
                "ORDER BY v.compound_id, v.t"
            )
        else:
            points = pd.DataFrame({"compound_id": [], "t": [], "p": []})
    finally:
        db.con.unregister("_panel_ids")
    group = points["compound_id"].map(index).to_numpy(dtype=int)
    t_all = points["t"].to_numpy(dtype=float)
    p_all = points["p"].to_numpy(dtype=float)
    tc_all, tb_all, pc_all = (info[c].reindex(compounds).to_numpy(dtype=float) if len(info)
                              else np.full(len(compounds), np.nan) for c in ("tc", "tb", "pc"))
    with np.errstate(invalid="ignore", divide="ignore"):  # the anchors the panel marks: tb, critical point
        anchors = np.column_stack([np.where(np.isfinite(tb_all) & (tb_all != 0), np.log(P_ATM), np.nan),
                                   np.where(np.isfinite(tc_all) & (tc_all != 0) & (pc_all > 0), np.log(pc_all), np.nan)])
    curve_t, curve_ln_p, curve_label = _run_curves(db, compounds, t_all, p_all, group, tc_all, anchors)
    mine = findings[findings["compound_id"].isin(index)]
    point_findings = mine[mine["t"].notna() & (mine["table"] == "vapor_pressure")]
    flagged_keys = set(zip(point_findings["compound_id"], pd.to_numeric(point_findings["t"]).round(6)))
    flagged_all = np.array([(c, round(t, 6)) in flagged_keys for c, t in zip(points["compound_id"], t_all)], dtype=bool)
    order = np.argsort(group, kind="stable")
    starts = np.searchsorted(group[order], np.arange(len(compounds) + 1))
    t_all, p_all, flagged_all = t_all[order], p_all[order], flagged_all[order]
    by_compound = {cid: frame for cid, frame in mine.groupby("compound_id")}
    panels = []
    for cid in compounds:  # one panel per flagged compound (bounded by the cap)
        i = index[cid]
        sl = slice(starts[i], starts[i + 1])
        row = info.loc[cid] if cid in info.index else None
        frame = by_compound.get(cid, mine.iloc[0:0])
        fixes: list = []
        for col, t, obs, sug in zip(frame["column"], frame["t"], frame["observed"], frame["suggestion"]):
            value = corrected_value(sug)
            if value is not None and col in ("p", "tb", "tc", "pc"):
                fix = (col, float(t) if t is not None else float("nan"), _num(obs), value)
                if fix not in fixes:
                    fixes.append(fix)

        panels.append(CompoundPanel(
            compound_id=cid,
            name=str(row["name"]) if row is not None and isinstance(row["name"], str) else "",
            n_findings=len(frame),
            rules=sorted(set(frame["rule"])),
            t=t_all[sl], p=p_all[sl], flagged=flagged_all[sl],
            curve_t=curve_t[i][np.isfinite(curve_ln_p[i])],
            curve_ln_p=curve_ln_p[i][np.isfinite(curve_ln_p[i])],
            curve_label=curve_label[i],
            tb=_num(row["tb"]) if row is not None else None,
            tc=_num(row["tc"]) if row is not None else None,
            pc=_num(row["pc"]) if row is not None else None,
            corrections=fixes,
        ))
    return panels


def _num(value) -> float | None:
    try:
        out = float(value)
    except (TypeError, ValueError):
        return None
    return out if np.isfinite(out) else None


def build_family_panels(db: Database, findings: pd.DataFrame, limit: int = 12) -> list[FamilyPanel]:
    """tc, tb and pc against molar mass per family; families with flagged members first, at most ``limit``."""
    frame = db.df(
        "SELECT compound_id, family, molar_mass, tc, tb, pc FROM compounds "
        "WHERE family IS NOT NULL AND molar_mass > 0 ORDER BY family, molar_mass, compound_id"
    )
    if frame.empty:
        return []
    named = findings[findings["compound_id"].notna()]
    keys = set(zip(named["compound_id"], named["column"].fillna("")))
    any_flag = set(named.loc[named["severity"].isin(("error", "warning")), "compound_id"])  # info flags nothing
    frame["_flag"] = frame["compound_id"].isin(any_flag)
    ranking = frame.groupby("family")["_flag"].agg(["sum", "size"]).reset_index()
    ranking = ranking[ranking["size"] >= 2].sort_values(["sum", "family"], ascending=[False, True])
    panels = []
    for family in ranking["family"].head(limit):  # loop over families (bounded)
        members = frame[frame["family"] == family]
        ids = members["compound_id"].to_numpy(dtype=object)
        panels.append(FamilyPanel(
            family=str(family),
            compound_id=ids,
            molar_mass=members["molar_mass"].to_numpy(dtype=float),
            values={c: members[c].to_numpy(dtype=float) for c in ("tc", "tb", "pc")},
            flagged={c: np.array([(cid, c) in keys for cid in ids], dtype=bool) for c in ("tc", "tb", "pc")},
            n_flagged=int(members["_flag"].sum()),
        ))
    return panels


P_NORMAL = P_ATM  # tb is defined at 101.325 kPa
