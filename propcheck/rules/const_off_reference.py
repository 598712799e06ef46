"""A constant disagrees with the consensus of independent reference sources.

What it checks
    tc, pc, vc, zc, omega, tb, tm and molar_mass of every compound that can
    be identified (by CAS, else name, else formula; see identity-mismatch)
    against every independent source available: the critically evaluated
    compilations carried by chemicals (IUPAC critical-data series, CRC
    Handbook tables, Mathews 1972, PSRK table rev. 4, Passut & Danner 1973,
    Yaws, NIST WebBook) and CoolProp's reference equations of state
    (published reducing values, not CoolProp's computed critical point).

Why it matters
    A constant that differs from what several independent compilations say
    is usually a typing or unit slip, a value of another compound, or a
    value on another convention (1 bar instead of 1 atm boiling point).
    Compilations carry errors of their own, so none of them is taken as
    truth alone.

Method
    Consensus of independent sources (``propcheck.reference.consensus``):
    a source more than ``outlier_z`` of its own uncertainty from the
    median of at least three is named as standing apart and left out; the
    consensus is the median of the rest, its uncertainty the median stated
    uncertainty combined with their spread. ``z = |d| / sqrt(u_db^2 + u_c^2)``
    (GUM combined standard uncertainty, JCGM 100:2008). Sources state
    their uncertainty (CRC Handbook) or get the pack default, as does the
    database value. Warning when ``z > warn_z``; error when ``z > error_z``
    and at least ``min_sources_for_error`` kept sources each disagree with
    the database value beyond ``error_z`` and no source supports it (within
    ``warn_z``); otherwise a warning, naming any supporting source. When the
    name points to another compound than the CAS, a warning at most (the
    CAS may be what is wrong).

Parameters
    warn_z
        z above which a warning is raised.
    error_z
        z above which an error is raised (with enough disagreeing sources).
    min_sources_for_error
        independent sources that must each disagree for an error.
    outlier_z
        distance from the median, in the source's own u, beyond which a source stands apart.
    default_uncertainty
        per property [absolute, relative] standard uncertainty used when none is stated.
    exclude_sources
        source names (or parts of them) to leave out, e.g. the compilation the database was built from.

Example finding
    n-Hexane's tc 507.6 K (IUPAC) entered in degC: ``tc = 234.45 K is off
    the reference consensus 507.6 K (z = 109; 7 of 7 sources disagree
    beyond z 5; identified by CAS 110-54-3). Sources: IUPAC critical-data
    series (J. Chem. Eng. Data 1995-2015) 507.6; ...`` with suggestion
    ``degC entered as K?``

References
    1. IUPAC critical-data series, J. Chem. Eng. Data 40-61 (1995-2015), Parts 1-12.
    2. W. M. Haynes (ed.), CRC Handbook of Chemistry and Physics, 95th ed. (2014).
    3. JCGM 100:2008 (GUM), combined standard uncertainty.
    4. I. H. Bell et al., Ind. Eng. Chem. Res. 53, 2498 (2014) (CoolProp).
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.findings import Finding
from propcheck.physics.unit_slips import pressure_slip, temperature_slip
from propcheck.reference import session
from propcheck.reference.base import PROPERTIES
from propcheck.reference.consensus import consensus, z_score
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="const-off-reference",
    title="Constant off the consensus of independent reference sources",
    severity="error",
    stage="consistency",
    method="median of independent compilations and reference EOS; z = |d|/sqrt(u1^2+u2^2)",
    reference="IUPAC critical-data series; CRC Handbook 95th ed.; CoolProp reference EOS; GUM",
    params={
        "warn_z": "z above which a warning is raised",
        "error_z": "z above which an error is raised",
        "min_sources_for_error": "independent sources that must each disagree for an error",
        "outlier_z": "distance from the median, in the source's own u, beyond which a source stands apart",
        "default_uncertainty": "per property [absolute, relative] standard uncertainty when none is stated",
        "exclude_sources": "source names (or parts) to leave out",
    },
)

UNITS = {"tc": "K", "tb": "K", "tm": "K", "pc": "Pa", "vc": "m3/mol", "zc": "", "omega": "", "molar_mass": "g/mol"}


def default_u(prop: pd.Series, value: pd.Series, table: dict) -> np.ndarray:
    """Standard uncertainty from the pack's [absolute, relative] pair per property."""
    codes, names = pd.factorize(prop)
    a = np.array([table.get(n, [np.nan, np.nan])[0] for n in names] + [np.nan], dtype=float)[codes]
    r = np.array([table.get(n, [np.nan, np.nan])[1] for n in names] + [np.nan], dtype=float)[codes]
    return a + r * np.abs(value.to_numpy(dtype=float))


def excluded(source: pd.Series, names: list[str]) -> np.ndarray:
    out = np.zeros(len(source), dtype=bool)
    for name in names:
        out |= source.str.contains(name, case=False, regex=False).to_numpy()
    return out


