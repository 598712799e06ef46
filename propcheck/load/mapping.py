"""The mapping file: source table and column names and the units of the data.

A TOML file, given with ``--config`` or found as ``propcheck.toml`` beside the
data::

    [compounds]
    table = "chem_master"            # source table (file stem); default "compounds"
    [compounds.columns]              # canonical name = source column name
    tc = "Tcrit"
    [compounds.units]                # canonical name = unit of the source values
    tc = "degC"
    pc = "bar"

    [csv]
    delimiter = ";"                  # default: detected
    decimal = ","                    # default: "," for ";"-separated files, else "."

Anything the file does not mention keeps its canonical name and unit.
"""

from __future__ import annotations

import tomllib
from dataclasses import dataclass, field
from pathlib import Path

from propcheck.canonical import TABLES
from propcheck.errors import UsageError
from propcheck.load.units import affine_to_canonical

__all__ = ["Conversion", "Mapping", "TableMapping", "read_mapping"]

MAPPING_FILENAME = "propcheck.toml"


@dataclass(frozen=True)
class Conversion:
    """canonical = scale * value + offset, from the declared ``unit``."""

    unit: str
    scale: float
    offset: float


@dataclass
class TableMapping:
    """How one canonical table is found in the source."""

    source_table: str
    columns: dict[str, str] = field(default_factory=dict)  # canonical -> source
    units: dict[str, Conversion] = field(default_factory=dict)  # canonical -> conversion

    def source_column(self, canonical: str) -> str:
        return self.columns.get(canonical, canonical)


@dataclass
class Mapping:
    """The whole mapping; defaults to canonical names and units."""

    path: str | None = None
    tables: dict[str, TableMapping] = field(default_factory=dict)
    csv_delimiter: str | None = None
    csv_decimal: str | None = None

    def table(self, canonical: str) -> TableMapping:
        return self.tables.get(canonical) or TableMapping(source_table=canonical)


def _expect_table(value, *, path: str, key: str) -> dict:
    if not isinstance(value, dict):
        raise UsageError("must be a TOML table", file=path, key=key)
    return value


def _expect_text(value, *, path: str, key: str) -> str:
    if not isinstance(value, str) or not value.strip():
        raise UsageError("must be a non-empty string", file=path, key=key)
    return value


def read_mapping(path: str | Path | None, data_dir: Path | None = None) -> Mapping:
    """Read and check a mapping file; without one, look for propcheck.toml in ``data_dir``."""
    if path is None:
        if data_dir is None or not (data_dir / MAPPING_FILENAME).is_file():
            return Mapping()
        path = data_dir / MAPPING_FILENAME
    path = Path(path)
    where = str(path)
    if not path.is_file():
        raise UsageError("mapping file not found", file=where, option="--config")
    try:
        doc = tomllib.loads(path.read_text(encoding="utf-8-sig"))
    except (tomllib.TOMLDecodeError, UnicodeDecodeError) as exc:
        raise UsageError(f"not valid TOML ({exc})", file=where) from None
    mapping = Mapping(path=where)
    for key, value in doc.items():
        if key == "csv":
            _read_csv_options(_expect_table(value, path=where, key="csv"), mapping, where)
        elif key in TABLES:
            mapping.tables[key] = _read_table(key, _expect_table(value, path=where, key=key), where)
        else:
            known = ", ".join(sorted(TABLES) + ["csv"])
            raise UsageError(f"unknown section (known: {known})", file=where, key=key)
    return mapping


def _read_csv_options(section: dict, mapping: Mapping, where: str) -> None:
    for key, value in section.items():
        if key == "delimiter":
            mapping.csv_delimiter = _expect_text(value, path=where, key="csv.delimiter")
        elif key == "decimal":
            if value not in (".", ","):
                raise UsageError('must be "." or ","', file=where, key="csv.decimal")
            mapping.csv_decimal = value
        else:
            raise UsageError("unknown key (known: delimiter, decimal)", file=where, key=f"csv.{key}")


def _read_table(name: str, section: dict, where: str) -> TableMapping:
    spec = TABLES[name]
    table = TableMapping(source_table=name)
    for key, value in section.items():
        dotted = f"{name}.{key}"
        if key == "table":
            table.source_table = _expect_text(value, path=where, key=dotted)
        elif key == "columns":
            for canonical, source in _expect_table(value, path=where, key=dotted).items():
                _known_column(spec, canonical, where, f"{dotted}.{canonical}")
                table.columns[canonical] = _expect_text(source, path=where, key=f"{dotted}.{canonical}")
        elif key == "units":
            for canonical, unit in _expect_table(value, path=where, key=dotted).items():
                column = _known_column(spec, canonical, where, f"{dotted}.{canonical}")
                if not column.numeric:
                    raise UsageError("a text column has no unit", file=where, table=name, column=canonical)
                unit = _expect_text(unit, path=where, key=f"{dotted}.{canonical}")
                try:
                    scale, offset = affine_to_canonical(unit, column.unit)
                except ValueError as exc:
                    raise UsageError(str(exc), file=where, table=name, column=canonical) from None
                table.units[canonical] = Conversion(unit, scale, offset)
        else:
            raise UsageError("unknown key (known: table, columns, units)", file=where, key=dotted)
    return table


def _known_column(spec, canonical: str, where: str, key: str):
    column = spec.column(canonical)
    if column is None:
        known = ", ".join(c.name for c in spec.columns)
        raise UsageError(f"not a canonical column of {spec.name} (known: {known})", file=where, key=key)
    return column
