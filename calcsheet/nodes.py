"""The AST: frozen dataclasses, each carrying its source span.

Nodes list their children in ``_children`` apart from position attributes,
so ``walk`` (and any stage) can visit any node without knowing its class;
each stage dispatches on the node's class up its MRO (``_eval_<Class>``,
``_infer_<Class>``, ``_print_<Class>``). Nothing past the
parser sees lark objects: only these.
"""
from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

from .errors import Span


@dataclass(frozen=True)
class Node:
    _children: tuple[str, ...] = field(default=(), init=False, repr=False, compare=False)

    def children(self):
        for name in self._children:
            value = getattr(self, name)
            if isinstance(value, tuple):
                yield from (v for v in value if isinstance(v, Node))
            elif isinstance(value, Node):
                yield value


# ------------------------------------------------------------ expressions


@dataclass(frozen=True)
class Expr(Node):
    pass


@dataclass(frozen=True)
class Number(Expr):
    """A literal, optionally with a unit: ``150 mm``, ``2.1e5 N/mm^2``, ``0.6``."""

    value: float
    text: str  # the number as written
    unit: tuple[tuple[str, float], ...] = ()  # (unit name, exponent) factors
    unit_text: str = ""
    span: Span | None = field(default=None, compare=False)


@dataclass(frozen=True)
class Name(Expr):
    id: str
    span: Span | None = field(default=None, compare=False)


@dataclass(frozen=True)
class Text(Expr):
    value: str
    span: Span | None = field(default=None, compare=False)


@dataclass(frozen=True)
class Neg(Expr):
    operand: Expr
    span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("operand",), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class BinOp(Expr):
    """Base of the arithmetic operators; subclasses are made by ``_binop``."""

    left: Expr
    right: Expr
    span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("left", "right"), init=False, repr=False, compare=False)
    op = "?"


def _binop(name: str, op: str) -> type[BinOp]:
    return dataclass(frozen=True)(type(name, (BinOp,), {"op": op, "__doc__": f"``a {op} b``"}))


Add = _binop("Add", "+")
Sub = _binop("Sub", "-")
Mul = _binop("Mul", "*")
Div = _binop("Div", "/")
Pow = _binop("Pow", "^")

BINOPS: dict[str, type[BinOp]] = {cls.op: cls for cls in (Add, Sub, Mul, Div, Pow)}


