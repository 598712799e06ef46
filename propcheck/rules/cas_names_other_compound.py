"""A valid CAS Registry Number that belongs to another compound.

What it checks
    The CAS number as known to the identifier database carried by
    ``chemicals`` (offline): its formula must equal ``formula`` and the
    compound it names must be the one ``name`` names.

Why it matters
    A valid CAS on the wrong row passes every format and check-digit test,
    then fetches another compound's reference data (isomers share formula
    and molar mass, so nothing else catches it).

Method
    ``chemicals.identifiers.search_chemical`` on the CAS and on the name
    (PubChem-derived local database, no network). A warning when the CAS's
    formula differs from ``formula`` (Hill order compared as element
    counts) and the name does not confirm the CAS, or when ``name``
    resolves to a different CAS; it says which compound the CAS belongs to.
    A formula that alone disagrees with a CAS its name confirms is left to
    identity-mismatch. Unknown CAS or names are not judged.

Parameters
    None.

Example finding
    Propyl acetate (109-60-4) given isopropyl acetate's 108-21-4 (CAS
    Registry): ``108-21-4 is the CAS of isopropyl acetate (C5H10O2), not of
    propyl acetate (109-60-4)`` with suggestion ``possibly: CAS of
    isopropyl acetate; propyl acetate is 109-60-4``

References
    1. C. Bell et al., chemicals (Python library), identifiers module
       (PubChem-derived database).
    2. CAS Registry (cas.org): one number per substance.
"""

from __future__ import annotations

import numpy as np
import pandas as pd

from propcheck.diagnose import get_context
from propcheck.diagnose.annotate import make_finding
from propcheck.identifiers import lookup_chemical
from propcheck.physics.atomic_weights import parse_formula
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="cas-names-other-compound",
    title="CAS Registry Number of another compound",
    severity="warning",
    stage="consistency",
    method="CAS and name looked up in the identifier database carried by chemicals (offline)",
    reference="chemicals.identifiers (PubChem-derived)",
)


def check(db, params) -> pd.DataFrame:
    ctx = get_context(db)
    frame = ctx.frame
    cas = frame["cas"].astype(object)
    ok = cas.notna() & cas.astype(str).str.fullmatch(r"[0-9]{2,7}-[0-9]{2}-[0-9]")
    if not ok.any():
        return pd.DataFrame()
    by_cas = {c: lookup_chemical(c) for c in cas[ok].unique()}  # index lookups per distinct CAS
    names = frame["name"].astype(object)
    by_name = {n: lookup_chemical(n) for n in names[ok & names.notna()].unique()}
    out = []
    for r in np.flatnonzero(ok.to_numpy()):  # rows with a CAS to look up
        meta = by_cas.get(cas.iloc[r])
        if meta is None:
            continue
        name, formula = names.iloc[r], frame["formula"].iloc[r]
        named = by_name.get(name)
        wrong_name = named is not None and named.CASs != meta.CASs
        # a formula off the CAS's is the formula's fault when the name confirms the CAS
        # (identity-mismatch reports that); here only when nothing backs the CAS
        name_confirms = named is not None and named.CASs == meta.CASs
        wrong_formula = (not name_confirms and bool(formula) and isinstance(formula, str)
                         and parse_formula(formula) not in (None, parse_formula(meta.formula)))
        if not (wrong_formula or wrong_name):
            continue
        message = f"{cas.iloc[r]} is the CAS of {meta.common_name} ({meta.formula}), not of {name}"
        message += f" ({named.CASs})" if wrong_name else f" (formula {formula})"
        out.append(make_finding(RULE, ctx, r, "cas", message, observed=cas.iloc[r],
                                expected=named.CASs if wrong_name else None,
                                suggestion=f"possibly: CAS of {meta.common_name}; {name} is {named.CASs}" if wrong_name else None,
                                reference="chemicals.identifiers (PubChem-derived, offline)"))
    return pd.DataFrame(out)
