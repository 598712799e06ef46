"""Schema stage: pandera models of the canonical tables, failures as findings."""

from propcheck.schema.stage import run_schema_stage

__all__ = ["run_schema_stage"]
