"""Reference values from the compilations carried by the ``chemicals`` library.

Each compilation is reported under its published name; predictions that
``chemicals`` also carries (Joback, Wilson-Jasperson, Fedors, omega from a
correlation) and web-aggregated tables (Wikidata, Open Notebook melting
points, CAS Common Chemistry) are left out: they are not independent,
critically evaluated data. CoolProp's equation-of-state values come from
:mod:`propcheck.reference.coolprop_ref`, not from the copy inside chemicals.

All tables are read once into one long frame keyed by CAS; a lookup is one
``merge``.
"""

from __future__ import annotations

from importlib import metadata

import numpy as np
import pandas as pd

from propcheck.reference.base import PROPERTIES, empty_constants, empty_vapor_pressure, format_cas

__all__ = ["ChemicalsReference", "SOURCES"]

# attribute path in chemicals -> (published name, {column: property}, {property: stated-uncertainty column})
SOURCES = {
    "critical.critical_data_IUPAC": (
        "IUPAC critical-data series (J. Chem. Eng. Data 1995-2015)",
        {"Tc": "tc", "Pc": "pc", "Vc": "vc", "Zc": "zc", "MW": "molar_mass"}, {}),
    "critical.critical_data_CRC": (
        "CRC Handbook 95th ed., critical constants of organic compounds",
        {"Tc": "tc", "Pc": "pc", "Vc": "vc", "Zc": "zc"}, {"tc": "Tc_error", "pc": "Pc_error", "vc": "Vc_error"}),
    "critical.critical_data_Matthews": (
        "Mathews 1972 (Chem. Rev. 72, 71), inorganic critical constants",
        {"Tc": "tc", "Pc": "pc", "Vc": "vc", "Zc": "zc", "MW": "molar_mass"}, {}),
    "critical.critical_data_PSRKR4": (
        "PSRK parameter table rev. 4 (Horstmann et al. 2005)",
        {"Tc": "tc", "Pc": "pc", "Vc": "vc", "Zc": "zc", "omega": "omega"}, {}),
    "critical.critical_data_PassutDanner": (
        "Passut & Danner 1973", {"Tc": "tc", "Pc": "pc", "omega": "omega"}, {}),
    "critical.critical_data_Yaws": (
        "Yaws 2014 handbook, critical constants",
        {"Tc": "tc", "Pc": "pc", "Vc": "vc", "Zc": "zc", "omega": "omega"}, {}),
    "miscdata.webbook_data": (
        "NIST Chemistry WebBook", {"Tc": "tc", "Pc": "pc", "Vc": "vc", "Tb": "tb", "Tm": "tm"}, {}),
    "miscdata.CRC_organic_data": (
        "CRC Handbook 95th ed., physical constants of organic compounds", {"Tb": "tb", "Tm": "tm"}, {}),
    "miscdata.CRC_inorganic_data": (
        "CRC Handbook 95th ed., physical constants of inorganic compounds", {"Tb": "tb", "Tm": "tm"}, {}),
    "phase_change.Tb_data_Yaws": ("Yaws 2014 handbook, boiling points", {"Tb": "tb"}, {}),
}

# vapor-pressure correlation tables: attribute -> published name
VP_SOURCES = {
    "Psat_data_WagnerMcGarry": "McGarry 1983 Wagner (3-6) coefficients",
    "Psat_data_WagnerPoling": "Poling et al. 2001 Wagner (2.5-5) coefficients",
    "Psat_data_AntoinePoling": "Poling et al. 2001 Antoine coefficients",
    "Psat_data_Perrys2_8": "Perry's Handbook 8th ed. DIPPR-101 coefficients",
}


def _table(path: str) -> pd.DataFrame:
    import importlib

    module, attr = path.split(".")
    return getattr(importlib.import_module(f"chemicals.{module}"), attr)


def _cas_index(frame: pd.DataFrame) -> pd.Series:
    index = frame.index.to_series()
    return format_cas(index) if pd.api.types.is_integer_dtype(index) else index.astype(str)


def _long_constants() -> pd.DataFrame:
    frames = []
    for path, (source, columns, errors) in SOURCES.items():
        data = _table(path)
        cas = _cas_index(data).to_numpy()
        for column, prop in columns.items():
            if column not in data.columns:
                continue
            values = pd.to_numeric(data[column], errors="coerce").to_numpy(dtype=float)
            if prop in errors:
                u = pd.to_numeric(data[errors[prop]], errors="coerce").to_numpy(dtype=float)
            else:
                u = np.full(len(values), np.nan)
            keep = np.isfinite(values) & (values > 0 if prop != "omega" else True)
            frames.append(pd.DataFrame({"cas": cas[keep], "property": prop, "source": source,
                                        "value": values[keep], "uncertainty": u[keep]}))
    long = pd.concat(frames, ignore_index=True)
    return long[long["property"].isin(PROPERTIES)].reset_index(drop=True)


