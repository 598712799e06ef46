"""junit.xml: one test case per rule x compound, for CI dashboards.

Each enabled rule is a test suite. A compound with findings of that rule is a
test case: it fails when a new finding reaches ``--fail-on``, is skipped when
a baseline or waiver accepts all its findings, and passes (findings listed
in system-out) otherwise. A rule without findings is one passing test case,
``all compounds``. Findings without a compound (table-wide) go under
``(table <name>)``.
"""

from __future__ import annotations

import xml.etree.ElementTree as ET

from propcheck.findings import severity_rank
from propcheck.report.data import ReportData
from propcheck.report.formatting import fmt

__all__ = ["render_junit"]


def _line(rec: dict) -> str:
    where = f" t={fmt(rec['t'])} K" if rec.get("t") is not None else ""
    return f"[{rec['severity']}, {rec.get('status', 'new')}] {rec['finding_id']} {rec['column'] or ''}{where}: {rec['message']}"


def render_junit(data: ReportData) -> str:
    threshold = None if data.fail_on == "none" else severity_rank(data.fail_on)
    frame = data.findings
    records = frame.to_dict("records") if len(frame) else []
    groups: dict[str, dict[str, list[dict]]] = {}
    for rec in records:  # loop over findings
        case = rec["compound_id"] or f"(table {rec['table']})"
        groups.setdefault(rec["rule"], {}).setdefault(case, []).append(rec)
    rule_ids = sorted(set(data.meta.get("rules_run", [])) | set(groups))
    root = ET.Element("testsuites", name="propcheck", tests="0", failures="0", skipped="0", errors="0", time="0")
    totals = {"tests": 0, "failures": 0, "skipped": 0}
    for rule in rule_ids:
        cases = groups.get(rule, {})
        suite = ET.SubElement(root, "testsuite", name=rule, time="0")
        counts = {"tests": 0, "failures": 0, "skipped": 0}
        if not cases:
            ET.SubElement(suite, "testcase", classname=rule, name="all compounds", time="0")
            counts["tests"] += 1
        for case in sorted(cases):
            recs = cases[case]
            tc = ET.SubElement(suite, "testcase", classname=rule, name=case, time="0")
            counts["tests"] += 1
            failing = [r for r in recs if r.get("status", "new") == "new" and threshold is not None
                       and severity_rank(r["severity"]) >= threshold]
            text = "\n".join(_line(r) for r in recs)
            if failing:
                worst = max(failing, key=lambda r: severity_rank(r["severity"]))
                node = ET.SubElement(tc, "failure", message=str(worst["message"])[:500], type=worst["severity"])
                node.text = text
                counts["failures"] += 1
            elif all(r.get("status", "new") in ("baselined", "waived") for r in recs):
                ET.SubElement(tc, "skipped", message=f"accepted: {', '.join(sorted({r['status'] for r in recs}))}")
                counts["skipped"] += 1
            else:
                ET.SubElement(tc, "system-out").text = text
        for key, value in counts.items():
            suite.set(key, str(value))
            totals[key] += value
        suite.set("errors", "0")
    for key, value in totals.items():
        root.set(key, str(value))
    ET.indent(root)
    return '<?xml version="1.0" encoding="UTF-8"?>\n' + ET.tostring(root, encoding="unicode") + "\n"
