"""A reference behind the same interface, fed from a small JSON file (for tests).

JSON layout::

    {"identifiers": [{"cas": "110-54-3", "name": "hexane", "formula": "C6H14",
                      "synonyms": ["n-hexane"]}, ...],
     "constants": [{"cas": "110-54-3", "property": "tc", "source": "...",
                    "value": 507.6, "uncertainty": null}, ...],
     "vapor_pressure": [{"cas": "110-54-3", "source": "...", "form": "antoine",
                         "coefficients": [9.00139, 1170.875, -48.833],
                         "tmin": 254.24, "tmax": 365.25}, ...]}

Forms: ``antoine`` (a, b, c: ``log10(p/Pa) = a - b/(T/K + c)``) and
``wagner_25_5`` (tc, pc, a, b, c, d), each valid on [tmin, tmax].
"""

from __future__ import annotations

import json
from pathlib import Path

import numpy as np
import pandas as pd

from propcheck.physics.vapor_pressure import antoine, wagner_25_5
from propcheck.reference.base import empty_constants, empty_vapor_pressure

__all__ = ["FakeReference"]


class FakeReference:
    """In-memory reference from a JSON fixture; same answers as the real adapters give."""

    has_identifiers = True

    def __init__(self, path: str | Path):
        doc = json.loads(Path(path).read_text(encoding="utf-8"))
        self.name = f"fake reference ({Path(path).name})"
        self._ids = pd.DataFrame(doc.get("identifiers", []), columns=["cas", "name", "formula", "synonyms"])
        names = self._ids.assign(synonyms=self._ids["synonyms"].map(lambda s: s if isinstance(s, list) else []))
        names = pd.concat([names[["cas", "name"]],
                           names[["cas", "synonyms"]].explode("synonyms").rename(columns={"synonyms": "name"})])
        names = names.dropna()
        self._names = dict(zip(names["name"].str.lower(), names["cas"]))
        self._constants = pd.DataFrame(doc.get("constants", []),
                                       columns=["cas", "property", "source", "value", "uncertainty"])
        self._constants["value"] = self._constants["value"].astype(float)
        self._constants["uncertainty"] = self._constants["uncertainty"].astype(float)
        self._vp = pd.DataFrame(doc.get("vapor_pressure", []),
                                columns=["cas", "source", "form", "coefficients", "tmin", "tmax"])

    def versions(self) -> dict[str, str]:
        return {"fake reference": self.name}

    def cas_info(self, cas: pd.Series) -> pd.DataFrame:
        out = pd.DataFrame({"cas": cas.to_numpy()}).merge(self._ids[["cas", "name", "formula"]], on="cas", how="left")
        return pd.DataFrame({"name": out["name"].to_numpy(), "formula": out["formula"].to_numpy()}, index=cas.index)

    def cas_for_names(self, names: pd.Series) -> pd.Series:
        return names.str.strip().str.lower().map(self._names)

    def search_names(self, names: pd.Series) -> pd.Series:
        return self.cas_for_names(names)

    def cas_for_formulas(self, formulas: pd.Series) -> pd.DataFrame:
        counts = self._ids.groupby("formula").size()
        first = self._ids.drop_duplicates("formula").set_index("formula")["cas"]
        return pd.DataFrame({"cas": formulas.map(first), "candidates": formulas.map(counts).fillna(0).astype(int)},
                            index=formulas.index)

    def constants(self, compounds: pd.DataFrame) -> pd.DataFrame:
        hit = compounds[["key", "cas"]].dropna().merge(self._constants, on="cas")
        return hit.drop(columns="cas").reset_index(drop=True) if not hit.empty else empty_constants()

    def vapor_pressure_cas(self) -> set[str]:
        return set(self._vp["cas"].dropna()) if "cas" in self._vp else set()

    def vapor_pressure(self, points: pd.DataFrame) -> pd.DataFrame:
        hit = points[["key", "cas", "t"]].dropna().merge(self._vp, on="cas")
        hit = hit[(hit["t"] >= hit["tmin"]) & (hit["t"] <= hit["tmax"])].reset_index(drop=True)
        if hit.empty:
            return empty_vapor_pressure()
        t = hit["t"].to_numpy(float)
        width = max(len(c) for c in hit["coefficients"])
        k = np.array([list(c) + [np.nan] * (width - len(c)) for c in hit["coefficients"]], dtype=float).T
        is_antoine = (hit["form"] == "antoine").to_numpy()
        with np.errstate(all="ignore"):
            p = np.where(is_antoine, antoine(t, k[0], k[1], k[2]), wagner_25_5(t, *k[:6]) if width >= 6 else np.nan)
        return pd.DataFrame({"key": hit["key"].to_numpy(), "t": t, "source": hit["source"].to_numpy(),
                             "value": p, "uncertainty": np.nan})
