"""Command line: ``propcheck check | rules | explain``.

One ``main()`` maps every outcome to an exit status: 0 clean, 1 findings at
or above ``--fail-on``, 2 unusable input or options (one line on stderr),
3 an internal failure (a bug; say so, never exit 1 for it).
"""

from __future__ import annotations

import argparse
import json
import os
import sys
import traceback

from propcheck import __version__
from propcheck.errors import EXIT_INTERNAL, EXIT_USAGE, PropcheckError, UsageError

__all__ = ["main"]

EPILOG = """exit status:
  0  no finding reaches --fail-on
  1  at least one finding reaches --fail-on
  2  the input or the options cannot be used (one line on stderr says where)
  3  propcheck itself failed (a bug; please report it)

examples:
  propcheck check sample_db --out report/
  propcheck check delivery/ --config delivery/propcheck.toml --rules my-pack.toml --fail-on warning
  propcheck rules
  propcheck explain vp-falls-with-temperature
"""


class _Parser(argparse.ArgumentParser):
    def error(self, message: str):  # one line, exit 2
        raise UsageError(f"{message} (see 'propcheck --help')")


def _parser() -> argparse.ArgumentParser:
    parser = _Parser(
        prog="propcheck",
        description="Audit a pure-compound property database: schema, consistency, discrepancy report.",
        epilog=EPILOG,
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("--version", action="version", version=f"propcheck {__version__}")
    sub = parser.add_subparsers(dest="command", metavar="COMMAND", parser_class=_Parser)

    check = sub.add_parser("check", help="check a database and write the report", epilog=EPILOG,
                           formatter_class=argparse.RawDescriptionHelpFormatter)
    check.add_argument("source", help="folder of .csv/.parquet files, or a .duckdb file")
    check.add_argument("--out", default="propcheck-report", help="folder for the report files (default: %(default)s)")
    check.add_argument("--config", help="mapping file (TOML); default: propcheck.toml beside the data, if any")
    check.add_argument("--rules", help="rule pack (TOML) overriding rules/default.toml")
    check.add_argument("--fail-on", choices=("error", "warning", "info", "none"), default="error",
                       help="lowest severity that makes the run fail with exit 1 (default: %(default)s)")
    check.add_argument("--quiet", action="store_true", help="print nothing but errors")

    rules = sub.add_parser("rules", help="list every rule")
    rules.add_argument("--rules", help="rule pack to apply (shows its severities and custom rules)")
    rules.add_argument("--json", action="store_true", help="machine-readable output")

    explain = sub.add_parser("explain", help="explain one rule: what, method, tolerances")
    explain.add_argument("rule", help="rule id, e.g. vp-falls-with-temperature")
    explain.add_argument("--rules", help="rule pack whose parameters to show")
    explain.add_argument("--json", action="store_true", help="machine-readable output")
    return parser


def _progress(quiet: bool):
    if quiet or not sys.stderr.isatty():
        return lambda message: None
    return lambda message: print(f"propcheck: {message} ...", file=sys.stderr, flush=True)


def _cmd_check(args) -> int:
    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data, write_reports
    from propcheck.report.terminal import render_terminal

    result = run_check(args.source, args.config, args.rules, progress=_progress(args.quiet))
    data = build_report_data(result, fail_on=args.fail_on)
    write_reports(data, args.out)
    if not args.quiet:
        print(render_terminal(data, args.out))
    return data.exit_code


def _cmd_rules(args) -> int:
    from propcheck.rules.pack import load_pack
    from propcheck.rules.registry import all_rules

    pack = load_pack(args.rules)
    rows = [
        {"id": r.id, "severity": pack.rules[r.id].severity, "enabled": pack.rules[r.id].enabled,
         "stage": r.info.stage, "title": r.info.title}
        for r in all_rules().values()
    ]
    rows += [
        {"id": c.id, "severity": c.severity, "enabled": c.enabled, "stage": "custom", "title": c.title}
        for c in pack.custom.values()
    ]
    if args.json:
        print(json.dumps(rows, indent=2))
        return 0
    for row in rows:
        state = row["severity"] if row["enabled"] else "off"
        print(f"{row['id']:<28} {state:<8} {row['stage']:<12} {row['title']}")
    return 0


def _cmd_explain(args) -> int:
    from propcheck.rules.pack import load_pack
    from propcheck.rules.registry import all_rules

    pack = load_pack(args.rules)
    rule = all_rules().get(args.rule)
    if rule is None:
        custom = pack.custom.get(args.rule)
        if custom is None:
            raise UsageError("no such rule (see 'propcheck rules')", rule=args.rule)
        if args.json:
            print(json.dumps(custom.__dict__, indent=2))
        else:
            print(f"{custom.id}: {custom.title}\n\ncustom SQL rule from {custom.origin}, severity {custom.severity}\n\n{custom.sql}")
        return 0
    resolved = pack.rules[rule.id]
    if args.json:
        print(json.dumps({
            "id": rule.id, "title": rule.info.title, "severity": resolved.severity, "enabled": resolved.enabled,
            "stage": rule.info.stage, "method": rule.info.method, "reference": rule.info.reference,
            "params": resolved.params, "doc": rule.doc,
        }, indent=2))
        return 0
    print(f"{rule.id}: {rule.info.title}")
    print(f"severity {resolved.severity}{'' if resolved.enabled else ' (disabled)'}; stage {rule.info.stage}")
    print(f"method: {rule.info.method}\n")
    print(rule.doc)
    if resolved.params:
        print("\nParameters in effect:")
        for key, value in resolved.params.items():
            meaning = rule.info.params.get(key, "")
            print(f"  {key} = {json.dumps(value)}    # {meaning}")
    return 0


def main(argv: list[str] | None = None) -> int:
    """Run the command line; return the exit status."""
    try:
        args = _parser().parse_args(argv)
        if args.command is None:
            _parser().print_help()
            return EXIT_USAGE
        return {"check": _cmd_check, "rules": _cmd_rules, "explain": _cmd_explain}[args.command](args)
    except PropcheckError as exc:
        print(f"propcheck: error: {exc}", file=sys.stderr)
        return exc.exit_code
    except KeyboardInterrupt:
        print("propcheck: interrupted", file=sys.stderr)
        return 130
    except Exception as exc:  # a bug in propcheck, never the user's data
        if os.environ.get("PROPCHECK_DEBUG"):
            traceback.print_exc()
        where = traceback.extract_tb(exc.__traceback__)[-1]
        print(
            f"propcheck: internal error (a bug, not a problem with your data): {type(exc).__name__}: {exc} "
            f"[{os.path.basename(where.filename)}:{where.lineno}]; set PROPCHECK_DEBUG=1 for the traceback",
            file=sys.stderr,
        )
        return EXIT_INTERNAL
