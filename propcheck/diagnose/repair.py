"""Try the usual slips on suspect cells; keep the one that makes the row consistent.

Each candidate row (one cell repaired, or two cells swapped) is scored by
the evidence available for that compound, all candidates at once:

* order and bands: tm < tb < tc; tb/tc in Guldberg's band (Guldberg 1890);
  Zc = pc vc/(R tc) in the observed band and equal to a stored zc;
  omega in the observed range; the gross bounds of ``value-out-of-range``;
* its own vapor-pressure curve: tb against Lee-Kesler from tc, pc, omega
  (Lee & Kesler 1975), tc above its highest point, tb against the run's
  fitted curve at 101325 Pa (tb-off-vp-curve's tolerance; else the points
  bracketing 101325 Pa), omega against Pitzer's definition on the fitted
  curve at 0.7 tc of the candidate's tc and pc (Pitzer et al. 1955;
  omega-off-vp-curve's tolerance);
* its family's trend and its formula's molar mass (IUPAC 2021 weights);
* the median of the independent reference sources for the column, when the
  reference checks run (the compilations carried by chemicals and CoolProp's
  reference equations; see ``propcheck.reference``).

A check contributes ``z = |deviation| / tolerance``; a row is consistent
when every z <= 1. The best candidate fails fewest checks, then has the
smallest sum of z^2 (plus a small penalty for transposed digits, swaps and
copies: unit slips are the commoner clerical error); it is proposed only if
it fails fewer checks than the row as stored. "likely" when it leaves no check failing and no other
candidate does as well, else "possibly".

When the caller asks which of several columns is wrong (attribution), tb and
omega are also tried at the values the compound's own fitted curve gives
(101325 Pa; Pitzer's definition at 0.7 tc; without a fitted curve, tb
interpolated between the two points bracketing 101325 Pa, and the
suggestion says so): a value that is no slip but
disagrees with the compound's own points is then named, rather than a
constant its points confirm. A slip landing within that check's tolerance
of such a value is the same answer (not a rival) and is preferred: it says
what went wrong.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from propcheck.diagnose.context import NUMERIC, TREND_COLUMNS, Context
from propcheck.physics.corresponding_states import lee_kesler_tb
from propcheck.physics.slips import QUANTITY, value_candidates

__all__ = ["Diagnosis", "EVIDENCE", "diagnose", "evidence_z"]

R = 8.314462618  # J/(mol K), exact (SI 2019)

# Tolerances of the evidence, the defaults of the rules that judge each one
# (their bases are given there and in rules/default.toml): Lee-Kesler tb 2 K,
# doubled for polar compounds (tb-off-corresponding-states); Guldberg band
# (tb-tc-ratio-out-of-band); Zc (zc-inconsistent); molar mass
# (molar-mass-off-formula); omega range (omega-out-of-range).
EVIDENCE = {
    "guldberg_band": (0.55, 0.87),
    "zc_band": (0.20, 0.31),
    "zc_match": 0.005,
    "omega_range": (-0.40, 1.5),
    "lk_tb": 2.0,
    "lk_polar_factor": 2.0,
    "bounds": {"molar_mass": (1.0, 5000.0), "tc": (2.0, 2500.0), "pc": (1e5, 2e8), "vc": (1e-5, 1e-2),
               "zc": (0.05, 0.5), "omega": (-1.0, 2.5), "tb": (1.0, 2500.0), "tm": (0.5, 4000.0)},
}
_HARD = 1e3
# Tolerances against the median of the reference sources, wider than a
# single compilation's stated uncertainty because compilations differ among
# themselves (CRC Handbook critical table: median u(Tc) 0.8 K, u(Pc) 2.4 %,
# u(Vc) 3.2 %; IUPAC vs CRC spreads of several K for some compounds).
REFERENCE_TOLERANCE = {
    "tc": lambda ref: 3.0 + 0.005 * ref,
    "pc": lambda ref: 0.05 * ref,
    "vc": lambda ref: 0.08 * ref,
    "tb": lambda ref: 2.0 + 0.0 * ref,
    "tm": lambda ref: 3.0 + 0.0 * ref,
    "omega": lambda ref: 0.03 + 0.0 * ref,
    "molar_mass": lambda ref: 0.05 + 5e-4 * ref,
}

PRIOR_PENALTY = 0.5

# Attribution candidates taken from the compound's own fitted curve: what the
# suggestion says, and the check that compares the column with that curve.
OWN_CURVE = {
    "tb": ("off its own vapor-pressure curve? the curve reaches 101.325 kPa at", "tb from vapor-pressure points"),
    "omega": ("off its own vapor-pressure curve? Pitzer's definition at 0.7 tc gives", "omega from vapor-pressure curve"),
}
# Without a fitted curve, tb comes from the two points bracketing 101325 Pa (context.py).
OWN_POINTS_TB = "off its own vapor-pressure points? interpolation between the two points bracketing 101.325 kPa gives"
_OWN_CURVE_WHAT = {what for what, _ in OWN_CURVE.values()} | {OWN_POINTS_TB}


def _is_unit(what: str) -> bool:
    return not (what.startswith("transposed") or "swapped" in what or "copied" in what or what in _OWN_CURVE_WHAT)


SWAPS = {"tc": ("tb", "tm", "pc"), "tb": ("tc", "tm"), "tm": ("tb", "tc"), "pc": ("tc",), "zc": ("omega",), "omega": ("zc",)}


@dataclass
class Diagnosis:
    row: int  # position in the context frame
    column: str
    what: str
    corrected: float
    confidence: str  # "likely" | "possibly"
    evidence: str
    others: dict[str, float]  # further cells changed by the repair (a swap)

    def suggestion(self, unit: str = "") -> str:
        more = "".join(f", {c} {v:.6g}" for c, v in self.others.items())
        return f"{self.confidence}: {self.what} corrected {self.column} {self.corrected:.6g}{unit}{more} ({self.evidence})"


def _polar(ctx: Context, rows: np.ndarray) -> np.ndarray:
    return ctx.polar[rows]


def evidence_z(ctx: Context, rows: np.ndarray, v: dict[str, np.ndarray]) -> dict[str, np.ndarray]:
    """z of every check for candidate rows ``v`` of compounds ``rows``; NaN where a check does not apply."""
    e = EVIDENCE
    z: dict[str, np.ndarray] = {}
    with np.errstate(divide="ignore", invalid="ignore"):
        out = np.zeros(len(rows))
        for c, (lo, hi) in e["bounds"].items():
            out = np.where(np.isfinite(v[c]) & ((v[c] < lo) | (v[c] > hi)), _HARD, out)
        z["bounds"] = out
        order = np.zeros(len(rows))
        for a, b in (("tm", "tb"), ("tb", "tc"), ("tm", "tc")):
            order = np.where(np.isfinite(v[a]) & np.isfinite(v[b]) & (v[a] >= v[b]), _HARD, order)
        z["phase order"] = order
        ratio = v["tb"] / v["tc"]
        lo, hi = e["guldberg_band"]
        # NaN where a check has nothing to judge (a missing value): the evidence text then claims nothing
        z["Guldberg tb/tc"] = np.where(ratio < lo, 1 + (lo - ratio) / 0.02,
                                       np.where(ratio > hi, 1 + (ratio - hi) / 0.02, np.where(np.isfinite(ratio), 0.0, np.nan)))
        zc = v["pc"] * v["vc"] / (R * v["tc"])
        lo, hi = e["zc_band"]
        z["Zc band"] = np.where(zc < lo, 1 + (lo - zc) / 0.01, np.where(zc > hi, 1 + (zc - hi) / 0.01, np.where(np.isfinite(zc), 0.0, np.nan)))
        z["stored zc"] = np.abs(v["zc"] - zc) / e["zc_match"]
        lo, hi = e["omega_range"]
        z["omega range"] = np.where((v["omega"] < lo) | (v["omega"] > hi), 2.0, np.where(np.isfinite(v["omega"]), 0.0, np.nan))
        tol = np.where(_polar(ctx, rows), e["lk_tb"] * e["lk_polar_factor"], e["lk_tb"])
        z["Lee-Kesler tb"] = np.abs(v["tb"] - lee_kesler_tb(v["tc"], v["pc"], v["omega"])) / tol
        # only for compounds that have points (vp_tmax is -inf without any): no claim about points that do not exist
        has_points = np.isfinite(ctx.vp_tmax[rows])
        z["vapor-pressure points below tc"] = np.where(np.isfinite(v["tc"]) & has_points,
                                                       np.where(v["tc"] < ctx.vp_tmax[rows], _HARD, 0.0), np.nan)
        z["tb from vapor-pressure points"] = np.abs(v["tb"] - ctx.vp_tb[rows]) / ctx.vp_tb_tol[rows]
        z["omega from vapor-pressure curve"] = np.abs(v["omega"] - ctx.curve_omega(rows, v["tc"], v["pc"])) / ctx.curve_omega_tol
        m = v["molar_mass"]
        z["formula molar mass"] = np.abs(m - ctx.formula_mass[rows]) / (0.02 + 2e-4 * m)
        for c in TREND_COLUMNS:
            z[f"family trend {c}"] = ctx.family_z(c, v[c], rows)
        for c, ref in ctx.reference.items():
            if c not in v:
                continue
            tol = REFERENCE_TOLERANCE[c](ref[rows]) if c in REFERENCE_TOLERANCE else np.nan
            z[f"reference {c}"] = np.abs(v[c] - ref[rows]) / tol
    return z


def _score(z: dict[str, np.ndarray]) -> tuple[np.ndarray, np.ndarray]:
    stack = np.vstack(list(z.values()))
    failing = np.nansum(stack > 1.0, axis=0)
    total = np.nansum(np.minimum(np.nan_to_num(stack, nan=0.0), 30.0) ** 2, axis=0)
    return failing, total


def _names_passing(z, before, i) -> str:
    fixed = [k for k in z if np.isfinite(before[k][i]) and before[k][i] > 1 and z[k][i] <= 1]
    kept = [k for k in z if np.isfinite(z[k][i]) and z[k][i] <= 1 and k not in fixed
            and k not in ("bounds", "phase order", "omega range")]
    parts = ["restores " + _join(fixed) if fixed else "improves the row"]
    if kept:
        parts.append("agrees with " + _join(kept))
    return "; ".join(parts)


def _join(names: list[str]) -> str:
    """List check names, the reference comparisons gathered into one item."""
    ref = [n.removeprefix("reference ") for n in names if n.startswith("reference ")]
    rest = [n for n in names if not n.startswith("reference ")]
    if ref:
        rest.append(f"reference data ({', '.join(ref)})")
    return ", ".join(rest)


def diagnose(ctx: Context, rows, columns, raw: dict[str, np.ndarray] | None = None) -> list[Diagnosis | None]:
    """Best repair of cell (rows[k], columns[k]) for each k; None where no slip helps.

    ``columns[k]`` may be one column or a tuple of columns to try (the best
    over them is kept: attribution between constants that disagree).
    ``raw`` overrides the context values; by default the cells the schema
    stage withheld as out of range (a slip may explain them, or a swap may
    bring them back into range).
    """
    rows = np.asarray(rows, dtype=int)
    raw = ctx.withheld if raw is None else raw
    base = {c: ctx.values[c].copy() for c in NUMERIC}
    for c, arr in (raw or {}).items():
        base[c] = np.where(np.isfinite(arr), arr, base[c])
    own = {"tb": ctx.vp_tb[rows], "omega": ctx.curve_omega(rows, base["tc"][rows], base["pc"][rows])}
    cand_cell, cand_row, cand_what, cand_col, cand_val, cand_extra = [], [], [], [], [], []
    for k, (r, cols) in enumerate(zip(rows, columns)):  # loop over suspect cells (findings)
        cols = (cols,) if isinstance(cols, str) else tuple(cols)
        cand_cell.append(k); cand_row.append(r); cand_what.append(""); cand_col.append(cols[0])
        cand_val.append(base[cols[0]][r]); cand_extra.append({})
        swapped = set()  # a swap of two tried columns is one repair, not two rivals
        for col in cols:
            value = base[col][r]
            if not np.isfinite(value) or col not in QUANTITY:
                continue
            for what, new in value_candidates(col, float(value)):
                cand_cell.append(k); cand_row.append(r); cand_what.append(what); cand_col.append(col)
                cand_val.append(new); cand_extra.append({})
            for other in SWAPS.get(col, ()):
                if frozenset((col, other)) in swapped:
                    continue
                swapped.add(frozenset((col, other)))
                if np.isfinite(base[other][r]):
                    cand_cell.append(k); cand_row.append(r); cand_what.append(f"{col} and {other} swapped?")
                    cand_col.append(col); cand_val.append(base[other][r]); cand_extra.append({other: float(value)})
            dup = _copied_from(ctx, col, r, value)
            if dup is not None and col in ctx.judged and ctx.judged[col][r]:
                cand_cell.append(k); cand_row.append(r); cand_what.append(f"value copied from {dup}? family trend gives")
                cand_col.append(col); cand_val.append(ctx.expected_value(col, r)); cand_extra.append({})
            if len(cols) > 1 and col in OWN_CURVE and np.isfinite(own[col][k]) and not np.isclose(own[col][k], value):
                from_points = col == "tb" and not ctx.vp_tb_from_curve[r]
                cand_cell.append(k); cand_row.append(r); cand_what.append(OWN_POINTS_TB if from_points else OWN_CURVE[col][0])
                cand_col.append(col); cand_val.append(float(own[col][k])); cand_extra.append({})
    cand_row_a = np.array(cand_row, dtype=int)
    v = {c: base[c][cand_row_a].copy() for c in NUMERIC}
    cand_col_a = np.array(cand_col, dtype=object)
    for c in NUMERIC:
        hit = cand_col_a == c
        v[c][hit] = np.array(cand_val, dtype=float)[hit]
    for i, extra in enumerate(cand_extra):
        for c, val in extra.items():
            v[c][i] = val
    z = evidence_z(ctx, cand_row_a, v)
    failing, total = _score(z)
    # among repairs that fit equally, unit slips (the commoner clerical error) beat
    # transposed digits, swaps and copies: a small prior penalty on the latter
    what = np.array(cand_what, dtype=object)
    total = total + np.array([PRIOR_PENALTY if w and not _is_unit(w) else 0.0 for w in what])
    cell = np.array(cand_cell)
    result: list[Diagnosis | None] = []
    for k in range(len(rows)):  # pick per suspect cell
        idx = np.flatnonzero(cell == k)
        stored, trials = idx[0], idx[1:]
        if len(trials) == 0:
            result.append(None)
            continue
        order = trials[np.lexsort((total[trials], failing[trials]))]
        best = order[0]
        if failing[best] >= failing[stored] or total[best] >= total[stored]:
            result.append(None)
            continue
        if cand_what[best] in _OWN_CURVE_WHAT:  # a slip landing on the curve's value says what went wrong: prefer it
            best = next((j for j in order if failing[j] == failing[best] and cand_what[j] not in _OWN_CURVE_WHAT
                         and _same_answer(z, cand_col, best, j)), best)
        rivals = [j for j in order if j != best and failing[j] == failing[best] and total[j] < 4 * total[best] + 0.1
                  and not np.isclose(v[cand_col[j]][j], v[cand_col[best]][best]) and not _same_answer(z, cand_col, best, j)]
        sure = failing[best] == 0 and not rivals
        before = {name: np.full(len(cand_row), arr[stored]) for name, arr in z.items()}
        result.append(Diagnosis(
            row=int(rows[k]), column=cand_col[best], what=cand_what[best], corrected=float(cand_val[best]),
            confidence="likely" if sure else "possibly", evidence=_names_passing(z, before, best),
            others=cand_extra[best]))
    return result


def _same_answer(z, cand_col, a: int, b: int) -> bool:
    """Two repairs of one column that both agree with the compound's own curve for it."""
    col = cand_col[a]
    if col != cand_col[b] or col not in OWN_CURVE:
        return False
    check = z[OWN_CURVE[col][1]]
    return bool(check[a] <= 1 and check[b] <= 1)


def _copied_from(ctx: Context, column: str, row: int, value: float) -> str | None:
    same = np.flatnonzero(ctx.values[column] == value)
    names = ctx.frame["name"].astype(object).to_numpy()
    others = [i for i in same if i != row and names[i] != names[row]]
    return str(ctx.frame["compound_id"].iloc[others[0]]) if others else None
