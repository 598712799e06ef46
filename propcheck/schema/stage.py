"""Validate the canonical tables with pandera and turn failures into findings.

Validation is lazy, so one run reports every failure. Rows that cannot be
checked (no id, duplicate id, no usable ``t`` or ``p``, unknown compound) are
removed from the working tables; out-of-range cells are set to missing so
that later rules do not compute with them. Both are counted per table.
"""

from __future__ import annotations

from pathlib import Path

import pandas as pd
import pandera.pandas as pa

from propcheck.database import Database
from propcheck.findings import Finding
from propcheck.identifiers import cas_check_digit, cas_check_digit_ok, cas_format_ok, lookup_chemical
from propcheck.rules.pack import Pack
from propcheck.schema.models import BoilingPointsModel, CompoundsModel, VaporPressureModel, VpEquationsModel
from propcheck.schema.prefilter import suspect_rows_sql

__all__ = ["build_schema", "run_schema_stage"]

MODELS = {
    "compounds": CompoundsModel,
    "vapor_pressure": VaporPressureModel,
    "boiling_points": BoilingPointsModel,
    "vp_equations": VpEquationsModel,
}
POINT_TABLES = ("vapor_pressure", "boiling_points")  # rows that each state one (t, p) of a compound
CHILD_TABLES = (*POINT_TABLES, "vp_equations")  # tables whose rows belong to a compound


def _cas_unique(cas: pd.Series) -> pd.Series:
    text = cas.astype("object")
    return text.isna() | ~text.duplicated(keep=False)


def build_schema(table: str, pack: Pack, known_ids: set[str] | None = None) -> pa.DataFrameSchema:
    """The table's pandera schema with the pack's ranges and enabled rules applied."""
    schema = MODELS[table].to_schema()
    checks: dict[str, list[pa.Check]] = {}
    if pack.enabled("value-out-of-range"):
        for column, (low, high) in pack.params("value-out-of-range").get(table, {}).items():
            checks.setdefault(column, []).append(
                pa.Check(lambda s, lo=low, hi=high: s.between(lo, hi), name=f"range:{column}",
                         statistics={"low": low, "high": high})
            )
    if table == "compounds":
        if pack.enabled("cas-malformed"):
            checks.setdefault("cas", []).append(pa.Check(cas_format_ok, name="cas-malformed"))
        if pack.enabled("cas-check-digit"):
            checks.setdefault("cas", []).append(pa.Check(cas_check_digit_ok, name="cas-check-digit"))
        if pack.enabled("cas-shared-by-ids"):
            checks.setdefault("cas", []).append(pa.Check(_cas_unique, name="cas-shared-by-ids"))
    if table in CHILD_TABLES and known_ids is not None and pack.enabled("vp-unknown-compound"):
        ids = pd.Index(sorted(known_ids))
        checks.setdefault("compound_id", []).append(
            pa.Check(lambda s: s.isna() | s.isin(ids), name="vp-unknown-compound")
        )
    updates = {column: {"checks": column_checks} for column, column_checks in checks.items()}
    if not pack.enabled("required-value-missing"):
        for name, column in schema.columns.items():
            if not column.nullable:
                updates.setdefault(name, {})["nullable"] = True
    if table == "compounds" and not pack.enabled("duplicate-compound-id"):
        updates.setdefault("compound_id", {})["unique"] = False
    return schema.update_columns(updates) if updates else schema


def _failures(schema: pa.DataFrameSchema, frame: pd.DataFrame) -> pd.DataFrame:
    try:
        schema.validate(frame, lazy=True)
    except pa.errors.SchemaErrors as exc:
        return exc.failure_cases
    return pd.DataFrame(columns=["column", "check", "failure_case", "index"])


def _load_pandera_backend() -> None:
    """Validate a one-cell frame once at import.

    pandera imports its pandas backend (and its data-synthesis strategies)
    on the first validation, a fixed start-up cost of a few tenths of a
    second that belongs with the other imports, not with the first table.
    """
    pa.DataFrameSchema({"x": pa.Column(float)}).validate(pd.DataFrame({"x": [1.0]}))


_load_pandera_backend()

CHUNK_ROWS = 500_000  # vapor-pressure rows validated at a time, to bound memory


