"""Draw the report's figures with matplotlib (Agg backend) as inline SVG text."""

from __future__ import annotations

import io
import re
import textwrap

import matplotlib

matplotlib.use("Agg")  # no display, no GUI toolkit

import matplotlib.pyplot as plt  # noqa: E402
import numpy as np  # noqa: E402

from propcheck.report.figures import P_NORMAL, CompoundPanel, FamilyPanel  # noqa: E402

__all__ = ["compound_figure", "compound_svg", "compound_svgs", "family_svg", "history_svg"]

INK = "#1f2a36"
GRID = "#d5dbe1"
DATA = "#3b6e99"
FLAG = "#b3261e"
FIT = "#5d6b78"
MARK = "#7a5a00"
FIX = "#2e7d32"

_STYLE = {
    "svg.fonttype": "none",  # text stays text: smaller, searchable
    "svg.hashsalt": "propcheck",  # deterministic element ids
    "font.family": "sans-serif",
    "font.size": 8.5,
    "axes.edgecolor": "#8a96a3",
    "axes.labelcolor": INK,
    "axes.linewidth": 0.8,
    "xtick.color": INK,
    "ytick.color": INK,
    "axes.grid": True,
    "grid.color": GRID,
    "grid.linewidth": 0.6,
    "legend.frameon": False,
    "legend.fontsize": 7.5,
}


def _svg(fig) -> str:
    text = _svg_text(fig)
    plt.close(fig)
    return text


def _svg_text(fig) -> str:
    """The figure as inline SVG text; the figure stays open."""
    buffer = io.StringIO()
    fig.savefig(buffer, format="svg", dpi=110, metadata={"Date": None, "Creator": None})
    text = buffer.getvalue()
    text = text[text.index("<svg"):]
    text = re.sub(r"\s*<metadata>.*?</metadata>", "", text, flags=re.S)  # RDF block: external namespace URIs only
    # let CSS size the figure: drop the fixed width/height, keep the viewBox
    return re.sub(r'<svg([^>]*?) width="[^"]*" height="[^"]*"', r'<svg\1 role="img"', text, count=1)


def compound_svg(panel: CompoundPanel) -> str:
    """ln p against 1/T: points, fitted curve, flagged points, tb, critical point, corrections."""
    return compound_svgs([panel])[0]


def compound_svgs(panels: list[CompoundPanel]) -> list[str]:
    """:func:`compound_svg` of each panel, drawn one after another on one reused figure.

    Creating a figure, its axes and their ticks is a fifth of a panel's cost;
    emptying the axes and putting them back where a new figure has them gives
    the same SVG text.
    """
    out = []
    with plt.rc_context(_STYLE):
        fig, ax = _compound_axes()
        home = ax.get_position(original=True).frozen(), ax.get_xlim(), ax.get_ylim()
        try:
            for panel in panels:
                _draw_compound(ax, panel)
                out.append(_svg_text(fig))
                _empty(ax, home)
        finally:
            plt.close(fig)
    return out


def _compound_axes():
    return plt.subplots(figsize=(4.6, 3.1), layout="constrained")


def _empty(ax, home) -> None:
    """Remove what :func:`_draw_compound` drew; restore a new figure's position and limits."""
    position, xlim, ylim = home
    for artist in [*ax.lines, *ax.texts, *ax.patches, *ax.collections, *ax.images]:
        artist.remove()
    if ax.get_legend() is not None:
        ax.get_legend().remove()
    ax.relim()  # forget the data limits
    ax.set_xlim(xlim)  # what a panel with nothing to plot shows
    ax.set_ylim(ylim)
    ax.set_autoscale_on(True)  # (set_xlim and set_ylim turned it off)
    ax.set_position(position)  # constrained layout starts from here, as in a new figure
    ax.set_in_layout(True)  # (set_position takes the axes out of the layout)


def compound_figure(panel: CompoundPanel):
    """The matplotlib figure behind :func:`compound_svg` (the caller closes it)."""
    with plt.rc_context(_STYLE):
        fig, ax = _compound_axes()
        _draw_compound(ax, panel)
        return fig


