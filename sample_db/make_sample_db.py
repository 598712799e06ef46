"""Build the propcheck demo database in ``sample_db/``.

Scenario: Larkspur Process Chemicals keeps a curated set of pure-compound
properties ("Larkspur curated 2026-10").  The vendor Brightwater Data Services
delivered further rows in delivery "BDS-2026-11", and that delivery contains
problems.  This script

1. collects clean, published values from the ``chemicals`` library
   (critical constants, acentric factor, normal boiling and melting points,
   molar mass) and generates vapor-pressure points from published
   correlations strictly inside their stated temperature range;
2. seeds the documented problems into the vendor's rows (separate step);
3. writes ``compounds.csv``, ``vapor_pressure.csv`` and
   ``seeded_problems.toml`` next to this file.

Deterministic: no randomness; rerunning gives byte-identical files.
Run:  python sample_db/make_sample_db.py
"""
from __future__ import annotations

import csv
import math
import sys
from pathlib import Path

import numpy as np
from scipy.optimize import brentq
from chemicals import acentric, critical, phase_change
from chemicals import vapor_pressure as vp
from chemicals.elements import molecular_weight, simple_formula_parser
from chemicals.iapws import Psat_IAPWS
from chemicals.identifiers import pubchem_db

HERE = Path(__file__).resolve().parent
R = 8.314462618  # J/(mol K)
LARKSPUR, VENDOR = "Larkspur curated 2026-10", "BDS-2026-11"

# family -> [(name, CAS Registry Number)]; compound_id LPC-0001... follows this order.
FAMILIES = {
    "n-alkane": [("methane", "74-82-8"), ("ethane", "74-84-0"), ("propane", "74-98-6"),
                 ("n-butane", "106-97-8"), ("n-pentane", "109-66-0"), ("n-hexane", "110-54-3"),
                 ("n-heptane", "142-82-5"), ("n-octane", "111-65-9"), ("n-nonane", "111-84-2"),
                 ("n-decane", "124-18-5")],
    "1-alkanol": [("methanol", "67-56-1"), ("ethanol", "64-17-5"), ("1-propanol", "71-23-8"),
                  ("1-butanol", "71-36-3"), ("1-pentanol", "71-41-0"),
                  ("1-hexanol", "111-27-3")],
    "aromatic": [("benzene", "71-43-2"), ("toluene", "108-88-3"), ("ethylbenzene", "100-41-4"),
                 ("o-xylene", "95-47-6"), ("m-xylene", "108-38-3"), ("p-xylene", "106-42-3"),
                 ("n-propylbenzene", "103-65-1"), ("cumene", "98-82-8")],
    "ketone": [("acetone", "67-64-1"), ("2-butanone", "78-93-3"), ("2-pentanone", "107-87-9"),
               ("3-pentanone", "96-22-0"), ("2-hexanone", "591-78-6"),
               ("4-methyl-2-pentanone", "108-10-1")],
    "acetate ester": [("methyl acetate", "79-20-9"), ("ethyl acetate", "141-78-6"),
                      ("propyl acetate", "109-60-4"), ("butyl acetate", "123-86-4"),
                      ("isobutyl acetate", "110-19-0")],
    "inorganic": [("water", "7732-18-5"), ("ammonia", "7664-41-7"),
                  ("carbon dioxide", "124-38-9"), ("nitrogen", "7727-37-9"),
                  ("hydrogen sulfide", "7783-06-4"), ("oxygen", "7782-44-7"),
                  ("argon", "7440-37-1")],
}
# Rows that arrived with the vendor delivery (all seeded problems live here).
VENDOR_ROWS = {"propane", "n-heptane", "n-nonane", "n-decane", "1-propanol", "1-butanol",
               "benzene", "toluene", "o-xylene", "m-xylene", "cumene", "2-pentanone",
               "2-hexanone", "methyl acetate", "ethyl acetate", "propyl acetate",
               "isobutyl acetate"}
ORPHAN = ("LPC-0099", "110-82-7")  # cyclohexane: vendor sent points, but no compound row

