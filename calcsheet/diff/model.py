"""The snapshot model: one side of a diff, reduced to values by name and checks with what they read."""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from .. import units as U
from ..display import plain_number, unit_text

SIGFIGS = 4  # the diff shows one more figure than the package, so small moves are visible


class DiffSourceError(Exception):
    """A side of the diff cannot be read; the message names it."""


@dataclass
class Entry:
    """One value of a sheet (a record's fields are entries ``rec.field``)."""

    name: str
    quantity: Any = None  # pint Quantity (magnitude float or array) when the value is a number
    text: str | None = None  # the value when it is not a quantity, as a comparable string
    is_input: bool = False
    line: int | None = None
    description: str | None = None
    formula: str | None = None  # the right-hand side as written, when the side is a sheet
    reads: tuple[str, ...] | None = None  # names it reads, when known
    parent: str | None = None  # the record a field belongs to

    def shown(self) -> str:
        if self.quantity is not None:
            return show_quantity(self.quantity)
        return self.text if self.text is not None else "—"


@dataclass
class CheckEntry:
    text: str
    ok: bool
    ratio: float | None
    description: str | None = None
    reads: tuple[str, ...] | None = None
    line: int | None = None


@dataclass
class Snapshot:
    label: str
    meta: dict = field(default_factory=dict)
    values: dict[str, Entry] = field(default_factory=dict)  # in sheet order
    checks: list[CheckEntry] = field(default_factory=list)
    errors: int = 0

    @property
    def rev(self) -> str:
        return str(self.meta.get("rev", "") or "")


def show_quantity(q) -> str:
    mag = q.magnitude
    try:
        text = plain_number(float(mag), SIGFIGS)
    except TypeError:
        text = "[" + ", ".join(plain_number(float(x), SIGFIGS) for x in list(mag)[:4]) + (", …]" if len(mag) > 4 else "]")
    unit = unit_text(q.units) if not q.dimensionless or q.units != U.registry().Unit("") else ""
    return f"{text} {unit}".strip()
