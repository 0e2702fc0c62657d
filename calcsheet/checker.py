"""Static dimension inference: every unit mistake, found without evaluating.

Types come from literals, declared ``[unit]``s and plugin signatures. A
statement whose root is broken gets the type ANY, and nothing downstream of
it is reported again: one error per root cause. Errors are specialised into
the slip they most likely are (``calcsheet.slips``), and statements that
type-check are then linted for warnings and infos: implausible values for
what their name says they are, unit names shadowing variables, unused
inputs, checks without a utilisation, unusual declared units.
"""
from __future__ import annotations

from dataclasses import dataclass

from . import nodes as N
from . import units as U
from . import lint
from .errors import (
    AngleError,
    CalcError,
    DeclaredUnitError,
    DimensionError,
    Diagnostic,
    OffsetTemperatureError,
    PluginArgumentError,
    TypeMismatchError,
    UnknownFieldError,
    UnknownUnitError,
)
from .evaluator import INVERSE_TRIG, TRANSCENDENTAL, TRIG
from .plugin import PluginFunction, PluginRegistry
from .resolver import Resolution, check_key
from .slips import specialise

TEMPERATURE = (("[temperature]", 1),)


@dataclass(frozen=True)
class T:
    """A static type: kind 'q' (quantity of ``dim``), 'text', 'list', 'record', or 'any'.

    ``offset`` marks a temperature on an offset scale (°C, °F): it may be
    stored, compared and subtracted from another, never added or multiplied.
    """

    kind: str
    dim: U.Dim | None = None
    item: "T | None" = None
    record: PluginFunction | None = None  # the function that made this record
    record_type: str | None = None
    offset: bool = False

    def describe(self) -> str:
        if self.kind == "q":
            return U.describe_dim(self.dim) + (" on an offset scale (°C/°F)" if self.offset else "")
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
        self.defined: dict[str, int] = {}
        self.res: Resolution | None = None
        self._shadows: list[N.Number] = []  # literals in the current statement whose unit is a variable name
        self.shadowed: set[str] = set()  # variable names read as units somewhere (not also "unused")
        self._pending: list[Diagnostic] = []  # warnings of the current statement (dropped if it has an error)
        self.consts = lint.Constants(self)

    # ------------------------------------------------------------ statements
    def check_sheet(self, sheet: N.Sheet, res: Resolution) -> list[Diagnostic]:
        self.res = res
        self.defined = res.defined_at
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
            self._shadows, self._pending = [], []
            try:
                if isinstance(stmt, N.Definition):
                    self.types[stmt.name] = self.definition(stmt)
                else:
                    self.check(stmt)
            except Broken:
                res.broken.add(key)
                if isinstance(stmt, N.Definition):
                    self.types[stmt.name] = ANY
                continue
            except CalcError as exc:
                res.broken.add(key)
                diags.append(self._with_shadow_note(exc).diagnostic(self.path))
                if isinstance(stmt, N.Definition):
                    self.types[stmt.name] = ANY
                continue
            diags.extend(lint.shadow_warnings(self._shadows, self.defined, self.path))
            diags.extend(self._pending)
            if isinstance(stmt, N.Definition):
                diags.extend(lint.definition_findings(stmt, self.types[stmt.name], self, self.path))
            else:
                diags.extend(lint.check_findings(stmt, self, self.path))
        diags.extend(lint.unused_inputs(res, self.path, skip=self.shadowed))
        return diags

    def _with_shadow_note(self, exc: CalcError) -> CalcError:
        """An error in a statement with ``2 L`` (L a variable) most likely comes from that literal."""
        if self._shadows:
            lit = self._shadows[0]
            name, fix = lint.shadowing_factor(lit, self.defined)
            note = (f"'{lit.text} {lit.unit_text}' reads {name} as a unit ({lint.unit_words(name)}), "
                    f"not the variable {name} defined on line {self.defined[name]}: write {fix}")
            exc.hint = f"{note}; {exc.hint}" if exc.hint else note
        return exc

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
                exc = DeclaredUnitError(
                    f"{stmt.name} is declared [{stmt.unit_text}] ({U.describe_dim(want)}) "
                    f"but the expression gives {U.describe_dim(t.dim)}",
                    stmt.unit_span or stmt.span,
                    hint=_explain(stmt.expr, self),
                )
                specialise(exc, want, t.dim, _operand(stmt.expr, "the expression"))
                raise exc
        return t

    def check(self, stmt: N.Check) -> None:
        a = self._quantity(self.infer(stmt.left), stmt.left)
        b = self._quantity(self.infer(stmt.right), stmt.right)
        if a.kind == "any" or b.kind == "any":
            return
        if a.dim != b.dim:
            exc = DimensionError(
                f"cannot compare {U.describe_dim(a.dim)} with {U.describe_dim(b.dim)}", stmt.span,
                hint=f"left: {_operand(stmt.left)} is {U.describe_dim(a.dim)}; "
                     f"right: {_operand(stmt.right)} is {U.describe_dim(b.dim)}; "
                     "both sides of a check must have the same dimension")
            if not specialise(exc, b.dim, a.dim, _operand(stmt.left, "the left side")):
                specialise(exc, a.dim, b.dim, _operand(stmt.right, "the right side"))
            raise exc

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
        shadow = lint.shadowing_factor(node, self.defined)
        if shadow is not None:
            self._shadows.append(node)
            self.shadowed.add(shadow[0])
        try:
            unit = U.build_unit(node.unit)
        except UnknownUnitError as exc:
            bad = next((n for n, _ in node.unit if n in self.defined and n not in U.VOCABULARY), None)
            if bad is not None:
                prefix = node.unit_text.split(bad)[0].rstrip("*·")
                if prefix:
                    exc.hint = (f"'{bad}' is a variable of this sheet, but a unit after a number runs on through "
                                f"'*': write ({node.text} {prefix})*{bad}…, or put the variable first")
                else:
                    exc.hint = (f"'{bad}' is a variable of this sheet; a number followed directly by a name reads "
                                f"the name as a unit: write {node.text}*{bad}")
            raise exc.with_span(_unit_span(node))
        offset = any(U.VOCABULARY.get(n) in U.OFFSET_UNITS for n, _ in node.unit)
        if offset and (len(node.unit) > 1 or node.unit[0][1] != 1):
            raise OffsetTemperatureError(
                f"'{node.unit_text}' puts a temperature scale (°C/°F) inside a compound unit", _unit_span(node),
                hint="a per-degree coefficient is per kelvin: write e.g. 1.2e-5 K^-1")
        return T("q", U.dim_of(unit), offset=offset)

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

    def _offset_error(self, node: N.BinOp, a: T, b: T) -> None:
        side = node.left if a.offset else node.right
        what = {"+": "added to", "-": "combined with", "*": "multiplied", "/": "divided", "^": "raised to a power"}
        raise OffsetTemperatureError(
            f"{_operand(side, 'this value')} is a temperature on the °C/°F scale; it cannot be "
            f"{what[node.op]}" + ("" if node.op in "*/^" else " another value"), side.span,
            hint="only a difference of two such temperatures is a quantity (T_2 - T_1 gives K); "
                 "use that difference, or write the temperature in K")

    def _infer_BinOp(self, node: N.BinOp) -> T:
        a = self._quantity(self.infer(node.left), node.left)
        b = self._quantity(self.infer(node.right), node.right)
        op = node.op
        if a.offset or b.offset:
            if op == "-" and a.offset and b.offset:
                return T("q", a.dim)
            self._offset_error(node, a, b)
        if op in "+-":
            if a.kind == "any" or b.kind == "any":
                return a if b.kind == "any" else b
            if a.dim != b.dim:
                word = "add" if op == "+" else "subtract"
                exc = DimensionError(
                    f"cannot {word} {U.describe_dim(b.dim)} {'to' if op == '+' else 'from'} {U.describe_dim(a.dim)}",
                    node.span, hint=f"left: {_operand(node.left)} is {U.describe_dim(a.dim)}; "
                                    f"right: {_operand(node.right)} is {U.describe_dim(b.dim)}")
                if not specialise(exc, a.dim, b.dim, _operand(node.right, "the right operand")):
                    specialise(exc, b.dim, a.dim, _operand(node.left, "the left operand"))
                raise exc
            return a
        if op in "*/":
            if a.kind == "any" or b.kind == "any":
                return ANY
            return T("q", U.dim_mul(a.dim, b.dim, 1 if op == "*" else -1))
        # power
        if b.kind == "q" and b.dim != U.DIMENSIONLESS:
            raise DimensionError(f"an exponent must be a plain number, not {U.describe_dim(b.dim)}", node.right.span,
                                 hint=f"{_operand(node.right)} is {U.describe_dim(b.dim)}")
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
        try:
            ns = self.plugins.namespace(record_type.split(".")[0]) if self.plugins.is_namespace(
                record_type.split(".")[0]) else None
        except Exception:  # a plugin that fails to load is reported where it is called
            return None
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

    def _infer_Compare(self, node: N.Compare) -> T:
        raise TypeMismatchError("a comparison belongs in a check, or as the condition of if(…)", node.span,
                                hint="write if(a <= b, value, otherwise)")

    def _infer_if(self, node: N.Call) -> T:
        if len(node.args) != 3:
            raise TypeMismatchError(f"if() takes 3 arguments (condition, value, otherwise), got {len(node.args)}",
                                    node.span)
        cond, then, otherwise = node.args
        if not isinstance(cond, N.Compare):
            raise TypeMismatchError("if() needs a comparison first: if(a <= b, value, otherwise)", cond.span)
        a = self._quantity(self.infer(cond.left), cond.left)
        b = self._quantity(self.infer(cond.right), cond.right)
        if a.kind == "q" and b.kind == "q" and a.dim != b.dim:
            raise DimensionError(f"cannot compare {U.describe_dim(a.dim)} with {U.describe_dim(b.dim)}", cond.span,
                                 hint="both sides of the condition must have the same dimension")
        x, y = self.infer(then), self.infer(otherwise)
        if x.kind == "any" or y.kind == "any":
            return ANY
        if x.kind != y.kind or (x.kind == "q" and x.dim != y.dim):
            raise DimensionError(f"the two values of if() differ: {x.describe()} and {y.describe()}", node.span,
                                 hint="both outcomes must have the same dimension")
        return x

    def _infer_Call(self, node: N.Call) -> T:
        name = node.func
        if name == "if":
            return self._infer_if(node)
        args = [self._quantity(self.infer(a), a) for a in node.args]
        if not args:
            raise TypeMismatchError(f"{name}() needs an argument", node.span)
        x = args[0]
        if any(a.kind == "any" for a in args):
            return ANY if name not in TRIG and name not in INVERSE_TRIG else (
                NUMBER if name in TRIG else T("q", U.ANGLE))
        if name in ("abs", "min", "max"):
            for a, arg in zip(args[1:], node.args[1:]):
                if a.dim != x.dim:
                    raise DimensionError(f"{name}() of {U.describe_dim(x.dim)} and {U.describe_dim(a.dim)}",
                                         arg.span, hint=f"{_operand(node.args[0])} is {U.describe_dim(x.dim)}, "
                                                        f"{_operand(arg)} is {U.describe_dim(a.dim)}; every value "
                                                        "compared must have the same dimension")
            return x
        for a, arg in zip(args, node.args):
            if a.offset:
                raise OffsetTemperatureError(f"{name}() of a temperature on the °C/°F scale", arg.span,
                                             hint="use a temperature difference (T_2 - T_1), or the value in K")
        if name == "sqrt":
            return T("q", U.dim_pow(x.dim, 0.5))
        if name in TRIG:
            if x.dim != U.ANGLE:
                arg = node.args[0]
                if x.dim == U.DIMENSIONLESS:
                    shown = _operand(arg, "")
                    hint = (f"{shown} is a bare number; write the angle with its unit, e.g. {shown} deg or "
                            f"{shown} rad" if isinstance(arg, N.Number) else
                            f"{shown or 'the argument'} is a bare number; give it a unit where it is defined "
                            "(deg or rad)")
                else:
                    hint = f"{_operand(arg)} is {U.describe_dim(x.dim)}; a trigonometric function takes an angle"
                raise AngleError(f"{name}() needs an angle, got {U.describe_dim(x.dim)}", arg.span, hint=hint)
            return NUMBER
        if name in INVERSE_TRIG:
            if x.dim != U.DIMENSIONLESS:
                raise DimensionError(f"{name}() needs a plain number (a ratio), got {U.describe_dim(x.dim)}",
                                     node.args[0].span, hint="divide two values of the same dimension first")
            return T("q", U.ANGLE)
        if name == "atan2":
            if len(args) == 2 and args[1].dim != x.dim:
                raise DimensionError("atan2() needs two values of the same dimension", node.span,
                                     hint=f"{U.describe_dim(x.dim)} and {U.describe_dim(args[1].dim)}")
            return T("q", U.ANGLE)
        if name in TRANSCENDENTAL or name in ("ceil", "floor"):
            if x.dim != U.DIMENSIONLESS:
                raise DimensionError(f"{name}() needs a plain number, got {U.describe_dim(x.dim)}",
                                     node.args[0].span, hint="divide by a reference value of the same unit first")
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

    def _need(self, where: str, want, t: T, value: N.Expr) -> None:
        """A quantity argument (or list item, or coordinate) of dimension ``want``."""
        if t.kind != "q":
            raise PluginArgumentError(f"{where} needs {U.describe_dim(want)}, got a {t.describe()}", value.span)
        if t.dim == want:
            return
        if t.dim == U.DIMENSIONLESS:
            example = {U.ANGLE: "deg"}.get(want) or _example_unit(want)
            shown = value.text if isinstance(value, N.Number) else None
            hint = (f"{shown} is a bare number; write it with its unit, e.g. {shown} {example}" if shown else
                    f"{_operand(value, 'the value')} is a bare number; give it a unit ({example}) where it is defined")
            raise PluginArgumentError(f"{where} needs {U.describe_dim(want)}, got dimensionless (a bare number)",
                                      value.span, hint=hint)
        exc = PluginArgumentError(f"{where} needs {U.describe_dim(want)}, got {U.describe_dim(t.dim)}", value.span,
                                  hint=f"{_operand(value)} is {U.describe_dim(t.dim)}")
        specialise(exc, want, t.dim, _operand(value, "the value"))
        raise exc

    def _argument(self, pf: PluginFunction, p, t: T, kw: N.Keyword) -> None:
        where = f"{pf.qualname}: '{p.name}'"
        kind = p.kind_
        if t.kind == "any":
            return
        if kind in ("quantity", "number"):
            want = p.dimension if kind == "quantity" else U.DIMENSIONLESS
            self._need(where, want, t, kw.value)
            self._pending.extend(lint.argument_findings(p.name, kw.value, self, self.path))
        elif kind in ("text", "flag"):
            if t.kind != "text":
                raise PluginArgumentError(f"{where} needs a text in quotes, got a {t.describe()}", kw.value.span)
            choices = p.choices or (("yes", "no") if kind == "flag" else None)
            if choices and isinstance(kw.value, N.Text) and kw.value.value not in choices:
                import difflib

                close = difflib.get_close_matches(kw.value.value, list(choices), n=1)
                raise PluginArgumentError(f"{where} must be one of " + ", ".join(f'"{c}"' for c in choices),
                                          kw.value.span, hint=f'did you mean "{close[0]}"?' if close else None)
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
                        if ct.kind == "q":
                            self._need(f"{where} coordinate", p.dimension, ct, c)
                elif p.record:
                    if it.kind != "record" or it.record_type != p.record:
                        raise PluginArgumentError(f"{where} needs {p.record} records, got a {it.describe()}",
                                                  item.span)
                else:
                    want = p.dimension if p.dim is not None else U.DIMENSIONLESS
                    self._need(f"{where} item", want, it, item)


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


