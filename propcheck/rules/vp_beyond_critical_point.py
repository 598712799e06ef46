"""A vapor-pressure point lies beyond the compound's critical point.

What it checks
    Every point has t <= tc + ``t_margin`` and p <= pc x (1 + ``p_relative_margin``).

Why it matters
    The liquid-vapor saturation curve ends at the critical point: above tc
    there is no vapor pressure. A point beyond it is either a wrong point
    (a temperature in the wrong scale, a supercritical measurement filed as
    saturation data) or a wrong tc or pc. When at least ``blame_tc_share``
    of a compound's points (default: half) lie above tc, tc itself is blamed in one finding instead of flagging
    every point.

Method
    The critical point terminates the vapor-pressure curve (Poling et al.,
    ch. 7). Comparison in canonical units; the margins allow for the
    uncertainty of tc and pc. When tc is blamed, a temperature-scale slip
    (degC, degF or degR stored as K) that would put tc above every point
    is named in ``suggestion``.

Parameters
    t_margin
        Kelvin by which a point may exceed tc (uncertainty of tc).
    p_relative_margin
        Relative amount by which a point may exceed pc (uncertainty of pc).
    blame_tc_share
        Share of a compound's points above tc from which tc is blamed instead of the points.

Example finding
    ``point at 523.15 K lies above tc = 507.6 K: the vapor-pressure curve ends at the critical point``

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids,
       5th ed., McGraw-Hill (2001), ch. 7.
"""

from __future__ import annotations

import numpy as np

from propcheck.findings import Finding
from propcheck.physics.unit_slips import TEMPERATURE_SLIPS
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="vp-beyond-critical-point",
    title="Vapor-pressure point beyond the critical point",
    severity="error",
    stage="consistency",
    method="the saturation curve ends at (tc, pc)",
    reference="Poling et al. 2001, ch. 7",
    params={
        "t_margin": "K by which a point may exceed tc",
        "p_relative_margin": "relative amount by which a point may exceed pc",
        "blame_tc_share": "share of points above tc from which tc itself is blamed",
    },
)

_SQL = """
WITH beyond AS (
    SELECT v.compound_id, v._row AS v_row, v.t, v.p, v.source, c.tc, c.pc, c._row AS c_row, c.source AS c_source,
           coalesce(v.t > c.tc + ?, false) AS above_tc,
           coalesce(v.p > c.pc * (1 + ?), false) AS above_pc
    FROM vapor_pressure v JOIN compounds c USING (compound_id)
    WHERE v.t > c.tc + ? OR v.p > c.pc * (1 + ?)
), series AS (  -- only for compounds with a point beyond the critical point
    SELECT compound_id, count(*) AS n_points, max(t) AS t_max
    FROM vapor_pressure WHERE compound_id IN (SELECT compound_id FROM beyond) GROUP BY compound_id
)
SELECT b.*, s.n_points, s.t_max,
       count(*) FILTER (WHERE b.above_tc) OVER (PARTITION BY b.compound_id) AS n_above
FROM beyond b JOIN series s USING (compound_id)
ORDER BY b.compound_id, b.t
"""


def _tc_slip(tc: float, t_max: float) -> tuple[str | None, float | None]:
    """A temperature-scale slip of tc that would put it above every point: (suggestion, corrected tc)."""
    for what, convert in TEMPERATURE_SLIPS:
        fixed = float(convert(np.float64(tc)))
        if fixed > t_max and 0.3 < t_max / fixed:
            return f"{what}? corrected tc {fixed:.6g} K would lie above every point", fixed
    return None, None


def check(db, params) -> list[Finding]:
    if not db.has("vapor_pressure"):
        return []
    margin, p_margin = params["t_margin"], params["p_relative_margin"]
    rows = db.df(_SQL, [margin, p_margin, margin, p_margin])
    findings: list[Finding] = []
    blamed_tc: set[str] = set()
    for rec in rows.itertuples(index=False):
        many = rec.n_points >= 2 and rec.n_above >= params["blame_tc_share"] * rec.n_points
        if rec.above_tc is True and many:
            if rec.compound_id in blamed_tc:
                continue
            blamed_tc.add(rec.compound_id)
            suggestion, corrected = _tc_slip(rec.tc, rec.t_max)
            findings.append(
                Finding(
                    rule=RULE.id, severity=RULE.severity, table="compounds", compound_id=rec.compound_id,
                    column="tc", observed=float(rec.tc), expected=f"> {rec.t_max:.6g}", tolerance=margin,
                    row=int(rec.c_row), source=rec.c_source, suggestion=suggestion, corrected=corrected,
                    reference="highest vapor-pressure point of the compound",
                    message=(f"{rec.n_above} of {rec.n_points} vapor-pressure points lie above tc = {rec.tc:.6g} K "
                             f"(up to {rec.t_max:.6g} K): tc is likely wrong"),
                )
            )
            continue
        if rec.above_tc is True:
            findings.append(
                Finding(
                    rule=RULE.id, severity=RULE.severity, table="vapor_pressure", compound_id=rec.compound_id,
                    column="t", t=float(rec.t), observed=float(rec.t), expected=f"<= {rec.tc:.6g}", tolerance=margin,
                    row=int(rec.v_row), source=rec.source, reference="critical temperature of the compound",
                    message=f"point at {rec.t:.6g} K lies above tc = {rec.tc:.6g} K: the vapor-pressure curve ends at the critical point",
                )
            )
        elif rec.above_pc is True:
            findings.append(
                Finding(
                    rule=RULE.id, severity=RULE.severity, table="vapor_pressure", compound_id=rec.compound_id,
                    column="p", t=float(rec.t), observed=float(rec.p), expected=f"<= {rec.pc:.6g}", tolerance=p_margin,
                    row=int(rec.v_row), source=rec.source, reference="critical pressure of the compound",
                    message=f"p = {rec.p:.6g} Pa at {rec.t:.6g} K exceeds pc = {rec.pc:.6g} Pa: the vapor-pressure curve ends at the critical point",
                )
            )
    return findings
