"""Benchmark ``propcheck check`` against DuckDB merely reading the same files.

A synthetic database (``make_synthetic.py``: Lee-Kesler vapor pressures,
B. I. Lee and M. G. Kesler, AIChE J. 21, 510 (1975)) of N compounds x M points
is written as CSV and as Parquet under ``tests/bench/data/`` (git-ignored).
For each format, in the same run and interleaved so that both see the same
load on a shared machine, it times:

- baseline: a fresh Python process in which DuckDB reads both files into
  tables (``CREATE TABLE ... AS SELECT * FROM read_csv/read_parquet``) and
  runs ``SELECT count(*), sum(p)``;
- propcheck: a fresh ``python -m propcheck check DIR --out OUT --quiet``
  (load, schema, rules, and writing findings.csv/json, summary.md, report.html).

Each is repeated ``--repeat`` times; the median wall time and the largest peak
resident memory (``os.wait4`` rusage of that child, so runs do not mix) are
reported, with the ratio propcheck/baseline. Absolute times depend on the
machine and its load: compare ratios. Per-stage times come from an in-process
``propcheck.pipeline.run_check`` (``RunResult.stage_seconds``) plus the time
to build and write the report files.

Usage::

    python tests/bench/bench_check.py                       # 10000 x 100, 3 repeats
    python tests/bench/bench_check.py --compounds 1000 --points 20 --repeat 5
"""

from __future__ import annotations

import argparse
import json
import os
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

HERE = Path(__file__).resolve().parent

BASELINE = """
import sys, duckdb
folder, fmt = sys.argv[1], sys.argv[2]
reader = "read_csv" if fmt == "csv" else "read_parquet"
con = duckdb.connect()
con.execute(f"CREATE TABLE compounds AS SELECT * FROM {reader}('{folder}/compounds.{fmt}')")
con.execute(f"CREATE TABLE vapor_pressure AS SELECT * FROM {reader}('{folder}/vapor_pressure.{fmt}')")
print(con.execute("SELECT (SELECT count(*) FROM compounds), count(*), sum(p) FROM vapor_pressure").fetchone())
"""


def run_child(argv: list[str]) -> tuple[float, float, int, str]:
    """Run ``argv``; return wall seconds, peak RSS in MB of that child, exit status, stderr."""
    start = time.perf_counter()
    proc = subprocess.Popen(argv, stdout=subprocess.DEVNULL, stderr=subprocess.PIPE, text=True)
    stderr = proc.stderr.read()
    _, status, usage = os.wait4(proc.pid, 0)
    seconds = time.perf_counter() - start
    proc.returncode = os.waitstatus_to_exitcode(status)
    return seconds, usage.ru_maxrss / 1024.0, proc.returncode, stderr  # ru_maxrss is KiB on Linux


def measure(folder: Path, fmt: str, repeat: int, out: Path) -> dict:
    """Interleave baseline and propcheck runs; return medians and peaks."""
    base_t, base_mb, pc_t, pc_mb = [], [], [], []
    for _ in range(repeat):
        seconds, mb, code, err = run_child([sys.executable, "-c", BASELINE, str(folder), fmt])
        if code != 0:
            raise SystemExit(f"baseline failed on {folder}: {err.strip()}")
        base_t.append(seconds)
        base_mb.append(mb)
        seconds, mb, code, err = run_child(
            [sys.executable, "-m", "propcheck", "check", str(folder), "--out", str(out), "--quiet", "--fail-on", "none"]
        )
        if code != 0:
            raise SystemExit(f"propcheck exited {code} on {folder}: {err.strip()}")
        pc_t.append(seconds)
        pc_mb.append(mb)
    return {
        "format": fmt,
        "baseline_s": statistics.median(base_t),
        "propcheck_s": statistics.median(pc_t),
        "ratio": statistics.median(pc_t) / statistics.median(base_t),
        "baseline_peak_mb": max(base_mb),
        "propcheck_peak_mb": max(pc_mb),
        "findings": _count_findings(out),
    }