_EXAMPLE_UNITS = {
    (("[length]", 1),): "mm",
    (("[length]", 2),): "mm^2",
    (("[length]", 3),): "mm^3",
    (("[length]", 4),): "mm^4",
    (("[length]", 1), ("[mass]", 1), ("[time]", -2)): "kN",
    (("[mass]", 1), ("[time]", -2)): "kN/m",
    (("[length]", -1), ("[mass]", 1), ("[time]", -2)): "MPa",
    (("[length]", 2), ("[mass]", 1), ("[time]", -2)): "kN*m",
    (("[length]", -3), ("[mass]", 1)): "kg/m^3",
}


def _example_unit(dim) -> str:
    return _EXAMPLE_UNITS.get(dim, "its unit")


def _unit_span(node: N.Number):
    s = node.span
    if s is None:
        return None
    width = len(node.unit_text)
    return type(s)(s.end_line, s.end_col - width, s.end_line, s.end_col)


def _operand(node, fallback: str = "the expression") -> str:
    while isinstance(node, N.Paren):
        node = node.inner
    if isinstance(node, N.Name):
        return node.id
    if isinstance(node, N.FieldAccess):
        inner = _operand(node.obj, "")
        return f"{inner}.{node.field_name}" if inner else node.field_name
    if isinstance(node, N.Number):
        return f"{node.text} {node.unit_text}".strip()
    return fallback


def _explain(expr, checker: Checker) -> str | None:
    """Which operand carried which dimension, for a declared-unit mismatch."""
    parts = []
    for n in N.walk(expr):
        if isinstance(n, N.Name) and n.id in checker.types and checker.types[n.id].kind == "q":
            parts.append(f"{n.id} is {U.describe_dim(checker.types[n.id].dim)}")
        elif isinstance(n, N.FieldAccess):
            try:
                t = checker.infer(n)
            except (CalcError, Broken):
                continue
            if t.kind == "q":
                parts.append(f"{_operand(n)} is {U.describe_dim(t.dim)}")
    if not parts:
        return None
    seen = []
    for p in parts:
        if p not in seen:
            seen.append(p)
    return "; ".join(seen[:4])
