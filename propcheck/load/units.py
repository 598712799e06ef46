"""Unit conversion of mapped columns to canonical SI units (pint).

The only module that imports pint. Every supported conversion is affine,
``canonical = scale * value + offset``, so it runs as one SQL expression over
a whole column.
"""

from __future__ import annotations

from functools import lru_cache

__all__ = ["affine_to_canonical"]


@lru_cache(maxsize=1)
def _registry():
    import pint

    ureg = pint.UnitRegistry(autoconvert_offset_to_baseunit=True)
    # pint has no pound-mole; molar masses in lb/lbmol equal g/mol.
    ureg.define("lbmol = 453.59237 * mol")
    return ureg


def affine_to_canonical(unit: str, canonical: str) -> tuple[float, float]:
    """Return ``(scale, offset)`` converting ``unit`` to ``canonical``.

    Raises ValueError with a short reason when pint does not know ``unit`` or
    its dimension differs from the canonical one.

    Examples
    --------
    >>> affine_to_canonical("degC", "K")     # common practice: t/K = t/degC + 273.15
    (1.0, 273.15)
    >>> affine_to_canonical("kPa", "Pa")
    (1000.0, 0.0)
    """
    import pint

    ureg = _registry()
    try:
        src = ureg.Unit(unit)
    except (pint.errors.UndefinedUnitError, AttributeError, TypeError, ValueError, AssertionError) as exc:
        raise ValueError(f"unknown unit {unit!r}") from exc
    except Exception as exc:  # pint raises assorted parser errors
        raise ValueError(f"unknown unit {unit!r}") from exc
    dst = ureg.Unit(canonical)
    if src.dimensionality != dst.dimensionality:
        raise ValueError(
            f"unit {unit!r} is {src.dimensionality}, but the column needs {dst.dimensionality} ({canonical})"
        )
    zero = ureg.Quantity(0.0, src).to(dst).magnitude
    thousand = ureg.Quantity(1000.0, src).to(dst).magnitude
    scale = float(thousand - zero) / 1000.0
    offset = float(zero)
    # Drop floating-point dust so that exact factors stay exact.
    return float(f"{scale:.15g}"), float(f"{offset:.15g}")
