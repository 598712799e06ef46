"""Independent reference data behind one small interface.

:func:`get_reference` returns the reference every rule uses; the default
(chemicals compilations + CoolProp equations of state) is loaded once per
process (``functools.lru_cache``). Tests swap in another implementation,
e.g. :class:`~propcheck.reference.fake.FakeReference`, with
:func:`set_reference` (``set_reference(None)`` restores the default).
"""

from __future__ import annotations

from functools import lru_cache

from propcheck.reference.base import CombinedReference, Reference

__all__ = ["Reference", "default_reference", "get_reference", "set_reference"]

_override = None


@lru_cache(maxsize=1)
def default_reference() -> CombinedReference:
    """chemicals compilations + CoolProp reference EOS, loaded on first use."""
    from propcheck.reference.chemicals_ref import ChemicalsReference
    from propcheck.reference.coolprop_ref import CoolPropReference

    return CombinedReference([ChemicalsReference(), CoolPropReference()])


def set_reference(reference) -> None:
    """Use ``reference`` for every later run in this process; None restores the default."""
    global _override
    _override = reference


def get_reference():
    """The reference in use: the one set with :func:`set_reference`, else the default."""
    return _override if _override is not None else default_reference()