def run_schema_stage(db: Database, pack: Pack) -> list[Finding]:
    """Validate ``compounds`` then ``vapor_pressure``; return the findings."""
    frame = db.df("SELECT * FROM compounds").set_index("_row", drop=False)
    findings, reject, null_cells = _check_frame(db, "compounds", frame, build_schema("compounds", pack), pack)
    _apply(db, "compounds", reject, null_cells)
    known = {r[0] for r in db.con.execute("SELECT compound_id FROM compounds WHERE compound_id IS NOT NULL").fetchall()}
    for table in CHILD_TABLES:
        if not db.has(table):
            continue
        schema = build_schema(table, pack, known)
        reject, null_cells = set(), {}
        columns = ", ".join(["_row", *MODELS[table].to_schema().columns])
        suspect = suspect_rows_sql(schema)
        query = f"SELECT {columns} FROM {table}" + (f" WHERE {suspect}" if suspect else "")
        batches = _batches_or_empty(db.con.sql(query).to_arrow_reader(CHUNK_ROWS), db, f"SELECT {columns} FROM {table} LIMIT 0")
        for batch in batches:
            chunk = batch.to_pandas().set_index("_row", drop=False)
            found, chunk_reject, chunk_null = _check_frame(db, table, chunk, schema, pack)
            findings += found
            reject |= chunk_reject
            for column, rows in chunk_null.items():
                null_cells.setdefault(column, set()).update(rows)
        _apply(db, table, reject, null_cells)
    return findings


def _batches_or_empty(reader, db: Database, empty_query: str):
    """The batches of ``reader``; an empty table of the same columns if it has none.

    pandera then still checks the column types of a table whose rows all pass.
    """
    seen = False
    for batch in reader:
        seen = True
        yield batch
    if not seen:
        yield db.con.sql(empty_query).to_arrow_table()


def _label(db: Database, table: str) -> str:
    origin = db.tables[table].origin
    return Path(origin).name if db.kind == "folder" else origin


def _check_frame(db: Database, table: str, frame: pd.DataFrame, schema, pack: Pack):
    """Validate one frame; return its findings, the rows to reject and the cells to withhold."""
    failures = _failures(schema, frame)
    label = _label(db, table)
    findings: list[Finding] = []
    reject_rows: set[int] = set()
    null_cells: dict[str, set[int]] = {}
    required = {name for name, col in MODELS[table].to_schema().columns.items() if not col.nullable}
    ranges = pack.params("value-out-of-range").get(table, {})

    def new(rule, row, column, message, **extra):
        record = frame.loc[row]
        findings.append(
            Finding(
                rule=rule, severity=pack.rules[rule].severity, table=table,
                compound_id=record["compound_id"], column=column, row=int(row),
                source=record.get("source"), message=f"{label} row {row}, column {column}: {message}",
                t=float(record["t"]) if table in POINT_TABLES and pd.notna(record["t"]) else None,
                **extra,
            )
        )

    for column, check, value, row in failures[["column", "check", "failure_case", "index"]].itertuples(index=False):
        if row is None or pd.isna(row):
            raise RuntimeError(f"schema check {check} on {table}.{column} failed without a row")
        row = int(row)
        if check == "not_nullable":
            if column in required and table in CHILD_TABLES or column == "compound_id":
                reject_rows.add(row)
            if (table, row, column) not in db.rejected_cells:
                new("required-value-missing", row, column, f"required value {column} is empty")
        elif check == "field_uniqueness":
            continue  # handled below, keeping the first occurrence
        elif str(check).startswith("range:"):
            low, high = ranges[column]
            if table in POINT_TABLES and column in ("t", "p"):
                reject_rows.add(row)
            else:
                null_cells.setdefault(column, set()).add(row)
                if table == "compounds":  # kept for the slip diagnosis, which may restore it (propcheck.diagnose)
                    db.cache.setdefault("withheld_cells", {})[(row, column)] = float(value)
            new("value-out-of-range", row, column, f"{value:.6g} is outside [{low:g}, {high:g}] {_unit(table, column)}",
                observed=float(value), expected=f"[{low:g}, {high:g}]", tolerance=None,
                reference="value-out-of-range bounds, rules/default.toml")
        elif check == "cas-malformed":
            new(check, row, "cas", f"{value!r} is not a CAS Registry Number (NNNNNNN-NN-N)", observed=value,
                reference="CAS Registry Number format")
        elif check == "cas-check-digit":
            body = str(value).rsplit("-", 1)[0]
            digit = cas_check_digit(body)
            name = frame.loc[row, "name"]
            record = lookup_chemical(name) if isinstance(name, str) else None  # the offline identifier database
            named = record.CASs if record is not None else None
            how = _cas_slip(str(value), named) if named else ""
            suggestion = (f"{how}? the name gives CAS {named}" if how
                          else f"the name gives CAS {named}" if named
                          else "a mistyped or transposed digit; the check digit alone may also be wrong")
            new(check, row, "cas", f"{value} fails its check digit (digits before it give {digit})", observed=value,
                expected=named, reference="CAS check-digit rule (cas.org)"
                + ("; name looked up in the identifier database carried by chemicals (offline)" if named else ""),
                suggestion=suggestion)
        elif check == "cas-shared-by-ids":
            others = frame[(frame["cas"] == value) & (frame["_row"] != row)]
            names = ", ".join(f"{cid} ({name})" for cid, name in zip(others["compound_id"], others["name"]))
            new(check, row, "cas", f"{value} is also the CAS of {names}", observed=value)
        elif check == "vp-unknown-compound":
            reject_rows.add(row)
            new(check, row, "compound_id", f"compound_id {value} is not in compounds", observed=value)
        else:
            raise RuntimeError(f"unexpected schema failure {check!r} on {table}.{column}")

    if table == "compounds" and pack.enabled("duplicate-compound-id"):
        ids = frame["compound_id"]
        repeated = frame[ids.notna() & ids.duplicated(keep="first")]
        first = frame[ids.notna()].drop_duplicates("compound_id", keep="first").set_index("compound_id")
        for row, cid, name in zip(repeated["_row"], repeated["compound_id"], repeated["name"]):
            reject_rows.add(int(row))
            first_row, first_name = first.loc[cid, "_row"], first.loc[cid, "name"]
            new("duplicate-compound-id", row, "compound_id",
                f"compound_id {cid} is used again (first at row {first_row}, {first_name!r}); this row is not checked",
                observed=name)  # the duplicate row's name: what tells it apart (and keeps its finding_id stable)
    elif table == "compounds":  # still cannot check two rows under one key
        ids = frame["compound_id"]
        reject_rows.update(int(r) for r in frame[ids.notna() & ids.duplicated(keep="first")]["_row"])
    if table == "compounds":
        reject_rows.update(int(r) for r in frame[frame["compound_id"].isna()]["_row"])
    else:  # a row of a child table without a required value cannot be checked
        for column in required:
            reject_rows.update(int(r) for r in frame[frame[column].isna()]["_row"])
    return findings, reject_rows, null_cells


