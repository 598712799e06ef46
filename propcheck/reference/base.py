"""The reference interface: long tables of independent values per compound.

Every adapter answers for a *batch* of compounds at once and returns a long
table, one row per (compound, property, source), so that rules join and
aggregate in one pass instead of looking compounds up one by one.
"""

from __future__ import annotations

from typing import Protocol, runtime_checkable

import pandas as pd

__all__ = [
    "CONSTANT_COLUMNS",
    "PROPERTIES",
    "VP_COLUMNS",
    "CombinedReference",
    "Reference",
    "empty_constants",
    "empty_vapor_pressure",
    "format_cas",
]

# Properties a reference may carry, named like the canonical compounds columns.
PROPERTIES = ("tc", "pc", "vc", "zc", "omega", "tb", "tm", "molar_mass")
CONSTANT_COLUMNS = ("key", "property", "source", "value", "uncertainty")
VP_COLUMNS = ("key", "t", "source", "value", "uncertainty")


def empty_constants() -> pd.DataFrame:
    return pd.DataFrame({c: pd.Series(dtype=float if c in ("value", "uncertainty") else object)
                         for c in CONSTANT_COLUMNS})


def empty_vapor_pressure() -> pd.DataFrame:
    return pd.DataFrame({c: pd.Series(dtype=object if c in ("key", "source") else float)
                         for c in VP_COLUMNS})


def format_cas(numbers: pd.Series) -> pd.Series:
    """Integer CAS numbers (7732185) as text (``7732-18-5``), vectorised."""
    s = numbers.astype("int64").astype(str)
    return s.str[:-3] + "-" + s.str[-3:-1] + "-" + s.str[-1]


@runtime_checkable
class Reference(Protocol):
    """What a reference adapter provides (all methods batched).

    ``uncertainty`` is the source's stated standard uncertainty in canonical
    units, NaN when it states none (the rule pack then supplies a default).
    """

    name: str

    def versions(self) -> dict[str, str]:
        """Library or data versions behind the values, for the report."""

    def cas_info(self, cas: pd.Series) -> pd.DataFrame:
        """For each CAS: ``name`` and ``formula`` known to the identifier database (None if unknown)."""

    def cas_for_names(self, names: pd.Series) -> pd.Series:
        """For each name: the CAS the identifier database gives it (None if unknown)."""

    def search_names(self, names: pd.Series) -> pd.Series:
        """Like :meth:`cas_for_names` but thorough (synonyms, formulas, SMILES); slower, for few rows."""

    def cas_for_formulas(self, formulas: pd.Series) -> pd.DataFrame:
        """For each formula: ``cas`` of the best-known compound and ``candidates``, how many share it."""

    def constants(self, compounds: pd.DataFrame) -> pd.DataFrame:
        """``compounds`` has ``key, cas``; return :data:`CONSTANT_COLUMNS` rows.

        ``key`` is the caller's compound key, carried through unchanged
        (propcheck passes the source row, so duplicate ids stay apart).
        """

    def vapor_pressure(self, points: pd.DataFrame) -> pd.DataFrame:
        """``points`` has ``key, cas, t`` [K]; return :data:`VP_COLUMNS` rows, value in Pa."""

    def vapor_pressure_cas(self) -> set[str]:
        """The CAS numbers :meth:`vapor_pressure` can answer for (in some range of t)."""


class CombinedReference:
    """Several adapters behind one interface: identity from the first, values from all."""

    def __init__(self, parts: list):
        self.parts = list(parts)
        self.name = " + ".join(p.name for p in self.parts)

    def versions(self) -> dict[str, str]:
        out: dict[str, str] = {}
        for part in self.parts:
            out.update(part.versions())
        return out

    def _identity(self):
        return next(p for p in self.parts if getattr(p, "has_identifiers", False))

    def cas_info(self, cas):
        return self._identity().cas_info(cas)

    def cas_for_names(self, names):
        return self._identity().cas_for_names(names)

    def search_names(self, names):
        return self._identity().search_names(names)

    def cas_for_formulas(self, formulas):
        return self._identity().cas_for_formulas(formulas)

    def constants(self, compounds):
        frames = [p.constants(compounds) for p in self.parts]
        frames = [f for f in frames if not f.empty]
        return pd.concat(frames, ignore_index=True) if frames else empty_constants()

    def vapor_pressure_cas(self):
        return set().union(*(p.vapor_pressure_cas() for p in self.parts))

    def vapor_pressure(self, points):
        frames = [p.vapor_pressure(points) for p in self.parts]
        frames = [f for f in frames if not f.empty]
        return pd.concat(frames, ignore_index=True) if frames else empty_vapor_pressure()
