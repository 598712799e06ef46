"""A value lies outside the physically possible range for its column.

What it checks
    Every numeric column of ``compounds`` and ``vapor_pressure`` against the
    inclusive bounds in the rule pack.

Why it matters
    Negative pressures, a zero molar mass or an acentric factor of 30 are not
    data but slips (unit mix-ups, shifted columns). Out-of-range cells are
    withheld from later checks so they cannot distort them; an out-of-range
    ``t`` or ``p`` rejects its vapor-pressure row.

Method
    Inclusive range test per column in canonical SI units. The bounds are
    deliberately wide: they bracket every real pure compound (helium to heavy
    organics) so that a finding here is a gross error, not a borderline
    value. Finer, physics-based bands are separate rules.

Parameters
    compounds
        Table of ``column = [low, high]`` for the compounds table.
    vapor_pressure
        Table of ``column = [low, high]`` for the vapor_pressure table.
    boiling_points
        Table of ``column = [low, high]`` for the boiling_points table.

Example finding
    n-Hexane (pc 3.025 MPa, IUPAC) with a minus sign:
    ``compounds.csv row 6, column pc: -3.025e+06 is outside [100000, 2e+08] Pa``

References
    1. Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids, 5th
       ed., McGraw-Hill (2001), Appendix A (ranges of tabulated constants).
    2. IAPWS R2-83(1992): water critical point (the largest common pc).
"""

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="value-out-of-range",
    title="Value outside the physically possible range",
    severity="error",
    stage="schema",
    method="inclusive range check in canonical SI units",
    reference="Poling et al. 2001, Appendix A (ranges of tabulated constants)",
    params={
        "compounds": "inclusive [low, high] per numeric column of compounds, canonical units",
        "vapor_pressure": "inclusive [low, high] per numeric column of vapor_pressure, canonical units",
        "boiling_points": "inclusive [low, high] per numeric column of boiling_points, canonical units",
    },
)
