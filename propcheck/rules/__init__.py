"""Rules: one module per rule; see :mod:`propcheck.rules.registry`."""
