"""A compound cannot be cross-checked: no reference data found.

What it checks
    Compounds that the identifier database cannot identify (by CAS, name or
    formula), identified compounds that no reference source carries, and
    those for which the references carry only the molar mass (from the
    identifier database), so that none of their other constants is
    cross-checked.

Why it matters
    The reference cross-checks say nothing about such compounds; a steward
    should know which rows rest on the database alone. Missing reference
    data is never an error: plenty of real compounds are in no compilation.

Method
    Outer join of the database's compounds with the reference's long tables.

Parameters
    None.

Example finding
    A row for Therminol 66 (a heat-transfer fluid, a mixture) without CAS
    or formula: ``not identified (no valid, known CAS; name and formula
    unknown to the identifier database): not cross-checked``

References
    1. C. Bell et al., chemicals (identifiers, critical, phase_change modules), version 1.5.
    2. I. H. Bell et al., Ind. Eng. Chem. Res. 53, 2498 (2014) (CoolProp).
"""

from __future__ import annotations

from propcheck.findings import Finding
from propcheck.reference import session
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="reference-missing",
    title="No reference data for a compound",
    severity="info",
    stage="consistency",
    method="identity lookup and join with the reference tables",
    reference="chemicals compilations and identifiers; CoolProp",
)


def check(db, params) -> list[Finding]:
    ident = session.identity(db)
    constants = session.constants(db)
    covered = ident["row"].isin(constants["key"])
    beyond_mass = ident["row"].isin(constants.loc[constants["property"] != "molar_mass", "key"])
    identified = ident["matched_by"].notna()  # None or NaN: not identified
    pick = ~identified | ~beyond_mass
    findings = []
    for rec, known, mass_only in zip(ident[pick].itertuples(index=False), identified[pick], covered[pick]):  # findings
        if not known:
            shared = int(rec.formula_candidates or 0)
            why = (f"name unknown to the identifier database, formula shared by {shared} known compounds" if shared > 1
                   else "name and formula unknown to the identifier database")
            message = f"not identified (no valid, known CAS; {why}): not cross-checked"
        elif mass_only:
            message = f"{rec.note}, but the references carry only its molar mass: its other constants are not cross-checked"
        else:
            message = f"{rec.note}, but no reference source carries its constants: not cross-checked"
        findings.append(Finding(
            rule=RULE.id, severity="info", table="compounds", compound_id=rec.compound_id, column="cas",
            observed=rec.cas, message=message, row=int(rec.row), source=rec.source,
            reference="chemicals compilations and identifiers; CoolProp"))
    return findings
