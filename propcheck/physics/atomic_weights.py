"""IUPAC standard atomic weights and molar masses from molecular formulas.

The table holds the abridged (conventional, for elements with an interval)
standard atomic weights of IUPAC 2021 for the elements that occur in
process chemicals. Formulas are parsed once per distinct text and the molar
mass is a matrix product of element counts and weights.
"""

from __future__ import annotations

import re

import numpy as np

__all__ = ["ATOMIC_WEIGHTS", "molar_mass", "parse_formula"]

# Abridged standard atomic weights [g/mol], IUPAC CIAAW 2021: T. Prohaska et
# al., "Standard atomic weights of the elements 2021", Pure Appl. Chem. 94,
# 573 (2022), Table 2 (abridged values; conventional values for H, Li, B, C,
# N, O, Mg, Si, S, Cl, Br, Tl). Values from memory of that table, checked to
# agree with chemicals 1.5.2 (older 2007-2013 weights) within 0.005.
ATOMIC_WEIGHTS: dict[str, float] = {
    "H": 1.008, "D": 2.014, "He": 4.0026, "Li": 6.94, "Be": 9.0122, "B": 10.81,
    "C": 12.011, "N": 14.007, "O": 15.999, "F": 18.998, "Ne": 20.180,
    "Na": 22.990, "Mg": 24.305, "Al": 26.982, "Si": 28.085, "P": 30.974,
    "S": 32.06, "Cl": 35.45, "Ar": 39.95, "K": 39.098, "Ca": 40.078,
    "Ti": 47.867, "Cr": 51.996, "Mn": 54.938, "Fe": 55.845, "Co": 58.933,
    "Ni": 58.693, "Cu": 63.546, "Zn": 65.38, "Ga": 69.723, "Ge": 72.630,
    "As": 74.922, "Se": 78.971, "Br": 79.904, "Kr": 83.798, "Rb": 85.468,
    "Sr": 87.62, "Zr": 91.224, "Mo": 95.95, "Ag": 107.87, "Cd": 112.41,
    "Sn": 118.71, "Sb": 121.76, "Te": 127.60, "I": 126.90, "Xe": 131.29,
    "Cs": 132.91, "Ba": 137.33, "W": 183.84, "Pt": 195.08, "Au": 196.97,
    "Hg": 200.59, "Pb": 207.2, "Bi": 208.98, "U": 238.03,
}
# D (deuterium, 2H) is not an element: its mass 2.014 u is the nuclide's
# (AME 2020), kept because deuterated solvents are written with D.

_TOKEN = re.compile(r"([A-Z][a-z]?)(\d*)|(\()|(\))(\d*)")


def parse_formula(formula: str) -> dict[str, int] | None:
    """Element counts of a molecular formula, or None when it does not parse.

    Accepts element symbols with counts and nested parentheses
    (``CH3(CH2)4CH3``); refuses unknown symbols, stray characters and
    empty text.

    Examples
    --------
    >>> parse_formula("C6H14O")
    {'C': 6, 'H': 14, 'O': 1}
    >>> parse_formula("CH3(CH2)2OH")
    {'C': 3, 'H': 8, 'O': 1}
    >>> parse_formula("C6H1x") is None
    True
    """
    text = str(formula).strip()
    if not text:
        return None
    stack: list[dict[str, int]] = [{}]
    pos = 0
    while pos < len(text):
        match = _TOKEN.match(text, pos)
        if match is None:
            return None
        symbol, count, opening, closing, group_count = match.groups()
        if symbol:
            if symbol not in ATOMIC_WEIGHTS:
                return None
            stack[-1][symbol] = stack[-1].get(symbol, 0) + int(count or 1)
        elif opening:
            stack.append({})
        else:
            if len(stack) == 1:
                return None
            inner = stack.pop()
            for element, n in inner.items():
                stack[-1][element] = stack[-1].get(element, 0) + n * int(group_count or 1)
        pos = match.end()
    if len(stack) != 1 or not stack[0]:
        return None
    return stack[0]


def molar_mass(formulas) -> np.ndarray:
    """Molar mass [g/mol] of each formula from IUPAC 2021 abridged weights; NaN where it does not parse.

    ``M = sum_i n_i Ar_i`` (IUPAC standard atomic weights [1]_). Each distinct
    formula is parsed once; the sum is one matrix product.

    Examples
    --------
    Water, H2O: 2 x 1.008 + 15.999 = 18.015 g/mol (IUPAC 2021 abridged weights).

    >>> molar_mass(["H2O", "C6H14", "bad!"]).round(3).tolist()
    [18.015, 86.178, nan]

    References
    ----------
    .. [1] T. Prohaska et al., Pure Appl. Chem. 94, 573 (2022),
       doi:10.1515/pac-2019-0603.
    """
    texts = np.asarray([("" if f is None else str(f)) for f in formulas], dtype=object)
    unique, inverse = np.unique(texts, return_inverse=True)
    symbols = list(ATOMIC_WEIGHTS)
    index = {s: i for i, s in enumerate(symbols)}
    counts = np.zeros((len(unique), len(symbols)))
    ok = np.zeros(len(unique), dtype=bool)
    for k, text in enumerate(unique):  # one parse per distinct formula
        parsed = parse_formula(text)
        if parsed is not None:
            ok[k] = True
            for element, n in parsed.items():
                counts[k, index[element]] = n
    masses = counts @ np.array([ATOMIC_WEIGHTS[s] for s in symbols])
    masses[~ok] = np.nan
    return masses[inverse]
