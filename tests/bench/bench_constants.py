"""Benchmark the compound-constant rules against a DuckDB-only floor.

On N synthetic compounds grouped into homologous series (n-alkane-like
constants from a smooth trend in carbon number with 0.1 % scatter, and a few
injected slips), both in the same run:

- floor: one DuckDB SQL pass computing tb/tc, Zc = pc vc/(R tc), the phase
  order and a per-family window mean of tc (``avg() OVER`` 3 rows each side);
- propcheck: building the diagnosis context and running every
  compound-constant rule (``phase-order-violated`` ... ``constants-copied``)
  with the default pack, diagnosis included.

Reports the median of ``--repeat`` runs and the ratio propcheck/floor;
absolute times depend on the machine: compare ratios. Not a test.

Usage::

    python tests/bench/bench_constants.py --compounds 20000 --repeat 3
"""

from __future__ import annotations

import argparse
import statistics
import time

import duckdb
import numpy as np
import pandas as pd

from propcheck.physics.corresponding_states import lee_kesler_omega

RULES = ("phase-order-violated", "tb-tc-ratio-out-of-band", "zc-inconsistent", "omega-out-of-range",
         "tb-off-corresponding-states", "off-family-trend", "molar-mass-off-formula", "formula-unparsable",
         "name-shared-by-ids", "constants-copied")


def synthetic(n: int, seed: int = 7) -> pd.DataFrame:
    """Series of 20 members each; constants on smooth n-alkane-like trends (invented data)."""
    rng = np.random.default_rng(seed)
    carbon = np.tile(np.arange(3, 23), n // 20 + 1)[:n].astype(float)
    family = np.repeat(np.arange(n // 20 + 1), 20)[:n]
    tc = 180 + 160 * np.log(carbon) * (1 + 0.001 * rng.standard_normal(n))
    tb = 0.66 * tc
    pc = 6.5e6 * carbon ** -0.55
    omega = lee_kesler_omega(tb, tc, pc)  # consistent with tb by construction (Lee & Kesler 1975)
    vc = 0.27 * 8.314462618 * tc / pc
    frame = pd.DataFrame({
        "compound_id": [f"S{i:06d}" for i in range(n)], "name": [f"s{i}" for i in range(n)],
        "formula": [f"C{int(c)}H{int(2 * c + 2)}" for c in carbon], "family": [f"series-{f}" for f in family],
        "molar_mass": 12.011 * carbon + 1.008 * (2 * carbon + 2), "tc": tc, "pc": pc, "vc": vc,
        "zc": 0.27, "omega": omega, "tb": tb, "tm": 0.4 * tc,
    })
    bad = rng.choice(n, size=max(1, n // 200), replace=False)
    frame.loc[bad, "tc"] -= 273.15  # degC slips
    return frame


FLOOR_SQL = """
SELECT compound_id, tb / tc AS ratio, pc * vc / (8.314462618 * tc) AS zc_calc,
       (tm < tb AND tb < tc) AS ordered,
       avg(tc) OVER (PARTITION BY family ORDER BY molar_mass ROWS BETWEEN 3 PRECEDING AND 3 FOLLOWING) AS trend
FROM compounds
"""


def run_floor(frame):
    con = duckdb.connect()
    con.register("src", frame)
    con.execute("CREATE TABLE compounds AS SELECT * FROM src")
    t = time.perf_counter()
    con.execute(FLOOR_SQL).df()
    return time.perf_counter() - t


def run_propcheck(frame):
    from propcheck.database import Database, TableInfo
    from propcheck.rules.pack import load_pack
    from propcheck.rules.registry import all_rules

    con = duckdb.connect()
    con.register("src", frame.assign(_row=np.arange(1, len(frame) + 1), cas=None, source="bench"))
    con.execute("CREATE TABLE compounds AS SELECT * FROM src")
    db = Database(con=con, source="bench", kind="folder", tables={"compounds": TableInfo("compounds", "bench")})
    pack = load_pack(None)
    t = time.perf_counter()
    found = 0
    for rid in RULES:
        out = all_rules()[rid].check(db, pack.params(rid))
        found += len(out) if out is not None else 0
    return time.perf_counter() - t, found


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--compounds", type=int, default=20000)
    parser.add_argument("--repeat", type=int, default=3)
    args = parser.parse_args()
    frame = synthetic(args.compounds)
    floors, props, found = [], [], 0
    for _ in range(args.repeat):
        floors.append(run_floor(frame))
        seconds, found = run_propcheck(frame)
        props.append(seconds)
    floor, prop = statistics.median(floors), statistics.median(props)
    print(f"{args.compounds} compounds: floor {floor:.3f} s, propcheck constants rules {prop:.3f} s "
          f"({found} findings), ratio {prop / floor:.1f}x")


if __name__ == "__main__":
    main()
