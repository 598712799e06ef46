"""Vendor audit: what an incoming delivery would change, checked in the context of the current database."""

from propcheck.compare.run import CompareResult, run_compare

__all__ = ["CompareResult", "run_compare"]
