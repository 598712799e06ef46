"""Give memory that numpy freed back to the operating system.

glibc keeps freed heap memory in its arenas (one per thread that
allocated), so after a threaded pass over millions of points the process
can stay hundreds of megabytes above what it uses. ``malloc_trim(0)``
returns it; elsewhere (macOS, Windows, musl) this is a no-op.
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


def release_freed_memory() -> bool:
    """Return freed heap memory to the system; True if anything was released."""
    return bool(_TRIM(0)) if _TRIM is not None else False
