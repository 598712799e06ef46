"""Loading: CSV quirks, Parquet, DuckDB files (read-only), mapping and unit conversion."""

from __future__ import annotations

import hashlib

import duckdb
import pandas as pd
import pytest

from propcheck.load import load_database
from propcheck.pipeline import run_check
from tests.conftest import write_db

# n-hexane: Tc 507.6 K, Pc 3.025 MPa (IUPAC, Ambrose & Tsonopoulos, J. Chem. Eng. Data 40, 531 (1995));
# Tb 341.87 K (CRC Handbook 95th ed.). Unit factors are exact by definition (SI brochure 2019):
# 507.6 K = 234.45 degC; 3.025 MPa = 30.25 bar; 341.87 K = 155.696 degF.


def _compounds(db):
    return db.df("SELECT * FROM compounds ORDER BY _row")


def test_bom_semicolon_decimal_comma_quotes_blank_lines(tmp_path):
    folder = tmp_path / "db"
    folder.mkdir()
    text = (
        "\ufeffcompound_id;name;tc;pc\n"
        '"C6";"n-hexane; straight chain";507,6;3025000\n'
        '"C7";"n-heptane";540,2;2,74E6\n'
        "\n\n"
    )
    (folder / "compounds.csv").write_bytes(text.encode("utf-8"))
    db = load_database(str(folder))
    frame = _compounds(db)
    assert list(frame["compound_id"]) == ["C6", "C7"]
    assert frame["name"][0] == "n-hexane; straight chain"
    assert frame["tc"].tolist() == pytest.approx([507.6, 540.2])
    assert frame["pc"].tolist() == pytest.approx([3025000.0, 2740000.0])
    assert db.tables["compounds"].rows_read == 2
    assert db.load_findings == []


def test_parquet_folder(tmp_path):
    folder = tmp_path / "db"
    folder.mkdir()
    pd.DataFrame({"compound_id": ["C6"], "name": ["n-hexane"], "tc": [507.6], "pc": [3025000.0]}).to_parquet(
        folder / "compounds.parquet"
    )
    frame = _compounds(load_database(str(folder)))
    assert frame["tc"][0] == pytest.approx(507.6)


def test_parquet_text_column_with_bad_cell(tmp_path):
    folder = tmp_path / "db"
    folder.mkdir()
    pd.DataFrame({"compound_id": ["C6", "C7"], "name": ["n-hexane", "n-heptane"], "tc": ["507.6", "hot"]}).to_parquet(
        folder / "compounds.parquet"
    )
    db = load_database(str(folder))
    assert [(f.compound_id, f.column, f.observed) for f in db.load_findings] == [("C7", "tc", "hot")]


@pytest.mark.parametrize("own_column", [False, True])
def test_parquet_rows_numbered_as_in_the_file(tmp_path, own_column):
    """Row numbers of a Parquet file (read in parallel, many row groups) are its data rows, 1-based.

    With a column of the file named ``file_row_number`` (the reader's own
    numbering cannot be used) the rows are numbered in the order read.
    """
    import pyarrow as pa
    import pyarrow.parquet as pq

    folder = tmp_path / "db"
    folder.mkdir()
    pd.DataFrame({"compound_id": ["C6"], "name": ["n-hexane"]}).to_parquet(folder / "compounds.parquet")
    n = 50_000
    # row k holds t = k K and p = k Pa (numbers chosen for bookkeeping, not physics)
    columns = {"compound_id": ["C6"] * n, "t": [float(k) for k in range(1, n + 1)],
               "p": [float(k) for k in range(1, n + 1)]}
    if own_column:
        columns["file_row_number"] = list(range(n, 0, -1))
    pq.write_table(pa.table(columns), folder / "vapor_pressure.parquet", row_group_size=4096)
    db = load_database(str(folder))
    rows = db.con.execute("SELECT _row, t FROM vapor_pressure ORDER BY _row").fetchnumpy()
    assert rows["_row"].tolist() == list(range(1, n + 1))
    assert (rows["t"] == rows["_row"]).all()
    assert ("file_row_number" in db.tables["vapor_pressure"].extra_columns) == own_column


def test_two_files_for_one_table(tmp_path, run_cli):
    folder = write_db(tmp_path / "db", [{"compound_id": "C6", "name": "n-hexane"}])
    pd.DataFrame({"compound_id": ["C6"], "name": ["n-hexane"]}).to_parquet(folder / "compounds.parquet")
    result = run_cli("check", folder, "--out", tmp_path / "out")
    assert result.code == 2 and "keep one" in result.err


def _sha(path):
    return hashlib.sha256(path.read_bytes()).hexdigest()


def test_duckdb_file_is_read_only_and_unchanged(tmp_path, run_cli):
    path = tmp_path / "props.duckdb"
    con = duckdb.connect(str(path))
    con.execute("CREATE TABLE compounds (compound_id VARCHAR, name VARCHAR, tc DOUBLE, pc DOUBLE, tb DOUBLE)")
    con.execute("INSERT INTO compounds VALUES ('C6', 'n-hexane', 234.45, 3025000, 341.87)")
    con.close()
    before = _sha(path)
    result = run_cli("check", path, "--out", tmp_path / "out")
    assert result.code == 1  # tc stored in degC: phase order violated
    assert _sha(path) == before
    assert not (tmp_path / "props.duckdb.wal").exists()


def test_csv_source_unchanged(tmp_path, run_cli):
    folder = write_db(tmp_path / "db", [{"compound_id": "C6", "name": "n-hexane", "tc": "bad"}])
    before = _sha(folder / "compounds.csv")
    run_cli("check", folder, "--out", tmp_path / "out")
    assert _sha(folder / "compounds.csv") == before
    assert sorted(p.name for p in folder.iterdir()) == ["compounds.csv"]


