"""Write every report format into the output folder, never leaving half a file."""

from __future__ import annotations

import os
import tempfile
from pathlib import Path

from propcheck.errors import UsageError
from propcheck.report.data import ReportData
from propcheck.report.corrections_csv import render_corrections
from propcheck.report.findings_csv import render_csv
from propcheck.report.findings_json import render_json
from propcheck.report.html import render_html
from propcheck.report.junit import render_junit
from propcheck.report.summary_md import render_summary

__all__ = ["atomic_write", "write_reports"]

WRITERS = {
    "findings.csv": render_csv,
    "findings.json": render_json,
    "summary.md": render_summary,
    "report.html": render_html,
    "corrections.csv": render_corrections,
    "junit.xml": render_junit,
}


def _umask() -> int:
    """The process's umask; read from /proc where it can be, without changing it even briefly."""
    try:
        for line in Path("/proc/self/status").read_text().splitlines():
            if line.startswith("Umask:"):
                return int(line.split()[1], 8)
    except (OSError, ValueError):
        pass
    mask = os.umask(0o022)
    os.umask(mask)
    return mask


def atomic_write(path: Path, text: str) -> None:
    """Write ``text`` to a temporary file beside ``path``, then rename it over ``path``.

    The file gets the permissions of any new file (0666 less the umask), not the
    owner-only 0600 of a temporary file, so CI jobs and colleagues can read it.
    """
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", dir=path.parent)
    try:
        with os.fdopen(fd, "w", encoding="utf-8", newline="") as handle:
            handle.write(text)
        os.chmod(tmp, 0o666 & ~_umask())
        os.replace(tmp, path)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise


def write_reports(data: ReportData, out_dir: str) -> list[Path]:
    """Write findings.csv, findings.json, summary.md and report.html into ``out_dir``."""
    folder = Path(out_dir)
    if folder.exists() and not folder.is_dir():
        raise UsageError("exists and is not a folder", file=out_dir, option="--out")
    try:
        folder.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        raise UsageError(f"cannot create the output folder ({exc.strerror})", file=out_dir, option="--out") from None
    written = []
    for name, render in WRITERS.items():
        path = folder / name
        atomic_write(path, render(data))
        written.append(path)
    return written
