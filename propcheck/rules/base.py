"""What every rule declares: its id, title, severity, method and parameters."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any, Callable, Iterable

import pandas as pd

from propcheck.findings import Finding

__all__ = ["DOC_HEADINGS", "Rule", "RuleInfo"]

# Every rule docstring carries these headings, in this order.
DOC_HEADINGS = (
    "What it checks",
    "Why it matters",
    "Method",
    "Parameters",
    "Example finding",
    "References",
)

STAGES = ("load", "schema", "consistency", "custom")


@dataclass(frozen=True)
class RuleInfo:
    """A rule's metadata.

    ``params`` maps each rule-pack key to its meaning; its default value lives
    in ``rules/default.toml`` beside the reason for it.
    """

    id: str
    title: str
    severity: str
    stage: str
    method: str
    reference: str
    params: dict[str, str] = field(default_factory=dict)


CheckFn = Callable[[Any, dict], "pd.DataFrame | Iterable[Finding]"]


@dataclass(frozen=True)
class Rule:
    """A registered rule: metadata, documentation and (for data rules) a check."""

    info: RuleInfo
    doc: str
    check: CheckFn | None = None  # None: the load or schema stage applies it

    @property
    def id(self) -> str:
        return self.info.id
