"""Pure numerics in canonical SI units; no I/O, no DuckDB, no pandas."""
