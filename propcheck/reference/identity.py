"""Which reference compound each database row is: by CAS, else name, else formula.

Per compounds row (``_row``): the CAS Registry Number when it is well formed
with a valid check digit (and, when the identifier database does not know
it but knows the name, the name instead); else the name through the
identifier database carried by chemicals (fast exact index first, then its
thorough search); else the formula when exactly one known compound has it.
The result says which identity was used and flags a name that points to a
different compound than the CAS, a stored formula that differs from the
CAS's formula, and an ambiguous formula-only match.
"""

from __future__ import annotations

import re

import numpy as np
import pandas as pd

from propcheck.identifiers import cas_check_digit_ok, cas_format_ok

__all__ = ["normalise_formula", "resolve_identity"]

_ELEMENT = re.compile(r"([A-Z][a-z]?)(\d*)")


def normalise_formula(formula: str | None) -> str | None:
    """Element counts in a fixed order, so ``NH3`` and ``H3N`` compare equal.

    >>> normalise_formula("NH3") == normalise_formula("H3N")
    True
    """
    if not isinstance(formula, str) or not formula.strip():
        return None
    counts: dict[str, int] = {}
    for element, number in _ELEMENT.findall(formula.replace(" ", "")):
        counts[element] = counts.get(element, 0) + (int(number) if number else 1)
    return "".join(f"{e}{counts[e]}" for e in sorted(counts)) or None


def _norm(series: pd.Series) -> pd.Series:
    uniques = series.dropna().unique()
    return series.map(dict(zip(uniques, (normalise_formula(f) for f in uniques))))


def resolve_identity(compounds: pd.DataFrame, reference) -> pd.DataFrame:
    """Resolve ``compounds`` (``row, compound_id, name, cas, formula``) against ``reference``.

    Returns one row per input row with ``ref_cas``, ``matched_by`` (``cas``,
    ``name``, ``formula`` or None), ``cas_name``/``cas_formula`` (what the
    CAS is in the identifier database), ``name_cas`` (what the name is),
    ``name_conflict``, ``formula_conflict``, ``formula_candidates`` and
    ``note`` (one line on how the identity was chosen).
    """
    c = compounds.reset_index(drop=True).copy()
    for col in ("name", "cas", "formula"):
        if col not in c.columns:
            c[col] = None
        text = c[col].astype("string").str.strip()
        c[col] = text.where(text.notna() & (text != ""), None).astype(object)
    cas = c["cas"].fillna("")
    valid = (cas_format_ok(cas) & cas_check_digit_ok(cas)).to_numpy(dtype=bool)
    info = reference.cas_info(c["cas"].where(valid, None))
    c["cas_name"], c["cas_formula"] = info["name"].to_numpy(), info["formula"].to_numpy()
    c["name_cas"] = reference.cas_for_names(c["name"]).to_numpy()
    known = valid & c["cas_name"].notna().to_numpy()
    name_known = c["name_cas"].notna().to_numpy()
    # no usable CAS and the fast name index missed: the thorough search, for those rows only
    slow = ~valid & ~name_known & c["name"].notna().to_numpy()
    if slow.any():
        c.loc[slow, "name_cas"] = reference.search_names(c.loc[slow, "name"]).to_numpy()
        name_known = c["name_cas"].notna().to_numpy()
    by_cas = valid & (known | ~name_known)
    by_name = ~by_cas & name_known
    c["ref_cas"] = np.where(by_cas, c["cas"], np.where(by_name, c["name_cas"], None))
    c["matched_by"] = np.where(by_cas, "cas", np.where(by_name, "name", None))
    c["formula_candidates"] = 0
    rest = ~by_cas & ~by_name & c["formula"].notna().to_numpy()
    if rest.any():
        found = reference.cas_for_formulas(c.loc[rest, "formula"])
        c.loc[rest, "formula_candidates"] = found["candidates"].to_numpy()
        unique = rest.copy()
        unique[rest] = (found["candidates"].to_numpy() == 1) & found["cas"].notna().to_numpy()
        c.loc[unique, "ref_cas"] = found.loc[unique[rest], "cas"].to_numpy() if unique.any() else []
        c.loc[unique, "matched_by"] = "formula"
    # what the chosen CAS is, for rows matched by name or formula
    need = c["matched_by"].isin(["name", "formula"]).to_numpy()
    if need.any():
        more = reference.cas_info(c.loc[need, "ref_cas"])
        c.loc[need, "cas_name"] = more["name"].to_numpy()
        c.loc[need, "cas_formula"] = more["formula"].to_numpy()
    c["name_conflict"] = by_cas & known & name_known & (c["name_cas"] != c["cas"]).to_numpy()
    stored = _norm(c["formula"])
    ref = _norm(c["cas_formula"].where(stored.notna()))  # only where there is a stored formula to compare
    c["formula_conflict"] = (stored.notna() & ref.notna() & (stored != ref)).to_numpy()
    c["note"] = _notes(c, valid, known)
    return c


def _notes(c: pd.DataFrame, valid, known) -> np.ndarray:
    """One line per compound saying how it was identified (vectorised string building)."""
    cas = c["cas"].fillna("").astype(str)
    ref = c["ref_cas"].fillna("").astype(str)
    name = c["name"].fillna("").astype(str)
    formula = c["formula"].fillna("").astype(str)
    why = np.where(c["cas"].isna(), "no CAS",
                   np.where(~valid, "CAS " + cas + " is not valid", "CAS " + cas + " is not in the identifier database"))
    by = c["matched_by"].to_numpy(dtype=object)
    known_cas = np.asarray(known, dtype=bool)
    return np.where((by == "cas") & known_cas, "identified by CAS " + cas,
           np.where(by == "cas", "looked up by CAS " + cas + " (not in the identifier database)",
           np.where(by == "name", "identified by name '" + name + "' as CAS " + ref + " (" + why + ")",
           np.where(by == "formula", "identified by formula " + formula + " alone as CAS " + ref, "not identified"))))
