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
from propcheck.cli_ci import add_check_options, add_commands, cmd_baseline, cmd_check, cmd_compare
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
    check.add_argument("source", help="folder of .csv/.parquet files, a .duckdb/.sqlite/.db/.xlsx file, or a postgresql:// URL")
    check.add_argument("--out", default="propcheck-report", help="folder for the report files (default: %(default)s)")
    check.add_argument("--config", help="mapping file (TOML); default: propcheck.toml beside the data, if any")
    check.add_argument("--rules", help="rule pack (TOML) overriding rules/default.toml")
    check.add_argument("--fail-on", choices=("error", "warning", "info", "none"), default="error",
                       help="lowest severity that makes the run fail with exit 1 (default: %(default)s)")
    check.add_argument("--quiet", action="store_true", help="print nothing but errors")
    add_check_options(check)

    rules = sub.add_parser("rules", help="list every rule")
    rules.add_argument("--rules", help="rule pack to apply (shows its severities and custom rules)")
    rules.add_argument("--json", action="store_true", help="machine-readable output")

    explain = sub.add_parser("explain", help="explain one rule: what, method, tolerances")
    explain.add_argument("rule", help="rule id, e.g. vp-falls-with-temperature")
    explain.add_argument("--rules", help="rule pack whose parameters to show")
    explain.add_argument("--json", action="store_true", help="machine-readable output")

    init = sub.add_parser("init", help="propose a mapping file for a database with unknown names and units")
    init.add_argument("source", help="folder, .duckdb/.sqlite/.db/.xlsx file, or postgresql:// URL")
    init.add_argument("--out", default="propcheck.toml", help="mapping file to write (default: %(default)s)")
    init.add_argument("--force", action="store_true", help="overwrite --out if it exists")
    add_commands(sub)
    return parser


def _progress(quiet: bool):
    if quiet or not sys.stderr.isatty():
        return lambda message: None
    return lambda message: print(f"propcheck: {message} ...", file=sys.stderr, flush=True)


def _cmd_check(args) -> int:
    return cmd_check(args)  # propcheck/cli_ci.py: baseline, waivers, history, progress bar


def _cmd_init(args) -> int:
    from pathlib import Path

    from propcheck.load.propose import propose_mapping, render_mapping

    out = Path(args.out)
    if out.exists() and not args.force:
        raise UsageError("file exists; give another --out or --force", file=str(out), option="--out")
    proposals = propose_mapping(args.source)
    if not proposals:
        raise UsageError("no table looks like compounds (an id and a name column); write the mapping by hand",
                         file=args.source if "://" not in args.source else None)
    out.write_text(render_mapping(args.source, proposals), encoding="utf-8")
    print(f"propcheck: wrote {out}; review every line, then run: propcheck check SOURCE --config {out}")
    return 0


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
        return {"check": _cmd_check, "rules": _cmd_rules, "explain": _cmd_explain, "init": _cmd_init,
                "baseline": cmd_baseline, "compare": cmd_compare}[args.command](args)
    except PropcheckError as exc:
        print(f"propcheck: error: {exc}", file=sys.stderr)
        return exc.exit_code
    except KeyboardInterrupt:
        print("propcheck: interrupted", file=sys.stderr)
        return 130
    except BrokenPipeError:  # stdout closed by its reader (`propcheck rules | head`): nothing left to say
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return 0
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
