"""Golden files: summary.md, findings.json and junit.xml of `propcheck check sample_db`.

Volatile fields (timestamps, durations, versions, absolute paths, the data
fingerprint) are scrubbed before comparing, and floats in findings.json are
compared to 8 significant digits. To accept new output after a
deliberate change (a new rule changes the findings on sample_db):

    PROPCHECK_UPDATE_GOLDEN=1 python -m pytest tests/test_golden.py

On a mismatch the actual (scrubbed) output is saved under tests/actual/golden/
(git-ignored) and the test shows a unified diff.
"""

from __future__ import annotations

import difflib
import json
import os
import re

import pytest

from tests.conftest import REPO

GOLDEN = REPO / "tests" / "golden" / "sample_db"
ACTUAL = REPO / "tests" / "actual" / "golden"
FILES = ("summary.md", "findings.json", "junit.xml")
UPDATE = os.environ.get("PROPCHECK_UPDATE_GOLDEN") == "1"


def scrub(name: str, text: str) -> str:
    """Replace what changes from run to run or machine to machine."""
    text = text.replace(str(REPO) + os.sep, "").replace(str(REPO), ".")
    if name == "findings.json":
        doc = json.loads(text)
        meta = doc["meta"]
        for key in ("started", "seconds", "propcheck", "fingerprint"):
            if key in meta:
                meta[key] = f"<{key}>"
        meta["libraries"] = "<libraries>"
        for record in doc["findings"]:  # iterative fits differ in the last digits between machines and BLAS builds
            for key, value in record.items():
                if isinstance(value, float):
                    record[key] = float(f"{value:.8g}")
        return json.dumps(doc, indent=2, ensure_ascii=False) + "\n"
    if name == "summary.md":
        text = re.sub(r"^- propcheck .*$", "- propcheck <versions>", text, flags=re.M)
        text = re.sub(r"^- started .*$", "- started <started>, <seconds> s", text, flags=re.M)
    if name == "junit.xml":
        text = re.sub(r'time="[^"]*"', 'time="0"', text)
    return text


@pytest.fixture(scope="module")
def outputs(tmp_path_factory):
    from propcheck.cli import main

    out = tmp_path_factory.mktemp("golden")
    cwd = os.getcwd()
    os.chdir(REPO)  # relative paths in the report, as a user would type them
    try:
        code = main(["check", "sample_db", "--out", str(out), "--quiet"])
    finally:
        os.chdir(cwd)
    assert code == 1
    return {name: scrub(name, (out / name).read_text(encoding="utf-8")) for name in FILES}


@pytest.mark.parametrize("name", FILES)
def test_golden(outputs, name):
    actual = outputs[name]
    golden = GOLDEN / name
    if UPDATE:
        golden.parent.mkdir(parents=True, exist_ok=True)
        golden.write_text(actual, encoding="utf-8")
    assert golden.exists(), f"no golden file {golden.relative_to(REPO)}; run PROPCHECK_UPDATE_GOLDEN=1 python -m pytest tests/test_golden.py"
    expected = golden.read_text(encoding="utf-8")
    if actual != expected:
        ACTUAL.mkdir(parents=True, exist_ok=True)
        (ACTUAL / name).write_text(actual, encoding="utf-8")
        diff = "".join(list(difflib.unified_diff(
            expected.splitlines(keepends=True), actual.splitlines(keepends=True),
            fromfile=f"tests/golden/sample_db/{name}", tofile=f"tests/actual/golden/{name}"))[:120])
        pytest.fail(f"{name} differs from its golden file (actual saved to tests/actual/golden/{name}; "
                    f"accept with PROPCHECK_UPDATE_GOLDEN=1 python -m pytest tests/test_golden.py):\n{diff}")


def test_scrub_removes_volatile_fields(outputs):
    # the scrubbed outputs carry no timestamp, duration or absolute path
    for name, text in outputs.items():
        assert not re.search(r"\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ", text), name
        assert str(REPO) not in text, name
