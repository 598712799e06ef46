"""A vapor-pressure point disagrees with the consensus of reference sources.

What it checks
    Every vapor-pressure point of an identified compound against the
    saturation pressure at the point's temperature from CoolProp's reference
    equation of state (between the triple point and the EOS's own critical
    temperature) and from the compiled correlations carried by chemicals
    (McGarry 1983 and Poling et al. 2001 Wagner sets, Poling et al. 2001
    Antoine set, Perry's DIPPR 101 set), each only inside its stated
    temperature range.

Why it matters
    A point far from what a reference equation of state and the compiled
    correlations agree on is a unit slip, a point of another compound, or a
    mistyped value; it would bias every correlation fitted to it.

Method
    In ln p: consensus of the sources as in const-off-reference (median,
    sources standing apart named and left out, spread counted in the
    tolerance); ``z = |ln p - c| / sqrt(u_db^2 + u_c^2)`` with relative
    standard uncertainties (uncertainty propagation per GUM). Warning above ``warn_z``;
    error above ``error_z`` when at least ``min_sources_for_error`` sources
    each disagree beyond it and none supports the point (within ``warn_z``),
    and the compound's name does not point to another compound than its CAS.
    When every compared point of a compound (at least 3) is off by one
    factor (ln-ratio range below 0.2), a single finding covers the series,
    with the unit slip the factor matches.

Parameters
    warn_z
        z above which a warning is raised.
    error_z
        z above which an error is raised (with enough disagreeing sources).
    min_sources_for_error
        independent sources that must each disagree for an error.
    outlier_z
        distance from the median, in the source's own u, beyond which a source stands apart.
    default_relative_uncertainty
        relative u of a database point that states none.
    eos_relative_uncertainty
        relative u of a reference EOS saturation pressure.
    correlation_relative_uncertainty
        relative u of a compiled correlation inside its range.
    exclude_sources
        source names (or parts of them) to leave out.

Example finding
    ``p = 101.325 Pa at 341.87 K is off the reference consensus 1.0133e+05
    Pa (z = 345; 3 of 3 sources disagree)`` with suggestion ``kPa entered as Pa?``

References
    1. I. H. Bell et al., Ind. Eng. Chem. Res. 53, 2498 (2014) (CoolProp).
    2. J. McGarry, Ind. Eng. Chem. Process Des. Dev. 22, 313 (1983).
    3. B. E. Poling, J. M. Prausnitz, J. P. O'Connell, The Properties of
       Gases and Liquids, 5th ed., McGraw-Hill (2001), ch. 7 and App. A.
    4. JCGM 100:2008 (GUM), combined standard uncertainty.
"""

from __future__ import annotations

import numpy as np

from propcheck.findings import Finding
from propcheck.physics.unit_slips import pressure_slip
from propcheck.reference import session
from propcheck.reference.consensus import consensus, z_score
from propcheck.rules.base import RuleInfo
from propcheck.rules.const_off_reference import excluded

RULE = RuleInfo(
    id="vp-off-reference",
    title="Vapor-pressure point off the reference EOS and compiled correlations",
    severity="error",
    stage="consistency",
    method="consensus in ln p of CoolProp reference EOS and compiled correlations; z-score",
    reference="CoolProp reference EOS; McGarry 1983; Poling et al. 2001; GUM",
    params={
        "warn_z": "z above which a warning is raised",
        "error_z": "z above which an error is raised",
        "min_sources_for_error": "independent sources that must each disagree for an error",
        "outlier_z": "distance from the median, in the source's own u, beyond which a source stands apart",
        "default_relative_uncertainty": "relative u of a database point that states none",
        "eos_relative_uncertainty": "relative u of a reference EOS saturation pressure",
        "correlation_relative_uncertainty": "relative u of a compiled correlation inside its range",
        "exclude_sources": "source names (or parts) to leave out",
    },
)