def test_mapping_beside_a_database_file_is_used(tmp_path):
    """propcheck.toml in the folder of a database file is read, as for a folder of CSV files."""
    folder = tmp_path / "delivery"
    folder.mkdir()
    path = folder / "vendor.duckdb"
    con = duckdb.connect(str(path))
    # n-hexane Tc 234.45 degC = 507.6 K (IUPAC; exact conversion)
    con.execute("CREATE TABLE chem_master AS SELECT 'C6' AS ID, 'n-hexane' AS Chemical, 234.45 AS Tcrit_C")
    con.close()
    (folder / "propcheck.toml").write_text(
        '[compounds]\ntable = "chem_master"\n[compounds.columns]\ncompound_id = "ID"\nname = "Chemical"\n'
        'tc = "Tcrit_C"\n[compounds.units]\ntc = "degC"\n'
    )
    db = load_database(str(path))
    assert _compounds(db)["tc"][0] == pytest.approx(507.6, abs=1e-9)
    assert any("propcheck.toml" in note for note in db.notes)


def test_mapping_renames_and_converts_units(tmp_path):
    folder = tmp_path / "delivery"
    folder.mkdir()
    (folder / "chem_master.csv").write_text("ID,Chemical,Tcrit_C,Pcrit_bar,NBP_F\nC6,n-hexane,234.45,30.25,155.696\n")
    (folder / "vp_data.csv").write_text("ID,T_C,P_kPa,U_kPa\nC6,68.72,101.325,0.5\n")
    (folder / "propcheck.toml").write_text(
        """
[compounds]
table = "chem_master"
[compounds.columns]
compound_id = "ID"
name = "Chemical"
tc = "Tcrit_C"
pc = "Pcrit_bar"
tb = "NBP_F"
[compounds.units]
tc = "degC"
pc = "bar"
tb = "degF"

[vapor_pressure]
table = "vp_data"
[vapor_pressure.columns]
compound_id = "ID"
t = "T_C"
p = "P_kPa"
uncertainty = "U_kPa"
[vapor_pressure.units]
t = "degC"
p = "kPa"
"""
    )
    db = load_database(str(folder))
    row = _compounds(db).iloc[0]
    assert row["tc"] == pytest.approx(507.6, abs=1e-9)
    assert row["pc"] == pytest.approx(3025000.0, rel=1e-12)
    assert row["tb"] == pytest.approx(341.87, abs=1e-3)
    vp = db.df("SELECT * FROM vapor_pressure").iloc[0]
    assert vp["t"] == pytest.approx(341.87, abs=1e-9)
    assert vp["p"] == pytest.approx(101325.0)
    assert vp["uncertainty"] == pytest.approx(500.0)  # follows the unit of p


def test_extra_columns_are_carried_and_usable_by_custom_rules(tmp_path):
    folder = write_db(
        tmp_path / "db",
        [{"compound_id": "C6", "name": "n-hexane", "tc": 507.6, "reviewed_by": ""},
         {"compound_id": "C7", "name": "n-heptane", "tc": 540.2, "reviewed_by": "AK"}],
    )
    pack = tmp_path / "pack.toml"
    pack.write_text(
        '[custom.unreviewed-row]\ntitle = "Row not reviewed"\nseverity = "info"\ncolumn = "reviewed_by"\n'
        "sql = \"SELECT compound_id, 'nobody signed this row' AS message FROM compounds WHERE reviewed_by IS NULL\"\n"
    )
    result = run_check(str(folder), rules_path=str(pack))
    found = result.findings[result.findings["rule"] == "unreviewed-row"]
    assert found[["compound_id", "severity", "column", "message"]].values.tolist() == [
        ["C6", "info", "reviewed_by", "nobody signed this row"]
    ]


@pytest.mark.parametrize("on_file", [False, True], ids=["in-memory", "working-file"])
def test_custom_rules_may_name_tables_in_the_memory_catalog(tmp_path, monkeypatch, on_file):
    # Tc IUPAC (Ambrose & Tsonopoulos 1995): n-hexane 507.6 K, n-heptane 540.2 K
    import gc
    from pathlib import Path

    import propcheck.load as load

    made = []
    if on_file:
        real_attach = load._attach_work_catalog
        monkeypatch.setattr(load, "LARGE_SOURCE_BYTES", 0)

        def spy(con, source):
            made.append(real_attach(con, source))
            return made[-1]

        monkeypatch.setattr(load, "_attach_work_catalog", spy)
    folder = write_db(tmp_path / "db", [{"compound_id": "C6", "name": "n-hexane", "tc": 507.6},
                                        {"compound_id": "C7", "name": "n-heptane", "tc": 540.2}])
    pack = tmp_path / "pack.toml"
    pack.write_text("".join(
        f'[custom.{rule}]\ntitle = "tc above 520 K"\nsql = "SELECT compound_id, tc AS observed FROM {table} WHERE tc > 520"\n'
        for rule, table in (("unqualified", "compounds"), ("catalog", "memory.compounds"),
                            ("catalog-schema", "memory.main.compounds"))))
    result = run_check(str(folder), rules_path=str(pack))
    for rule in ("unqualified", "catalog", "catalog-schema"):
        found = result.findings[result.findings["rule"] == rule]
        assert found[["compound_id", "observed"]].values.tolist() == [["C7", 540.2]], rule
    if on_file:
        assert made and made[0] is not None, "the working file was not used"
        workdir = Path(made[0].name)
        del result, made
        gc.collect()
        assert not workdir.exists(), "the working database file outlived the run"
