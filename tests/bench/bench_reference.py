"""Benchmark the reference cross-check: one-time load, batched lookup, naive per-compound lookup.

10,000 compounds with real CAS Registry Numbers are taken from the
compilations themselves (the Yaws critical-constants table carried by
chemicals, values unchanged, then further CAS from the CRC organic table),
loaded into a canonical ``compounds`` table, and cross-checked by the four
reference rules (identity-mismatch, reference-missing, const-off-reference;
vp-off-reference has no points here). Measured in the same run:

- load: building the default reference (chemicals compilations, the full
  identifier database, CoolProp's fluids), once per process;
- cross-check: identity + the rules' checks on a fresh database (median of
  ``--repeat``), i.e. the time beyond the load; target < 0.5 s;
- baseline: one bare pandas merge of the 10,000 CAS with the long reference
  table (the floor for any batched lookup);
- naive: one ``thermo.Chemical`` per compound on ``--naive`` compounds,
  extrapolated to 10,000.

Nothing here asserts a time; read the ratios.

Usage::

    python tests/bench/bench_reference.py
    python tests/bench/bench_reference.py --compounds 10000 --repeat 5 --naive 30
"""

from __future__ import annotations

import argparse
import statistics
import time
import warnings

import duckdb
import numpy as np
import pandas as pd


def _compounds(n: int) -> pd.DataFrame:
    import chemicals.critical as critical
    import chemicals.miscdata as miscdata

    yaws = critical.critical_data_Yaws.reset_index()
    frame = pd.DataFrame({"cas": yaws["CAS"], "name": yaws["Chemical"], "tc": yaws["Tc"], "pc": yaws["Pc"],
                          "vc": yaws["Vc"], "zc": yaws["Zc"], "omega": yaws["omega"]})
    crc = miscdata.CRC_organic_data.reset_index()
    more = pd.DataFrame({"cas": crc["CAS"], "name": crc["Name"], "tb": crc["Tb"], "tm": crc["Tm"]})
    frame = pd.concat([frame, more[~more["cas"].isin(frame["cas"])]], ignore_index=True).head(n)
    frame.insert(0, "compound_id", [f"B{i:05d}" for i in range(len(frame))])
    frame.insert(0, "_row", np.arange(1, len(frame) + 1))
    frame["source"] = "bench"
    frame["formula"] = None
    return frame


def _database(frame: pd.DataFrame):
    from propcheck.database import Database

    con = duckdb.connect()
    con.register("frame", frame)
    con.execute("CREATE TABLE compounds AS SELECT * FROM frame")
    return Database(con=con, source="bench", kind="bench")


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--compounds", type=int, default=10000)
    parser.add_argument("--repeat", type=int, default=5)
    parser.add_argument("--naive", type=int, default=30, help="compounds for the thermo.Chemical estimate")
    args = parser.parse_args()
    warnings.simplefilter("ignore")

    clock = time.perf_counter()
    from propcheck.reference import default_reference

    reference = default_reference()
    reference.parts[0]._load_full(True)  # the full identifier database: part of the one-time load
    load = time.perf_counter() - clock

    from propcheck.rules import const_off_reference, identity_mismatch, reference_missing
    from propcheck.rules.pack import load_pack

    pack = load_pack()
    frame = _compounds(args.compounds)
    cross, base, counts = [], [], {}
    long = reference.parts[0]._long
    for _ in range(args.repeat):
        db = _database(frame)
        clock = time.perf_counter()
        found = []
        for rule in (identity_mismatch, reference_missing, const_off_reference):
            found += rule.check(db, pack.params(rule.RULE.id))
        cross.append(time.perf_counter() - clock)
        counts = pd.Series([f.severity for f in found]).value_counts().to_dict()
        clock = time.perf_counter()
        frame[["_row", "cas"]].merge(long, on="cas")
        base.append(time.perf_counter() - clock)

    from thermo import Chemical

    Chemical("7732-18-5")  # warm-up: thermo's own lazy table loading is a one-time cost, not per compound
    sample = frame["cas"].head(args.naive).tolist()
    clock = time.perf_counter()
    for cas in sample:
        try:
            chem = Chemical(cas)
            _ = (chem.Tc, chem.Pc, chem.Vc, chem.omega, chem.Tb, chem.Tm, chem.MW)
        except Exception:  # noqa: BLE001 - a compound thermo cannot build is still timed
            pass
    naive = (time.perf_counter() - clock) / len(sample) * len(frame)

    cross_s, base_s = statistics.median(cross), statistics.median(base)
    print(f"compounds: {len(frame)} (real CAS from Yaws + CRC organic tables); findings {counts}")
    print(f"load (once per process):            {load:8.2f} s")
    print(f"cross-check beyond the load:        {cross_s:8.3f} s  (median of {args.repeat}; target < 0.5 s)")
    print(f"baseline bare pandas merge:         {base_s:8.3f} s")
    print(f"naive thermo.Chemical per compound: {naive:8.1f} s  (measured on {len(sample)}, extrapolated)")
    print(f"ratio cross-check / bare merge:     {cross_s / base_s:8.1f}")
    print(f"ratio naive / cross-check:          {naive / cross_s:8.0f}")


if __name__ == "__main__":
    main()
