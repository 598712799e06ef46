"""Load time of a 1,000,000-row vapor-pressure table from SQLite and PostgreSQL against Parquet.

The synthetic database of ``make_synthetic.py`` (10,000 compounds x 100
Lee-Kesler points; B. I. Lee and M. G. Kesler, AIChE J. 21, 510 (1975)) is
written as Parquet, copied into a SQLite file and, when ``--pg URL`` (or
PROPCHECK_TEST_PG_URL) is given, into a throw-away PostgreSQL schema. Each
source is then loaded with ``propcheck.load.load_database`` (Arrow batches,
canonicalize) ``--repeat`` times, interleaved; the median seconds and the
ratio to Parquet (measured in the same run) are printed. Not a test.

    python tests/bench/bench_sources.py [--pg postgresql://...] [--repeat 3]
"""

from __future__ import annotations

import argparse
import os
import sqlite3
import statistics
import sys
import tempfile
import time
import uuid
from pathlib import Path

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE))
sys.path.insert(0, str(HERE.parents[1]))

import make_synthetic  # noqa: E402  (sibling script)
import pyarrow.parquet as pq  # noqa: E402

from propcheck.load import load_database  # noqa: E402


def _sqlite(folder: Path, path: Path) -> None:
    con = sqlite3.connect(path)
    for table in ("compounds", "vapor_pressure"):
        frame = pq.read_table(folder / f"{table}.parquet").to_pandas()
        frame.to_sql(table, con, index=False, chunksize=100_000)
    con.close()


def _pg(folder: Path, url: str) -> str:
    import adbc_driver_postgresql.dbapi as adbc_pg

    schema = f"bench_{uuid.uuid4().hex[:8]}"
    con = adbc_pg.connect(url)
    cur = con.cursor()
    cur.execute(f"CREATE SCHEMA {schema}")
    for table in ("compounds", "vapor_pressure"):
        cur.adbc_ingest(table, pq.read_table(folder / f"{table}.parquet"), mode="create", db_schema_name=schema)
    con.commit()
    con.close()
    return schema


def _drop(url: str, schema: str) -> None:
    import adbc_driver_postgresql.dbapi as adbc_pg

    con = adbc_pg.connect(url)
    con.cursor().execute(f"DROP SCHEMA {schema} CASCADE")
    con.commit()
    con.close()


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--compounds", type=int, default=10_000)
    ap.add_argument("--points", type=int, default=100)
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--pg", default=os.environ.get("PROPCHECK_TEST_PG_URL"))
    args = ap.parse_args()
    with tempfile.TemporaryDirectory() as tmp:
        folder = Path(tmp) / "parquet"
        folder.mkdir()
        compounds, points = make_synthetic.generate(args.compounds, args.points)
        make_synthetic.write(compounds, folder, "compounds", "parquet")
        make_synthetic.write(points, folder, "vapor_pressure", "parquet")
        sources = {"parquet": str(folder)}
        _sqlite(folder, Path(tmp) / "syn.sqlite")
        sources["sqlite"] = str(Path(tmp) / "syn.sqlite")
        schema = _pg(folder, args.pg) if args.pg else None
        if schema:
            sources["postgresql"] = args.pg + ("&" if "?" in args.pg else "?") + f"schema={schema}"
        times: dict[str, list[float]] = {k: [] for k in sources}
        try:
            for _ in range(args.repeat):
                for kind, source in sources.items():
                    start = time.perf_counter()
                    db = load_database(source)
                    times[kind].append(time.perf_counter() - start)
                    rows = db.tables["vapor_pressure"].rows_read
                    db.con.close()
        finally:
            if schema:
                _drop(args.pg, schema)
    base = statistics.median(times["parquet"])
    print(f"vapor_pressure rows: {rows:,}; median of {args.repeat} loads (load_database, in-process)")
    for kind, values in times.items():
        med = statistics.median(values)
        print(f"{kind:<11} {med:6.2f} s   ratio to parquet {med / base:5.2f}")


if __name__ == "__main__":
    main()
