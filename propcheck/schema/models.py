"""One pandera model per canonical table: types and required values.

Ranges are not written here: their bounds live in the rule pack
(``value-out-of-range``) and are added by :func:`propcheck.schema.stage.build_schema`.
"""

from __future__ import annotations

import pandera.pandas as pa
from pandera.typing import Series

__all__ = ["BoilingPointsModel", "CompoundsModel", "VaporPressureModel", "VpEquationsModel"]


class CompoundsModel(pa.DataFrameModel):
    """The ``compounds`` table (README, 'Usage': tables, columns and canonical units)."""

    compound_id: Series[str] = pa.Field(nullable=False, unique=True, title="compound id", description="the database's own key; unique, non-empty")
    name: Series[str] = pa.Field(nullable=False, title="name", description="common name")
    cas: Series[str] = pa.Field(nullable=True, title="CAS Registry Number", description="NNNNNNN-NN-N with check digit")
    formula: Series[str] = pa.Field(nullable=True, title="formula", description="molecular formula, e.g. C6H14O")
    family: Series[str] = pa.Field(nullable=True, title="family", description="homologous series or class label")
    molar_mass: Series[float] = pa.Field(nullable=True, title="molar mass", description="g/mol")
    tc: Series[float] = pa.Field(nullable=True, title="critical temperature", description="K")
    pc: Series[float] = pa.Field(nullable=True, title="critical pressure", description="Pa")
    vc: Series[float] = pa.Field(nullable=True, title="critical molar volume", description="m3/mol")
    zc: Series[float] = pa.Field(nullable=True, title="critical compressibility factor", description="dimensionless")
    omega: Series[float] = pa.Field(nullable=True, title="acentric factor", description="Pitzer acentric factor, dimensionless")
    tb: Series[float] = pa.Field(nullable=True, title="normal boiling point", description="K, at 101.325 kPa")
    tm: Series[float] = pa.Field(nullable=True, title="melting point", description="K")
    source: Series[str] = pa.Field(nullable=True, title="source", description="where the row came from")

    class Config:
        strict = False  # other columns are carried along untouched
        coerce = False


class VaporPressureModel(pa.DataFrameModel):
    """The ``vapor_pressure`` table (README, 'Usage': tables, columns and canonical units)."""

    compound_id: Series[str] = pa.Field(nullable=False, title="compound id", description="must exist in compounds")
    t: Series[float] = pa.Field(nullable=False, title="temperature", description="K")
    p: Series[float] = pa.Field(nullable=False, title="vapor pressure", description="Pa, saturation pressure at t")
    source: Series[str] = pa.Field(nullable=True, title="source", description="where the point came from")
    uncertainty: Series[float] = pa.Field(nullable=True, title="uncertainty", description="stated standard uncertainty of p, Pa")

    class Config:
        strict = False
        coerce = False


class BoilingPointsModel(pa.DataFrameModel):
    """The optional ``boiling_points`` table: boiling temperatures at stated pressures."""

    compound_id: Series[str] = pa.Field(nullable=False, title="compound id", description="must exist in compounds")
    p: Series[float] = pa.Field(nullable=False, title="pressure", description="Pa")
    t: Series[float] = pa.Field(nullable=False, title="boiling temperature", description="K, at p")
    source: Series[str] = pa.Field(nullable=True, title="source", description="catalogue or handbook")

    class Config:
        strict = False
        coerce = False


class VpEquationsModel(pa.DataFrameModel):
    """The optional ``vp_equations`` table: stored vapor-pressure correlations (see the README)."""

    compound_id: Series[str] = pa.Field(nullable=False, title="compound id", description="must exist in compounds")
    form: Series[str] = pa.Field(nullable=False, title="form", description="published form of the equation")
    a: Series[float] = pa.Field(nullable=False, title="A", description="first coefficient")
    b: Series[float] = pa.Field(nullable=False, title="B", description="second coefficient")
    tmin: Series[float] = pa.Field(nullable=False, title="Tmin", description="lower end of the range, in t_unit")
    tmax: Series[float] = pa.Field(nullable=False, title="Tmax", description="upper end of the range, in t_unit")
    p_unit: Series[str] = pa.Field(nullable=False, title="unit of p", description="pint unit the coefficients give p in")
    t_unit: Series[str] = pa.Field(nullable=False, title="unit of T", description="K or degC")

    class Config:
        strict = False
        coerce = False
