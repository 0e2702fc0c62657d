"""Evaluate statements to pint quantities, leaving Step records behind.

Every operator and built-in function applies its rule from
``calcsheet.builtins`` to the dimensions of the evaluated operands before it
computes, so the evaluator keeps the language's dimension rules on its own
(plugin formulas reach it without the static checker in front), and it keeps
them exactly as the checker does. Every arithmetic result is checked for
being finite and real, with the span of the operation that produced it;
pint's silent surprises (angles as plain numbers, unreduced ratios, complex
powers) are refused here. Plugin calls go through ``plugin_host``.

``evaluate_statement`` is the one place a statement is evaluated: the full
run (``engine``) and the incremental rebuild (``incremental``) both call it.
"""
from __future__ import annotations

import dataclasses
import math
from typing import Any, Callable

import pint

from . import builtins as B
from . import nodes as N
from . import units as U
from .display import DisplayPolicy
from .errors import (
    DeclaredUnitError,
    Diagnostic,
    NumericError,
    OffsetTemperatureError,
    PluginArgumentError,
    TypeMismatchError,
    UndefinedNameError,
    UnknownFieldError,
    UnknownFunctionError,
)
from .names import did_you_mean, dotted, strip_sign
from .plugin import PluginRegistry, Record, default_registry
from .plugin_host import PluginHost, kind_of, show
from .trace import CheckResult, Step



class Evaluator:
    """Walks expressions; one instance per sheet run (it holds the display policy and the plugin host)."""

    def __init__(self, policy: DisplayPolicy | None = None, plugins: PluginRegistry | None = None):
        self.policy = policy or DisplayPolicy()
        self.plugins = plugins or default_registry()
        self.reg = U.registry()
        self._dimensionless = self.reg.Unit("")
        self._constants = {name: c.quantity() for name, c in B.CONSTANTS.items()}
        self.host = PluginHost(self, self.plugins)
        self._branch_checker = None

    @property
    def warnings(self) -> list[tuple[str, Any]]:
        """(message, span) of the plugin warnings since last cleared."""
        return self.host.warnings

    def take_warnings(self, span, path: str) -> list[Diagnostic]:
        """The plugin warnings of the statement just evaluated (at ``span`` unless a plugin named its
        argument), as diagnostics; cleared for the next statement."""
        out = [Diagnostic("warning", "plugin-warning", message, at or span, path=path)
               for message, at in self.host.warnings]
        self.host.warnings.clear()
        return out

    @property
    def plugin_versions(self) -> dict[str, str]:
        return self.host.versions

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
        return self.host.display_unit_for(value, unit_text)

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
        if node.id in self._constants:
            return self._constants[node.id]
        raise UndefinedNameError(f"'{node.id}' is not defined", node.span)

    def _eval_Paren(self, node, env, used):
        return self.eval(node.inner, env, used)

    def _eval_Neg(self, node, env, used):
        v = self._need_quantity(self.eval(node.operand, env, used), node.operand.span)
        B.rule_neg(B.arg_of(v), node)
        return -v

    def _eval_BinOp(self, node: N.BinOp, env, used):
        a = self._need_quantity(self.eval(node.left, env, used), node.left.span)
        b = self._need_quantity(self.eval(node.right, env, used), node.right.span)
        try:
            result = B.apply_binop(node, a, b)
        except pint.OffsetUnitCalculusError:  # the rules refuse these first; pint's word is the last resort
            raise OffsetTemperatureError("a temperature in °C or °F cannot be used in arithmetic", node.span,
                                         hint="use a temperature difference in K, or convert to K first") from None
        except ZeroDivisionError:
            from .errors import DivisionByZeroError

            raise DivisionByZeroError("division by zero", node.right.span) from None
        return self._finite(result, node.span)

    def _eval_FieldAccess(self, node: N.FieldAccess, env, used):
        obj = self.eval(node.obj, env, None)
        if not isinstance(obj, Record):
            raise TypeMismatchError(f"'{dotted(node.obj) or 'value'}' is a {kind_of(obj)}, it has no fields",
                                    node.obj.span)
        try:
            value = obj.get(node.field_name)
        except UnknownFieldError as exc:
            raise exc.with_span(node.field_span or node.span)
        if used is not None:
            used[dotted(node) or "value"] = value
        return value

    def _eval_ListExpr(self, node, env, used):
        return tuple(self.eval(i, env, used) for i in node.items)

    def _eval_TupleExpr(self, node, env, used):
        return tuple(self.eval(i, env, used) for i in node.items)

    def _eval_Call(self, node: N.Call, env, used):
        fn = B.FUNCTIONS.get(node.func)
        if fn is None:
            raise UnknownFunctionError(f"unknown function '{node.func}'", node.func_span or node.span,
                                       hint=did_you_mean(node.func, B.FUNCTIONS))
        B.check_call_shape(fn, node)
        if fn.lazy:
            return self._eval_if(node, env, used)
        args = [self._need_quantity(self.eval(a, env, used), a.span) for a in node.args]
        fn.rule([B.arg_of(a) for a in args], node.args, node)
        return self._finite(fn.impl(args, node), node.span)

    def _eval_if(self, node: N.Call, env, used):
        cond, then, otherwise = node.args
        if not isinstance(cond, N.Compare):
            raise TypeMismatchError("if() needs a comparison first: if(a <= b, value, otherwise)", cond.span)
        a = self._need_quantity(self.eval(cond.left, env, used), cond.left.span)
        b = self._need_quantity(self.eval(cond.right, env, used), cond.right.span)
        B.rule_compare(B.arg_of(a), B.arg_of(b), cond, cond.left, cond.right, where="the condition")
        am, bm = float(a.magnitude), float(b.to(a.units).magnitude)
        chosen, skipped = (then, otherwise) if B.COMPARISONS[cond.op](am, bm) else (otherwise, then)
        value = self.eval(chosen, env, used)
        if used is not None:  # the branch not taken is printed with its values too
            for n in N.walk(skipped):
                if isinstance(n, N.Name) and n.id in env:
                    used.setdefault(n.id, env[n.id])
        # the branch not taken is not evaluated (it may well be the one that cannot be: sqrt of a negative),
        # but its dimension must still be the taken one's: the checker's inference gives it from the values
        taken, other = _word(value), self._static_word(skipped, env)
        B.rule_if(taken, other, node) if chosen is then else B.rule_if(other, taken, node)
        return value

    def _static_word(self, node: N.Expr, env: dict):
        from .checker import Checker, ValueTypes

        if self._branch_checker is None:
            self._branch_checker = Checker(self.plugins)
        self._branch_checker.types = ValueTypes(env, self.plugins)
        return self._branch_checker.infer(node).word()

    def _eval_Compare(self, node, env, used):
        raise TypeMismatchError("a comparison belongs in a check, or as the condition of if(…)", node.span)

    # ---------------------------------------------------------------- plugins
    def _eval_PluginCall(self, node: N.PluginCall, env, used):
        pf = self.host.function(node)
        if node.args:
            raise PluginArgumentError(f"{pf.qualname} takes named arguments only", node.args[0].span,
                                      hint="write name=value for each argument")
        spans = {kw.name: kw.span for kw in node.kwargs}
        given = {}
        for kw in node.kwargs:
            if kw.name in given:
                raise PluginArgumentError(f"'{kw.name}' is given twice", kw.span)
            given[kw.name] = self.eval(kw.value, env, used)
        return self.host.call(pf, node, given, spans)

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

            def mismatch():
                return DeclaredUnitError(
                    f"{stmt.name} is declared [{stmt.unit_text}] ({U.describe_dim(U.dim_of(unit))}) "
                    f"but the expression gives {U.describe_dim(U.dim_of(value))}",
                    stmt.unit_span or stmt.span, hint=f"the expression evaluates to {show(value)}")

            B.rule_declared(B.arg_of(value), B.unit_arg(unit), stmt, mismatch)
            if not stmt.unit:
                unit = None
        elif isinstance(value, pint.Quantity):
            if B.arg_of(value).offset:  # a °C/°F temperature keeps its scale (in K it would lose it)
                unit = value.units
            else:
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
        B.rule_compare(B.arg_of(a), B.arg_of(b), stmt, stmt.left, stmt.right)
        am = float(a.magnitude)
        bm = float(b.to(a.units).magnitude)
        ok = B.COMPARISONS[stmt.op](am, bm)
        demand, capacity = (a, b) if stmt.op in ("<=", "<") else (b, a)
        dm = float(demand.to(a.units).magnitude)
        cm = float(capacity.to(a.units).magnitude)
        ratio = dm / cm if cm > 0 and dm >= 0 else None
        unit_of = unit_of or (lambda k, v: self.policy.unit_for(v) if isinstance(v, pint.Quantity) else None)
        key = dotted(stmt.left if stmt.op in ("<=", "<") else stmt.right) or "value"
        shown = unit_of(key, demand) if key != "value" else None
        shown = shown or self.policy.unit_for(demand)
        if shown is not None:
            demand, capacity = demand.to(shown), capacity.to(shown)
        return CheckResult(left=stmt.left, op=stmt.op, right=stmt.right, demand=demand, capacity=capacity,
                           ok=ok, ratio=ratio, text="", used={k: (v, unit_of(k, v)) for k, v in used.items()},
                           description=stmt.description, span=stmt.span)


