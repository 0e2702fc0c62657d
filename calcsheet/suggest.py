""""Did you mean": the one place that guesses which known name a mistyped one meant.

Below every stage (it needs nothing of ours), so the unit vocabulary, the plugin contract, the engine, the
schedule runner and the plugins all suggest names the same way.
"""
from __future__ import annotations

import difflib
from typing import Iterable


def closest(name: str, options: Iterable[str]) -> str | None:
    """The known name ``name`` most likely meant, if one is close."""
    close = difflib.get_close_matches(name, list(options), n=1)
    return close[0] if close else None


def did_you_mean(name: str, options: Iterable[str], quote: str = "'", prefix: str = "") -> str | None:
    """"did you mean 'x'?" for the closest option, else None."""
    hit = closest(name, options)
    return f"did you mean {quote}{prefix}{hit}{quote}?" if hit else None
