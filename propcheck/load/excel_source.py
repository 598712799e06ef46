"""Read the sheets of an Excel workbook (``*.xlsx``): one sheet per table.

Read with python-calamine (a Rust reader; the workbook is only read). In each
sheet the header is the first row with two or more filled cells; rows above
it (a title, blank rows) are skipped, and data rows are numbered from 1 below
the header, as in a CSV file. Fully blank rows are skipped.

Refused with a one-line error, because a guess would shift columns silently:

- merged cells in or below the header row (a merged title above it is fine);
- a header over more than one row (e.g. a units row ``K | bar`` under
  ``Tc | Pc``): put the header on one row and declare units in the mapping;
- a header cell that is empty or a number while its column holds data, and
  two columns with the same header.

A column is passed to DuckDB as numbers when every filled cell is a number,
otherwise as text (numbers written with ``repr``, which round-trips a double
exactly), so that ``canonicalize`` reports every non-numeric cell. Dates,
times and booleans in a column mapped to a numeric canonical column are an
error.
"""

from __future__ import annotations

import datetime as dt
from pathlib import Path

import duckdb
import pyarrow as pa

from propcheck.errors import UsageError
from propcheck.load.arrow_input import numeric_targets, register_arrow, wanted_tables, wrong_type
from propcheck.load.mapping import Mapping
from propcheck.load.sources import RawTable

__all__ = ["excel_tables"]


def _col_letter(index: int) -> str:
    letters = ""
    index += 1
    while index:
        index, rem = divmod(index - 1, 26)
        letters = chr(65 + rem) + letters
    return letters


def _filled(value) -> bool:
    return not (value is None or (isinstance(value, str) and not value.strip()))


def _is_number(value) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def _as_text(value):
    if not _filled(value):
        return None
    if isinstance(value, bool):
        return "TRUE" if value else "FALSE"
    if isinstance(value, float):
        return str(int(value)) if value.is_integer() and abs(value) < 1e15 else repr(value)
    if isinstance(value, (dt.date, dt.time, dt.datetime, dt.timedelta)):
        return value.isoformat() if hasattr(value, "isoformat") else str(value)
    return str(value).strip()


def _header_row(rows: list[list]) -> int | None:
    for i, row in enumerate(rows):
        if sum(_filled(v) for v in row) >= 2:
            return i
    return None


def _check_second_header(rows, head: int, sheet: str, where: str, offset: int) -> None:
    """A row right below the header that is all text over columns that hold numbers further down."""
    if head + 2 >= len(rows):
        return
    below = rows[head + 1]
    cells = [j for j, v in enumerate(below) if _filled(v)]
    if not cells or any(_is_number(below[j]) for j in cells):
        return
    numeric_below = [
        j for j in cells
        if any(_is_number(r[j]) for r in rows[head + 2: head + 12] if j < len(r))
    ]
    if numeric_below:
        j = numeric_below[0]
        raise UsageError(
            f"the header spans more than one row (row {head + offset + 2} holds {below[j]!r} above numbers in column "
            f"{_col_letter(j)}); keep one header row and declare units in the mapping file",
            file=where, table=sheet,
        )


def _read_sheet(book, sheet: str, where: str, targets: dict[str, str]) -> pa.Table:
    data = book.get_sheet_by_name(sheet)
    rows = data.to_python(skip_empty_area=False)
    head = _header_row(rows)
    if head is None:
        raise UsageError("no header row found (a row with two or more filled cells)", file=where, table=sheet)
    for (r0, c0), (r1, c1) in data.merged_cell_ranges or []:
        if r1 >= head:
            span = f"{_col_letter(c0)}{r0 + 1}:{_col_letter(c1)}{r1 + 1}"
            place = "the header" if r0 <= head else "the data"
            raise UsageError(f"merged cells {span} in {place}; unmerge them so that each value has its own cell",
                             file=where, table=sheet)
    _check_second_header(rows, head, sheet, where, 0)
    header = rows[head]
    body = [r for r in rows[head + 1:] if any(_filled(v) for v in r)]
    columns: dict[str, pa.Array] = {}
    for j, title in enumerate(header):
        values = [r[j] if j < len(r) else None for r in body]
        if not _filled(title):
            if any(_filled(v) for v in values):
                raise UsageError(f"column {_col_letter(j)} holds data but has no header (row {head + 1})",
                                 file=where, table=sheet)
            continue
        if _is_number(title):
            raise UsageError(
                f"header cell {_col_letter(j)}{head + 1} is a number ({title!r}); is the header row missing?",
                file=where, table=sheet,
            )
        name = str(title).strip()
        if name.lower() in {c.lower() for c in columns}:
            raise UsageError(f"two columns are headed {name!r}", file=where, table=sheet)
        filled = [v for v in values if _filled(v)]
        canonical = targets.get(name.lower())
        if canonical is not None:
            odd = next((v for v in filled if isinstance(v, (bool, dt.date, dt.time, dt.datetime, dt.timedelta))), None)
            if odd is not None:
                raise wrong_type(where, sheet, name, canonical, type(odd).__name__)
        if filled and all(_is_number(v) for v in filled):
            columns[name] = pa.array([float(v) if _filled(v) else None for v in values], type=pa.float64())
        else:
            columns[name] = pa.array([_as_text(v) for v in values], type=pa.string())
    return pa.table(columns)


def excel_tables(
    con: duckdb.DuckDBPyConnection, path: Path, mapping: Mapping, wanted: set[str] | None = None
) -> dict[str, RawTable]:
    """Return the workbook's sheets as tables (sheet name, lower case); read those in ``wanted``."""
    from python_calamine import CalamineWorkbook

    where = str(path)
    try:
        book = CalamineWorkbook.from_path(where)
    except Exception as exc:
        first = str(exc).strip().splitlines()[0] if str(exc).strip() else type(exc).__name__
        raise UsageError(f"cannot open as an Excel workbook ({first})", file=where) from None
    wanted = wanted_tables(mapping) if wanted is None else wanted
    tables: dict[str, RawTable] = {}
    for sheet in book.sheet_names:
        key = sheet.strip().lower()
        if key in tables:
            raise UsageError(f"two sheets hold table {key!r}; keep one", file=where)
        origin = f"{path}:{sheet}"
        if key not in wanted:
            tables[key] = RawTable(key, "(SELECT 1)", origin)
            continue
        table = _read_sheet(book, sheet, where, numeric_targets(mapping, key))
        tables[key] = RawTable(key, register_arrow(con, f"xlsx_{key}", table), origin, keep=table)
    return tables