_DISPATCH: dict = {}


def _word(value):
    """A value as ``builtins.rule_if`` compares it."""
    return B.arg_of(value) if isinstance(value, pint.Quantity) else kind_of(value)


def evaluate_statement(ev: Evaluator, stmt: N.Statement, env: dict, display: dict, *,
                       overrides: dict | None = None, applied: dict | None = None, inputs=(),
                       unit_of: Callable | None = None) -> Step | CheckResult:
    """Evaluate one definition or check: the one statement step of the full run and the incremental rebuild.

    A definition named in ``overrides`` (a pint Quantity, or an expression node) takes that value, keeps the
    sheet's own as ``overridden`` and records (original, new) in ``applied``; its value and display unit are
    bound in ``env`` and ``display``. A check's demand is shown in ``unit_of(key, value)``.
    """
    if isinstance(stmt, N.Check):
        return ev.evaluate_check(stmt, env, unit_of)
    overrides = overrides or {}
    if stmt.name in overrides:
        original = ev.evaluate_definition(stmt, env, display).value
        o = overrides[stmt.name]
        if isinstance(o, pint.Quantity):
            step = ev.evaluate_definition(stmt, env, display)
            step.value = o
        else:
            step = ev.evaluate_definition(dataclasses.replace(stmt, expr=o), env, display)
        step.overridden = original
        if applied is not None:
            applied[stmt.name] = (original, step.value)
    else:
        step = ev.evaluate_definition(stmt, env, display)
    step.is_input = stmt.name in inputs
    step.anchor = "v-" + stmt.name
    env[stmt.name] = step.value
    display[stmt.name] = step.display_unit
    return step


def literal_unit(expr: N.Expr):
    """An input written as a single literal keeps the unit it was written in."""
    expr = strip_sign(expr)
    if isinstance(expr, N.Number) and expr.unit:
        return U.build_unit(expr.unit)
    return None
