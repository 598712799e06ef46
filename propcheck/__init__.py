"""propcheck: audit pure-compound thermophysical property databases."""

import os

# DuckDB's allocator (jemalloc on Linux) keeps freed pages for seconds by default; a
# sort of ten million points would then stay resident beside the arrays fetched
# from it. Return them within 0.2 s (unless the user configured the allocator):
# as low a peak as returning them at once (0 ms), which made loading ten million
# points 1.5 s slower (measured with tests/bench/bench_vapor_pressure.py).
os.environ.setdefault("DUCKDB_JE_MALLOC_CONF", "dirty_decay_ms:200,muzzy_decay_ms:0")

__all__ = ["__version__"]

__version__ = "0.1.0"