# Preferred compilation per property, first available wins.
CRIT_PREF = ("IUPAC", "HEOS", "CRC")
OMEGA_PREF = ("PSRK", "HEOS")
TB_PREF = ("CRC_ORG", "HEOS", "CRC_INORG")
TM_PREF = ("CRC_ORG", "CRC_INORG")
WATER = {"tc": 647.096, "pc": 22.064e6, "tb": 373.124}  # IAPWS values
CO2 = "124-38-9"  # sublimes at 1 atm: no normal boiling point; liquid from the triple point
CO2_TRIPLE = 216.6

VP_LABEL = {"WP": "Wagner (Poling 5th ed. set)", "WM": "Wagner (McGarry set)",
            "AP": "Antoine (Poling 5th ed. set)", "IF97": "IAPWS-IF97 saturation line"}
VP_UNC = {"WP": 0.005, "WM": 0.005, "AP": None, "IF97": 0.001}  # relative std. uncertainty
N_POINTS = {"WP": 8, "WM": 8, "AP": 7, "IF97": 8}
P_LOW = 1000.0  # Pa, lowest pressure tabulated
HI_FRAC = 0.93  # highest point at 0.93 tc (or the correlation Tmax if lower)


def fmt(x, sig=None):
    """Plain decimal text (no exponent); ``sig`` significant digits if given."""
    if x is None or (isinstance(x, float) and math.isnan(x)):
        return ""
    if sig is None:
        return np.format_float_positional(float(x), trim="-")
    return np.format_float_positional(float(x), precision=sig, unique=False,
                                      fractional=False, trim="-")


def pick(getter, methods_fn, cas, prefs):
    avail = methods_fn(cas)
    for m in prefs:
        if m in avail:
            return float(getter(cas, method=m)), m
    return None, None


def correlation(cas, tc):
    """Return (key, psat(T), Tlo, Thi) for the preferred published correlation."""
    if cas == "7732-18-5":
        return "IF97", Psat_IAPWS, 275.0, HI_FRAC * tc
    if cas in vp.Psat_data_WagnerPoling.index:
        r = vp.Psat_data_WagnerPoling.loc[cas]
        if not math.isnan(r.Tmin):
            f = lambda T, r=r: vp.Wagner(T, r.Tc, r.Pc, r.A, r.B, r.C, r.D)
            return "WP", f, float(r.Tmin), min(float(r.Tmax), HI_FRAC * tc)
    if cas in vp.Psat_data_WagnerMcGarry.index:
        r = vp.Psat_data_WagnerMcGarry.loc[cas]
        f = lambda T, r=r: vp.Wagner_original(T, r.Tc, r.Pc, r.A, r.B, r.C, r.D)
        lo = max(float(r.Tmin), CO2_TRIPLE) if cas == CO2 else float(r.Tmin)
        return "WM", f, lo, HI_FRAC * min(float(r.Tc), tc)
    r = vp.Psat_data_AntoinePoling.loc[cas]
    f = lambda T, r=r: vp.Antoine(T, r.A, r.B, r.C, base=10.0)
    return "AP", f, float(r.Tmin), min(float(r.Tmax), HI_FRAC * tc)


def vp_points(cid, cas, tc, source_prefix="", t_cap=None):
    key, f, lo, hi = correlation(cas, tc)
    if t_cap is not None:
        hi = min(hi, t_cap)
    if f(lo) < P_LOW:  # start where p reaches 1 kPa, not deep in the subcooled tail
        lo = brentq(lambda T: f(T) - P_LOW, lo, hi)
    n = N_POINTS[key]
    span = hi - lo
    # strictly inside the range, evenly spaced in 1/T (denser at low T, near tb)
    ts = 1.0 / np.linspace(1.0 / (lo + 0.02 * span), 1.0 / (hi - 0.02 * span), n)
    rows = []
    for t in ts:
        t = round(float(t), 2)
        p = float(fmt(f(t), 6))
        unc = fmt(VP_UNC[key] * p, 2) if VP_UNC[key] else ""
        rows.append({"compound_id": cid, "t": fmt(t), "p": fmt(p), "uncertainty": unc,
                     "source": source_prefix + VP_LABEL[key]})
    return rows, key