def check(db, params) -> list[Finding]:
    if not db.has("vapor_pressure"):
        return []
    points, ref = session.vapor_pressure(db)
    if ref.empty:
        return []
    ref = ref[~excluded(ref["source"], params["exclude_sources"])].copy()
    if ref.empty:
        return []
    eos = ref["source"].str.startswith("CoolProp").to_numpy()
    ref["value"] = np.log(ref["value"].to_numpy(dtype=float))
    ref["uncertainty"] = np.where(eos, params["eos_relative_uncertainty"], params["correlation_relative_uncertainty"])
    summary, apart = consensus(ref, ["key"], params["outlier_z"])
    ref["apart"] = apart.to_numpy()
    pts = points[points["p"] > 0].rename(columns={"_row": "key"})
    pts = pts.assign(ln_p=np.log(pts["p"].to_numpy(dtype=float)))
    rel = (pts["uncertainty"].astype(float) / pts["p"]).where(pts["uncertainty"].astype(float) > 0)
    pts["u_db"] = rel.fillna(params["default_relative_uncertainty"]).to_numpy(dtype=float)
    both = pts.merge(summary, on="key")
    if both.empty:
        return []
    both["z"] = z_score(both["ln_p"] - both["consensus"], both["u_db"], both["u_consensus"])
    per = ref.merge(both[["key", "ln_p", "u_db"]], on="key")
    z_i = z_score(per["ln_p"] - per["value"], per["u_db"], per["uncertainty"])
    per["disagrees"] = ~per["apart"] & (z_i > params["error_z"])
    per["supports"] = z_i <= params["warn_z"]
    count = per.groupby("key").agg(n_disagree=("disagrees", "sum"), n_support=("supports", "sum"))
    both = both.merge(count.reset_index(), on="key")
    flagged = both[both["z"] > params["warn_z"]].reset_index(drop=True)
    if flagged.empty:
        return []
    expected = np.exp(flagged["consensus"].to_numpy(dtype=float))
    conflict = flagged["name_conflict"].astype(object).fillna(False).astype(bool).to_numpy()
    error = ((flagged["z"] > params["error_z"]) & (flagged["n_disagree"] >= params["min_sources_for_error"])
             & (flagged["n_support"] == 0) & ~conflict)
    slip = pressure_slip(flagged["p"].to_numpy(dtype=float), expected)[0]
    groups = {k: g for k, g in per[per["key"].isin(flagged["key"])].groupby("key")}
    findings = []
    for i, rec in enumerate(flagged.itertuples(index=False)):
        src = groups[rec.key]
        listing = "; ".join(f"{s} {np.exp(v):.5g}" + (" (stands apart)" if a else "")
                            for s, v, a in zip(src["source"], src["value"], src["apart"]))
        spread = ""
        if src["apart"].any():
            spread = "; sources disagree among themselves: " + ", ".join(src.loc[src["apart"], "source"]) + " stands apart"
        if rec.n_support:
            spread += "; supported by " + ", ".join(src.loc[src["supports"], "source"]) + ", so not an error"
        if conflict[i]:
            spread += "; the name points to another compound (identity-mismatch), so the CAS may be wrong instead"
        findings.append(Finding(
            rule=RULE.id, severity="error" if error.iloc[i] else "warning", table="vapor_pressure",
            compound_id=rec.compound_id, column="p", t=float(rec.t), observed=float(rec.p), expected=float(expected[i]),
            tolerance=float(params["warn_z"] * np.hypot(rec.u_db, rec.u_consensus) * expected[i]),
            suggestion=slip[i] or None, reference="consensus of: " + ", ".join(src["source"]),
            message=(f"p = {rec.p:.6g} Pa at {rec.t:.6g} K is off the reference consensus {expected[i]:.5g} Pa "
                     f"(z = {rec.z:.3g}; {int(rec.n_disagree)} of {int(rec.n_sources)} sources disagree beyond "
                     f"z {params['error_z']:g}; {rec.note}){spread}. Sources: {listing}"),
            row=int(rec.key), source=rec.source))
    compared = both.groupby("compound_id").size()
    return _collapse_series(findings, compared)


def _collapse_series(findings: list[Finding], compared) -> list[Finding]:
    """One finding for a compound whose every compared point is off by the same factor (a whole-series slip)."""
    by_compound: dict[str, list[Finding]] = {}
    for f in findings:
        by_compound.setdefault(f.compound_id, []).append(f)
    out = []
    for cid, group in by_compound.items():
        ratios = np.log([f.observed / f.expected for f in group])
        whole = len(group) >= 3 and len(group) == compared.get(cid, 0) and np.ptp(ratios) < 0.2
        if not whole:
            out.extend(group)
            continue
        factor = float(np.exp(np.median(ratios)))
        slip = pressure_slip([factor], [1.0])[0][0]
        first = group[0]
        out.append(Finding(
            rule=RULE.id, severity=max((f.severity for f in group), key=["info", "warning", "error"].index),
            table="vapor_pressure", compound_id=cid, column="p", observed=factor, expected=1.0,
            tolerance=first.tolerance and first.tolerance / first.expected, suggestion=slip or None,
            reference=first.reference,
            message=(f"all {len(group)} points compared lie at {factor:.4g}x the reference consensus "
                     f"(one factor for the whole series)"),
            row=None, source=first.source))
    return out
