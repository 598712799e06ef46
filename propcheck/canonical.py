"""The canonical tables and columns of the data contract (section 1)."""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["TABLES", "Column", "TableSpec", "numeric_columns"]


@dataclass(frozen=True)
class Column:
    """One canonical column: its meaning, canonical unit and whether it is required."""

    name: str
    title: str
    unit: str | None = None  # pint unit string; None for text columns
    required: bool = False
    numeric: bool = False


@dataclass(frozen=True)
class TableSpec:
    """One canonical table."""

    name: str
    required: bool
    columns: tuple[Column, ...]

    def column(self, name: str) -> Column | None:
        """Return the column called ``name`` or None."""
        return next((c for c in self.columns if c.name == name), None)

    @property
    def required_columns(self) -> list[str]:
        return [c.name for c in self.columns if c.required]


def _num(name: str, title: str, unit: str, required: bool = False) -> Column:
    return Column(name, title, unit, required=required, numeric=True)


COMPOUNDS = TableSpec(
    "compounds",
    required=True,
    columns=(
        Column("compound_id", "the database's own key; unique, non-empty", required=True),
        Column("name", "common name", required=True),
        Column("cas", "CAS Registry Number, NNNNNNN-NN-N"),
        Column("formula", "molecular formula"),
        Column("family", "homologous series or class label"),
        _num("molar_mass", "molar mass", "g/mol"),
        _num("tc", "critical temperature", "K"),
        _num("pc", "critical pressure", "Pa"),
        _num("vc", "critical molar volume", "m**3/mol"),
        _num("zc", "critical compressibility factor", "dimensionless"),
        _num("omega", "Pitzer acentric factor", "dimensionless"),
        _num("tb", "normal boiling point (at 101.325 kPa)", "K"),
        _num("tm", "melting point", "K"),
        Column("source", "where the row came from"),
    ),
)

VAPOR_PRESSURE = TableSpec(
    "vapor_pressure",
    required=False,
    columns=(
        Column("compound_id", "must exist in compounds", required=True),
        _num("t", "temperature", "K", required=True),
        _num("p", "saturation (vapor) pressure at t", "Pa", required=True),
        Column("source", "where the point came from"),
        _num("uncertainty", "stated standard uncertainty of p", "Pa"),
    ),
)

BOILING_POINTS = TableSpec(
    "boiling_points",
    required=False,
    columns=(
        Column("compound_id", "must exist in compounds", required=True),
        _num("p", "pressure at which the compound boils", "Pa", required=True),
        _num("t", "boiling temperature at p", "K", required=True),
        Column("source", "where the entry came from (catalogue, handbook)"),
    ),
)

TABLES: dict[str, TableSpec] = {t.name: t for t in (COMPOUNDS, VAPOR_PRESSURE, BOILING_POINTS)}


def numeric_columns(table: str) -> list[str]:
    """Names of the numeric canonical columns of ``table``."""
    return [c.name for c in TABLES[table].columns if c.numeric]