def _count_findings(out: Path) -> int:
    with open(out / "findings.json", encoding="utf-8") as handle:
        data = json.load(handle)
    return len(data["findings"] if isinstance(data, dict) else data)


def stage_times(folder: Path, repeat: int, out: Path) -> dict[str, float]:
    """Median per-stage seconds of an in-process run, plus writing the report."""
    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data, write_reports

    runs: list[dict[str, float]] = []
    for _ in range(repeat):
        result = run_check(str(folder))
        stages = dict(result.stage_seconds)
        start = time.perf_counter()
        write_reports(build_report_data(result, fail_on="none"), str(out))
        stages["report"] = time.perf_counter() - start
        runs.append(stages)
    return {name: statistics.median(run[name] for run in runs) for name in runs[0]}


def import_seconds(repeat: int) -> float:
    """Median time for a fresh interpreter to import propcheck's check path (fixed cost)."""
    code = "import propcheck.cli, propcheck.pipeline, propcheck.report"
    return statistics.median(run_child([sys.executable, "-c", code])[0] for _ in range(repeat))


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--compounds", type=int, default=10_000, help="default: %(default)s")
    parser.add_argument("--points", type=int, default=100, help="vapor-pressure points per compound (default: %(default)s)")
    parser.add_argument("--repeat", type=int, default=3, help="runs per measurement; the median is reported (default: %(default)s)")
    parser.add_argument("--data", default=str(HERE / "data"), help="folder for the generated files (default: tests/bench/data)")
    parser.add_argument("--json", help="also write the figures to this JSON file")
    args = parser.parse_args(argv)

    data = Path(args.data) / f"syn_{args.compounds}x{args.points}"
    # generated in a child process: a forked child starts with its parent's resident memory
    # counted in its own peak, so the parent stays small until the children have run
    subprocess.run([sys.executable, str(HERE / "make_synthetic.py"), "--compounds", str(args.compounds),
                    "--points", str(args.points), "--out", str(data), "--format", "both"],
                   check=True, stdout=subprocess.DEVNULL)
    print(f"data: {args.compounds} compounds x {args.points} points = {args.compounds * args.points} vapor-pressure rows; "
          f"{os.cpu_count()} CPUs; median of {args.repeat}")

    rows, stages = [], {}
    with tempfile.TemporaryDirectory(prefix="propcheck-bench-") as tmp:
        for fmt in ("csv", "parquet"):
            rows.append(measure(data / fmt, fmt, args.repeat, Path(tmp) / f"out-{fmt}"))
        for fmt in ("csv", "parquet"):
            stages[fmt] = stage_times(data / fmt, args.repeat, Path(tmp) / f"stages-{fmt}")
    startup = import_seconds(args.repeat)

    print(f"\n{'format':<8} {'baseline s':>10} {'propcheck s':>11} {'ratio':>6} {'peak MB':>8} {'base MB':>8} {'findings':>8}")
    for r in rows:
        print(f"{r['format']:<8} {r['baseline_s']:>10.2f} {r['propcheck_s']:>11.2f} {r['ratio']:>6.1f} "
              f"{r['propcheck_peak_mb']:>8.0f} {r['baseline_peak_mb']:>8.0f} {r['findings']:>8}")
    names = list(stages["csv"])
    print(f"\nin-process stage seconds (median): {'  '.join(f'{n:>7}' for n in names)}")
    for fmt, times in stages.items():
        print(f"{fmt:<34}  {'  '.join(f'{times[n]:>7.2f}' for n in names)}")
    print(f"\nfixed cost: importing propcheck in a fresh interpreter takes {startup:.2f} s (included in 'propcheck s')")

    if args.json:
        record = {"compounds": args.compounds, "points": args.points, "repeat": args.repeat,
                  "cpus": os.cpu_count(), "runs": rows, "stage_seconds": stages, "import_seconds": startup}
        Path(args.json).write_text(json.dumps(record, indent=2), encoding="utf-8")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
