"""Static dimension inference: every unit mistake, found without evaluating.

Types come from literals, declared ``[unit]``s and plugin signatures. A
statement whose root is broken gets the type ANY, and nothing downstream of
it is reported again: one error per root cause.
"""
from __future__ import annotations

from dataclasses import dataclass

from . import nodes as N
from . import units as U
from .errors import (
    AngleError,
    CalcError,
    DeclaredUnitError,
    DimensionError,
    Diagnostic,
    PluginArgumentError,
    TypeMismatchError,
    UnknownFieldError,
    UnknownUnitError,
)
from .evaluator import INVERSE_TRIG, TRANSCENDENTAL, TRIG
from .plugin import PluginFunction, PluginRegistry
from .resolver import Resolution, check_key


@dataclass(frozen=True)
class T:
    """A static type: kind 'q' (quantity of ``dim``), 'text', 'list', 'record', or 'any'."""

    kind: str
    dim: U.Dim | None = None
    item: "T | None" = None
    record: PluginFunction | None = None  # the function that made this record
    record_type: str | None = None

    def describe(self) -> str:
        if self.kind == "q":
            return U.describe_dim(self.dim)
        if self.kind == "record":
            return f"{self.record_type} record"
        return self.kind


ANY = T("any")
TEXT = T("text")
NUMBER = T("q", U.DIMENSIONLESS)


class Broken(Exception):
    """Raised inside inference when an operand is already known broken (stay quiet)."""


