"""``propcheck init``: propose a mapping file for a database whose names and units are unknown.

Reads every table of the source, scores each against the canonical tables by
its header spellings (``Tc``, ``Tcrit``, ``T_crit_C``, ``Pc (bar)``, ``CAS
No.``, ``MW`` ...), and proposes for each numeric column the unit that puts
the column's median nearest the typical magnitude of that property
(critical pressures of organic compounds lie near 2-5 MPa, boiling points
near 300-450 K: Poling, Prausnitz and O'Connell, *The Properties of Gases and
Liquids*, 5th ed., Appendix A). A unit written in the header (``Pc (bar)``,
``T_C``) wins over the magnitude. The result is a commented TOML mapping for
the data steward to confirm; ``propcheck check`` never guesses, it reads only
what the mapping states.

Magnitude alone cannot tell units whose factor is near 1 (bar / atm, K /
degR at high values) or whose scales overlap (K / degF): only K and degC are
proposed from magnitudes for temperatures, bar is proposed for values near
40, and every proposal is marked for review.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass, field

import duckdb

from propcheck.canonical import TABLES
from propcheck.load.mapping import Mapping
from propcheck.load.sources import RawTable, display_source, open_source
from propcheck.load.units import affine_to_canonical

__all__ = ["propose_mapping", "render_mapping", "normalise_header"]

# Header spellings, compared after lower-casing and dropping separators and units.
SPELLINGS: dict[str, dict[str, tuple[str, ...]]] = {
    "compounds": {
        "compound_id": ("compoundid", "id", "cmpdid", "compid", "componentid", "substanceid", "chemid", "key", "code"),
        "name": ("name", "compound", "compoundname", "chemical", "chemicalname", "component", "substance", "componentname"),
        "cas": ("cas", "casno", "casnumber", "casrn", "casregistrynumber", "casnr"),
        "formula": ("formula", "molecularformula", "chemicalformula", "mf"),
        "family": ("family", "class", "group", "series", "chemicalclass"),
        "molar_mass": ("molarmass", "mw", "molwt", "molecularweight", "molarweight", "mm", "mwt"),
        "tc": ("tc", "tcrit", "tcritical", "criticaltemperature", "crittemp", "tcr"),
        "pc": ("pc", "pcrit", "pcritical", "criticalpressure", "critpress", "pcr"),
        "vc": ("vc", "vcrit", "vcritical", "criticalvolume", "critvol"),
        "zc": ("zc", "zcrit", "criticalcompressibility", "zcritical"),
        "omega": ("omega", "acentricfactor", "acentric", "w", "acf"),
        "tb": ("tb", "nbp", "tboil", "boilingpoint", "normalboilingpoint", "tnb", "bp", "tbp"),
        "tm": ("tm", "mp", "tmelt", "meltingpoint", "tfus", "tf", "tmp", "freezingpoint"),
        "source": ("source", "ref", "reference", "origin", "datasource"),
    },
    "vapor_pressure": {
        "compound_id": ("compoundid", "id", "cmpdid", "compid", "componentid", "substanceid", "chemid", "key", "code"),
        "t": ("t", "temp", "temperature"),
        "p": ("p", "psat", "pvap", "vp", "pv", "pressure", "vaporpressure", "vapourpressure", "saturationpressure"),
        "source": ("source", "ref", "reference", "origin", "datasource"),
        "uncertainty": ("uncertainty", "u", "up", "unc", "sigma", "stdunc", "pu", "uncert"),
    },
}

# Unit spellings seen in headers -> pint unit.
HEADER_UNITS = {
    "k": "K", "kelvin": "K", "c": "degC", "degc": "degC", "°c": "degC", "oc": "degC", "f": "degF", "degf": "degF",
    "°f": "degF", "r": "degR", "degr": "degR", "pa": "Pa", "kpa": "kPa", "mpa": "MPa", "bar": "bar", "bara": "bar",
    "atm": "atm", "mmhg": "mmHg", "torr": "torr", "psi": "psi", "psia": "psi", "g/mol": "g/mol", "kg/kmol": "kg/kmol",
    "kg/mol": "kg/mol", "cm3/mol": "cm**3/mol", "cm^3/mol": "cm**3/mol", "m3/mol": "m**3/mol", "m3/kmol": "m**3/kmol",
    "l/mol": "L/mol", "dm3/mol": "L/mol",
}

# Typical magnitude (canonical unit) of each column and the units proposed from magnitudes alone.
# Poling, Prausnitz, O'Connell, The Properties of Gases and Liquids, 5th ed., Appendix A (medians of
# the organic compounds listed, rounded) # from memory
TYPICAL = {
    "molar_mass": (100.0, ("g/mol", "kg/mol")),
    "tc": (550.0, ("K", "degC")),
    "pc": (4.0e6, ("Pa", "kPa", "MPa", "bar", "psi", "mmHg")),
    "vc": (3.0e-4, ("m**3/mol", "cm**3/mol", "L/mol")),
    "tb": (380.0, ("K", "degC")),
    "tm": (250.0, ("K", "degC")),
    "t": (350.0, ("K", "degC")),
    "p": (1.0e5, ("Pa", "kPa", "MPa", "bar", "psi", "mmHg")),
}


def normalise_header(header: str) -> tuple[str, str | None]:
    """Return the header's base spelling and the pint unit written in it, if any.

    >>> normalise_header("Pc (bar)")
    ('pc', 'bar')
    >>> normalise_header("T_crit_C")
    ('tcrit', 'degC')
    >>> normalise_header("CAS No.")
    ('casno', None)
    """
    text = header.strip().lower()
    unit = None
    match = re.search(r"[\(\[]\s*([^\)\]]+?)\s*[\)\]]\s*$", text)
    if match and match.group(1).replace(" ", "") in HEADER_UNITS:
        unit = HEADER_UNITS[match.group(1).replace(" ", "")]
        text = text[: match.start()]
    elif match:
        text = text[: match.start()]
    parts = [p for p in re.split(r"[\s_\-./]+", text) if p]
    if unit is None and len(parts) > 1 and parts[-1] in HEADER_UNITS:
        unit = HEADER_UNITS[parts[-1]]
        parts = parts[:-1]
    return "".join(parts), unit


@dataclass
class ColumnProposal:
    canonical: str
    source: str
    unit: str | None = None
    why: str = ""


@dataclass
class TableProposal:
    canonical: str
    source_table: str
    origin: str
    rows: int
    columns: list[ColumnProposal] = field(default_factory=list)
    unmatched: list[str] = field(default_factory=list)


def _match_columns(canonical_table: str, headers: list[str]) -> dict[str, tuple[str, str | None]]:
    """canonical column -> (source header, unit from the header)."""
    found: dict[str, tuple[str, str | None]] = {}
    for header in headers:
        base, unit = normalise_header(header)
        for canonical, spellings in SPELLINGS[canonical_table].items():
            if canonical not in found and (base in spellings or base == canonical.replace("_", "")):
                found[canonical] = (header, unit)
                break
    return found


def _unit_from_magnitude(canonical: str, median: float, minimum: float) -> tuple[str, str]:
    """Best unit for a column from its median (and its 5th percentile, for the sign of temperatures)."""
    typical, candidates = TYPICAL[canonical]
    target = TABLES["vapor_pressure" if canonical in ("t", "p") else "compounds"].column(canonical).unit
    best, best_distance = candidates[0], math.inf
    for unit in candidates:
        scale, offset = affine_to_canonical(unit, target)
        if offset and minimum * scale + offset <= 0:  # nearly every absolute temperature is positive
            continue
        value = median * scale + offset
        if value <= 0:
            continue
        distance = abs(math.log10(value / typical))
        if distance < best_distance - 1e-9:
            best, best_distance = unit, distance
    return best, f"median {median:.6g} fits {best} (typical {canonical} about {typical:g} {target})"


def _numeric_stats(con, relation: str, column: str) -> tuple[float | None, float | None]:
    q = '"' + column.replace('"', '""') + '"'
    value = f"TRY_CAST(replace(trim(CAST({q} AS VARCHAR)), ',', '.') AS DOUBLE)"
    row = con.execute(f"SELECT median({value}), quantile_cont({value}, 0.05) FROM {relation}").fetchone()
    return row[0], row[1]


def propose_mapping(source: str) -> list[TableProposal]:
    """Inspect every table of ``source``; propose a table and column mapping with units."""
    con = duckdb.connect(":memory:")
    kind, listed = open_source(con, source, Mapping(), wanted=_all_tables(con, source))
    loaded: dict[str, tuple[RawTable, list[str], int, str]] = {}
    for key, raw in listed.items():
        name = f"init_{len(loaded)}"
        con.execute(f"CREATE TEMP TABLE {name} AS SELECT * FROM {raw.relation}")
        headers = [r[0] for r in con.execute(f"DESCRIBE {name}").fetchall()]
        rows = con.execute(f"SELECT count(*) FROM {name}").fetchone()[0]
        loaded[key] = (raw, headers, rows, name)
    proposals: list[TableProposal] = []
    taken: set[str] = set()
    for canonical_table in ("compounds", "vapor_pressure"):
        best = None
        for key, (raw, headers, rows, name) in sorted(loaded.items()):
            if key in taken:
                continue
            matched = _match_columns(canonical_table, headers)
            required = TABLES[canonical_table].required_columns
            score = len(matched) + 10 * sum(c in matched for c in required)
            if best is None or score > best[0]:
                best = (score, key, matched)
        if best is None or not all(c in best[2] for c in TABLES[canonical_table].required_columns):
            continue
        _, key, matched = best
        taken.add(key)
        raw, headers, rows, name = loaded[key]
        proposal = TableProposal(canonical_table, key, display_source(raw.origin), rows)
        for column in TABLES[canonical_table].columns:
            if column.name not in matched:
                continue
            header, header_unit = matched[column.name]
            cp = ColumnProposal(column.name, header)
            if column.numeric and column.name in TYPICAL:
                median, minimum = _numeric_stats(con, name, header)
                if header_unit is not None:
                    cp.unit, cp.why = header_unit, f"unit written in the header {header!r}"
                elif median is not None:
                    cp.unit, cp.why = _unit_from_magnitude(column.name, median, minimum)
            elif column.name == "uncertainty":
                cp.why = "stated in the unit of p"
            proposal.columns.append(cp)
        used = {c.source for c in proposal.columns}
        proposal.unmatched = [h for h in headers if h not in used]
        proposals.append(proposal)
    return proposals


def _all_tables(con, source: str) -> set[str]:
    """Every table name of the source (read them all for inspection)."""
    _, listed = open_source(con, source, Mapping(), wanted=set())
    return set(listed)


def _toml_str(text: str) -> str:
    return '"' + text.replace("\\", "\\\\").replace('"', '\\"') + '"'


def render_mapping(source: str, proposals: list[TableProposal]) -> str:
    """The proposal as a commented mapping file (format: propcheck/load/mapping.py)."""
    lines = [
        f"# propcheck mapping proposed by 'propcheck init' for {display_source(source)}",
        "# REVIEW EVERY LINE before use: names were matched by spelling and units guessed from",
        "# the magnitudes of the values. 'propcheck check' uses exactly what this file states.",
        "",
    ]
    for p in proposals:
        lines += [f"[{p.canonical}]", f"table = {_toml_str(p.source_table)}    # {p.rows} rows in {p.origin}",
                  f"[{p.canonical}.columns]    # canonical name = source column"]
        for c in p.columns:
            lines.append(f"{c.canonical} = {_toml_str(c.source)}")
        units = [c for c in p.columns if c.unit]
        if units:
            lines.append(f"[{p.canonical}.units]    # canonical name = unit of the source values; check each")
            for c in units:
                lines.append(f"{c.canonical} = {_toml_str(c.unit)}    # {c.why}")
        if p.unmatched:
            lines.append(f"# not matched (carried along as extra columns): {', '.join(p.unmatched)}")
        missing = [c.name for c in TABLES[p.canonical].columns if c.name not in {x.canonical for x in p.columns}]
        if missing:
            lines.append(f"# canonical columns not found: {', '.join(missing)}")
        lines.append("")
    return "\n".join(lines)
