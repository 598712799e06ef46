"""The registry: one explicit list of rule modules, refusing duplicate ids."""

from __future__ import annotations

import importlib
from functools import lru_cache

from propcheck.rules.base import Rule

__all__ = ["RULE_MODULES", "all_rules", "get_rule"]

# Module names under propcheck.rules, in the order rules run and are listed.
RULE_MODULES = (
    "cell_not_numeric",
    "required_value_missing",
    "value_out_of_range",
    "duplicate_compound_id",
    "cas_malformed",
    "cas_check_digit",
    "cas_shared_by_ids",
    "vp_unknown_compound",
    "vp_falls_with_temperature",
    "vp_beyond_critical_point",
    "phase_order_violated",
    "tb_tc_ratio_out_of_band",
    "zc_inconsistent",
    "omega_out_of_range",
    "tb_off_corresponding_states",
    "off_family_trend",
    "molar_mass_off_formula",
    "formula_unparsable",
    "cas_names_other_compound",
    "name_shared_by_ids",
    "constants_copied",
    "vp_point_off_curve",
    "vp_series_scaled",
    "tb_off_vp_curve",
    "vp_curve_misses_critical_point",
    "omega_off_vp_curve",
    "vp_slope_irregular",
    "boiling_point_off_curve",
    "vp_equation_invalid",
    "vp_equation_off_data",
    "identity_mismatch",
    "reference_missing",
    "const_off_reference",
    "vp_off_reference",
)


@lru_cache(maxsize=1)
def all_rules() -> dict[str, Rule]:
    """Import every rule module once; return rules by id, in registry order."""
    rules: dict[str, Rule] = {}
    for name in RULE_MODULES:
        module = importlib.import_module(f"propcheck.rules.{name}")
        info = module.RULE
        if info.id in rules:
            raise RuntimeError(f"duplicate rule id {info.id!r} in propcheck.rules.{name}")
        if info.id.replace("-", "_") != name:
            raise RuntimeError(f"rule id {info.id!r} does not match its module {name}")
        rules[info.id] = Rule(info=info, doc=(module.__doc__ or "").strip(), check=getattr(module, "check", None))
    return rules


def get_rule(rule_id: str) -> Rule | None:
    """Return the rule with this id, or None."""
    return all_rules().get(rule_id)