def build_clean():
    comps, points, prov = [], [], []
    rows = [(n, c, fam) for fam, members in FAMILIES.items() for n, c in members]
    for i, (name, cas, family) in enumerate(rows, start=1):
        vendor = name in VENDOR_ROWS
        cid = f"LPC-{i:04d}"
        formula = pubchem_db.search_CAS(cas).formula
        mm = molecular_weight(simple_formula_parser(formula))
        tc, m_tc = pick(critical.Tc, critical.Tc_methods, cas, CRIT_PREF)
        pc, m_pc = pick(critical.Pc, critical.Pc_methods, cas, CRIT_PREF)
        vc, m_vc = pick(critical.Vc, critical.Vc_methods, cas, CRIT_PREF)
        om, m_om = pick(acentric.omega, acentric.omega_methods, cas, OMEGA_PREF)
        tb, m_tb = pick(phase_change.Tb, phase_change.Tb_methods, cas, TB_PREF)
        tm, m_tm = pick(phase_change.Tm, phase_change.Tm_methods, cas, TM_PREF)
        if cas == "7732-18-5":
            tc, pc, tb = WATER["tc"], WATER["pc"], WATER["tb"]
            m_tc = m_pc = m_tb = "IAPWS"
        if cas == CO2:
            tb, m_tb = None, "(sublimes)"
        vc = float(fmt(vc, 4))
        zc = pc * vc / (R * tc)
        comps.append({"compound_id": cid, "name": name, "cas": cas, "formula": formula,
                      "family": family, "molar_mass": fmt(round(mm, 3)), "tc": fmt(tc),
                      "pc": fmt(pc), "vc": fmt(vc), "zc": fmt(round(zc, 4)),
                      "omega": fmt(round(om, 4)), "tb": fmt(tb), "tm": fmt(tm),
                      "source": VENDOR if vendor else LARKSPUR})
        prefix = VENDOR + "; " if vendor else ""
        cap = 520.0 if name == "benzene" else None  # stay below the (later) mangled tc
        rows, key = vp_points(cid, cas, tc, prefix, cap)
        points += rows
        prov.append((cid, name, m_tc, m_pc, m_vc, m_om, m_tb, m_tm, VP_LABEL[key]))
    return comps, points, prov


# --------------------------------------------------------------------------
# Seed problems: everything below only touches the vendor's (BDS-2026-11)
# rows and their vapor-pressure points.
# --------------------------------------------------------------------------
def cas_check_ok(cas):
    body, check = cas.replace("-", "")[:-1], cas[-1]
    return sum(int(d) * k for k, d in enumerate(reversed(body), 1)) % 10 == int(check)


