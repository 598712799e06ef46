"""Constants copied from another compound: identical tc, pc and omega under different names.

What it checks
    Pairs of rows with different names whose tc, pc and omega are all
    identical.

Why it matters
    Three independent constants never coincide for two real compounds; the
    row was filled from the wrong line of a table (often a neighbouring
    isomer).

Method
    Self-join on (tc, pc, omega) in DuckDB; both rows are reported, naming
    each other.

Parameters
    None.

Example finding
    p-Xylene (P17) filled with ethylbenzene's tc, pc, omega (IUPAC; Zhou
    et al. 2012 EOS): ``tc, pc, omega (617.15 K, 3.609e+06 Pa, 0.304)
    identical to P16 (ethylbenzene)`` with suggestion ``possibly copied
    from another compound: check against a reference`` (and the same on
    P16, naming P17)

References
    1. D. Ambrose, C. Tsonopoulos, J. Chem. Eng. Data 40, 531 (1995)
       (independent critical constants per compound).
"""

from __future__ import annotations

import pandas as pd

from propcheck.rules.base import RuleInfo

RULE = RuleInfo(
    id="constants-copied",
    title="tc, pc and omega identical to another compound's",
    severity="warning",
    stage="consistency",
    method="self-join on (tc, pc, omega) across rows with different names",
    reference="independent critical constants per compound",
)


def check(db, params) -> pd.DataFrame:
    pairs = db.df("""
        SELECT a._row AS row, a.compound_id, a.source, a.tc, a.pc, a.omega,
               string_agg(b.compound_id || ' (' || coalesce(b.name, '') || ')', ', ' ORDER BY b._row) AS others
        FROM compounds a JOIN compounds b
          ON a.tc = b.tc AND a.pc = b.pc AND a.omega = b.omega AND a._row <> b._row
         AND lower(trim(coalesce(a.name, ''))) <> lower(trim(coalesce(b.name, '')))
        GROUP BY ALL""")
    if pairs.empty:
        return pd.DataFrame()
    return pd.DataFrame({
        "rule": RULE.id, "severity": RULE.severity, "table": "compounds", "compound_id": pairs["compound_id"],
        "column": "tc", "row": pairs["row"], "source": pairs["source"], "observed": pairs["tc"],
        "message": [f"tc, pc, omega ({tc:.6g} K, {pc:.6g} Pa, {om:.4g}) identical to {o}"
                    for tc, pc, om, o in zip(pairs["tc"], pairs["pc"], pairs["omega"], pairs["others"])],
        "suggestion": "possibly copied from another compound: check against a reference",
        "reference": "independent critical constants per compound",
    })
