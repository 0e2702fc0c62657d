"""Evaluate statements to pint quantities, leaving Step records behind.

Every arithmetic result is checked for being finite and real, with the span
of the operation that produced it; pint's silent surprises (angles as plain
numbers, unreduced ratios, complex powers) are refused here.
"""
from __future__ import annotations

import math
from typing import Any

import pint

from . import nodes as N
from . import units as U
from .display import DisplayPolicy
from .errors import (
    AngleError,
    CalcError,
    DeclaredUnitError,
    DimensionError,
    DivisionByZeroError,
    NumericError,
    PluginArgumentError,
    PluginInputError,
    TypeMismatchError,
    UndefinedNameError,
    UnknownFieldError,
    UnknownFunctionError,
)
from .plugin import PluginRegistry, Record, Work, check_argument_kinds, default_registry
from .trace import CheckResult, Step

CONSTANTS = {"pi": math.pi}

TRIG = {"sin": math.sin, "cos": math.cos, "tan": math.tan}
INVERSE_TRIG = {"asin": math.asin, "acos": math.acos, "atan": math.atan}
TRANSCENDENTAL = {"exp": math.exp, "ln": math.log, "log10": math.log10}
FUNCTIONS = {
    "sqrt": (1, 1), "abs": (1, 1), "min": (1, None), "max": (1, None), "atan2": (2, 2),
    "ceil": (1, 1), "floor": (1, 1), "if": (3, 3),
    **{f: (1, 1) for f in TRIG}, **{f: (1, 1) for f in INVERSE_TRIG}, **{f: (1, 1) for f in TRANSCENDENTAL},
}


def kind_of(v) -> str:
    if isinstance(v, pint.Quantity):
        return "quantity"
    if isinstance(v, str):
        return "text"
    if isinstance(v, Record):
        return f"{v.type} record"
    if isinstance(v, tuple):
        return "list"
    return type(v).__name__