def seed_problems(comps, points):
    probs = []
    by_name = {c["name"]: c for c in comps}

    def pts(cid):
        return [p for p in points if p["compound_id"] == cid]

    def add(slug, kind, table, cid, column, detect, true=None, seeded=None, t=None,
            note=None, severity=None):
        probs.append({"id": slug, "kind": kind, "table": table, "compound_id": cid,
                      "column": column, "t": t, "true_value": true, "seeded_value": seeded,
                      "detectable_by": detect, "note": note, "severity": severity})

    def change(name, column, new, slug, kind, detect, true_as=float, note=None, severity=None):
        c = by_name[name]
        true, c[column] = true_as(c[column]), new
        add(slug, kind, "compounds", c["compound_id"], column, detect, true, new, note=note,
            severity=severity)

    # 1 non-numeric cell in compounds: unit text inside the number
    change("n-nonane", "tc", by_name["n-nonane"]["tc"] + " K", "tc-unit-text",
           "non-numeric cell (unit text)", "schema")
    # 2 non-numeric cell in vapor_pressure
    cid = by_name["1-propanol"]["compound_id"]
    p = pts(cid)[3]
    true, p["p"] = float(p["p"]), p["p"] + " Pa"
    add("p-unit-text", "non-numeric cell (unit text)", "vapor_pressure", cid, "p",
        "schema", true, p["p"], float(p["t"]))
    # 3 duplicate compound_id: 2-hexanone delivered under 3-pentanone's id, no points
    c = by_name["2-hexanone"]
    own, c["compound_id"] = c["compound_id"], by_name["3-pentanone"]["compound_id"]
    points[:] = [p for p in points if p["compound_id"] != own]
    add("duplicate-id", "duplicate compound_id (different names)", "compounds",
        c["compound_id"], "compound_id", "schema", own, c["compound_id"],
        note="the 3-pentanone row (Larkspur) carries the same id legitimately")
    # 4 CAS with a wrong check digit (two body digits transposed: 108 -> 180)
    assert not cas_check_ok("180-88-3")
    change("toluene", "cas", "180-88-3", "cas-check-digit", "CAS check digit wrong",
           "schema", str)
    # 5 malformed CAS
    change("ethyl acetate", "cas", "141-78-6X", "cas-malformed", "malformed CAS",
           "schema", str)
    # 6 same CAS under two compound_ids (m-xylene given p-xylene's number)
    change("m-xylene", "cas", by_name["p-xylene"]["cas"], "cas-duplicate",
           "same CAS under two compound_ids", "schema", str,
           note="p-xylene (Larkspur) holds this CAS legitimately")
    # 7 orphan vapor-pressure rows (cyclohexane: no compound row was delivered)
    tc_orphan, _ = pick(critical.Tc, critical.Tc_methods, ORPHAN[1], CRIT_PREF)
    points += vp_points(ORPHAN[0], ORPHAN[1], tc_orphan, VENDOR + "; ")[0][::2]
    add("vp-orphan", "vapor-pressure rows for unknown compound_id", "vapor_pressure",
        ORPHAN[0], "compound_id", "schema", note="4 points of cyclohexane")
    # 8 one point entered in kPa instead of Pa
    cid = by_name["o-xylene"]["compound_id"]
    p = pts(cid)[4]
    true, p["p"] = float(p["p"]), fmt(float(p["p"]) / 1000.0, 6)
    p["uncertainty"] = fmt(float(p["uncertainty"]) / 1000.0, 2)
    add("vp-point-kpa", "one point in kPa (p falls with t)", "vapor_pressure", cid, "p",
        "physics", true, p["p"], float(p["t"]))
    # 9 a point beyond the critical temperature (ln p extrapolated linearly in 1/T)
    c = by_name["propane"]
    (t1, p1), (t2, p2) = [(float(x["t"]), float(x["p"])) for x in pts(c["compound_id"])[-2:]]
    t_bad = round(float(c["tc"]) + 15.0, 2)
    slope = math.log(p2 / p1) / (1 / t2 - 1 / t1)
    p_bad = float(fmt(p2 * math.exp(slope * (1 / t_bad - 1 / t2)), 6))
    points.append(dict(pts(c["compound_id"])[-1], t=fmt(t_bad), p=fmt(p_bad),
                       uncertainty=fmt(0.005 * p_bad, 2)))
    add("vp-above-tc", "vapor-pressure point above tc", "vapor_pressure",
        c["compound_id"], "t", "physics", None, fmt(t_bad), t_bad,
        note="no true value: no vapor pressure exists above tc; the row should go")
    # 10 tc entered in degC (tb >= tc)
    tc = float(by_name["1-butanol"]["tc"])
    change("1-butanol", "tc", fmt(round(tc - 273.15, 2)), "tc-in-celsius",
           "tc in degC instead of K", "physics",
           note="side effect: all vapor-pressure points of this compound lie above it")
    # 11 tb entered in degC (tb <= tm)
    tb = float(by_name["n-decane"]["tb"])
    change("n-decane", "tb", fmt(round(tb - 273.15, 2)), "tb-in-celsius",
           "tb in degC instead of K", "physics")
    # 12 value out of physical range
    change("2-pentanone", "pc", "-" + by_name["2-pentanone"]["pc"], "pc-negative",
           "negative critical pressure", "schema")
    # 13 missing required value
    change("isobutyl acetate", "name", "", "name-missing", "empty required name",
           "schema", str)
    # 14 empty compound_id (its points could not be delivered either)
    c = by_name["cumene"]
    own, c["compound_id"] = c["compound_id"], ""
    points[:] = [p for p in points if p["compound_id"] != own]
    add("id-missing", "empty compound_id", "compounds", "", "compound_id", "schema",
        own, "")

    # ---- problems for the compound-constant rules ("constants"), then deeper checks ("later") ----
    om = float(by_name["methyl acetate"]["omega"])
    change("methyl acetate", "omega", fmt(round(om / 10, 5)), "omega-tenfold",
           "acentric factor 10x too small", "constants")
    change("benzene", "tc", "526.05", "tc-transposed",
           "transposed digits in tc (562.05 -> 526.05)", "constants",
           note="its points stop at 520 K, so no point lies above the wrong tc")
    cid = by_name["n-heptane"]["compound_id"]
    for p in pts(cid):
        p["p"] = fmt(float(p["p"]) / 1000.0, 6)
        p["uncertainty"] = fmt(float(p["uncertainty"]) / 1000.0, 2)
    add("vp-series-kpa", "whole series in kPa (monotonic; misses tb)", "vapor_pressure",
        cid, "p", "vapor-pressure", note="every p of the compound is 1000x too low")
    assert cas_check_ok("108-21-4")
    change("propyl acetate", "cas", "108-21-4", "cas-other-compound",
           "valid CAS of another compound (isopropyl acetate)", "constants", str,
           severity="warning")  # an identity mismatch is a warning (cas-names-other-compound)
    return probs