@dataclass(frozen=True)
class Compare(Expr):
    """``a <= b`` as the condition of ``if(a <= b, x, y)``."""

    left: Expr
    op: str
    right: Expr
    span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("left", "right"), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class Keyword(Node):
    name: str
    value: Expr
    span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("value",), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class Call(Expr):
    """A built-in or sheet function: ``sqrt(x)``, ``max(a, b)``."""

    func: str
    args: tuple[Expr, ...]
    kwargs: tuple[Keyword, ...] = ()
    span: Span | None = field(default=None, compare=False)
    func_span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("args", "kwargs"), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class PluginCall(Expr):
    """``ns.func(k=v, ...)``: keyword arguments only, so a reviewer reads what each value is."""

    namespace: str
    func: str
    kwargs: tuple[Keyword, ...]
    args: tuple[Expr, ...] = ()  # positional arguments are refused by the resolver
    span: Span | None = field(default=None, compare=False)
    func_span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("args", "kwargs"), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class FieldAccess(Expr):
    """``rec.field``."""

    obj: Expr
    field_name: str
    span: Span | None = field(default=None, compare=False)
    field_span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("obj",), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class ListExpr(Expr):
    items: tuple[Expr, ...]
    span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("items",), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class TupleExpr(Expr):
    """A point ``(x, y)``."""

    items: tuple[Expr, ...]
    span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("items",), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class Paren(Expr):
    """Parentheses as written, kept so a printed formula matches the sheet."""

    inner: Expr
    span: Span | None = field(default=None, compare=False)
    _children: tuple[str, ...] = field(default=("inner",), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class Flag(Expr):
    """A word standing alone among a call's arguments: ``clamp`` in ``lookup(t.k, h=120 mm, clamp)``."""

    name: str
    span: Span | None = field(default=None, compare=False)


# ------------------------------------------------------------ statements


@dataclass(frozen=True)
class Statement(Node):
    pass


@dataclass(frozen=True)
class Definition(Statement):
    """``name [unit] = expr  -- description``."""

    name: str
    expr: Expr
    unit: tuple[tuple[str, float], ...] | None = None
    unit_text: str | None = None
    description: str | None = None
    span: Span | None = field(default=None, compare=False)
    name_span: Span | None = field(default=None, compare=False)
    unit_span: Span | None = field(default=None, compare=False)
    comment: str | None = None  # the hidden `//` comment on the line (suppressions live here)
    _children: tuple[str, ...] = field(default=("expr",), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class Param(Node):
    """A parameter of a sheet function: ``w`` or ``w [kN/m]``."""

    name: str
    unit: tuple[tuple[str, float], ...] | None = None
    unit_text: str | None = None
    span: Span | None = field(default=None, compare=False)
    unit_span: Span | None = field(default=None, compare=False)


@dataclass(frozen=True)
class FunctionDef(Statement):
    """``M_ss(w [kN/m], L [m]) [kN*m] = w*L^2/8  -- description``: a sheet's own function.

    Its body reads only its parameters and values defined above it; it is called like a built-in.
    """

    name: str
    params: tuple[Param, ...]
    expr: Expr
    unit: tuple[tuple[str, float], ...] | None = None
    unit_text: str | None = None
    description: str | None = None
    span: Span | None = field(default=None, compare=False)
    name_span: Span | None = field(default=None, compare=False)
    unit_span: Span | None = field(default=None, compare=False)
    comment: str | None = None
    _children: tuple[str, ...] = field(default=("expr",), init=False, repr=False, compare=False)

    @property
    def param_names(self) -> tuple[str, ...]:
        return tuple(p.name for p in self.params)


@dataclass(frozen=True)
class TableDef(Statement):
    """A table bound to a name: written in the sheet as pipe rows, or read with ``name = table "file.csv"``.

    ``header`` names the columns (a two-way table: ``h \\ b`` then the column keys), ``units`` is the units
    row, ``rows`` the data, all as written; ``values`` the data as numbers. ``source`` is the file's name
    for a table read from a file; ``cell_spans`` locates each row's cells (header, units, then the rows).
    """

    name: str
    header: tuple[str, ...]
    units: tuple[str, ...]
    rows: tuple[tuple[str, ...], ...]
    values: tuple[tuple[float, ...], ...]
    source: str | None = None
    description: str | None = None
    span: Span | None = field(default=None, compare=False)
    name_span: Span | None = field(default=None, compare=False)
    comment: str | None = None
    cell_spans: tuple[tuple[Span, ...], ...] = field(default=(), compare=False, repr=False)

    @property
    def two_way(self) -> bool:
        return "\\" in self.header[0]


@dataclass(frozen=True)
class Check(Statement):
    """``check a <= b  -- description``."""

    left: Expr
    op: str
    right: Expr
    description: str | None = None
    span: Span | None = field(default=None, compare=False)
    comment: str | None = None
    _children: tuple[str, ...] = field(default=("left", "right"), init=False, repr=False, compare=False)


@dataclass(frozen=True)
class Heading(Statement):
    level: int
    text: str
    span: Span | None = field(default=None, compare=False)


@dataclass(frozen=True)
class Prose(Statement):
    text: str
    span: Span | None = field(default=None, compare=False)


@dataclass(frozen=True)
class Sheet(Node):
    meta: tuple[tuple[str, Any], ...]
    body: tuple[Statement, ...]
    path: str = "<sheet>"
    source: str = field(default="", repr=False, compare=False)
    includes: tuple[tuple[str, str], ...] = field(default=(), repr=False, compare=False)  # (path, text)
    meta_lines: tuple[tuple[str, int], ...] = field(default=(), repr=False, compare=False)  # (key, line)
    _children: tuple[str, ...] = field(default=("body",), init=False, repr=False, compare=False)

    @property
    def meta_dict(self) -> dict[str, Any]:
        return dict(self.meta)


def _quick_inits() -> None:
    from .errors import quick_init

    for value in list(globals().values()):
        if isinstance(value, type) and issubclass(value, Node):
            quick_init(value)


_quick_inits()


def walk(node: Node):
    """Every node below (and including) ``node``, iteratively (deep sums are fine), in source order."""
    stack = [node]
    pop, push = stack.pop, stack.append
    while stack:
        n = pop()
        yield n
        names = n._children
        if not names:  # a leaf (a number, a name): most nodes
            continue
        for name in reversed(names):
            value = getattr(n, name)
            if isinstance(value, tuple):
                for v in reversed(value):
                    if isinstance(v, Node):
                        push(v)
            elif isinstance(value, Node):
                push(value)


def names_used(expr: Expr) -> list[Name]:
    """Names an expression reads, in order (plugin namespaces excluded)."""
    return [n for n in walk(expr) if isinstance(n, Name)]