def check(db, params) -> list[Finding]:
    ident = session.identity(db)
    ref = session.constants(db)
    if ref.empty:
        return []
    ref = ref[~excluded(ref["source"], params["exclude_sources"])].copy()
    cols = [c[0] for c in db.con.execute("DESCRIBE compounds").fetchall()]
    props = [p for p in PROPERTIES if p in cols]
    if not props or ref.empty:
        return []
    stored = db.df(f"SELECT _row AS key, {', '.join(props)} FROM compounds").melt(
        id_vars="key", var_name="property", value_name="db_value").dropna()
    table = params["default_uncertainty"]
    ref["stated"] = ref["uncertainty"] > 0
    ref["uncertainty"] = ref["uncertainty"].where(ref["uncertainty"] > 0, default_u(ref["property"], ref["value"], table))
    summary, apart = consensus(ref, ["key", "property"], params["outlier_z"])
    ref["apart"] = apart.to_numpy()
    both = stored.merge(summary, on=["key", "property"])
    if both.empty:
        return []
    both["u_db"] = default_u(both["property"], both["db_value"], table)
    both["z"] = z_score(both["db_value"] - both["consensus"], both["u_db"], both["u_consensus"])
    # how many kept sources, each on its own, disagree beyond error_z
    per = ref.merge(both[["key", "property", "db_value", "u_db"]], on=["key", "property"])
    per["z_i"] = z_score(per["db_value"] - per["value"], per["u_db"], per["uncertainty"])
    per["disagrees"] = ~per["apart"] & (per["z_i"] > params["error_z"])
    per["supports"] = per["z_i"] <= params["warn_z"]
    count = per.groupby(["key", "property"]).agg(n_disagree=("disagrees", "sum"), n_support=("supports", "sum"))
    both = both.merge(count.reset_index(), on=["key", "property"], how="left")
    flagged = both[both["z"] > params["warn_z"]].copy()
    if flagged.empty:
        return []
    flagged["severity"] = np.where(
        (flagged["z"] > params["error_z"]) & (flagged["n_disagree"] >= params["min_sources_for_error"])
        & (flagged["n_support"] == 0), "error", "warning")
    flagged = flagged.merge(ident[["row", "compound_id", "source", "note", "name_conflict"]], left_on="key", right_on="row")
    # the name points to another compound than the CAS: the CAS may be what is wrong, not the value
    flagged["severity"] = np.where(flagged["name_conflict"], "warning", flagged["severity"])
    slips = _slips(flagged)
    wanted = per.merge(flagged[["key", "property"]], on=["key", "property"])
    text = _listing(wanted)
    findings = []
    for i, rec in enumerate(flagged.itertuples(index=False)):
        listing, names, apart_names, support_names = text[(rec.key, rec.property)]
        unit = UNITS[rec.property]
        spread = ""
        if apart_names:
            spread = "; sources disagree among themselves: " + apart_names + " stands apart"
        elif rec.n_kept > 1 and rec.spread > rec.u_median:
            spread = f"; sources disagree among themselves (spread {rec.spread:.3g} {unit}, counted in the tolerance)"
        if rec.n_support:
            spread += "; supported by " + support_names + ", so not an error"
        if rec.name_conflict:
            spread += "; the name points to another compound (identity-mismatch), so the CAS may be wrong instead"
        message = (f"{rec.property} = {rec.db_value:.6g} {unit} is off the reference consensus "
                   f"{rec.consensus:.6g} {unit} (z = {rec.z:.3g}; {int(rec.n_disagree)} of {int(rec.n_sources)} "
                   f"sources disagree beyond z {params['error_z']:g}; {rec.note}){spread}. Sources: {listing}")
        findings.append(Finding(
            rule=RULE.id, severity=rec.severity, table="compounds", compound_id=rec.compound_id,
            column=rec.property, observed=float(rec.db_value), expected=float(rec.consensus),
            tolerance=float(params["warn_z"] * np.hypot(rec.u_db, rec.u_consensus)),
            suggestion=slips[i] or None, reference="consensus of: " + names,
            message=message, row=int(rec.key), source=rec.source))
    return findings


def _listing(per: pd.DataFrame) -> dict:
    """Per (key, property): the source listing, all names, names standing apart, names supporting.

    A plain loop over the sources of flagged findings only (a handful each).
    """
    parts: dict = {}
    for key, prop, source, value, u, stated, apart, supports in zip(
            per["key"], per["property"], per["source"], per["value"].to_numpy(float),
            per["uncertainty"].to_numpy(float), per["stated"], per["apart"], per["supports"]):
        entry = parts.setdefault((key, prop), ([], [], [], []))
        entry[0].append(f"{source} {value:.6g}" + (f" ± {u:.2g}" if stated else "") + (" (stands apart)" if apart else ""))
        entry[1].append(source)
        if apart:
            entry[2].append(source)
        if supports:
            entry[3].append(source)
    return {k: ("; ".join(a), ", ".join(b), ", ".join(c), ", ".join(d)) for k, (a, b, c, d) in parts.items()}


def _slips(flagged: pd.DataFrame) -> list[str]:
    text = np.full(len(flagged), "", dtype=object)
    obs, exp = flagged["db_value"].to_numpy(dtype=float), flagged["consensus"].to_numpy(dtype=float)
    is_p = (flagged["property"] == "pc").to_numpy()
    is_t = flagged["property"].isin(["tc", "tb", "tm"]).to_numpy()
    if is_p.any():
        text[is_p] = pressure_slip(obs[is_p], exp[is_p])[0]
    if is_t.any():
        text[is_t] = temperature_slip(obs[is_t], exp[is_t])[0]
    return list(text)
