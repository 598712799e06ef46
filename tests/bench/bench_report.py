"""Report stage on a large database: time and size against the check itself (not a test).

Generates N compounds x M points with tests/bench/make_synthetic.py, seeds a
kPa-entered-as-Pa slip into one point of every 20th compound (so that many
compounds are flagged), runs the check once, then times the report stage
(build_report_data + every writer, report.html with its capped plot panels)
against the check measured in the same run. Prints the ratio and the size of
report.html; nothing here is asserted.

    python tests/bench/bench_report.py                     # 10000 x 100
    python tests/bench/bench_report.py --compounds 2000 --points 30
"""

from __future__ import annotations

import argparse
import json
import sys
import tempfile
import time
from pathlib import Path

import numpy as np
import pyarrow as pa
import pyarrow.parquet as pq

sys.path.insert(0, str(Path(__file__).resolve().parent))
from make_synthetic import generate  # noqa: E402


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--compounds", type=int, default=10_000)
    parser.add_argument("--points", type=int, default=100)
    parser.add_argument("--every", type=int, default=20, help="seed a slip into every N-th compound")
    args = parser.parse_args(argv)

    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data, write_reports

    compounds, points = generate(args.compounds, args.points)
    p = points.column("p").to_numpy().copy()
    idx = np.arange(0, args.compounds, args.every) * args.points + args.points // 2  # one mid-curve point
    p[idx] = p[idx] / 1000.0  # kPa entered as Pa
    points = points.set_column(points.schema.get_field_index("p"), "p", pa.array(p))
    with tempfile.TemporaryDirectory() as tmp:
        src = Path(tmp) / "db"
        src.mkdir()
        pq.write_table(compounds, src / "compounds.parquet")
        pq.write_table(points, src / "vapor_pressure.parquet")
        t0 = time.perf_counter()
        result = run_check(str(src))
        t_check = time.perf_counter() - t0
        t0 = time.perf_counter()
        data = build_report_data(result)
        t_data = time.perf_counter() - t0
        t0 = time.perf_counter()
        write_reports(data, str(Path(tmp) / "out"))
        t_write = time.perf_counter() - t0
        size = {f.name: f.stat().st_size for f in (Path(tmp) / "out").iterdir()}
    out = {
        "compounds": args.compounds, "points": args.points, "findings": len(result.findings),
        "flagged_compounds": data.n_flagged_compounds, "panels": len(data.panels),
        "check_s": round(t_check, 3), "report_data_s": round(t_data, 3), "writers_s": round(t_write, 3),
        "report_over_check": round((t_data + t_write) / t_check, 3),
        "report_html_mb": round(size["report.html"] / 2**20, 2),
    }
    print(json.dumps(out, indent=2))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