class Checker:
    def __init__(self, plugins: PluginRegistry, path: str = "<sheet>"):
        self.plugins = plugins
        self.path = path
        self.types: dict[str, T] = {}

    # ------------------------------------------------------------ statements
    def check_sheet(self, sheet: N.Sheet, res: Resolution) -> list[Diagnostic]:
        diags: list[Diagnostic] = []
        for stmt in sheet.body:
            if isinstance(stmt, N.Definition):
                key = stmt.name
            elif isinstance(stmt, N.Check):
                key = check_key(stmt)
            else:
                continue
            if key in res.broken:
                if isinstance(stmt, N.Definition):
                    self.types.setdefault(stmt.name, ANY)
                continue
            try:
                if isinstance(stmt, N.Definition):
                    self.types[stmt.name] = self.definition(stmt)
                else:
                    self.check(stmt)
            except Broken:
                res.broken.add(key)
                if isinstance(stmt, N.Definition):
                    self.types[stmt.name] = ANY
            except CalcError as exc:
                res.broken.add(key)
                diags.append(exc.diagnostic(self.path))
                if isinstance(stmt, N.Definition):
                    self.types[stmt.name] = ANY
        return diags

    def definition(self, stmt: N.Definition) -> T:
        t = self.infer(stmt.expr)
        if stmt.unit is not None:
            try:
                want = U.dim_of(U.build_unit(stmt.unit)) if stmt.unit else U.DIMENSIONLESS
            except CalcError as exc:
                raise exc.with_span(stmt.unit_span or stmt.span)
            if t.kind == "any":
                return T("q", want)
            if t.kind != "q":
                raise DeclaredUnitError(f"{stmt.name} is a {t.describe()}; it cannot have a unit",
                                        stmt.unit_span or stmt.span)
            if U.without_angle(t.dim) != U.without_angle(want):
                raise DeclaredUnitError(
                    f"{stmt.name} is declared [{stmt.unit_text}] ({U.describe_dim(want)}) "
                    f"but the expression gives {U.describe_dim(t.dim)}",
                    stmt.unit_span or stmt.span,
                    hint=_explain(stmt.expr, self),
                )
        return t

    def check(self, stmt: N.Check) -> None:
        a = self._quantity(self.infer(stmt.left), stmt.left)
        b = self._quantity(self.infer(stmt.right), stmt.right)
        if a.kind == "any" or b.kind == "any":
            return
        if a.dim != b.dim:
            raise DimensionError(f"cannot compare {U.describe_dim(a.dim)} with {U.describe_dim(b.dim)}", stmt.span,
                                 hint="both sides of a check must have the same dimension")

    # ------------------------------------------------------------ expressions
    def infer(self, node: N.Expr) -> T:
        method = getattr(self, "_infer_" + type(node).__name__, None)
        if method is None:
            for cls in type(node).__mro__:
                method = getattr(self, "_infer_" + cls.__name__, None)
                if method:
                    break
        return method(node)

    def _quantity(self, t: T, node) -> T:
        if t.kind in ("q", "any"):
            return t
        raise TypeMismatchError(f"expected a number or quantity, got a {t.describe()}", node.span)

    def _infer_Number(self, node: N.Number) -> T:
        if not node.unit:
            return NUMBER
        try:
            return T("q", U.dim_of(U.build_unit(node.unit)))
        except UnknownUnitError as exc:
            raise exc.with_span(_unit_span(node))

    def _infer_Text(self, node) -> T:
        return TEXT

    def _infer_Name(self, node: N.Name) -> T:
        if node.id in self.types:
            t = self.types[node.id]
            if t.kind == "any":
                raise Broken()
            return t
        return NUMBER  # pi; undefined names were reported by the resolver

    def _infer_Paren(self, node) -> T:
        return self.infer(node.inner)

    def _infer_Neg(self, node) -> T:
        return self._quantity(self.infer(node.operand), node.operand)

    def _infer_BinOp(self, node: N.BinOp) -> T:
        a = self._quantity(self.infer(node.left), node.left)
        b = self._quantity(self.infer(node.right), node.right)
        op = node.op
        if op in "+-":
            if a.kind == "any" or b.kind == "any":
                return a if b.kind == "any" else b
            if a.dim != b.dim:
                word = "add" if op == "+" else "subtract"
                raise DimensionError(
                    f"cannot {word} {U.describe_dim(b.dim)} {'to' if op == '+' else 'from'} {U.describe_dim(a.dim)}",
                    node.span, hint=f"left: {_operand(node.left)} is {U.describe_dim(a.dim)}; "
                                    f"right: {_operand(node.right)} is {U.describe_dim(b.dim)}")
            return a
        if op in "*/":
            if a.kind == "any" or b.kind == "any":
                return ANY
            return T("q", U.dim_mul(a.dim, b.dim, 1 if op == "*" else -1))
        # power
        if b.kind == "q" and b.dim != U.DIMENSIONLESS:
            raise DimensionError(f"an exponent must be a plain number, not {U.describe_dim(b.dim)}", node.right.span)
        if a.kind == "any":
            return ANY
        if a.dim == U.DIMENSIONLESS:
            return NUMBER
        p = constant_value(node.right)
        if p is None:
            raise DimensionError("a quantity with units may only be raised to a number written in the sheet",
                                 node.right.span, hint="write e.g. L^2 or L^0.5")
        return T("q", U.dim_pow(a.dim, p))

    def _infer_FieldAccess(self, node: N.FieldAccess) -> T:
        obj = self.infer(node.obj)
        if obj.kind == "any":
            return ANY
        if obj.kind != "record":
            raise TypeMismatchError(f"a {obj.describe()} has no fields", node.obj.span)
        if obj.record is None:
            return ANY
        f = obj.record.field(node.field_name)
        if f is None:
            import difflib

            names = [x.name for x in obj.record.fields]
            close = difflib.get_close_matches(node.field_name, names, n=1)
            raise UnknownFieldError(f"{obj.record.qualname} result has no field '{node.field_name}'",
                                    node.field_span or node.span,
                                    hint=f"did you mean '{close[0]}'?" if close else "fields: " + ", ".join(names))
        return self._field_type(f)

    def _field_type(self, f) -> T:
        k = f.kind_
        if k == "quantity":
            return T("q", f.dimension)
        if k == "number":
            return NUMBER
        if k == "text":
            return TEXT
        if k == "record":
            return T("record", record=self._maker_of(f.record), record_type=f.record)
        return ANY

    def _maker_of(self, record_type: str | None) -> PluginFunction | None:
        """A function whose result is this record type (all makers share one field set)."""
        if not record_type:
            return None
        ns = self.plugins.namespace(record_type.split(".")[0]) if self.plugins.is_namespace(
            record_type.split(".")[0]) else None
        if ns is None:
            return None
        for pf in ns.functions.values():
            if pf.returns == record_type:
                return pf
        return None

    def _infer_ListExpr(self, node) -> T:
        items = [self.infer(i) for i in node.items]
        return T("list", item=items[0] if items else ANY)

    def _infer_TupleExpr(self, node) -> T:
        items = [self.infer(i) for i in node.items]
        return T("list", item=items[0] if items else ANY)

    def _infer_Call(self, node: N.Call) -> T:
        name = node.func
        args = [self._quantity(self.infer(a), a) for a in node.args]
        if not args:
            raise TypeMismatchError(f"{name}() needs an argument", node.span)
        x = args[0]
        if any(a.kind == "any" for a in args):
            return ANY if name not in TRIG and name not in INVERSE_TRIG else (
                NUMBER if name in TRIG else T("q", U.ANGLE))
        if name == "sqrt":
            return T("q", U.dim_pow(x.dim, 0.5))
        if name in ("abs",):
            return x
        if name in ("min", "max"):
            for a, arg in zip(args[1:], node.args[1:]):
                if a.dim != x.dim:
                    raise DimensionError(f"{name}() of {U.describe_dim(x.dim)} and {U.describe_dim(a.dim)}",
                                         arg.span, hint="every value compared must have the same dimension")
            return x
        if name in TRIG:
            if x.dim != U.ANGLE:
                raise AngleError(f"{name}() needs an angle, got {U.describe_dim(x.dim)}", node.args[0].span,
                                 hint="write the angle with its unit, e.g. 30 deg or 0.52 rad")
            return NUMBER
        if name in INVERSE_TRIG:
            if x.dim != U.DIMENSIONLESS:
                raise DimensionError(f"{name}() needs a plain number (a ratio), got {U.describe_dim(x.dim)}",
                                     node.args[0].span)
            return T("q", U.ANGLE)
        if name == "atan2":
            if len(args) == 2 and args[1].dim != x.dim:
                raise DimensionError("atan2() needs two values of the same dimension", node.span)
            return T("q", U.ANGLE)
        if name in TRANSCENDENTAL or name in ("ceil", "floor"):
            if x.dim != U.DIMENSIONLESS:
                raise DimensionError(f"{name}() needs a plain number, got {U.describe_dim(x.dim)}",
                                     node.args[0].span)
            return NUMBER
        return ANY

    def _infer_PluginCall(self, node: N.PluginCall) -> T:
        pf = self.plugins.function(node.namespace, node.func)
        given = {}
        for kw in node.kwargs:
            if kw.name in given:
                raise PluginArgumentError(f"'{kw.name}' is given twice", kw.span)
            given[kw.name] = (self.infer(kw.value), kw)
        from .plugin import check_argument_kinds

        try:
            check_argument_kinds(pf, {k: None for k in given})
        except PluginArgumentError as exc:
            param = getattr(exc, "param", None)
            raise exc.with_span(given[param][1].span if param in given else node.func_span or node.span)
        for name, (t, kw) in given.items():
            self._argument(pf, pf.param(name), t, kw)
        return T("record", record=pf, record_type=pf.returns)

    def _argument(self, pf: PluginFunction, p, t: T, kw: N.Keyword) -> None:
        where = f"{pf.qualname}: '{p.name}'"
        kind = p.kind_
        if t.kind == "any":
            return
        if kind in ("quantity", "number"):
            want = p.dimension if kind == "quantity" else U.DIMENSIONLESS
            if t.kind != "q":
                raise PluginArgumentError(f"{where} needs {p.describe()}, got a {t.describe()}", kw.value.span)
            if t.dim != want:
                hint = None
                if t.dim == U.DIMENSIONLESS:
                    hint = "a bare number has no unit: write it with one, e.g. 150 mm"
                raise PluginArgumentError(f"{where} needs {U.describe_dim(want)}, got {U.describe_dim(t.dim)}",
                                          kw.value.span, hint=hint)
        elif kind in ("text", "flag"):
            if t.kind != "text":
                raise PluginArgumentError(f"{where} needs a text in quotes, got a {t.describe()}", kw.value.span)
            choices = p.choices or (("yes", "no") if kind == "flag" else None)
            if choices and isinstance(kw.value, N.Text) and kw.value.value not in choices:
                raise PluginArgumentError(f"{where} must be one of " + ", ".join(f'"{c}"' for c in choices),
                                          kw.value.span)
        elif kind == "record":
            if t.kind != "record" or t.record_type != p.record:
                raise PluginArgumentError(f"{where} needs a {p.record} record, got a {t.describe()}", kw.value.span)
        elif kind in ("list", "points"):
            items = kw.value.items if isinstance(kw.value, N.ListExpr) else None
            if t.kind != "list":
                if kind == "list" and (t.kind == "q" or t.kind == "record"):
                    items = [kw.value]
                else:
                    raise PluginArgumentError(f"{where} needs a list [..], got a {t.describe()}", kw.value.span)
            for item in items or []:
                it = self.infer(item)
                if it.kind == "any":
                    continue
                if kind == "points":
                    pts = item.items if isinstance(item, N.TupleExpr) else None
                    if pts is None or len(pts) != 2:
                        raise PluginArgumentError(f"{where} needs points written (x, y)", item.span)
                    for c in pts:
                        ct = self.infer(c)
                        if ct.kind == "q" and ct.dim != p.dimension:
                            raise PluginArgumentError(
                                f"{where} needs coordinates in {U.describe_dim(p.dimension)}, got "
                                f"{U.describe_dim(ct.dim)}", c.span)
                elif p.record:
                    if it.kind != "record" or it.record_type != p.record:
                        raise PluginArgumentError(f"{where} needs {p.record} records, got a {it.describe()}",
                                                  item.span)
                else:
                    want = p.dimension if p.dim is not None else U.DIMENSIONLESS
                    if it.kind != "q" or it.dim != want:
                        raise PluginArgumentError(f"{where} needs items of {U.describe_dim(want)}, got "
                                                  f"{it.describe()}", item.span)


