"""Turn a source table into a canonical table, in SQL.

Renames mapped columns, parses numeric text (decimal comma included),
converts declared units to canonical SI units, and reports every numeric cell
that does not parse as a ``cell-not-numeric`` finding instead of turning it
into a missing value. Columns the contract does not know are carried along.
"""

from __future__ import annotations

from pathlib import Path

import duckdb

from propcheck.canonical import TableSpec
from propcheck.database import Database, TableInfo
from propcheck.errors import UsageError
from propcheck.findings import Finding
from propcheck.load.mapping import Conversion, Mapping
from propcheck.load.sources import RawTable

__all__ = ["canonicalize"]

NUMERIC_TYPES = ("DOUBLE", "FLOAT", "INTEGER", "BIGINT", "SMALLINT", "TINYINT", "HUGEINT", "DECIMAL", "UBIGINT", "UINTEGER", "REAL")


def _q(name: str) -> str:
    return '"' + name.replace('"', '""') + '"'


def _text(expr: str) -> str:
    return f"NULLIF(trim(CAST({expr} AS VARCHAR)), '')"


def _parsed(expr: str, typed: bool, decimal: str) -> str:
    """The cell as DOUBLE, NULL where it does not parse (DuckDB's cast ignores surrounding blanks)."""
    if typed:
        return f"CAST({expr} AS DOUBLE)"
    text = f"CAST({expr} AS VARCHAR)"
    if decimal == ",":
        # "1.013,25" -> "1013.25"; "101,3" -> "101.3"; "101.3" stays.
        text = f"CASE WHEN contains({text}, ',') THEN replace(replace({text}, '.', ''), ',', '.') ELSE {text} END"
    return f"TRY_CAST({text} AS DOUBLE)"


def _bad(expr: str, typed: bool, decimal: str) -> str:
    """True for a cell that holds something but not a finite number; blank cells are missing, not bad."""
    parsed = _parsed(expr, typed, decimal)
    if typed:
        return f"({expr} IS NOT NULL AND NOT isfinite({parsed}))"
    return f"({expr} IS NOT NULL AND coalesce(NOT isfinite({parsed}), trim(CAST({expr} AS VARCHAR)) <> ''))"


def _value(expr: str, typed: bool, decimal: str, conv) -> str:
    """The canonical number: the parsed cell in SI units, NULL unless finite."""
    parsed = _parsed(expr, typed, decimal)
    value = f"({parsed}) * {conv.scale!r} + {conv.offset!r}" if conv else parsed
    return f"CASE WHEN isfinite({parsed}) THEN {value} END"


def canonicalize(db: Database, spec: TableSpec, raw: RawTable, mapping: Mapping) -> None:
    """Create canonical table ``spec.name`` in ``db.con`` from ``raw``."""
    con = db.con
    table_map = mapping.table(spec.name)
    raw_name = f"raw_{spec.name}"
    try:
        # files are read through a view (no copy: read once, for the table);
        # a driver's Arrow stream can be read only once, so it is copied
        raw_kind = "VIEW" if raw.keep is None else "TABLE"
        _number_rows(con, raw_kind, raw_name, raw)
        described = con.execute(f"DESCRIBE {raw_name}").fetchall()
    except duckdb.Error as exc:
        reason = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
        raise UsageError(f"cannot read ({reason})", file=raw.origin, table=spec.name) from None
    types = {row[0]: row[1] for row in described if row[0] != "_row"}
    by_lower = {name.strip().lower(): name for name in types}

    chosen: dict[str, str] = {}
    for column in spec.columns:
        wanted = table_map.source_column(column.name)
        actual = by_lower.get(wanted.strip().lower())
        if actual is None:
            if column.name in table_map.columns:
                raise UsageError(
                    f"mapped column {wanted!r} for {column.name} not found (mapping {mapping.path})",
                    file=raw.origin, table=spec.name, column=column.name,
                )
            if column.required:
                found = ", ".join(types) or "none"
                raise UsageError(
                    f"required column missing (found: {found})", file=raw.origin, table=spec.name, column=column.name
                )
            continue
        chosen[column.name] = actual

    info = TableInfo(spec.name, raw.origin)
    select = ["_row"]
    for column in spec.columns:
        src = chosen.get(column.name)
        if src is None:
            kind = "DOUBLE" if column.numeric else "VARCHAR"
            select.append(f"CAST(NULL AS {kind}) AS {column.name}")
        elif column.numeric:
            typed = types[src].upper().startswith(NUMERIC_TYPES)
            conv = _conversion(table_map.units, column.name)
            select.append(f"{_value(_q(src), typed, raw.csv_decimal, conv)} AS {column.name}")
            # the text of a cell that is not a number, kept until it is reported (NULL almost everywhere)
            select.append(f"CASE WHEN {_bad(_q(src), typed, raw.csv_decimal)} THEN CAST({_q(src)} AS VARCHAR) END "
                          f"AS {_bad_mark(column.name)}")
        else:
            select.append(f"{_text(_q(src))} AS {column.name}")
    used = set(chosen.values())
    canonical_names = {c.name for c in spec.columns} | {"_row"}
    for src in types:
        if src not in used and src.strip().lower() not in canonical_names:
            select.append(_q(src))
            info.extra_columns.append(src)
    try:
        con.execute(f"CREATE TABLE {spec.name} AS SELECT {', '.join(select)} FROM {raw_name}")
    except duckdb.Error as exc:
        reason = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
        raise UsageError(f"cannot read ({reason})", file=raw.origin, table=spec.name) from None
    info.rows_read = con.execute(f"SELECT count(*) FROM {spec.name}").fetchone()[0]
    if info.rows_read == 0 and spec.required:
        raise UsageError("table has no rows", file=raw.origin, table=spec.name)
    _report_bad_cells(db, spec, raw, chosen, info)
    con.execute(f"DROP {raw_kind} {raw_name}")
    db.tables[spec.name] = info


