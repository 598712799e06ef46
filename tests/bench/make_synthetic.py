"""Write a synthetic, physically consistent property database for benchmarks.

The folder follows the canonical layout of the data contract: ``compounds``
and ``vapor_pressure`` as CSV and/or Parquet. Everything is drawn from a
numpy ``default_rng`` with a fixed seed, so the same arguments give the same
files, and computed with vectorised numpy (no loop per row).

Method
------
Critical constants are drawn uniformly (tc 300-700 K, pc 2-6 MPa, omega
0.1-0.6, zc 0.23-0.29, molar mass 30-400 g/mol) and vc = zc R tc / pc.
Vapor pressures come from the Lee-Kesler corresponding-states correlation
(B. I. Lee and M. G. Kesler, AIChE J. 21, 510 (1975))::

    ln Pr = f0(Tr) + omega f1(Tr)
    f0 = 5.92714 - 6.09648/Tr - 1.28862 ln Tr + 0.169347 Tr^6
    f1 = 15.2518 - 15.6875/Tr - 13.4721 ln Tr + 0.43577 Tr^6

tb is that equation solved for p = 101325 Pa by bisection on arrays of Tr;
tm = 0.5-0.7 tb. Each compound gets M points at temperatures evenly spaced
from 0.5 tc to 0.95 tc, with a stated uncertainty of 0.5 % of p. CAS numbers
are invented but carry a correct check digit (digits numbered from the right,
sum of digit x position, modulo 10), and are unique.

Usage::

    python tests/bench/make_synthetic.py --compounds 10000 --points 100 --out tests/bench/data/syn --format both
"""

from __future__ import annotations

import argparse
from pathlib import Path

import numpy as np
import pyarrow as pa
import pyarrow.csv as pacsv
import pyarrow.parquet as pq

SEED = 20260101
R = 8.314462618  # J/(mol K), CODATA 2018 exact
P_NORMAL = 101325.0  # Pa


def lee_kesler_ln_pr(tr: np.ndarray, omega: np.ndarray) -> np.ndarray:
    """ln(p/pc) from Lee & Kesler (1975) at reduced temperature ``tr``."""
    ln_tr = np.log(tr)
    tr6 = tr**6
    f0 = 5.92714 - 6.09648 / tr - 1.28862 * ln_tr + 0.169347 * tr6
    f1 = 15.2518 - 15.6875 / tr - 13.4721 * ln_tr + 0.43577 * tr6
    return f0 + omega * f1


def normal_boiling_tr(pc: np.ndarray, omega: np.ndarray, iterations: int = 60) -> np.ndarray:
    """Tr at which Lee-Kesler gives 101325 Pa; bisection on whole arrays."""
    target = np.log(P_NORMAL / pc)
    lo = np.full_like(pc, 0.3)
    hi = np.full_like(pc, 1.0)
    for _ in range(iterations):  # iterations, not rows: each step is vectorised
        mid = 0.5 * (lo + hi)
        below = lee_kesler_ln_pr(mid, omega) < target  # ln Pr rises with Tr
        lo = np.where(below, mid, lo)
        hi = np.where(below, hi, mid)
    return 0.5 * (lo + hi)