def constant_value(node: N.Expr) -> float | None:
    """The value of an expression made only of plain number literals (for exponents)."""
    if isinstance(node, N.Number):
        return None if node.unit else node.value
    if isinstance(node, N.Paren):
        return constant_value(node.inner)
    if isinstance(node, N.Neg):
        v = constant_value(node.operand)
        return None if v is None else -v
    if isinstance(node, N.BinOp) and node.op in "+-*/":
        a, b = constant_value(node.left), constant_value(node.right)
        if a is None or b is None:
            return None
        if node.op == "/":
            return a / b if b else None
        return {"+": a + b, "-": a - b, "*": a * b}[node.op]
    return None


def _unit_span(node: N.Number):
    s = node.span
    if s is None:
        return None
    width = len(node.unit_text)
    return type(s)(s.end_line, s.end_col - width, s.end_line, s.end_col)


def _operand(node) -> str:
    if isinstance(node, N.Name):
        return node.id
    if isinstance(node, N.FieldAccess):
        return f"{_operand(node.obj)}.{node.field_name}"
    if isinstance(node, N.Number):
        return f"{node.text} {node.unit_text}".strip()
    return "the expression"


def _explain(expr, checker: Checker) -> str | None:
    """Which operand carried which dimension, for a declared-unit mismatch."""
    parts = []
    for n in N.walk(expr):
        if isinstance(n, N.Name) and n.id in checker.types and checker.types[n.id].kind == "q":
            parts.append(f"{n.id} is {U.describe_dim(checker.types[n.id].dim)}")
    if not parts:
        return None
    seen = []
    for p in parts:
        if p not in seen:
            seen.append(p)
    return "; ".join(seen[:4])