def _number_rows(con, raw_kind: str, raw_name: str, raw: RawTable) -> None:
    """Create ``raw_name``: the source's rows with their 1-based row number ``_row``.

    The reader's own row number where it has one (Parquet: ``file_row_number``,
    read in parallel; ten million rows load in about half the time of a
    numbering window), else ``row_number() OVER ()`` in the order read.
    """
    if raw.numbered is not None:
        try:
            con.execute(f"CREATE TEMP {raw_kind} {raw_name} AS "
                        f"SELECT file_row_number + 1 AS _row, * EXCLUDE (file_row_number) FROM {raw.numbered}")
            return
        except duckdb.BinderException:  # the file has a column of that name
            pass
    con.execute(f"CREATE TEMP {raw_kind} {raw_name} AS SELECT row_number() OVER () AS _row, * FROM {raw.relation}")


def _conversion(units: dict[str, Conversion], column: str) -> Conversion | None:
    if column in units:
        return units[column]
    if column == "uncertainty" and "p" in units:  # an uncertainty is stated in the unit of p
        return Conversion(units["p"].unit, units["p"].scale, 0.0)
    return None


def _unit_hint(text: str) -> str | None:
    """Suggest the mapping file when a number carries a unit (``'507.6 K'``)."""
    head, _, tail = text.strip().partition(" ")
    try:
        float(head.replace(",", "."))
    except ValueError:
        return None
    return f"a number with a unit ({tail.strip()!r}): store the number alone and declare the unit in the mapping file" if tail.strip() else None


def _bad_mark(column: str) -> str:
    return _q(f"_propcheck_not_a_number_{column}")


def _report_bad_cells(db, spec, raw, chosen, info) -> None:
    """Every numeric cell that did not parse becomes a finding; its marks leave the table.

    The canonical table was created with, per numeric column, the text of
    each cell that is not a number (NULL elsewhere), so the source is read
    only once.
    """
    label = Path(raw.origin).name if db.kind == "folder" else raw.origin
    numeric = [c for c in spec.columns if c.numeric and c.name in chosen]
    if not numeric:
        return
    marks = [_bad_mark(c.name) for c in numeric]
    # findings on a point carry its temperature
    t_expr = "t" if spec.name in ("vapor_pressure", "boiling_points") else "NULL"
    rows = db.con.execute(
        f"SELECT _row, compound_id, source, {t_expr}, {', '.join(marks)}, {', '.join(m + ' IS NOT NULL' for m in marks)} "
        f"FROM {spec.name} WHERE {' OR '.join(m + ' IS NOT NULL' for m in marks)} ORDER BY _row"
    ).fetchall()
    for mark in marks:
        db.con.execute(f"ALTER TABLE {spec.name} DROP COLUMN {mark}")
    k = len(numeric)
    for record in rows:
        row, compound_id, source, t = record[:4]
        for column, text, is_bad in zip(numeric, record[4:4 + k], record[4 + k:]):
            if not is_bad:
                continue
            info.cells_rejected += 1
            db.rejected_cells.add((spec.name, row, column.name))
            db.load_findings.append(
                Finding(
                    rule="cell-not-numeric",
                    severity="error",
                    table=spec.name,
                    compound_id=compound_id,
                    column=column.name,
                    observed=text,
                    t=t if column.name != "t" else None,
                    row=row,
                    source=source,
                    suggestion=_unit_hint(text),
                    message=f"{label} row {row}, column {column.name}: {text!r} is not a number",
                )
            )