class Evaluator:
    """Walks expressions; one instance per sheet run (it holds the display policy)."""

    def __init__(self, policy: DisplayPolicy | None = None, plugins: PluginRegistry | None = None):
        self.policy = policy or DisplayPolicy()
        self.plugins = plugins or default_registry()
        self.reg = U.registry()
        self._dimensionless = self.reg.Unit("")
        self._radian = self.reg.Unit("radian")
        self.warnings: list[tuple[str, Any]] = []  # (message, span) from plugins
        self.plugin_versions: dict[str, str] = {}

    # ---------------------------------------------------------------- helpers
    def number(self, value: float, unit=None):
        return self.reg.Quantity(float(value), unit if unit is not None else self._dimensionless)

    def _finite(self, value, span):
        if isinstance(value, pint.Quantity):
            m = value.magnitude
            if isinstance(m, complex):
                raise NumericError("the result is a complex number", span)
            try:
                ok = math.isfinite(m)
            except TypeError:
                import numpy as np

                ok = bool(np.all(np.isfinite(m)))
            if not ok:
                raise NumericError("the result is infinite or not a number", span,
                                   hint="a value overflowed, or a division by a vanishing quantity")
        return value

    def _need_quantity(self, v, span, what="a number or quantity"):
        if not isinstance(v, pint.Quantity):
            raise TypeMismatchError(f"expected {what}, got a {kind_of(v)}", span)
        return v

    def display_unit_for(self, value, unit_text: str | None = None):
        if unit_text:
            from .units import parse_unit_text

            return U.build_unit(parse_unit_text(unit_text))
        return self.policy.unit_for(value) if isinstance(value, pint.Quantity) else None

    # ---------------------------------------------------------------- expressions
    def eval(self, node: N.Expr, env: dict, used: dict | None = None):
        cls = type(node)
        method = _DISPATCH.get(cls)
        if method is None:
            method = next(getattr(Evaluator, "_eval_" + k.__name__) for k in cls.__mro__
                          if hasattr(Evaluator, "_eval_" + k.__name__))
            _DISPATCH[cls] = method
        return method(self, node, env, used)

    def _eval_Number(self, node: N.Number, env, used):
        unit = U.build_unit(node.unit) if node.unit else self._dimensionless
        return self.reg.Quantity(node.value, unit)

    def _eval_Text(self, node, env, used):
        return node.value

    def _eval_Name(self, node: N.Name, env, used):
        if node.id in env:
            v = env[node.id]
            if used is not None:
                used[node.id] = v
            return v
        if node.id in CONSTANTS:
            return self.number(CONSTANTS[node.id])
        raise UndefinedNameError(f"'{node.id}' is not defined", node.span)

    def _eval_Paren(self, node, env, used):
        return self.eval(node.inner, env, used)

    def _eval_Neg(self, node, env, used):
        v = self._need_quantity(self.eval(node.operand, env, used), node.operand.span)
        return -v

    def _eval_BinOp(self, node: N.BinOp, env, used):
        a = self.eval(node.left, env, used)
        b = self.eval(node.right, env, used)
        a = self._need_quantity(a, node.left.span)
        b = self._need_quantity(b, node.right.span)
        op = node.op
        try:
            if op == "+":
                result = self._add(a, b, node, 1)
            elif op == "-":
                result = self._add(a, b, node, -1)
            elif op == "*":
                result = a * b
            elif op == "/":
                if b.magnitude == 0:
                    raise DivisionByZeroError("division by zero", node.right.span,
                                              hint="the divisor evaluates to zero")
                result = a / b
            else:
                result = self._pow(a, b, node)
        except pint.OffsetUnitCalculusError:
            raise DimensionError(
                "a temperature in °C or °F cannot be used in arithmetic", node.span,
                hint="use a temperature difference in K, or convert to K first",
            ) from None
        except ZeroDivisionError:
            raise DivisionByZeroError("division by zero", node.right.span) from None
        return self._finite(result, node.span)

    def _add(self, a, b, node, sign):
        da, db = U.dim_of(a), U.dim_of(b)
        if da != db:
            word = "add" if sign > 0 else "subtract"
            raise DimensionError(
                f"cannot {word} {U.describe_dim(db)} {'to' if sign > 0 else 'from'} {U.describe_dim(da)}",
                node.span,
                hint=f"left is {_show(a)}, right is {_show(b)}",
            )
        return a + b if sign > 0 else a - b

    def _pow(self, a, b, node):
        if U.dim_of(b) != U.DIMENSIONLESS:
            raise DimensionError(f"an exponent must be a plain number, not {U.describe_dim(U.dim_of(b))}",
                                 node.right.span)
        p = float(b.m_as(self._dimensionless))
        if U.dim_of(a) == U.DIMENSIONLESS:
            base = float(a.m_as(self._dimensionless))
            if base < 0 and not p.is_integer():
                raise NumericError("a negative number to a fractional power is not real", node.span)
            if base == 0 and p < 0:
                raise DivisionByZeroError("zero to a negative power", node.span)
            try:
                return self.number(base**p)
            except OverflowError:
                raise NumericError("the power overflows", node.span) from None
        if abs(p) > 12:
            raise DimensionError(f"a quantity with units raised to the power {p:g} is not a physical quantity",
                                 node.right.span)
        if a.magnitude < 0 and not p.is_integer():
            raise NumericError("a negative quantity to a fractional power is not real", node.span)
        if a.magnitude == 0 and p < 0:
            raise DivisionByZeroError("zero to a negative power", node.span)
        return a**p

    def _eval_FieldAccess(self, node: N.FieldAccess, env, used):
        obj = self.eval(node.obj, env, None)
        if not isinstance(obj, Record):
            raise TypeMismatchError(f"'{_expr_name(node.obj)}' is a {kind_of(obj)}, it has no fields", node.obj.span)
        try:
            value = obj.get(node.field_name)
        except UnknownFieldError as exc:
            raise exc.with_span(node.field_span or node.span)
        if used is not None:
            used[_expr_name(node)] = value
        return value

    def _eval_ListExpr(self, node, env, used):
        return tuple(self.eval(i, env, used) for i in node.items)

    def _eval_TupleExpr(self, node, env, used):
        return tuple(self.eval(i, env, used) for i in node.items)

    def _eval_Call(self, node: N.Call, env, used):
        name = node.func
        if name not in FUNCTIONS:
            raise UnknownFunctionError(f"unknown function '{name}'", node.func_span or node.span,
                                       hint=_close(name, FUNCTIONS))
        if node.kwargs:
            raise TypeMismatchError(f"{name}() takes no named arguments", node.kwargs[0].span)
        lo, hi = FUNCTIONS[name]
        if len(node.args) < lo or (hi is not None and len(node.args) > hi):
            want = f"{lo}" if lo == hi else f"at least {lo}"
            raise TypeMismatchError(f"{name}() takes {want} argument(s), got {len(node.args)}", node.span)
        if name == "if":
            return self._eval_if(node, env, used)
        args = [self._need_quantity(self.eval(a, env, used), a.span) for a in node.args]
        x = args[0]
        span = node.span
        if name == "sqrt":
            if x.magnitude < 0:
                raise NumericError("square root of a negative value", node.args[0].span)
            return self._finite(x**0.5, span)
        if name == "abs":
            return abs(x)
        if name in ("min", "max"):
            d0 = U.dim_of(x)
            for a, arg in zip(args[1:], node.args[1:]):
                if U.dim_of(a) != d0:
                    raise DimensionError(f"{name}() of {U.describe_dim(d0)} and {U.describe_dim(U.dim_of(a))}",
                                         arg.span)
            pick = min if name == "min" else max
            return pick(args, key=lambda q: q.to(x.units).magnitude)
        if name in TRIG:
            if U.dim_of(x) != U.ANGLE:
                hint = "write the angle with its unit, e.g. 30 deg or 0.52 rad"
                raise AngleError(f"{name}() needs an angle, got {U.describe_dim(U.dim_of(x))}", node.args[0].span,
                                 hint=hint)
            return self._finite(self.number(TRIG[name](x.m_as(self._radian))), span)
        if name in INVERSE_TRIG or name == "atan2":
            if name == "atan2":
                y, xx = args
                if U.dim_of(y) != U.dim_of(xx):
                    raise DimensionError("atan2() needs two values of the same dimension", span)
                angle = math.atan2(y.magnitude, xx.to(y.units).magnitude)
            else:
                v = self._plain(x, name, node.args[0].span)
                if name != "atan" and not -1 <= v <= 1:
                    raise NumericError(f"{name}() of {v:g} is outside -1…1", node.args[0].span)
                angle = INVERSE_TRIG[name](v)
            return self.reg.Quantity(math.degrees(angle), self.reg.Unit("degree"))
        if name in TRANSCENDENTAL:
            v = self._plain(x, name, node.args[0].span)
            if name != "exp" and v <= 0:
                raise NumericError(f"{name}() of a value that is not positive", node.args[0].span)
            try:
                return self._finite(self.number(TRANSCENDENTAL[name](v)), span)
            except OverflowError:
                raise NumericError(f"{name}() overflows", span) from None
        if name in ("ceil", "floor"):
            v = self._plain(x, name, node.args[0].span)
            return self.number(float(math.ceil(v) if name == "ceil" else math.floor(v)))
        raise UnknownFunctionError(f"unknown function '{name}'", span)  # pragma: no cover

    def _eval_if(self, node: N.Call, env, used):
        cond, then, otherwise = node.args
        if not isinstance(cond, N.Compare):
            raise TypeMismatchError("if() needs a comparison first: if(a <= b, value, otherwise)", cond.span)
        a = self._need_quantity(self.eval(cond.left, env, used), cond.left.span)
        b = self._need_quantity(self.eval(cond.right, env, used), cond.right.span)
        if U.dim_of(a) != U.dim_of(b):
            raise DimensionError(f"cannot compare {U.describe_dim(U.dim_of(a))} with {U.describe_dim(U.dim_of(b))}",
                                 cond.span, hint=f"left is {_show(a)}, right is {_show(b)}")
        am, bm = float(a.magnitude), float(b.to(a.units).magnitude)
        chosen, skipped = (then, otherwise) if _COMPARE[cond.op](am, bm) else (otherwise, then)
        value = self.eval(chosen, env, used)
        if used is not None:  # the branch not taken is printed with its values too
            for n in N.walk(skipped):
                if isinstance(n, N.Name) and n.id in env:
                    used.setdefault(n.id, env[n.id])
        other = self.eval(skipped, env, None) if _plain_branch(skipped, env) else None
        if isinstance(value, pint.Quantity) and isinstance(other, pint.Quantity) and \
                U.dim_of(value) != U.dim_of(other):
            raise DimensionError("the two values of if() have different dimensions", node.span,
                                 hint=f"{_show(value)} and {_show(other)}")
        return value

    def _eval_Compare(self, node, env, used):
        raise TypeMismatchError("a comparison belongs in a check, or as the condition of if(…)", node.span)

    def _plain(self, x, name, span) -> float:
        if U.dim_of(x) != U.DIMENSIONLESS:
            raise DimensionError(f"{name}() needs a plain number, got {U.describe_dim(U.dim_of(x))}", span)
        return float(x.m_as(self._dimensionless))

    # ---------------------------------------------------------------- plugins
    def _eval_PluginCall(self, node: N.PluginCall, env, used):
        try:
            pf = self.plugins.function(node.namespace, node.func)
        except CalcError as exc:
            raise exc.with_span(node.func_span or node.span)
        self.plugin_versions[node.namespace] = pf.version
        if node.args:
            raise PluginArgumentError(f"{pf.qualname} takes named arguments only", node.args[0].span,
                                      hint="write name=value for each argument")
        spans = {kw.name: kw.span for kw in node.kwargs}
        given = {}
        for kw in node.kwargs:
            if kw.name in given:
                raise PluginArgumentError(f"'{kw.name}' is given twice", kw.span)
            given[kw.name] = self.eval(kw.value, env, used)
        try:
            check_argument_kinds(pf, given)
        except PluginArgumentError as exc:
            raise exc.with_span(spans.get(getattr(exc, "param", None)) or node.func_span or node.span)
        args = {}
        for p in pf.params:
            if p.name in given:
                args[p.name] = self.coerce_argument(pf, p, given[p.name], spans[p.name])
            else:
                args[p.name] = p.default
        work = Work(pf, args, {"system": self.policy.system, "sigfigs": self.policy.sigfigs}, self)
        try:
            out = pf.func(work, **args)
        except PluginInputError as exc:
            raise exc.with_span(spans.get(getattr(exc, "param", None)) or node.span)
        except CalcError as exc:
            raise exc.with_span(node.span)
        except Exception as exc:  # a plugin bug must not crash the build
            raise PluginInputError(f"{pf.qualname} failed: {type(exc).__name__}: {exc}", node.span) from exc
        for message, param in work.warnings:
            self.warnings.append((message, spans.get(param) or node.span))
        return self.make_record(pf, out, work, node.span)

    def coerce_argument(self, pf, p, value, span):
        """Check one argument against its declared kind and dimension."""
        kind = p.kind_
        where = f"{pf.qualname}: '{p.name}'"
        if kind in ("quantity", "number"):
            if not isinstance(value, pint.Quantity):
                raise PluginArgumentError(f"{where} needs {p.describe()}, got a {kind_of(value)}", span)
            want = p.dimension if kind == "quantity" else U.DIMENSIONLESS
            self._check_dim(where, p, want, value, span)
            return value
        if kind in ("text", "flag"):
            if not isinstance(value, str):
                raise PluginArgumentError(f"{where} needs a text in quotes, got a {kind_of(value)}", span)
            choices = p.choices or (("yes", "no") if kind == "flag" else None)
            if choices and value not in choices:
                raise PluginArgumentError(f"{where} must be one of " + ", ".join(f'"{c}"' for c in choices),
                                          span, hint=_close(value, choices))
            return value
        if kind == "record":
            if not isinstance(value, Record) or value.type != p.record:
                raise PluginArgumentError(f"{where} needs a {p.record} record, got a {kind_of(value)}", span)
            return value
        if kind == "list":
            items = value if isinstance(value, tuple) else (value,)
            for item in items:
                if p.record:
                    if not isinstance(item, Record) or item.type != p.record:
                        raise PluginArgumentError(f"{where} needs a list of {p.record} records, "
                                                  f"got a {kind_of(item)} in it", span)
                elif not isinstance(item, pint.Quantity):
                    raise PluginArgumentError(f"{where} needs a list of quantities, got a {kind_of(item)} in it", span)
                else:
                    self._check_dim(where, p, p.dimension if p.dim is not None else U.DIMENSIONLESS, item, span)
            return items
        if kind == "points":
            if not isinstance(value, tuple):
                raise PluginArgumentError(f"{where} needs a list of (x, y) points", span)
            for pt in value:
                if not (isinstance(pt, tuple) and len(pt) == 2 and all(isinstance(c, pint.Quantity) for c in pt)):
                    raise PluginArgumentError(f"{where} needs points written (x, y)", span)
                for c in pt:
                    self._check_dim(where, p, p.dimension, c, span)
            return value
        return value  # pragma: no cover

    def _check_dim(self, where, p, want, value, span):
        got = U.dim_of(value)
        if got != want:
            hint = None
            if got == U.DIMENSIONLESS and want != U.DIMENSIONLESS:
                hint = f"give the unit, e.g. {p.name}=… mm" if want == (("[length]", 1),) else "give the value its unit"
            raise PluginArgumentError(
                f"{where} needs {U.describe_dim(want)}, got {U.describe_dim(got)} ({_show(value)})", span, hint=hint)

    def make_record(self, pf, out, work: Work, span) -> Record:
        if isinstance(out, Record):
            return out
        if not isinstance(out, dict):
            raise PluginInputError(f"{pf.qualname} returned {type(out).__name__}, not its fields", span)
        declared = {}
        for name, value in out.items():
            f = pf.field(name)
            if f is None:
                raise PluginInputError(f"{pf.qualname} returned an undeclared field '{name}' (plugin bug)", span)
            declared[name] = f
            if f.kind_ == "quantity" and isinstance(value, pint.Quantity) and U.dim_of(value) != f.dimension:
                if U.without_angle(U.dim_of(value)) != U.without_angle(f.dimension):
                    raise PluginInputError(
                        f"{pf.qualname} field '{name}' should be {U.describe_dim(f.dimension)} "
                        f"but is {U.describe_dim(U.dim_of(value))} (plugin bug)", span)
        absent = {}
        for f in pf.fields:
            if "{i}" not in f.name and f.name not in out:
                if not f.optional:
                    raise PluginInputError(f"{pf.qualname} did not return its field '{f.name}' (plugin bug)", span)
                absent[f.name] = f.doc
        return Record(type=pf.returns, fields=dict(out), working=work.working, source=pf.qualname,
                      declared=declared, optional=absent)

    def plugin_step(self, work: Work, name: str, formula: str, unit: str | None, desc: str | None) -> Step:
        from .parser import parse_expression

        expr = parse_expression(formula)
        used: dict = {}
        value = self.eval(expr, work.scope, used)
        display = self.display_unit_for(value, unit)
        if display is not None and isinstance(value, pint.Quantity):
            if U.without_angle(U.dim_of(value)) != U.without_angle(U.dim_of(display)):
                raise PluginInputError(f"{work.plugin.qualname}: {name} = {formula} gives "
                                       f"{U.describe_dim(U.dim_of(value))}, not [{unit}] (plugin bug)")
        return Step(name=name, expr=expr, value=value, display_unit=display,
                    used={k: (v, self.unit_of_used(work, k, v)) for k, v in used.items()}, description=desc)

    def unit_of_used(self, work: Work, key: str, value):
        for item in work.working.items:
            if isinstance(item, Step) and item.name == key:
                return item.display_unit
        return self.policy.unit_for(value) if isinstance(value, pint.Quantity) else None

    def plugin_check(self, work: Work, text: str, desc: str | None) -> CheckResult:
        from .parser import parse_statement

        stmt = parse_statement("check " + text)
        result = self.evaluate_check(stmt, work.scope, lambda k, v: self.unit_of_used(work, k, v))
        result.description = desc
        return result

    # ---------------------------------------------------------------- statements
    def evaluate_definition(self, stmt: N.Definition, env: dict, display: dict) -> Step:
        used: dict = {}
        value = self.eval(stmt.expr, env, used)
        if isinstance(value, pint.Quantity):
            self._finite(value, stmt.expr.span)
        unit = None
        if stmt.unit is not None:
            unit = U.build_unit(stmt.unit) if stmt.unit else self._dimensionless
            if not isinstance(value, pint.Quantity):
                raise DeclaredUnitError(f"{stmt.name} is a {kind_of(value)}; it cannot have a unit",
                                        stmt.unit_span or stmt.span)
            got, want = U.dim_of(value), U.dim_of(unit)
            if U.without_angle(got) != U.without_angle(want):
                raise DeclaredUnitError(
                    f"{stmt.name} is declared [{stmt.unit_text}] ({U.describe_dim(want)}) "
                    f"but the expression gives {U.describe_dim(got)}",
                    stmt.unit_span or stmt.span,
                    hint=f"the expression evaluates to {_show(value)}",
                )
            if not stmt.unit:
                unit = None
        elif isinstance(value, pint.Quantity):
            unit = literal_unit(stmt.expr) or self.policy.unit_for(value)
        if unit is not None and isinstance(value, pint.Quantity) and value.units != unit:
            value = value.to(unit)  # downstream substitutions read the value as shown
        step = Step(name=stmt.name, expr=stmt.expr, value=value, display_unit=unit,
                    used={k: (v, display.get(k) if k in display else self.policy.unit_for(v)
                              if isinstance(v, pint.Quantity) else None) for k, v in used.items()},
                    description=stmt.description, span=stmt.span)
        if isinstance(value, Record):
            step.working = value.working
        return step

    def evaluate_check(self, stmt: N.Check, env: dict, unit_of=None) -> CheckResult:
        used: dict = {}
        a = self._need_quantity(self.eval(stmt.left, env, used), stmt.left.span)
        b = self._need_quantity(self.eval(stmt.right, env, used), stmt.right.span)
        da, db = U.dim_of(a), U.dim_of(b)
        if da != db:
            raise DimensionError(f"cannot compare {U.describe_dim(da)} with {U.describe_dim(db)}", stmt.span,
                                 hint=f"left is {_show(a)}, right is {_show(b)}")
        am = float(a.magnitude)
        bm = float(b.to(a.units).magnitude)
        ok = {"<=": am <= bm, "<": am < bm, ">=": am >= bm, ">": am > bm}[stmt.op]
        demand, capacity = (a, b) if stmt.op in ("<=", "<") else (b, a)
        dm = float(demand.to(a.units).magnitude)
        cm = float(capacity.to(a.units).magnitude)
        ratio = dm / cm if cm > 0 and dm >= 0 else None
        unit_of = unit_of or (lambda k, v: self.policy.unit_for(v) if isinstance(v, pint.Quantity) else None)
        key = _expr_name(stmt.left if stmt.op in ("<=", "<") else stmt.right)
        shown = unit_of(key, demand) if key != "value" else None
        shown = shown or self.policy.unit_for(demand)
        if shown is not None:
            demand, capacity = demand.to(shown), capacity.to(shown)
        return CheckResult(left=stmt.left, op=stmt.op, right=stmt.right, demand=demand, capacity=capacity,
                           ok=ok, ratio=ratio, text="", used={k: (v, unit_of(k, v)) for k, v in used.items()},
                           description=stmt.description, span=stmt.span)


