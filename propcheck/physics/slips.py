"""Candidate repairs of one numeric value: the usual unit and clerical slips.

The shared mechanism behind every slip suggestion: for a suspect value of a
column, list what it would have been under each usual slip (a unit entered
as the canonical one, two adjacent digits transposed, a decimal point
shifted). Judging which candidate makes the row consistent is the caller's
job (``propcheck.diagnose``); this module only enumerates, in canonical SI
units. Pressure and temperature factors are those of
:mod:`propcheck.physics.unit_slips`.
"""

from __future__ import annotations

from propcheck.physics.unit_slips import PRESSURE_SLIPS, TEMPERATURE_SLIPS

__all__ = ["QUANTITY", "transpositions", "unit_candidates", "value_candidates"]

# The kind of quantity in each numeric column of compounds.
QUANTITY = {
    "tc": "temperature", "tb": "temperature", "tm": "temperature",
    "pc": "pressure", "vc": "volume", "molar_mass": "molar_mass",
    "omega": "dimensionless", "zc": "dimensionless",
}

# corrected = observed * factor (SI brochure 2019: L = dm3, exact).
_FACTORS = {
    "molar_mass": ((1e3, "kg/mol entered as g/mol"), (1e-3, "mg/mol or a value 1000x too large")),
    "volume": (
        (1e-6, "cm3/mol entered as m3/mol"), (1e-3, "L/mol entered as m3/mol"),
        (1e6, "m3/mol read as cm3/mol, converted twice"), (1e3, "m3/mol read as L/mol, converted twice"),
    ),
    "dimensionless": ((10.0, "decimal point shifted (10x too small)"), (0.1, "decimal point shifted (10x too large)")),
}


def unit_candidates(column: str, value: float) -> list[tuple[str, float]]:
    """(what happened, corrected value) for each unit slip of ``column``.

    Examples
    --------
    n-hexane pc 3.025 MPa (IUPAC) stored as 3025 (kPa entered as Pa):

    >>> [(w, round(v)) for w, v in unit_candidates("pc", 3025.0) if w.startswith("kPa")]
    [('kPa entered as Pa', 3025000)]
    """
    kind = QUANTITY.get(column)
    if kind == "pressure":
        return [(what, value / factor) for factor, what in PRESSURE_SLIPS]
    if kind == "temperature":
        return [(what, float(convert(value))) for what, convert in TEMPERATURE_SLIPS]
    return [(what, value * factor) for factor, what in _FACTORS.get(kind, ())]


def transpositions(value: float) -> list[float]:
    """Values reached by swapping two adjacent digits of ``value`` as written.

    Examples
    --------
    Benzene tc 562.05 K (IUPAC) mistyped as 526.05:

    >>> 562.05 in transpositions(526.05)
    True
    """
    text = format(value, ".10g")
    if "e" in text:
        return []
    out = []
    for i in range(len(text) - 1):
        a, b = text[i], text[i + 1]
        if a.isdigit() and b.isdigit() and a != b:
            swapped = text[:i] + b + a + text[i + 2:]
            number = float(swapped)
            if number > 0 and number not in out:
                out.append(number)
    return out


def value_candidates(column: str, value: float) -> list[tuple[str, float]]:
    """Every single-value slip of ``column``: unit slips, then transposed digits."""
    found = [(f"{what}?", v) for what, v in unit_candidates(column, value)]
    found += [(f"transposed digits ({format(value, '.10g')} for {format(v, '.10g')})?", v)
              for v in transpositions(value)]
    return found
