"""calcsheet: checkable engineering calculation sheets.

An aid to, not a substitute for, a licensed engineer's judgement; check every
result against the governing local codes.
"""
from __future__ import annotations

__version__ = "0.1.0"

__all__ = ["__version__", "run"]


def run(path_or_text, overrides=None, **options):
    """Parse, check and evaluate a sheet; returns a ``calcsheet.engine.Result``."""
    from .engine import run as _run

    return _run(path_or_text, overrides=overrides, **options)
