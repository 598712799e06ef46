"""Rule packs shipped with propcheck (installed as ``propcheck.packs``)."""