def _cas_slip(stored: str, named: str) -> str:
    """Name the clerical slip that turns CAS ``named`` into ``stored``, or "".

    >>> _cas_slip("180-88-3", "108-88-3")
    'transposed digits'
    >>> _cas_slip("108-88-2", "108-88-3")
    'wrong check digit'
    """
    a, b = stored.replace("-", ""), named.replace("-", "")
    if len(a) != len(b) or a == b:
        return ""
    diff = [i for i in range(len(a)) if a[i] != b[i]]
    if len(diff) == 2 and diff[1] == diff[0] + 1 and a[diff[0]] == b[diff[1]] and a[diff[1]] == b[diff[0]]:
        return "transposed digits"
    if diff == [len(a) - 1]:
        return "wrong check digit"
    if len(diff) == 1:
        return "one digit mistyped"
    return ""


def _unit(table: str, column: str) -> str:
    from propcheck.canonical import TABLES

    unit = TABLES[table].column(column).unit
    return {"dimensionless": "", "m**3/mol": "m3/mol"}.get(unit, unit)


def _apply(db: Database, table: str, reject_rows: set[int], null_cells: dict[str, set[int]]) -> None:
    """Delete rejected rows and null withheld cells in the working table; count both."""
    info = db.tables[table]
    if reject_rows:
        rows = pd.DataFrame({"_row": sorted(reject_rows)})
        db.con.register("_reject", rows)
        db.con.execute(f"DELETE FROM {table} WHERE _row IN (SELECT _row FROM _reject)")
        db.con.unregister("_reject")
    info.rows_rejected = len(reject_rows)
    for column, rows in null_cells.items():
        kept = sorted(rows - reject_rows)
        if not kept:
            continue
        db.con.register("_cells", pd.DataFrame({"_row": kept}))
        db.con.execute(f"UPDATE {table} SET {column} = NULL WHERE _row IN (SELECT _row FROM _cells)")
        db.con.unregister("_cells")
        info.cells_rejected += len(kept)