_DISPATCH: dict = {}
_COMPARE = {"<=": lambda a, b: a <= b, "<": lambda a, b: a < b, ">=": lambda a, b: a >= b,
            ">": lambda a, b: a > b}


def _plain_branch(node, env) -> bool:
    """A branch cheap and safe to evaluate for its dimension (no plugin calls)."""
    return not any(isinstance(n, (N.PluginCall, N.Call)) for n in N.walk(node))


def literal_unit(expr: N.Expr):
    """An input written as a single literal keeps the unit it was written in."""
    while isinstance(expr, (N.Neg, N.Paren)):
        expr = expr.operand if isinstance(expr, N.Neg) else expr.inner
    if isinstance(expr, N.Number) and expr.unit:
        return U.build_unit(expr.unit)
    return None


def _expr_name(node) -> str:
    if isinstance(node, N.Name):
        return node.id
    if isinstance(node, N.FieldAccess):
        return f"{_expr_name(node.obj)}.{node.field_name}"
    return "value"


def _show(q) -> str:
    if isinstance(q, pint.Quantity):
        from .display import plain_number, unit_text

        return f"{plain_number(float(q.magnitude), 4)} {unit_text(q.units)}".strip()
    return kind_of(q)


def _close(name, options) -> str | None:
    import difflib

    close = difflib.get_close_matches(name, list(options), n=1)
    return f"did you mean '{close[0]}'?" if close else None
