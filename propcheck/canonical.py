"""The canonical tables and columns (README, 'Usage': tables, columns and canonical units)."""

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

VP_EQUATIONS = TableSpec(
    "vp_equations",
    required=False,
    columns=(
        Column("compound_id", "must exist in compounds", required=True),
        Column("form", "antoine | antoine_extended | wagner_25_5 | wagner_3_6 | clausius_clapeyron", required=True),
        _num("a", "first coefficient", "dimensionless", required=True),
        _num("b", "second coefficient", "dimensionless", required=True),
        _num("c", "third coefficient (Antoine C, Wagner c)", "dimensionless"),
        _num("d", "fourth coefficient (Wagner d)", "dimensionless"),
        _num("e", "extended Antoine E", "dimensionless"),
        _num("f", "extended Antoine F", "dimensionless"),
        _num("n", "extended Antoine exponent n", "dimensionless"),
        _num("t0", "extended Antoine t0, degC", "dimensionless"),
        _num("eq_tc", "Wagner: the tc the coefficients were fitted with, K", "dimensionless"),
        _num("eq_pc", "Wagner: the pc the coefficients were fitted with, in p_unit", "dimensionless"),
        _num("tmin", "lower end of the validity range, in t_unit", "dimensionless", required=True),
        _num("tmax", "upper end of the validity range, in t_unit", "dimensionless", required=True),
        Column("p_unit", "unit of p the coefficients give (pint: Pa, kPa, bar, mmHg, ...)", required=True),
        Column("t_unit", "unit of T the coefficients take (K or degC)", required=True),
        Column("log_base", "10 or e (Antoine and Clausius-Clapeyron forms)"),
        Column("source", "where the equation came from"),
    ),
)

TABLES: dict[str, TableSpec] = {t.name: t for t in (COMPOUNDS, VAPOR_PRESSURE, BOILING_POINTS, VP_EQUATIONS)}


def numeric_columns(table: str) -> list[str]:
    """Names of the numeric canonical columns of ``table``."""
    return [c.name for c in TABLES[table].columns if c.numeric]
