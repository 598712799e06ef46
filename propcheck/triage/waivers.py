"""Waiver files: findings a steward accepted, with a reason, an owner and an expiry.

A waiver file is TOML, one ``[[waiver]]`` table per waiver::

    [[waiver]]
    finding_id = "5c3e05c8b3a2432e"      # one finding ...
    reason = "vendor confirmed the value; correction due in BDS-2026-12"
    owner = "j.steward"
    expires = 2027-03-31                 # optional; the waiver holds through this date

    [[waiver]]
    rule = "cas-shared-by-ids"           # ... or a rule and a compound_id pattern (glob)
    compound = "LPC-00*"
    reason = "isomer pairs registered under one CAS number by design"
    owner = "data-team"

An expired waiver no longer accepts anything and fails the run.
"""

from __future__ import annotations

import datetime as dt
import fnmatch
import tomllib
from dataclasses import dataclass
from pathlib import Path

from propcheck.errors import UsageError

__all__ = ["Waiver", "read_waivers"]

KEYS = {
    "finding_id": "the finding accepted (from findings.json)",
    "rule": "rule id whose findings are accepted (with compound)",
    "compound": "compound_id pattern, shell-style glob (default '*')",
    "reason": "why the finding is accepted (required)",
    "owner": "who accepted it (required)",
    "expires": "last day the waiver holds, YYYY-MM-DD (optional)",
}


@dataclass(frozen=True)
class Waiver:
    """One accepted finding or family of findings."""

    name: str  # waiver[i] in the file, for messages
    reason: str
    owner: str
    finding_id: str | None = None
    rule: str | None = None
    compound: str = "*"
    expires: dt.date | None = None

    def expired(self, today: dt.date) -> bool:
        return self.expires is not None and self.expires < today

    def matches(self, finding_id: str, rule: str, compound_id: str | None) -> bool:
        if self.finding_id is not None:
            return finding_id == self.finding_id
        return rule == self.rule and fnmatch.fnmatchcase(compound_id or "", self.compound)

    def describe(self) -> str:
        what = f"finding {self.finding_id}" if self.finding_id else f"rule {self.rule}, compound {self.compound}"
        until = f", expires {self.expires.isoformat()}" if self.expires else ""
        return f"{self.name}: {what} (owner {self.owner}{until}): {self.reason}"


def _text(entry: dict, key: str, path: str, name: str, required: bool) -> str | None:
    value = entry.get(key)
    if value is None:
        if required:
            raise UsageError("required key is missing", file=path, key=f"{name}.{key}")
        return None
    if not isinstance(value, str) or not value.strip():
        raise UsageError("must be a non-empty string", file=path, key=f"{name}.{key}")
    return value.strip()


def _date(entry: dict, path: str, name: str) -> dt.date | None:
    value = entry.get("expires")
    if value is None:
        return None
    if isinstance(value, dt.datetime):
        return value.date()
    if isinstance(value, dt.date):
        return value
    if isinstance(value, str):
        try:
            return dt.date.fromisoformat(value.strip())
        except ValueError:
            pass
    raise UsageError("must be a date, YYYY-MM-DD", file=path, key=f"{name}.expires")


def read_waivers(path: str, known_rules: set[str] | None = None, option: str = "--waivers") -> list[Waiver]:
    """Read a waiver file; UsageError naming the file and key when unusable."""
    file = Path(path)
    if not file.is_file():
        raise UsageError("waiver file not found", file=path, option=option)
    try:
        doc = tomllib.loads(file.read_text(encoding="utf-8-sig"))
    except (OSError, UnicodeDecodeError) as exc:
        raise UsageError(f"cannot read waiver file ({exc})", file=path, option=option) from None
    except tomllib.TOMLDecodeError as exc:
        raise UsageError(f"not valid TOML ({exc})", file=path) from None
    unknown = sorted(set(doc) - {"waiver"})
    if unknown:
        raise UsageError("unknown key (waivers go in [[waiver]] tables)", file=path, key=unknown[0])
    entries = doc.get("waiver", [])
    if not isinstance(entries, list):
        raise UsageError("must be an array of tables ([[waiver]])", file=path, key="waiver")
    waivers = []
    for i, entry in enumerate(entries):
        name = f"waiver[{i}]"
        extra = sorted(set(entry) - set(KEYS))
        if extra:
            raise UsageError(f"unknown key (known: {', '.join(KEYS)})", file=path, key=f"{name}.{extra[0]}")
        finding_id = _text(entry, "finding_id", path, name, False)
        rule = _text(entry, "rule", path, name, False)
        compound = _text(entry, "compound", path, name, False)
        if (finding_id is None) == (rule is None):
            raise UsageError("give either finding_id or rule (with compound)", file=path, key=f"{name}.rule")
        if finding_id is not None and compound is not None:
            raise UsageError("compound goes with rule, not with finding_id", file=path, key=f"{name}.compound")
        if rule is not None and known_rules is not None and rule not in known_rules:
            raise UsageError("no such rule (see 'propcheck rules')", file=path, key=f"{name}.rule")
        waivers.append(Waiver(
            name=name,
            reason=_text(entry, "reason", path, name, True),
            owner=_text(entry, "owner", path, name, True),
            finding_id=finding_id,
            rule=rule,
            compound=compound or "*",
            expires=_date(entry, path, name),
        ))
    return waivers