def _draw_compound(ax, panel: CompoundPanel) -> None:
    """Draw one compound's panel on empty axes."""
    x_all = [1.0 / panel.t] if len(panel.t) else []
    good = np.isfinite(panel.p) & (panel.p > 0) & (panel.t > 0)
    ok = good & ~panel.flagged
    if ok.any():
        ax.plot(1000.0 / panel.t[ok], np.log(panel.p[ok]), "o", ms=4, color=DATA, label="data points")
    bad = good & panel.flagged
    if bad.any():
        ax.plot(1000.0 / panel.t[bad], np.log(panel.p[bad]), "X", ms=7, color=FLAG, label="flagged point")
    if len(panel.curve_t) >= 2:  # the run's own curve (the one the rules judged by), sampled in figures.py
        ax.plot(1000.0 / panel.curve_t, panel.curve_ln_p, "-", lw=1.2, color=FIT, label=_wrap(panel.curve_label))
    if panel.tb:
        ax.plot([1000.0 / panel.tb], [np.log(P_NORMAL)], "s", ms=6, mfc="white", mec=MARK, mew=1.5,
                label="tb at 101.325 kPa")
    if panel.tc and panel.pc and panel.pc > 0:
        ax.plot([1000.0 / panel.tc], [np.log(panel.pc)], "D", ms=6, mfc="white", mec=INK, mew=1.5,
                label="critical point")
    shown_fix = False
    for col, t, observed, corrected in panel.corrections:
        if col == "p" and np.isfinite(t) and corrected > 0:
            xy = (1000.0 / t, np.log(corrected))
            ax.plot(*xy, "o", ms=7, mfc="none", mec=FIX, mew=1.6, label=None if shown_fix else "corrected value")
            if observed and observed > 0:
                ax.annotate("", xy=xy, xytext=(1000.0 / t, np.log(observed)),
                            arrowprops={"arrowstyle": "->", "color": FIX, "lw": 1.0})
            shown_fix = True
        elif col in ("tb", "tc") and corrected > 0:
            y = np.log(P_NORMAL) if col == "tb" else (np.log(panel.pc) if panel.pc and panel.pc > 0 else None)
            if y is not None:
                ax.plot([1000.0 / corrected], [y], "o", ms=7, mfc="none", mec=FIX, mew=1.6,
                        label=None if shown_fix else "corrected value")
                shown_fix = True
    ax.set_xlabel("1000 / T  [1/K]")
    ax.set_ylabel("ln(p / Pa)")
    if not x_all and not panel.tb and not panel.tc:
        ax.text(0.5, 0.5, "no vapor-pressure data", transform=ax.transAxes, ha="center", color=FIT)
    handles, labels = ax.get_legend_handles_labels()
    if handles:
        ax.legend(loc="best")


def _wrap(label: str, width: int = 34) -> str:
    """A long curve description on two or more legend lines."""
    return textwrap.fill(label, width) if label else "fitted curve"


RASTER_ABOVE = 400  # members beyond which a family plot's points are drawn as an embedded bitmap
LABELS = 8  # flagged members named on a family plot; more would only clutter it
_UNITS = {"tc": ("tc", "K", 1.0), "tb": ("tb", "K", 1.0), "pc": ("pc", "MPa", 1e-6)}


def family_svg(panel: FamilyPanel) -> str:
    """tc, tb and pc against molar mass, flagged members marked."""
    with plt.rc_context(_STYLE):
        fig, axes = plt.subplots(1, 3, figsize=(9.6, 2.6), layout="constrained")
        for ax, col in zip(axes, ("tc", "tb", "pc")):
            label, unit, scale = _UNITS[col]
            y = panel.values[col] * scale
            ok = np.isfinite(y)
            flag = panel.flagged[col] & ok
            dense = int(ok.sum()) > RASTER_ABOVE  # a large family's members go in as one inline PNG layer
            ax.plot(panel.molar_mass[ok], y[ok], "-", lw=0.8, color=GRID, zorder=1, rasterized=dense)
            ax.plot(panel.molar_mass[ok & ~flag], y[ok & ~flag], "o", ms=4 if not dense else 2, color=DATA, zorder=2,
                    label="member", rasterized=dense)
            if flag.any():
                ax.plot(panel.molar_mass[flag], y[flag], "X", ms=7, color=FLAG, zorder=3, label="flagged",
                        rasterized=int(flag.sum()) > RASTER_ABOVE)
                for mm, v, cid in list(zip(panel.molar_mass[flag], y[flag], panel.compound_id[flag]))[:LABELS]:
                    ax.annotate(str(cid), (mm, v), xytext=(4, 4), textcoords="offset points", fontsize=7, color=FLAG)
            ax.set_xlabel("molar mass  [g/mol]")
            ax.set_ylabel(f"{label}  [{unit}]")
        return _svg(fig)


def history_svg(runs: list[dict], series: dict[str, list[int]]) -> str:
    """Findings per rule over the last runs (one line per rule)."""
    with plt.rc_context(_STYLE):
        fig, ax = plt.subplots(figsize=(7.5, 2.4), layout="constrained")
        x = np.arange(len(runs))
        for rule, counts in series.items():
            ax.plot(x, counts, "-o", ms=3, lw=1.0, label=rule)
        ax.set_xticks(x, [f"#{r['run_id']}" for r in runs])
        ax.set_ylabel("findings")
        ax.set_xlabel("run")
        ax.legend(loc="center left", bbox_to_anchor=(1.0, 0.5))
        return _svg(fig)
