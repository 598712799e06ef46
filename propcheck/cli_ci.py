"""Command-line parts for CI and stewards: check options, ``baseline`` and ``compare``.

Kept apart from :mod:`propcheck.cli` so that the front end stays a thin map
from commands to exit statuses.
"""

from __future__ import annotations

import argparse
import sys

__all__ = ["add_check_options", "add_commands", "cmd_baseline", "cmd_check", "cmd_compare", "progress_for"]


def add_check_options(check: argparse.ArgumentParser) -> None:
    """Options of ``propcheck check`` for CI gating and history."""
    check.add_argument("--baseline", metavar="FILE",
                       help="baseline (JSON from 'propcheck baseline' or a findings.json): its findings do not fail the run")
    check.add_argument("--waivers", metavar="FILE", help="waiver file (TOML): accepted findings with reason, owner, expiry")
    check.add_argument("--history", metavar="FILE.duckdb", help="append this run to a history file; the report shows the last runs")


def add_commands(sub) -> None:
    """Add ``baseline`` and ``compare`` to the subcommands."""
    base = sub.add_parser("baseline", help="write a baseline from a run (or from a findings.json)")
    base.add_argument("source", help="database to check (folder, .duckdb, ...) or a findings.json")
    base.add_argument("--out", required=True, help="baseline file to write (JSON)")
    base.add_argument("--config", help="mapping file (TOML)")
    base.add_argument("--rules", help="rule pack (TOML)")
    base.add_argument("--quiet", action="store_true", help="print nothing but errors")

    comp = sub.add_parser("compare", help="audit an incoming delivery against the current database")
    comp.add_argument("current", help="the current database")
    comp.add_argument("incoming", help="the incoming delivery")
    comp.add_argument("--out", default="propcheck-compare", help="folder for the comparison (default: %(default)s)")
    comp.add_argument("--config", help="mapping file for CURRENT")
    comp.add_argument("--incoming-config", help="mapping file for INCOMING (default: --config)")
    comp.add_argument("--rules", help="rule pack (TOML)")
    comp.add_argument("--rtol", type=float, default=1e-6,
                      help="relative difference beyond which a value counts as changed (default: %(default)s)")
    comp.add_argument("--full", action="store_true",
                      help="INCOMING is the whole new database (what it lacks is removed), not a delivery of some rows")
    comp.add_argument("--fail-on", choices=("error", "warning", "info", "none"), default="error",
                      help="lowest severity of a finding on incoming rows that fails the run (default: %(default)s)")
    comp.add_argument("--quiet", action="store_true", help="print nothing but errors")


def progress_for(quiet: bool, rules_path: str | None = None):
    """A progress bar on stderr when it is a terminal; otherwise a no-op (returns callback, close)."""
    if quiet or not sys.stderr.isatty():
        return (lambda message: None), (lambda: None)
    from propcheck.progress import ProgressBar
    from propcheck.rules.pack import load_pack

    try:
        pack = load_pack(rules_path)
        total = 2 + sum(1 for r in pack.rules.values() if r.enabled) + sum(1 for c in pack.custom.values() if c.enabled)
    except Exception:  # the pipeline reports a bad pack properly; the bar only needs an estimate
        total = 20
    bar = ProgressBar(total)
    return bar, bar.close


def cmd_check(args) -> int:
    from propcheck.history import append_run, read_history
    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data, write_reports
    from propcheck.report.terminal import render_terminal
    from propcheck.rules.registry import all_rules
    from propcheck.triage import read_baseline, read_waivers

    baseline = read_baseline(args.baseline) if getattr(args, "baseline", None) else None
    waivers = None
    if getattr(args, "waivers", None):
        from propcheck.rules.pack import load_pack

        known = set(all_rules()) | set(load_pack(args.rules).custom)
        waivers = read_waivers(args.waivers, known_rules=known)
    progress, close = progress_for(args.quiet, args.rules)
    try:
        result = run_check(args.source, args.config, args.rules, progress=progress)
    finally:
        close()
    data = build_report_data(result, fail_on=args.fail_on, baseline=baseline, waivers=waivers,
                             waiver_path=getattr(args, "waivers", None))
    if getattr(args, "history", None):
        append_run(args.history, data.findings, data.meta, result.fingerprint, data.exit_code, result.started)
        data.history = read_history(args.history)
    write_reports(data, args.out)
    if not args.quiet:
        try:
            print(render_terminal(data, args.out), flush=True)
        except BrokenPipeError:  # the reader of stdout went away (e.g. `| head`): the exit status still counts
            _silence_stdout()
    for reason in data.fail_reasons:
        if reason.startswith("waiver expired"):
            print(f"propcheck: {reason}", file=sys.stderr)
    return data.exit_code


def cmd_baseline(args) -> int:
    from pathlib import Path

    from propcheck.report.write import atomic_write
    from propcheck.triage.baseline import read_baseline, render_baseline

    source = Path(args.source)
    if source.is_file() and source.suffix.lower() == ".json":
        import pandas as pd

        known = read_baseline(args.source, option="SOURCE")
        frame = pd.DataFrame(list(known.entries.values()))
        text = render_baseline(frame, args.source)
    else:
        from propcheck.pipeline import run_check

        progress, close = progress_for(args.quiet, args.rules)
        try:
            result = run_check(args.source, args.config, args.rules, progress=progress)
        finally:
            close()
        frame = result.findings
        text = render_baseline(frame, args.source, created=result.started)
    out = Path(args.out)
    if out.parent and not out.parent.exists():
        from propcheck.errors import UsageError

        raise UsageError("folder of the baseline file does not exist", file=args.out, option="--out")
    atomic_write(out, text)
    if not args.quiet:
        print(f"propcheck: baseline of {len(frame)} findings written to {args.out}")
    return 0


def cmd_compare(args) -> int:
    from propcheck.compare import run_compare
    from propcheck.compare.write import render_compare_terminal, write_compare

    result = run_compare(args.current, args.incoming, current_config=args.config,
                         incoming_config=args.incoming_config or args.config, rules_path=args.rules,
                         rtol=args.rtol, fail_on=args.fail_on, full=args.full)
    write_compare(result, args.out)
    if not args.quiet:
        print(render_compare_terminal(result, args.out))
    return result.exit_code


def _silence_stdout() -> None:
    """Point stdout at /dev/null so that Python's exit flush does not fail again."""
    import os

    devnull = os.open(os.devnull, os.O_WRONLY)
    os.dup2(devnull, sys.stdout.fileno())
