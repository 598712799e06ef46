"""Exit statuses and the one-line errors that map to them.

Every problem with the user's input or options is a :class:`UsageError`
carrying where it happened (file, table, row, column, option); the CLI prints
its one-line message on stderr and exits with :data:`EXIT_USAGE`.
"""

from __future__ import annotations

__all__ = [
    "EXIT_CLEAN",
    "EXIT_FINDINGS",
    "EXIT_INTERNAL",
    "EXIT_USAGE",
    "PropcheckError",
    "UsageError",
]

EXIT_CLEAN = 0  # no finding at or above --fail-on
EXIT_FINDINGS = 1  # at least one finding at or above --fail-on
EXIT_USAGE = 2  # input or options cannot be used
EXIT_INTERNAL = 3  # propcheck itself failed (a bug)


class PropcheckError(Exception):
    """Base class for errors propcheck reports to the user."""

    exit_code = EXIT_INTERNAL


class UsageError(PropcheckError):
    """The input or the options cannot be used.

    Parameters
    ----------
    reason : str
        What is wrong, in a few words.
    file, table, row, column, option, rule, key : optional
        Where it is wrong; every field given is named in the message.
    """

    exit_code = EXIT_USAGE

    def __init__(
        self,
        reason: str,
        *,
        file: str | None = None,
        table: str | None = None,
        row: int | None = None,
        column: str | None = None,
        option: str | None = None,
        rule: str | None = None,
        key: str | None = None,
    ) -> None:
        self.reason = reason
        self.file = file
        self.table = table
        self.row = row
        self.column = column
        self.option = option
        self.rule = rule
        self.key = key
        super().__init__(self.one_line())

    def one_line(self) -> str:
        """Return ``place: reason`` on a single line."""
        parts = []
        for label, value in (
            ("file", self.file),
            ("table", self.table),
            ("row", self.row),
            ("column", self.column),
            ("option", self.option),
            ("rule", self.rule),
            ("key", self.key),
        ):
            if value is not None:
                parts.append(f"{label} {value}")
        place = ", ".join(parts)
        text = f"{place}: {self.reason}" if place else self.reason
        return " ".join(text.split())
