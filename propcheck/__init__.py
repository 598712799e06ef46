"""propcheck: audit pure-compound thermophysical property databases."""

import os

# DuckDB's allocator (jemalloc on Linux) keeps freed pages for seconds by default; a
# sort of ten million points would then stay resident beside the arrays fetched
# from it. Return them at once (unless the user configured the allocator).
os.environ.setdefault("DUCKDB_JE_MALLOC_CONF", "dirty_decay_ms:0,muzzy_decay_ms:0")

__all__ = ["__version__"]

__version__ = "0.1.0"