def toml_value(v):
    if isinstance(v, str):
        return '"' + v.replace("\\", "\\\\").replace('"', '\\"') + '"'
    return repr(float(v))


def write_all(comps, points, probs):
    cols_c = ["compound_id", "name", "cas", "formula", "family", "molar_mass", "tc", "pc",
              "vc", "zc", "omega", "tb", "tm", "source"]
    cols_p = ["compound_id", "t", "p", "source", "uncertainty"]
    order = {c: i for i, c in enumerate(sorted({p["compound_id"] for p in points}))}
    points.sort(key=lambda p: (order[p["compound_id"]], float(p["t"])))
    for fname, cols, rows in (("compounds.csv", cols_c, comps),
                              ("vapor_pressure.csv", cols_p, points)):
        with open(HERE / fname, "w", newline="", encoding="utf-8") as fh:
            w = csv.DictWriter(fh, fieldnames=cols, lineterminator="\n")
            w.writeheader()
            w.writerows(rows)
    lines = ["# Problems seeded into delivery BDS-2026-11 by make_sample_db.py.",
             "# detectable_by: schema | physics | constants (compound-constant rules) | vapor-pressure (curve rules) | later.",
             "# severity: the least severity the finding must have (default error)."]
    for pr in probs:
        lines.append("\n[[problem]]")
        for k, v in pr.items():
            if v is not None:
                lines.append(f"{k} = {toml_value(v)}")
    (HERE / "seeded_problems.toml").write_text("\n".join(lines) + "\n", encoding="utf-8")


def main():
    comps, points, prov = build_clean()
    probs = seed_problems(comps, points)
    write_all(comps, points, probs)
    print(f"{len(comps)} compound rows, {len(points)} vapor-pressure points, "
          f"{len(probs)} seeded problems")
    if "--provenance" in sys.argv:  # markdown table of the compilation used per value
        print("| id | name | tc | pc | vc | omega | tb | tm | vapor pressure |")
        print("|---|---|---|---|---|---|---|---|---|")
        for row in prov:
            print("| " + " | ".join(str(x) for x in row) + " |")


if __name__ == "__main__":
    main()
