"""Reference values from CoolProp's reference equations of state.

Critical constants are the EOS's published reducing values (``T_reducing``,
``p_reducing``, ``rhomolar_reducing``), not CoolProp's own computed critical
point, which can differ (n-heptane: 541.23 K computed vs 540.13 K reducing).
Tb is solved from the EOS at 101 325 Pa only where the triple-point
pressure lies below 1 atm (carbon dioxide has no normal boiling point);
the triple-point temperature stands in for the melting point (within 0.3 K
of the 1-atm melting point for the common fluids tested, computed).
Saturation pressures are computed between the triple point and the EOS's
critical temperature.
"""

from __future__ import annotations

from importlib import metadata

import numpy as np
import pandas as pd

from propcheck.reference.base import empty_constants, empty_vapor_pressure

__all__ = ["CoolPropReference"]

R = 8.314462618  # J/(mol K), exact (SI 2019)
P_ATM = 101325.0  # Pa


def _fluid_table() -> pd.DataFrame:
    from CoolProp.CoolProp import PropsSI, get_fluid_param_string, get_global_param_string

    rows = []
    for fluid in get_global_param_string("FluidsList").split(","):  # ~140 fluids, once per run
        try:
            cas = get_fluid_param_string(fluid, "CAS")
            if get_fluid_param_string(fluid, "pure") != "true":
                continue
            row = {"fluid": fluid, "cas": cas}
            for key in ("T_reducing", "p_reducing", "rhomolar_reducing", "Tcrit", "Ttriple", "ptriple",
                        "acentric", "molar_mass"):
                row[key] = PropsSI(key, fluid)
            row["tb"] = PropsSI("T", "P", P_ATM, "Q", 0, fluid) if row["ptriple"] < P_ATM else np.nan
            row["ref"] = get_fluid_param_string(fluid, "BibTeX-EOS")
        except (ValueError, RuntimeError):
            continue
        rows.append(row)
    table = pd.DataFrame(rows)
    table = table[table["cas"].str.fullmatch(r"\d{2,7}-\d{2}-\d")]
    return table.drop_duplicates("cas").reset_index(drop=True)


class CoolPropReference:
    """Reference equations of state in CoolProp (pure fluids only)."""

    has_identifiers = False

    def __init__(self):
        self.name = "CoolProp"
        self._fluids = _fluid_table()
        f = self._fluids
        props = {
            "tc": f["T_reducing"], "pc": f["p_reducing"], "vc": 1.0 / f["rhomolar_reducing"],
            "zc": f["p_reducing"] / (f["rhomolar_reducing"] * R * f["T_reducing"]),
            "omega": f["acentric"], "tb": f["tb"], "tm": f["Ttriple"], "molar_mass": 1000.0 * f["molar_mass"],
        }
        self._long = pd.concat(
            [pd.DataFrame({"cas": f["cas"], "property": k, "value": v.astype(float),
                           "source": "CoolProp EOS (" + f["ref"] + ")" if k != "tm"
                           else "CoolProp EOS triple point (" + f["ref"] + ")"})
             for k, v in props.items()], ignore_index=True)
        self._long["uncertainty"] = np.nan
        self._long = self._long[np.isfinite(self._long["value"])]

    def versions(self) -> dict[str, str]:
        return {"CoolProp": metadata.version("CoolProp")}

    def constants(self, compounds: pd.DataFrame) -> pd.DataFrame:
        hit = compounds[["key", "cas"]].dropna().merge(self._long, on="cas")
        return hit.drop(columns="cas").reset_index(drop=True) if not hit.empty else empty_constants()

    def vapor_pressure_cas(self) -> set[str]:
        return set(self._fluids["cas"].dropna())

    def vapor_pressure(self, points: pd.DataFrame) -> pd.DataFrame:
        from CoolProp.CoolProp import PropsSI

        hit = points[["key", "cas", "t"]].dropna().merge(self._fluids, on="cas")
        hit = hit[(hit["t"] >= hit["Ttriple"]) & (hit["t"] < hit["Tcrit"])]
        if hit.empty:
            return empty_vapor_pressure()
        frames = []
        for fluid, group in hit.groupby("fluid", sort=False):  # one vectorised call per fluid
            t = group["t"].to_numpy(dtype=float)
            try:
                p = np.asarray(PropsSI("P", "T", t, "Q", 0, fluid), dtype=float)
            except (ValueError, RuntimeError):
                continue
            frames.append(pd.DataFrame({"key": group["key"].to_numpy(), "t": t,
                                        "source": f"CoolProp EOS ({group['ref'].iloc[0]})",
                                        "value": p, "uncertainty": np.nan}))
        out = pd.concat(frames, ignore_index=True) if frames else empty_vapor_pressure()
        return out[np.isfinite(out["value"]) & (out["value"] > 0)].reset_index(drop=True)
