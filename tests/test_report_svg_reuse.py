"""report.html draws its compound panels on one reused figure: the SVG must equal a new figure's."""

from __future__ import annotations

import numpy as np


def _fresh_svg(panel) -> str:
    """The panel drawn on a figure of its own (how every panel was drawn before the figure was reused)."""
    import matplotlib.pyplot as plt

    from propcheck.report.plots import _STYLE, _svg, compound_figure

    with plt.rc_context(_STYLE):
        return _svg(compound_figure(panel))


def _bare(**values):
    from propcheck.report.figures import CompoundPanel

    empty = np.array([])
    fields = dict(compound_id="bare", name="", n_findings=1, rules=["r"], t=empty, p=empty, flagged=empty.astype(bool),
                  curve_t=empty, curve_ln_p=empty, curve_label="", tb=None, tc=None, pc=None)
    return CompoundPanel(**{**fields, **values})


def test_reused_figure_draws_what_a_new_figure_draws():
    from propcheck.pipeline import run_check
    from propcheck.report import build_report_data
    from propcheck.report.plots import compound_svgs
    from tests.conftest import SAMPLE_DB

    panels = build_report_data(run_check(str(SAMPLE_DB)), panel_cap=8).panels
    assert any(p.corrections for p in panels) and any(p.curve_label for p in panels)
    # panels that plot nothing (limits of an empty axes) or a single marker, each after a full panel,
    # so that anything the previous panel left on the figure would show
    odd = [_bare(), _bare(tb=350.0), _bare(tc=500.0),
           _bare(t=np.array([300.0, 310.0]), p=np.array([-1.0, 0.0]), flagged=np.array([False, True]))]
    order = [x for pair in zip(panels, odd + panels[len(odd):]) for x in pair]
    drawn = compound_svgs(order)
    assert len(drawn) == len(order)
    for panel, svg in zip(order, drawn):
        assert svg == _fresh_svg(panel), panel.compound_id
    assert len(set(drawn)) > len(panels) // 2  # the panels are not all one picture
