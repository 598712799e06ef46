"""Swap the fake reference in for a test; restore the default afterwards."""

from __future__ import annotations

from pathlib import Path

import pytest

from propcheck.reference import set_reference
from propcheck.reference.fake import FakeReference

FIXTURE = Path(__file__).resolve().parents[1] / "fixtures" / "reference_small.json"


@pytest.fixture
def use_reference():
    """Call with a reference object (or a JSON path) to use it for the rest of the test."""

    def use(reference=None):
        set_reference(FakeReference(reference or FIXTURE) if reference is None or isinstance(reference, (str, Path))
                      else reference)

    yield use
    set_reference(None)
