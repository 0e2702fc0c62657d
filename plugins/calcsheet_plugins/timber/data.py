"""The timber plugin's data files, loaded once, and lookups that say where each value came from.

Every number a check uses is in a TOML file beside this module, with its standard, edition and table:
en338_2009.toml (solid timber strength classes), en14080_2013.toml (glulam), ec5_factors.toml
(EN 1995-1-1 factors), nds2018_values.toml and nds2018_factors.toml (NDS 2018 and its Supplement).
"""
from __future__ import annotations

import tomllib
from functools import lru_cache
from pathlib import Path

HERE = Path(__file__).parent


@lru_cache(maxsize=None)
def load(name: str) -> dict:
    with (HERE / name).open("rb") as fh:
        return tomllib.load(fh)


# ------------------------------------------------------------------ EN 1995-1-1 / EN 338 / EN 14080
def ec5_grades() -> dict[str, dict]:
    """Every strength class by name: C14…C50, D18…D70 (EN 338:2009), GL20h…GL32c (EN 14080:2013)."""
    out = {}
    for fname in ("en338_2009.toml", "en14080_2013.toml"):
        data = load(fname)
        meta = data["meta"]
        for name, row in data.items():
            if name == "meta":
                continue
            out[name] = dict(row, source=f"{meta['edition']} {row.get('table', 'Table 1')}, {name}",
                             edition=meta["edition"])
    return out


def ec5() -> dict:
    return load("ec5_factors.toml")


def durations() -> tuple[str, ...]:
    return tuple(ec5()["duration"]["order"])


def k_mod(product: str, service_class: int, duration: str) -> float:
    t = ec5()["k_mod"]
    return float(t[product][str(service_class)][durations().index(duration)])


def k_def(product: str, service_class: int) -> float:
    return float(ec5()["k_def"][product][str(service_class)])


def annexes() -> tuple[str, ...]:
    return tuple(ec5()["gamma_M"])


def gamma_M(product: str, annex: str = "recommended") -> tuple[float, str]:
    t = ec5()["gamma_M"][annex]
    return float(t[product]), t["source"]


def l_ef_ratio(case: str) -> float:
    return float(ec5()["l_ef"][case])


def l_ef_cases() -> tuple[str, ...]:
    return tuple(k for k in ec5()["l_ef"] if k != "source")


# ------------------------------------------------------------------ NDS 2018
def nds_values() -> dict:
    return load("nds2018_values.toml")


def nds() -> dict:
    return load("nds2018_factors.toml")


def nds_species() -> tuple[str, ...]:
    return tuple(k for k in nds_values() if k not in ("meta", "sizes"))


def nds_grades() -> tuple[str, ...]:
    seen = []
    for sp in nds_species():
        for g in nds_values()[sp]:
            if g not in seen:
                seen.append(g)
    return tuple(seen)


def nds_sizes() -> dict[str, list[float]]:
    return {k: v for k, v in nds_values()["sizes"].items() if k != "source"}


def nds_durations() -> tuple[str, ...]:
    """Table 2.3.2 durations, then the spelled-out names the loads plugin's combinations use."""
    t = nds()["C_D"]
    return tuple(k for k in t if k not in ("source", "why", "aliases")) + tuple(t["aliases"])


def nds_duration(name: str) -> str:
    """The Table 2.3.2 key for a duration written either way ("2 months" or "two months")."""
    return nds()["C_D"]["aliases"].get(name, name)


def nds_le_cases() -> tuple[str, ...]:
    return tuple(k for k in nds()["l_e"] if k != "source")


def table_row(rows: list[list[float]], key: float) -> list[float]:
    """The first row whose upper limit (first entry) is at least ``key``."""
    for row in rows:
        if key <= row[0]:
            return row
    return rows[-1]
