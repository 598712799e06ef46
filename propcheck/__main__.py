"""Allow ``python -m propcheck``."""

from propcheck.cli import main

raise SystemExit(main())
