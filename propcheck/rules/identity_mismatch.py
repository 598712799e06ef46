"""Name, CAS and formula of a compound point to different compounds.

What it checks
    Each compound is looked up in the identifier database carried by
    chemicals (offline): by CAS Registry Number when it is valid, else by
    name, else by formula. Warns when the name is another compound's name
    than the CAS's, when the stored formula differs from the CAS's formula,
    or when only a formula is there and several compounds share it. Says
    (info) when a compound was identified by name or formula instead of CAS.
    The name-versus-CAS warning is left to ``cas-names-other-compound``
    when that rule is enabled, so one problem gives one finding.

Why it matters
    Every reference cross-check rests on knowing which compound a row is.
    A CAS copied from the neighbouring isomer passes every format check and
    the molar-mass check, and then the wrong reference values are compared.

Method
    Exact lookup in the chemicals identifier database (PubChem-derived
    names, synonyms, formulas); formulas compared as element counts. The
    reference checks use the CAS when it is valid and known.

Parameters
    None.

Example finding
    Benzene (71-43-2, C6H6) with the formula typed C6H12: ``formula C6H12
    differs from C6H6, the formula of CAS 71-43-2 (benzene); identified by
    CAS 71-43-2`` (a name of another compound is reported by
    ``cas-names-other-compound`` under the default pack)

References
    1. C. Bell et al., chemicals: chemical properties component of Chemical
       Engineering Design Library (identifiers module), version 1.5.
    2. CAS, "Check Digit Verification of CAS Registry Numbers", cas.org.
"""

from __future__ import annotations

from propcheck.findings import Finding
from propcheck.reference import session
from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="identity-mismatch",
    title="Name, CAS and formula point to different compounds",
    severity="warning",
    stage="consistency",
    method="lookup of CAS, name and formula in the chemicals identifier database",
    reference="chemicals identifiers (PubChem-derived); CAS check digit",
)


def check(db, params) -> list[Finding]:
    ident = session.identity(db)
    findings = []

    def add(rec, severity, column, message, observed=None, expected=None):
        findings.append(Finding(
            rule=RULE.id, severity=severity, table="compounds", compound_id=rec.compound_id, column=column,
            observed=observed, expected=expected, message=message, row=int(rec.row), source=rec.source,
            reference="chemicals identifier database"))

    pack = db.cache.get("pack")
    # the name-vs-CAS conflict is cas-names-other-compound's finding when that rule runs: one finding, not two
    name_conflicts = ident[ident["name_conflict"]] if pack is None or not pack.enabled("cas-names-other-compound") else ident[:0]
    for rec in name_conflicts.itertuples(index=False):
        add(rec, "warning", "cas",
            f"name '{rec.name}' is CAS {rec.name_cas} in the identifier database, but cas {rec.cas} is "
            f"{rec.cas_name}; reference checks use {rec.cas}", rec.cas, rec.name_cas)
    for rec in ident[ident["formula_conflict"]].itertuples(index=False):
        add(rec, "warning", "formula",
            f"formula {rec.formula} differs from {rec.cas_formula}, the formula of CAS {rec.ref_cas} "
            f"({rec.cas_name}); {rec.note}", rec.formula, rec.cas_formula)
    ambiguous = ident["matched_by"].isna() & (ident["formula_candidates"] > 1)
    for rec in ident[ambiguous].itertuples(index=False):
        add(rec, "warning", "formula",
            f"only formula {rec.formula} identifies this compound and {int(rec.formula_candidates)} known "
            "compounds share it: not cross-checked", rec.formula)
    for rec in ident[ident["matched_by"].isin(["name", "formula"])].itertuples(index=False):
        add(rec, "info", "cas", rec.note, rec.cas, rec.ref_cas)
    return findings
