"""One way to format values in every report."""

from __future__ import annotations

import math

__all__ = ["fmt"]


def fmt(value) -> str:
    """Floats with 10 significant digits, missing as empty, everything else as text."""
    if value is None:
        return ""
    if isinstance(value, float):
        if math.isnan(value):
            return ""
        return format(value, ".10g")
    return str(value)
