"""Diagnosis: which column of a compound row is wrong, and what it should read.

``context`` gathers, once per run, the evidence a row can be judged by (its
family's trend, its formula's molar mass, its own vapor-pressure points);
``repair`` tries the usual slips on suspect cells and keeps the one that
makes the row consistent; ``annotate`` adds that diagnosis to the findings
of any rule that named a numeric column without a suggestion.
"""

from propcheck.diagnose.annotate import annotate_findings
from propcheck.diagnose.context import Context, get_context
from propcheck.diagnose.repair import Diagnosis, diagnose

__all__ = ["Context", "Diagnosis", "annotate_findings", "diagnose", "get_context"]