class ChemicalsReference:
    """Critically evaluated compilations carried by chemicals, plus its identifier database."""

    has_identifiers = True

    def __init__(self, include_vapor_pressure: bool = True):
        import chemicals.identifiers as identifiers
        import chemicals.vapor_pressure as vp

        self.name = "chemicals compilations"
        self._long = _long_constants()
        self._db = identifiers.pubchem_db
        self._full = False
        self._index_identifiers()
        self._vp = {}
        if include_vapor_pressure:
            for attr, source in VP_SOURCES.items():
                table = getattr(vp, attr).copy()
                table.index = _cas_index(table).to_numpy()
                self._vp[source] = table

    def versions(self) -> dict[str, str]:
        return {"chemicals": metadata.version("chemicals")}

    def _index_identifiers(self) -> None:
        metas = list(self._db.CAS_index.values())
        self._ids = pd.DataFrame({
            "cas": [m.CASs for m in metas],
            "id_name": [m.common_name or m.iupac_name for m in metas],
            "id_formula": [m.formula for m in metas],
            "id_mw": [m.MW for m in metas],
        }).drop_duplicates("cas")
        self._isomers = self._ids.groupby("id_formula").size()
        self._by_cas = self._ids.set_index("cas")[["id_name", "id_formula"]]

    def _load_full(self, misses: bool) -> None:
        """Load the full identifier database (about 1 s) the first time a lookup misses."""
        if misses and not self._full:
            self._db.autoload_main_db()
            self._full = True
            self._index_identifiers()

    # -- identity -------------------------------------------------------------
    def cas_info(self, cas: pd.Series) -> pd.DataFrame:
        keys = cas.to_numpy(dtype=object)
        out = self._by_cas.reindex(keys)
        if not self._full and (pd.notna(keys) & out["id_name"].isna().to_numpy()).any():
            self._load_full(True)
            out = self._by_cas.reindex(keys)
        return pd.DataFrame({"name": out["id_name"].to_numpy(), "formula": out["id_formula"].to_numpy()},
                            index=cas.index)

    def cas_for_names(self, names: pd.Series) -> pd.Series:
        index = self._db.name_index
        keys = names.fillna("").astype(str).str.strip().str.lower().tolist()
        found = [index.get(k) if k else None for k in keys]  # dict lookup per name; no numerics
        if not self._full and any(m is None and k for m, k in zip(found, keys)):
            self._load_full(True)
            found = [self._db.name_index.get(k) if k else None for k in keys]
        return pd.Series([getattr(m, "CASs", None) for m in found], index=names.index, dtype=object)

    def search_names(self, names: pd.Series) -> pd.Series:
        from chemicals.identifiers import search_chemical

        def one(name):
            try:
                return search_chemical(name, autoload=True).CASs
            except ValueError:
                return None

        return names.map(one, na_action="ignore")

    def cas_for_formulas(self, formulas: pd.Series) -> pd.DataFrame:
        self._load_full(True)
        best = formulas.map(lambda f: getattr(self._db.formula_index.get(f), "CASs", None), na_action="ignore")
        count = formulas.map(self._isomers).fillna(0).astype(int)
        return pd.DataFrame({"cas": best, "candidates": count}, index=formulas.index)

    # -- values ---------------------------------------------------------------
    def constants(self, compounds: pd.DataFrame) -> pd.DataFrame:
        ids = compounds[["key", "cas"]].dropna()
        hit = ids.merge(self._long, on="cas")
        mw = ids.merge(self._ids[["cas", "id_mw"]].dropna(), on="cas")
        mw = pd.DataFrame({"key": mw["key"], "property": "molar_mass",
                           "source": "formula weight (chemicals identifier database)",
                           "value": mw["id_mw"].astype(float), "uncertainty": np.nan})
        hit = pd.concat([hit.drop(columns="cas"), mw], ignore_index=True)
        return hit if not hit.empty else empty_constants()

    def vapor_pressure_cas(self) -> set[str]:
        return set().union(*(set(table.index) for table in self._vp.values()))

    def vapor_pressure(self, points: pd.DataFrame) -> pd.DataFrame:
        frames = []
        base = points[["key", "cas", "t"]].dropna()
        for source, table in self._vp.items():
            hit = base.merge(table, left_on="cas", right_index=True)
            if hit.empty:
                continue
            p = _evaluate(source, hit)
            ok = np.isfinite(p) & (p > 0)
            frames.append(pd.DataFrame({"key": hit["key"].to_numpy()[ok],
                                        "t": hit["t"].to_numpy()[ok], "source": source,
                                        "value": p[ok], "uncertainty": np.nan}))
        return pd.concat(frames, ignore_index=True) if frames else empty_vapor_pressure()


def _evaluate(source: str, hit: pd.DataFrame) -> np.ndarray:
    """Saturation pressure [Pa] from one coefficient table, NaN outside its stated range."""
    with np.errstate(all="ignore"):  # outside a form's range it may overflow; masked below
        return _evaluate_raw(source, hit)


def _evaluate_raw(source: str, hit: pd.DataFrame) -> np.ndarray:
    from propcheck.physics.dippr import dippr101
    from propcheck.physics.vapor_pressure import antoine, wagner_3_6, wagner_25_5

    t = hit["t"].to_numpy(dtype=float)
    col = {c: hit[c].to_numpy(dtype=float) for c in hit.columns if c not in ("key", "cas", "Name", "Chemical")}
    if "McGarry" in source:
        p = wagner_3_6(t, col["Tc"], col["Pc"], col["A"], col["B"], col["C"], col["D"])
        inside = (t >= col["Tmin"]) & (t <= col["Tc"])
    elif "Wagner" in source:
        p = wagner_25_5(t, col["Tc"], col["Pc"], col["A"], col["B"], col["C"], col["D"])
        inside = (t >= col["Tmin"]) & (t <= col["Tmax"])
    elif "Antoine" in source:
        p = antoine(t, col["A"], col["B"], col["C"])
        inside = (t >= col["Tmin"]) & (t <= col["Tmax"])
    else:
        p = dippr101(t, col["C1"], col["C2"], col["C3"], col["C4"], col["C5"])
        inside = (t >= col["Tmin"]) & (t <= col["Tmax"])
    return np.where(inside, p, np.nan)
