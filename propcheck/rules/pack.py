"""Rule packs: the default pack, a user's overrides and custom SQL rules.

A pack is TOML::

    [rules.vp-falls-with-temperature]     # a registered rule
    enabled = true
    severity = "error"                    # error | warning | info
    default_relative_uncertainty = 0.005  # one of the rule's parameters

    [custom.pc-below-one-bar]             # a rule of your own, as SQL
    title = "Critical pressure below 1 bar"
    severity = "warning"
    sql = "SELECT compound_id, 'pc' AS column, pc AS observed FROM compounds WHERE pc < 1e5"

The default pack (``rules/default.toml``) gives every rule's severity and
parameters; a user's pack may only name rules and keys that exist there.
"""

from __future__ import annotations

import copy
import re
import tomllib
from dataclasses import dataclass, field
from importlib import resources
from pathlib import Path
from typing import Any

from propcheck.errors import UsageError
from propcheck.findings import SEVERITIES
from propcheck.rules.registry import all_rules

__all__ = ["CustomRule", "Pack", "ResolvedRule", "default_pack_text", "load_pack", "settings_in_effect"]

SLUG = re.compile(r"^[a-z][a-z0-9]*(-[a-z0-9]+)*$")
CUSTOM_KEYS = {
    "title": "one line saying what the rule flags",
    "severity": "error, warning or info",
    "sql": "a SELECT over the canonical tables; each row becomes a finding",
    "message": "text for findings whose row has no message column",
    "table": "table named in the findings (default compounds)",
    "column": "column named in findings whose row has no column column",
    "reference": "the method or source behind the rule",
    "enabled": "false to switch the rule off",
}


@dataclass
class ResolvedRule:
    """A registered rule with the pack's settings applied."""

    id: str
    enabled: bool
    severity: str
    params: dict[str, Any]


@dataclass
class CustomRule:
    """A user's rule written as SQL."""

    id: str
    title: str
    severity: str
    sql: str
    message: str | None = None
    table: str = "compounds"
    column: str | None = None
    reference: str | None = None
    enabled: bool = True
    origin: str = ""


@dataclass
class Pack:
    """Resolved settings for every rule, plus custom rules."""

    rules: dict[str, ResolvedRule]
    custom: dict[str, CustomRule] = field(default_factory=dict)
    files: list[str] = field(default_factory=list)

    def enabled(self, rule_id: str) -> bool:
        rule = self.rules.get(rule_id)
        return bool(rule and rule.enabled)

    def params(self, rule_id: str) -> dict[str, Any]:
        return self.rules[rule_id].params


def default_pack_text() -> str:
    """Return the text of the shipped default pack."""
    try:
        return (resources.files("propcheck.packs") / "default.toml").read_text(encoding="utf-8")
    except (ModuleNotFoundError, FileNotFoundError):  # running from a source tree
        return (Path(__file__).resolve().parents[2] / "rules" / "default.toml").read_text(encoding="utf-8")


def _read_toml(text: str, where: str) -> dict:
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise UsageError(f"not valid TOML ({exc})", file=where) from None


def load_pack(user_path: str | None = None) -> Pack:
    """Resolve the default pack, overlaid with ``user_path`` when given."""
    default_doc = _read_toml(default_pack_text(), "rules/default.toml")
    pack = _from_default(default_doc)
    pack.files.append("rules/default.toml (built in)")
    if user_path is not None:
        path = Path(user_path)
        if not path.is_file():
            raise UsageError("rule pack not found", file=user_path, option="--rules")
        try:
            text = path.read_text(encoding="utf-8-sig")
        except (OSError, UnicodeDecodeError) as exc:
            raise UsageError(f"cannot read rule pack ({exc})", file=user_path) from None
        _overlay(pack, _read_toml(text, user_path), user_path)
        pack.files.append(user_path)
    return pack


def settings_in_effect(pack: Pack | None, rule_id: str) -> dict:
    """The rule's parameters in the run's pack, or in the built-in pack when the run does not use the rule.

    For code that borrows a sibling rule's judgement (its tolerance) whether or not that rule runs.
    """
    if pack is None or not pack.enabled(rule_id):
        pack = load_pack()
    return pack.params(rule_id)


