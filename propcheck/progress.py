"""A progress bar on stderr for long runs, drawn only when stderr is a terminal."""

from __future__ import annotations

import sys
from typing import TextIO

__all__ = ["ProgressBar"]


class ProgressBar:
    """Callable taking the pipeline's stage messages; draws ``[####....] 5/14 message``.

    ``total`` is the number of messages expected (load, schema, one per rule);
    the bar never runs past it and is cleared by :meth:`close`.
    """

    def __init__(self, total: int, stream: TextIO | None = None, width: int = 28) -> None:
        self.total = max(total, 1)
        self.stream = stream or sys.stderr
        self.width = width
        self.done = 0

    def __call__(self, message: str) -> None:
        self.done = min(self.done + 1, self.total)
        filled = round(self.width * self.done / self.total)
        bar = "#" * filled + "." * (self.width - filled)
        text = f"\rpropcheck [{bar}] {self.done}/{self.total} {message}"[:120]
        self.stream.write(text.ljust(120) + "\r")
        self.stream.flush()

    def close(self) -> None:
        self.stream.write("\r" + " " * 120 + "\r")
        self.stream.flush()
