"""Every rule is documented, has a case file and a default-pack entry."""

from __future__ import annotations

import tomllib
from pathlib import Path

import pytest

from propcheck.rules.base import DOC_HEADINGS
from propcheck.rules.pack import default_pack_text
from propcheck.rules.registry import all_rules

CASES = Path(__file__).parent / "rules" / "cases"
DEFAULT = tomllib.loads(default_pack_text())["rules"]


@pytest.mark.parametrize("rule_id", list(all_rules()))
def test_rule_is_complete(rule_id):
    rule = all_rules()[rule_id]
    positions = [rule.doc.find(f"\n{heading}\n") for heading in DOC_HEADINGS]
    assert all(p > 0 for p in positions), f"{rule_id}: missing doc headings"
    assert positions == sorted(positions), f"{rule_id}: doc headings out of order"
    assert (CASES / f"{rule_id}.toml").is_file(), f"{rule_id}: no case file"
    entry = DEFAULT.get(rule_id)
    assert entry is not None, f"{rule_id}: not in rules/default.toml"
    assert entry["severity"] == rule.info.severity
    declared = set(rule.info.params)
    in_pack = set(entry) - {"enabled", "severity"}
    assert declared == in_pack, f"{rule_id}: params {declared} vs pack keys {in_pack}"


def test_default_pack_names_only_registered_rules():
    assert set(DEFAULT) == set(all_rules())


def test_rule_ids_are_slugs():
    import re

    for rule_id in all_rules():
        assert re.fullmatch(r"[a-z][a-z0-9]*(-[a-z0-9]+)+", rule_id), rule_id
