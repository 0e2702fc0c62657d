"""Trace records: what evaluation leaves behind for the printers.

A Step is one line of a hand calculation: symbol = symbolic form =
substituted form = result. Plugins produce the same records through
``Working`` so their steps print exactly like the sheet's own.
"""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from .errors import Span


@dataclass
class Step:
    """A definition: ``name [unit] = expr`` with the values it used."""

    name: str
    expr: Any  # nodes.Expr, or None when a plugin states a result without a formula
    value: Any  # pint Quantity, str, Record, list ...
    display_unit: Any = None  # pint Unit the value is shown in
    used: dict[str, Any] = field(default_factory=dict)  # name -> value substituted
    description: str | None = None
    span: Span | None = None
    number: str = ""  # "2.3" — set when the package numbers its steps
    is_input: bool = False
    overridden: Any = None  # the sheet's own value when --set replaced it
    working: "Working | None" = None  # a plugin call's own working
    note: str | None = None  # e.g. the method a plugin used for a result
    anchor: str = ""  # html id of the definition
    namespace: str = ""  # "" for the sheet, or the plugin call's anchor prefix
    shown_expr: Any = None  # the formula with the sheet's own functions written out (for the substitution)
    after: list = field(default_factory=list)  # records printed right after this one (a table, a lookup's working)


@dataclass
class FunctionStep(Step):
    """A sheet function's definition, shown once: ``M_ss(w [kN/m], L [m]) [kN*m] = w*L^2/8``.

    ``expr`` is the body; ``params`` the (name, declared unit text or None) pairs; ``value`` is None.
    """

    params: tuple = ()
    unit_text: str | None = None


@dataclass
class CheckResult:
    """A ``check a <= b`` with its outcome and utilisation a/b."""

    left: Any
    op: str
    right: Any
    demand: Any
    capacity: Any
    ok: bool
    ratio: float | None
    text: str
    used: dict[str, Any] = field(default_factory=dict)
    description: str | None = None
    span: Span | None = None
    number: str = ""
    anchor: str = ""
    shown_left: Any = None  # each side with the sheet's own functions written out (for the substitution)
    shown_right: Any = None
    governing: int | None = None  # a check over a list: the position (from 1) of the element that governs
    after: list = field(default_factory=list)  # records printed right after it (a check over a list: every element)


@dataclass
class Table:
    """A table a plugin shows in its working (e.g. the parts of a built-up section)."""

    title: str
    columns: list[str]  # header cells; may hold simple math markup via Symbol
    rows: list[list[Any]]  # cells: str, float, pint Quantity
    units: list[Any] | None = None  # per-column display unit (pint Unit) or None
    footer: list[list[Any]] | None = None  # totals rows
    note: str | None = None


@dataclass
class SheetTable(Table):
    """A table the sheet itself shows in full: one of its own tables, or every element of a check over a list."""

    anchor: str = ""


@dataclass
class Figure:
    """An SVG drawing made by trusted plugin code; sheet text in it must be escaped."""

    svg: str
    caption: str = ""


@dataclass
class Note:
    """A sentence of prose inside a plugin's working."""

    text: str
    kind: str = "note"  # "note" | "method" | "warning" | "agreement"


@dataclass
class Heading:
    text: str
    level: int
    number: str = ""
    anchor: str = ""


@dataclass
class Prose:
    text: str


@dataclass
class Working:
    """The traced working of one plugin call, in order."""

    title: str
    items: list[Any] = field(default_factory=list)  # Step | CheckResult | Table | Figure | Note


def copied(record, **changes):
    """A shallow copy of a trace record with ``changes``: what ``dataclasses.replace`` gives for these plain
    records (no ``__post_init__``, no init-only fields, no slots), at a fraction of its cost — the live
    preview copies and numbers every record of a long sheet on each save."""
    new = object.__new__(type(record))
    new.__dict__.update(record.__dict__)
    if changes:
        new.__dict__.update(changes)
    return new