def _from_default(doc: dict) -> Pack:
    registry = all_rules()
    rules = {}
    section = doc.get("rules", {})
    for rule_id, rule in registry.items():
        entry = copy.deepcopy(section.get(rule_id, {}))
        rules[rule_id] = ResolvedRule(
            id=rule_id,
            enabled=entry.pop("enabled", True),
            severity=entry.pop("severity", rule.info.severity),
            params=entry,
        )
    return Pack(rules=rules)


def _same_kind(default: Any, value: Any) -> bool:
    if isinstance(default, bool) or isinstance(value, bool):
        return isinstance(default, bool) and isinstance(value, bool)
    if isinstance(default, (int, float)):
        return isinstance(value, (int, float))
    if isinstance(default, list):
        if not default:  # an empty default list takes a list of text of any length
            return isinstance(value, list) and all(isinstance(v, str) for v in value)
        return isinstance(value, list) and len(value) == len(default) and all(
            _same_kind(d, v) for d, v in zip(default, value)
        )
    return isinstance(value, type(default))


def _merge_param(default: Any, value: Any, where: str, rule_id: str, key: str) -> Any:
    if isinstance(default, dict):
        if not isinstance(value, dict):
            raise UsageError("must be a table", file=where, rule=rule_id, key=key)
        merged = dict(default)
        for sub, sub_value in value.items():
            if sub not in default:
                known = ", ".join(default)
                raise UsageError(f"unknown key (known: {known})", file=where, rule=rule_id, key=f"{key}.{sub}")
            merged[sub] = _merge_param(default[sub], sub_value, where, rule_id, f"{key}.{sub}")
        return merged
    if not _same_kind(default, value):
        raise UsageError(f"must be like the default {default!r}", file=where, rule=rule_id, key=key)
    return value


def _check_severity(value: Any, where: str, rule_id: str) -> str:
    if value not in SEVERITIES:
        raise UsageError(f"severity must be one of {', '.join(SEVERITIES)}", file=where, rule=rule_id, key="severity")
    return value


def _overlay(pack: Pack, doc: dict, where: str) -> None:
    for top, body in doc.items():
        if top == "pack":
            continue  # free-form description of the pack
        if top not in ("rules", "custom") or not isinstance(body, dict):
            raise UsageError("unknown section (known: pack, rules, custom)", file=where, key=top)
        for rule_id, entry in body.items():
            if not isinstance(entry, dict):
                raise UsageError("must be a table", file=where, rule=rule_id)
            if top == "rules":
                _overlay_rule(pack, rule_id, entry, where)
            else:
                _add_custom(pack, rule_id, entry, where)


def _overlay_rule(pack: Pack, rule_id: str, entry: dict, where: str) -> None:
    rule = pack.rules.get(rule_id)
    if rule is None:
        raise UsageError("unknown rule (see 'propcheck rules')", file=where, rule=rule_id)
    for key, value in entry.items():
        if key == "enabled":
            if not isinstance(value, bool):
                raise UsageError("must be true or false", file=where, rule=rule_id, key=key)
            rule.enabled = value
        elif key == "severity":
            rule.severity = _check_severity(value, where, rule_id)
        elif key in rule.params:
            rule.params[key] = _merge_param(rule.params[key], value, where, rule_id, key)
        else:
            known = ", ".join(["enabled", "severity", *rule.params])
            raise UsageError(f"unknown key (known: {known})", file=where, rule=rule_id, key=key)


def _add_custom(pack: Pack, rule_id: str, entry: dict, where: str) -> None:
    if not SLUG.match(rule_id):
        raise UsageError("a rule id is a lower-case slug such as 'pc-below-one-bar'", file=where, rule=rule_id)
    if rule_id in pack.rules or rule_id in pack.custom:
        raise UsageError("a rule with this id exists already", file=where, rule=rule_id)
    for key in entry:
        if key not in CUSTOM_KEYS:
            raise UsageError(f"unknown key (known: {', '.join(CUSTOM_KEYS)})", file=where, rule=rule_id, key=key)
    for key in ("title", "sql"):
        if not isinstance(entry.get(key), str) or not entry[key].strip():
            raise UsageError("required, a non-empty string", file=where, rule=rule_id, key=key)
    pack.custom[rule_id] = CustomRule(
        id=rule_id,
        title=entry["title"],
        severity=_check_severity(entry.get("severity", "warning"), where, rule_id),
        sql=entry["sql"],
        message=entry.get("message"),
        table=entry.get("table", "compounds"),
        column=entry.get("column"),
        reference=entry.get("reference"),
        enabled=bool(entry.get("enabled", True)),
        origin=where,
    )
