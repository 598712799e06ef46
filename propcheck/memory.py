"""Give memory that was freed back to the operating system.

glibc keeps freed heap memory in its arenas (one per thread that
allocated), and Arrow's memory pool keeps freed buffers for reuse, so after
a pass over millions of points the process can stay hundreds of megabytes
above what it uses. ``malloc_trim(0)`` (glibc only; a no-op elsewhere) and
the pool's ``release_unused`` return it.
"""

from __future__ import annotations

import ctypes
import ctypes.util
import sys

__all__ = ["release_freed_memory"]


def _malloc_trim():
    if not sys.platform.startswith("linux"):
        return None
    try:
        libc = ctypes.CDLL(ctypes.util.find_library("c") or "libc.so.6")
        return libc.malloc_trim
    except (OSError, AttributeError):
        return None


_TRIM = _malloc_trim()


def release_freed_memory() -> None:
    """Return freed heap and Arrow pool memory to the system."""
    import pyarrow

    pyarrow.default_memory_pool().release_unused()
    if _TRIM is not None:
        _TRIM(0)
