"""A compound cannot be cross-checked: no reference data found.

What it checks
    Compounds that the identifier database cannot identify (by CAS, name or
    formula), and identified compounds that no reference source carries.

Why it matters
    The reference cross-checks say nothing about such compounds; a steward
    should know which rows rest on the database alone. Missing reference
    data is never an error: plenty of real compounds are in no compilation.

Method
    Outer join of the database's compounds with the reference's long tables.

Parameters
    None.

Example finding
    ``not identified (no valid CAS; name and formula unknown to the
    identifier database): not cross-checked``

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
    covered = ident["row"].isin(session.constants(db)["key"])
    findings = []
    for rec in ident[ident["matched_by"].isna() | ~covered].itertuples(index=False):
        if rec.matched_by is None:
            message = "not identified (no valid, known CAS; name and formula unknown to the identifier database): not cross-checked"
        else:
            message = f"{rec.note}, but no reference source carries its constants: not cross-checked"
        findings.append(Finding(
            rule=RULE.id, severity="info", table="compounds", compound_id=rec.compound_id, column="cas",
            observed=rec.cas, message=message, row=int(rec.row), source=rec.source,
            reference="chemicals compilations and identifiers; CoolProp"))
    return findings