def cas_numbers(n: int, rng: np.random.Generator) -> np.ndarray:
    """``n`` distinct invented CAS numbers NNNNNN-NN-C with a valid check digit."""
    bodies = 10_000_000 + rng.choice(90_000_000, size=n, replace=False).astype(np.int64)  # 8 digits
    digits = (bodies[:, None] // 10 ** np.arange(8)) % 10  # column k: digit k+1 from the right
    check = (digits * np.arange(1, 9)).sum(axis=1) % 10
    head = (bodies // 100).astype(str)
    middle = np.char.zfill((bodies % 100).astype(str), 2)
    return np.char.add(np.char.add(np.char.add(np.char.add(head, "-"), middle), "-"), check.astype(str))


def generate(n_compounds: int, n_points: int, seed: int = SEED) -> tuple[pa.Table, pa.Table]:
    """Return the ``compounds`` and ``vapor_pressure`` tables."""
    rng = np.random.default_rng(seed)
    n = n_compounds
    tc = rng.uniform(300.0, 700.0, n)
    pc = rng.uniform(2.0e6, 6.0e6, n)
    omega = rng.uniform(0.1, 0.6, n)
    zc = rng.uniform(0.23, 0.29, n)
    vc = zc * R * tc / pc
    molar_mass = rng.uniform(30.0, 400.0, n)
    tb = normal_boiling_tr(pc, omega) * tc
    tm = rng.uniform(0.5, 0.7, n) * tb

    number = np.char.zfill(np.arange(1, n + 1).astype(str), 6)
    ids = pa.array(np.char.add("SYN-", number))
    compounds = pa.table({
        "compound_id": ids,
        "name": pa.array(np.char.add("synthetic-", number)),
        "cas": pa.array(cas_numbers(n, rng)),
        "formula": pa.nulls(n, pa.string()),
        "family": pa.array(np.full(n, "synthetic")),
        "molar_mass": np.round(molar_mass, 3),
        "tc": np.round(tc, 2),
        "pc": np.round(pc, -2),
        "vc": np.round(vc, 9),
        "zc": np.round(zc, 4),
        "omega": np.round(omega, 4),
        "tb": np.round(tb, 2),
        "tm": np.round(tm, 2),
        "source": pa.array(np.full(n, "synthetic Lee-Kesler 1975")),
    })

    # Points: the rounded constants are the ones written, so use them.
    tc_w, pc_w, om_w = (compounds[c].to_numpy() for c in ("tc", "pc", "omega"))
    tr = np.linspace(0.5, 0.95, n_points)[None, :]  # same reduced grid for every compound
    t = tc_w[:, None] * tr
    p = pc_w[:, None] * np.exp(lee_kesler_ln_pr(tr, om_w[:, None]))
    p = _round_sig(p.ravel(), 7)
    rows = n * n_points
    vapor_pressure = pa.table({
        "compound_id": ids.take(pa.array(np.repeat(np.arange(n), n_points))),
        "t": np.round(t.ravel(), 3),
        "p": p,
        "source": pa.array(np.full(rows, "synthetic Lee-Kesler 1975")) if rows else pa.array([], pa.string()),
        "uncertainty": _round_sig(0.005 * p, 3),
    })
    return compounds, vapor_pressure


def _round_sig(x: np.ndarray, digits: int) -> np.ndarray:
    """Round to ``digits`` significant figures (keeps the CSV files short)."""
    if x.size == 0:
        return x
    scale = 10.0 ** (digits - 1 - np.floor(np.log10(np.abs(x))))
    return np.round(x * scale) / scale


def write(table: pa.Table, out: Path, name: str, fmt: str) -> None:
    """Write ``table`` as ``out/name.csv`` and/or ``out/name.parquet``."""
    if fmt in ("csv", "both"):
        options = pacsv.WriteOptions(quoting_style="needed")
        pacsv.write_csv(table, out / f"{name}.csv", write_options=options)
    if fmt in ("parquet", "both"):
        pq.write_table(table, out / f"{name}.parquet")


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--compounds", type=int, default=10_000, help="number of compounds (default: %(default)s)")
    parser.add_argument("--points", type=int, default=100, help="vapor-pressure points per compound (default: %(default)s)")
    parser.add_argument("--out", required=True, help="output folder (created); with --format both, csv/ and parquet/ inside it")
    parser.add_argument("--format", choices=("csv", "parquet", "both"), default="csv")
    parser.add_argument("--seed", type=int, default=SEED, help="random seed (default: %(default)s)")
    args = parser.parse_args(argv)

    compounds, vapor_pressure = generate(args.compounds, args.points, args.seed)
    out = Path(args.out)
    # A folder may hold only one file per table, so "both" writes two folders.
    targets = [(out / "csv", "csv"), (out / "parquet", "parquet")] if args.format == "both" else [(out, args.format)]
    for folder, fmt in targets:
        folder.mkdir(parents=True, exist_ok=True)
        write(compounds, folder, "compounds", fmt)
        write(vapor_pressure, folder, "vapor_pressure", fmt)
        print(f"wrote {compounds.num_rows} compounds, {vapor_pressure.num_rows} points as {fmt} to {folder}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
