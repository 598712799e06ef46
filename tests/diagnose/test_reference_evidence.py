"""Slip diagnosis weighs the consensus of the reference sources when the reference checks run.

Check values: n-hexane Tc 507.6 K, Pc 3.025 MPa (IUPAC, Ambrose & Tsonopoulos 1995), Tb 341.87 K
(CRC Handbook 95th ed.), omega 0.300 (Thol 2019 EOS), CAS 110-54-3; reference data from the
compilations carried by chemicals 1.5.2 and CoolProp 8 (real libraries).
"""

from __future__ import annotations

import csv

from propcheck.cli import main
from tests.conftest import write_db

HEXANE = {"compound_id": "C6", "name": "n-hexane", "cas": "110-54-3", "formula": "C6H14",
          "tc": 234.45, "pc": 3025000.0, "tb": 341.87, "omega": 0.300}  # tc stored in degC


def _corrections(tmp_path, pack_text=None):
    folder = write_db(tmp_path / "db", [HEXANE])
    args = ["check", str(folder), "--out", str(tmp_path / "out"), "--quiet"]
    if pack_text:
        pack = tmp_path / "pack.toml"
        pack.write_text(pack_text)
        args += ["--rules", str(pack)]
    main(args)
    with (tmp_path / "out" / "corrections.csv").open() as handle:
        return {row["column"]: row for row in csv.DictReader(handle)}


def test_reference_consensus_is_part_of_the_evidence(tmp_path):
    row = _corrections(tmp_path)["tc"]
    assert float(row["proposed_value"]) == 507.6
    assert "restores" in row["evidence"] and "reference data (tc)" in row["evidence"]


def test_without_reference_checks_the_repair_stands_on_its_own(tmp_path):
    pack = "[rules.const-off-reference]\nenabled = false\n[rules.vp-off-reference]\nenabled = false\n"
    row = _corrections(tmp_path, pack)["tc"]
    assert float(row["proposed_value"]) == 507.6
    assert "reference" not in row["evidence"]
