"""The material data file: read once, values returned as quantities with their sources.

Why a TOML file: properties are data an engineer can read and correct, not
code; each carries its source, or says it was recalled and must be verified.
"""
from __future__ import annotations

import tomllib
from functools import lru_cache
from pathlib import Path

from calcsheet.units import Quantity

DATA = Path(__file__).with_name("materials.toml")
PROPERTIES = ("E", "G", "nu", "f_y", "f_u", "rho")


@lru_cache(maxsize=1)
def data() -> dict:
    with DATA.open("rb") as fh:
        return tomllib.load(fh)


def grades(category: str) -> tuple[str, ...]:
    return tuple(data()[category])


def entry(category: str, key: str) -> dict:
    return data()[category][key]


def value(item: dict):
    """(quantity, source) for one property entry."""
    unit = item.get("unit", "")
    return Quantity(float(item["value"]), unit or ""), item["source"]
