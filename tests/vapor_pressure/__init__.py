"""Tests of the vapor-pressure rules."""

VP_RULES = frozenset({
    "vp-falls-with-temperature", "vp-beyond-critical-point", "vp-point-off-curve", "vp-series-scaled",
    "tb-off-vp-curve", "vp-curve-misses-critical-point", "omega-off-vp-curve", "vp-slope-irregular",
    "boiling-point-off-curve",
})


def vp_findings(result, severities=("warning", "error", "info")):
    """The run's findings from vapor-pressure rules only."""
    f = result.findings
    return f[f["rule"].isin(VP_RULES) & f["severity"].isin(severities)]
