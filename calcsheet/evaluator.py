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

import collections
import dataclasses
import math
import weakref
from math import isfinite as _isfinite
from typing import Any, Callable

import pint

from . import builtins as B
from . import nodes as N
from . import units as U
from .display import DisplayPolicy
from .errors import (
    CalcError,
    CheckSignError,
    DeclaredUnitError,
    DivisionByZeroError,
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
from .trace import CheckResult, FunctionStep, Note, SheetTable, Step, Working


@dataclasses.dataclass(frozen=True)
class SheetFunction:
    """A sheet's own function as a value in the environment (the resolver keeps its name from being read)."""

    fd: N.FunctionDef

    def __str__(self):
        return f"function {self.fd.name}"



class Evaluator:
    """Walks expressions; one instance per sheet run (it holds the display policy and the plugin host)."""

    def __init__(self, policy: DisplayPolicy | None = None, plugins: PluginRegistry | None = None,
                 front_matter: dict | None = None):
        self.lookups: list = []  # the working of the current statement's table lookups
        self.policy = policy or DisplayPolicy()
        # the sheet's front matter, which plugins read as Work.settings["front_matter"] (e.g. design_method)
        self.front_matter = dict(front_matter or {})
        self.plugins = plugins or default_registry()
        self.reg = U.registry()
        self._dimensionless = self.reg.Unit("")
        self._constants = {name: c.quantity() for name, c in B.CONSTANTS.items()}
        self.host = PluginHost(weakref.proxy(self), self.plugins)  # weak: no cycle (see Checker.consts)
        self._branch_checker = None
        # whether the environment can hold a sheet function: False lets a statement skip looking for calls
        # of one; None (not known: an environment filled elsewhere) always looks
        self.sheet_functions: bool | None = None

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

    def _finite(self, value, span, what: str = "the result"):
        """The one finiteness rule of evaluation: no literal, operand, intermediate or check side is
        infinite, NaN or complex (a literal is held to it by the parser first, where its text is known)."""
        if isinstance(value, pint.Quantity):
            m = value._magnitude
            if type(m) is float and _isfinite(m):  # the common case: one float, finite
                return value
            if isinstance(m, complex):
                raise NumericError(f"{what} is a complex number", span)
            try:
                ok = math.isfinite(m)
            except TypeError:
                import numpy as np

                ok = bool(np.all(np.isfinite(m)))
            if not ok:
                raise NumericError(f"{what} is infinite or not a number", span,
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
        return self._finite(U.quantity(node.value, unit._units), node.span, "the number")

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
        return self._finite(-v, node.span)  # builtins.rule_neg: any quantity keeps its dimension

    def _eval_BinOp(self, node: N.BinOp, env, used):
        op = node.op
        if op == "*" or op == "/":
            # a plain-number literal (``1.2*g``, ``w*L^2/8``) scales the other operand as a float: the same
            # value and unit as multiplying by a dimensionless quantity, without making one
            left, right = node.left, node.right
            if type(right) is N.Number and not right.unit:
                a = self._need_quantity(self.eval(left, env, used), left.span)
                return self._finite(B.scale_binop(node, a, right.value, literal_right=True), node.span)
            if type(left) is N.Number and not left.unit:
                b = self._need_quantity(self.eval(right, env, used), right.span)
                return self._finite(B.scale_binop(node, b, left.value, literal_right=False), node.span)
        elif op == "^" and type(node.right) is N.Number and not node.right.unit:  # L^2: the power as written
            a = self._need_quantity(self.eval(node.left, env, used), node.left.span)
            return self._finite(B.power_binop(node, a, node.right.value), node.span)
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
        if isinstance(obj, B.TableValue):  # a column of a table: a list
            if obj.info.column(node.field_name) is None:
                names = [c for c, _ in obj.info.columns]
                raise UnknownFieldError(f"table {obj.info.name} has no column '{node.field_name}'",
                                        node.field_span or node.span,
                                        hint=did_you_mean(node.field_name, names) or "columns: " + ", ".join(names))
            value = obj.column(node.field_name)
            if used is not None:
                used[dotted(node) or "value"] = value
            return value
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
        values = tuple(self.eval(i, env, used) for i in node.items)
        if values and all(isinstance(v, pint.Quantity) for v in values):  # a list of quantities: one array
            for v, item in zip(values, node.items):
                self._finite(v, item.span, "the element")
            return B.make_list(values, node)
        return values

    def _eval_TupleExpr(self, node, env, used):
        return tuple(self.eval(i, env, used) for i in node.items)

    def _eval_Call(self, node: N.Call, env, used):
        fn = B.FUNCTIONS.get(node.func)
        if fn is None and isinstance(env.get(node.func), SheetFunction):
            return self._eval_user_call(env[node.func].fd, node, env, used)
        if fn is None:
            raise UnknownFunctionError(f"unknown function '{node.func}'", node.func_span or node.span,
                                       hint=did_you_mean(node.func, B.FUNCTIONS))
        if fn.name == "lookup":
            return self._eval_lookup(node, env, used)
        B.check_call_shape(fn, node)
        if fn.lazy:
            return self._eval_if(node, env, used)
        args = [self._finite(self._need_quantity(self.eval(a, env, used), a.span), a.span, "the argument")
                for a in node.args]
        fn.rule([B.arg_of(a) for a in args], node.args, node)
        try:
            result = fn.impl(args, node)
        except (OverflowError, ValueError) as exc:  # math.ceil(inf), math.sin(inf): never a traceback
            raise NumericError(f"{node.func}() cannot be computed here: {exc}", node.span) from None
        return self._finite(result, node.span)

    def _eval_user_call(self, fd: N.FunctionDef, node: N.Call, env, used):
        """A sheet function: the arguments against the declared parameters (the rule the checker applies),
        then the body with the parameters bound, then the declared result."""
        B.check_user_call_shape(fd, node)
        B.count_user_call(self, node)
        local = {}
        for p, a in zip(fd.params, node.args):
            v = self.eval(a, env, used)
            if p.unit is not None:
                try:
                    B.declared_arg(p)
                except CalcError as exc:
                    raise exc.with_span(p.unit_span or p.span)
                B.rule_user_param(fd, p, B.arg_of(self._need_quantity(v, a.span)), a)
                if p.unit:  # the parameter takes its declared unit, as a declared definition does
                    v = v.to(U.build_unit(p.unit))
            local[p.name] = v
        body_used: dict | None = {} if used is not None else None
        try:
            value = self._need_quantity(self.eval(fd.expr, collections.ChainMap(local, env), body_used),
                                        fd.expr.span)
        except CalcError as exc:
            raise B.at_call(exc, fd, node)
        if used is not None:  # the values the body read besides its parameters, for the substitution
            renamed = {p.name: dotted(a) for p, a in zip(fd.params, node.args)}
            for k, v in body_used.items():
                head, dot, rest = k.partition(".")
                if head not in local:
                    used.setdefault(k, v)
                elif dot and renamed.get(head):  # x.M of a parameter x is p.M of the argument p
                    used.setdefault(f"{renamed[head]}.{rest}", v)
        if fd.unit is not None:
            try:
                B.declared_arg(fd)
            except CalcError as exc:
                raise exc.with_span(fd.unit_span or fd.span)
            B.rule_user_result(fd, B.arg_of(value), node)
            if fd.unit:
                value = value.to(U.build_unit(fd.unit))
        return self._finite(value, node.span)

    def try_function(self, fd: N.FunctionDef, env) -> None:
        """A function whose parameters all have declared units is tried once where it is defined, with one
        of each unit, so a dimension mistake in its body is found even if it is never called (as the checker
        finds it); a numeric failure of the trial values says nothing and is let go."""
        declared = {}
        for p in (*fd.params, fd):
            try:
                declared[p.name] = B.declared_arg(p)
            except CalcError as exc:
                raise exc.with_span(p.unit_span or p.span)
        if any(p.unit is None for p in fd.params):
            return
        local = {p.name: self.number(1.0, U.build_unit(p.unit) if p.unit else None) for p in fd.params}
        try:
            value = self._need_quantity(self.eval(fd.expr, collections.ChainMap(local, env), None), fd.expr.span)
        except (NumericError, DivisionByZeroError):
            return
        want = declared[fd.name]
        if want is not None:
            got = B.arg_of(value)
            B.rule_declared(got, want, fd, lambda: DeclaredUnitError(
                f"{fd.name} is declared [{fd.unit_text}] ({U.describe_dim(want.dim)}) but its body gives "
                f"{U.describe_dim(got.dim)}", fd.unit_span or fd.span))

    def _eval_if(self, node: N.Call, env, used):
        cond, then, otherwise = node.args
        if not isinstance(cond, N.Compare):
            raise TypeMismatchError("if() needs a comparison first: if(a <= b, value, otherwise)", cond.span)
        a = self._need_quantity(self.eval(cond.left, env, used), cond.left.span)
        b = self._need_quantity(self.eval(cond.right, env, used), cond.right.span)
        B.rule_compare(B.arg_of(a), B.arg_of(b), cond, cond.left, cond.right, where="the condition")
        B.rule_scalar(B.is_list(a), cond.left, "a side of the condition of if()")
        B.rule_scalar(B.is_list(b), cond.right, "a side of the condition of if()")
        self._finite(a, cond.left.span, "the left side of the condition")
        self._finite(b, cond.right.span, "the right side of the condition")
        am, bm = float(a.magnitude), float(b.to(a.units).magnitude)
        chosen, skipped = (then, otherwise) if B.COMPARISONS[cond.op](am, bm) else (otherwise, then)
        value = self.eval(chosen, env, used)
        if used is not None:  # the branch not taken is printed with its values too
            for n in N.walk(skipped):
                if isinstance(n, N.Name) and n.id in env:
                    used.setdefault(n.id, env[n.id])
        # the branch not taken is not evaluated (it may well be the one that cannot be: sqrt of a negative),
        # but its dimension must still be the taken one's: the checker's inference gives it from the values
        other_type = self._static_type(skipped, env)
        taken, other = _word(value), other_type.word()
        B.rule_if(taken, other, node) if chosen is then else B.rule_if(other, taken, node)
        if other is not None:
            B.rule_if_shape(B.is_list(value), other_type.many, node)
        return value

    def _static_type(self, node: N.Expr, env: dict):
        from .checker import Checker, ValueTypes

        if self._branch_checker is None:
            self._branch_checker = Checker(self.plugins)
        self._branch_checker.types = ValueTypes(env, self.plugins)
        return self._branch_checker.infer(node)

    def _eval_Flag(self, node, env, used):
        raise TypeMismatchError(f"'{node.name}' stands alone only at the end of a lookup: lookup(tab.k, h=…, "
                                f"{node.name})", node.span)

    def _eval_lookup(self, node: N.Call, env, used):
        """``lookup``: the rule (``builtins.rule_lookup``), then linear interpolation between the rows around
        the key; the bracketing rows and the formula with its substitution are kept for the package."""
        table_node, column, clamp = B.check_lookup_shape(node)
        tv = self.eval(table_node, env, None)
        if not isinstance(tv, B.TableValue):
            raise TypeMismatchError(f"lookup() reads a table of the sheet; {table_node.id} is a {kind_of(tv)}",
                                    table_node.span)
        given, keys = {}, []
        for kw in node.kwargs:
            v = self._finite(self._need_quantity(self.eval(kw.value, env, used), kw.value.span), kw.value.span,
                             "the key")
            given[kw.name] = (v, kw)
            keys.append((kw, B.arg_of(v), B.is_list(v)))
        B.rule_lookup(tv.info, column, node.args[0], keys, node)
        value, working = lookup_working(tv, column, given, clamp)  # in the read column's unit
        self.lookups.append(working)
        return self._finite(value, node.span)

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
            given[kw.name] = self._plugin_value(pf, kw, self.eval(kw.value, env, used))
        return self.host.call(pf, node, given, spans)

    @staticmethod
    def _plugin_value(pf, kw: N.Keyword, value):
        """A list of quantities goes to a plugin only where it declares a list (as a tuple of single values)."""
        if not B.is_list(value):
            return value
        p = pf.param(kw.name)
        if p is None or p.kind_ not in ("quantity", "number"):
            return tuple(value[i] for i in range(len(value.magnitude)))
        B.rule_plugin_scalar(f"{pf.qualname}: '{p.name}'", True, kw.value)

    # ---------------------------------------------------------------- statements
    def evaluate_definition(self, stmt: N.Definition, env: dict, display: dict) -> Step:
        used: dict = {}
        value = self.eval(stmt.expr, env, used)
        quantity = isinstance(value, pint.Quantity)
        if quantity:
            self._finite(value, stmt.expr.span)
        unit = None
        if stmt.unit is not None:
            unit = U.build_unit(stmt.unit) if stmt.unit else self._dimensionless
            if not quantity:
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
        elif quantity:
            if B.arg_of(value).offset:  # a °C/°F temperature keeps its scale (in K it would lose it)
                unit = value.units
            else:
                unit = literal_unit(stmt.expr) or self.policy.unit_for(value)
        if unit is not None and quantity:
            value = U.convert(value, unit)  # downstream substitutions read the value as shown (itself if in it)
        unit_for = self.policy.unit_for
        step = Step(name=stmt.name, expr=stmt.expr, value=value, display_unit=unit,
                    used={k: (v, display[k] if k in display else unit_for(v)
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
        if B.is_list(a) or B.is_list(b):
            return self._evaluate_list_check(stmt, a, b, used, unit_of)
        # a check is judged only between finite sides, with a finite ratio when one is formed
        self._finite(a, stmt.left.span, "the left side of the check")
        self._finite(b, stmt.right.span, "the right side of the check")
        am = float(a.magnitude)
        bm = float(U.convert(b, a._units).magnitude)  # one conversion, not three
        ok = B.COMPARISONS[stmt.op](am, bm)
        demand, capacity = (a, b) if stmt.op in ("<=", "<") else (b, a)
        dm, cm = (am, bm) if demand is a else (bm, am)  # both in a's unit
        if dm * cm < 0 or (dm < 0 and cm < 0):  # no utilisation exists: never OK
            raise _sign_error(stmt, demand, capacity)
        ratio = dm / cm if cm > 0 and dm >= 0 else None
        if ratio is not None and not math.isfinite(ratio):
            raise NumericError("the check's ratio (demand / capacity) overflows", stmt.span,
                               hint="the capacity is vanishingly small next to the demand")
        unit_of = unit_of or (lambda k, v: self.policy.unit_for(v) if isinstance(v, pint.Quantity) else None)
        key = dotted(stmt.left if stmt.op in ("<=", "<") else stmt.right) or "value"
        shown = unit_of(key, demand) if key != "value" else None
        shown = shown or self.policy.unit_for(demand)
        if shown is not None:
            demand, capacity = U.convert(demand, shown), U.convert(capacity, shown)
        return CheckResult(left=stmt.left, op=stmt.op, right=stmt.right, demand=demand, capacity=capacity,
                           ok=ok, ratio=ratio, text="", used={k: (v, unit_of(k, v)) for k, v in used.items()},
                           description=stmt.description, span=stmt.span)

    def _evaluate_list_check(self, stmt: N.Check, a, b, used: dict, unit_of) -> CheckResult:
        """A check over a list passes only if every element passes; the element with the greatest
        utilisation governs (an element that fails governs before any that passes). The check's demand,
        capacity and substitution are the governing element's; ``table`` lists every element."""
        import numpy as np

        self._finite(a, stmt.left.span, "the left side of the check")
        self._finite(b, stmt.right.span, "the right side of the check")
        am = np.atleast_1d(np.asarray(a.magnitude, float))
        bm = np.atleast_1d(np.asarray(b.to(a.units).magnitude, float))
        B.rule_lengths([len(am) if B.is_list(a) else None, len(bm) if B.is_list(b) else None],
                       [stmt.left, stmt.right], stmt)
        if am.shape != bm.shape:
            am, bm = np.broadcast_to(am, (max(len(am), len(bm)),)), np.broadcast_to(bm, (max(len(am), len(bm)),))
        oks = np.asarray(B.COMPARISONS[stmt.op](am, bm), bool)
        dm, cm = (am, bm) if stmt.op in ("<=", "<") else (bm, am)
        # no utilisation where the two are of opposite sign or both negative (as for one value)
        if dm.min() < 0 or cm.min() < 0:
            bad = ((dm < 0) & (cm != 0)) | ((cm < 0) & (dm != 0))
        else:
            bad = None
        formed = (cm > 0) & (dm >= 0)
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            ratios = dm / cm if formed.all() else np.where(formed, dm / np.where(formed, cm, 1.0), np.nan)
        if np.isinf(ratios).any():
            raise NumericError("the check's ratio (demand / capacity) overflows", stmt.span,
                               hint="the capacity is vanishingly small next to the demand")
        # which element governs: one with no utilisation at all, else the failing one with the highest ratio,
        # else the highest ratio (no ratio counts below any)
        score = np.where(np.isnan(ratios), -1.0, ratios) if not formed.all() else ratios
        ng = ~oks
        if ng.any():
            score = score + np.where(ng, score.max() + 2.0, 0.0)
        if bad is not None and bad.any():
            score = np.where(bad, np.inf, score)
        g = int(np.argmax(score))
        demand_q, capacity_q = (a, b) if stmt.op in ("<=", "<") else (b, a)

        def at(q, i):
            return q[i] if B.is_list(q) else q

        if bad is not None and bad[g]:
            raise _sign_error(stmt, at(demand_q, g), at(capacity_q, g).to(at(demand_q, g).units),
                              element=g + 1)
        unit_of = unit_of or (lambda k, v: self.policy.unit_for(v) if isinstance(v, pint.Quantity) else None)
        key = dotted(stmt.left if stmt.op in ("<=", "<") else stmt.right) or "value"
        shown = (unit_of(key, demand_q) if key != "value" else None) or self.policy.unit_for(demand_q)
        demand, capacity = at(demand_q, g), at(capacity_q, g)
        if shown is not None:
            demand, capacity = demand.to(shown), capacity.to(shown)
        ratio = None if np.isnan(ratios[g]) else float(ratios[g])
        # the substitution shows the governing element's values; the table shows them all
        used_g = {k: (at(v, g), unit_of(k, v)) for k, v in used.items()}
        lists = {k: v for k, v in used.items() if B.is_list(v) and k != key}
        columns = ["element", *lists, "demand", "capacity", "ratio", "result"]
        units = [None, *(unit_of(k, v) for k, v in lists.items()), shown, shown, None, None]
        unit = shown if shown is not None else demand_q.units
        # magnitudes once, as arrays: the rows are made without arithmetic on quantities
        cols = [np.broadcast_to(np.asarray(v.m_as(unit_of(k, v) or v.units), float), dm.shape)
                for k, v in lists.items()]
        col_units = [unit_of(k, v) or v.units for k, v in lists.items()]
        d_mag = np.broadcast_to(np.asarray(demand_q.m_as(unit), float), dm.shape)
        c_mag = np.broadcast_to(np.asarray(capacity_q.m_as(unit), float), dm.shape)
        reg = U.registry()
        shown_rows = range(len(dm))
        note = None
        if len(dm) > MAX_CHECK_ROWS:  # a long list: the elements with the highest utilisation, in order
            top = np.argpartition(-score, MAX_CHECK_ROWS)[:MAX_CHECK_ROWS]
            shown_rows = sorted(int(i) for i in top)
            note = (f"{len(dm):,} elements; the {MAX_CHECK_ROWS} with the highest utilisation are shown "
                    f"({int(np.sum(ng)):,} NG in all)")
        rows = []
        for i in shown_rows:
            rows.append([str(i + 1), *(reg.Quantity(float(c[i]), u) for c, u in zip(cols, col_units)),
                         reg.Quantity(float(d_mag[i]), unit), reg.Quantity(float(c_mag[i]), unit),
                         "–" if np.isnan(ratios[i]) else f"{ratios[i]:.2f}", "OK" if oks[i] else "NG"])
        table = SheetTable(f"each element of the check (element {g + 1} governs)", columns, rows, units, note=note)
        return CheckResult(left=stmt.left, op=stmt.op, right=stmt.right, demand=demand, capacity=capacity,
                           ok=bool(np.all(oks)), ratio=ratio, text="", used=used_g, description=stmt.description,
                           span=stmt.span, governing=g + 1, after=[table])


_DISPATCH: dict = {}
MAX_CHECK_ROWS = 50  # a check over a longer list shows this many elements (those with the highest utilisation)


def _sign_error(stmt: N.Check, demand, capacity, element: int | None = None) -> CheckSignError:
    side = stmt.left if stmt.op in ("<=", "<") else stmt.right
    name = dotted(side) or "the demand"
    return CheckSignError(
        ("" if element is None else f"element {element}: ")
        + f"check: the demand {show(demand)} and the capacity {show(capacity)} are of opposite sign or both "
        "negative, so the check has no utilisation and cannot pass", stmt.span,
        hint=f"compare magnitudes with check abs({name}) {stmt.op} ..., or write a compression check "
             f"with the compressive value positive (check -{name} {stmt.op} ...)")


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
    ev.user_calls = 0  # the budget of sheet-function calls is per statement
    ev.lookups = []  # the working of each table lookup in the statement, shown after it
    if isinstance(stmt, N.TableDef):
        tv = B.make_table(stmt)
        step = Step(name=stmt.name, expr=None, value=tv, description=stmt.description, span=stmt.span,
                    anchor="v-" + stmt.name, after=[table_record(tv)])
        env[stmt.name] = tv
        return step
    if isinstance(stmt, N.Check):
        check = ev.evaluate_check(stmt, env, unit_of)
        check.after = [*ev.lookups, *check.after]
        if _calls_sheet_function(stmt.left, env, ev) or _calls_sheet_function(stmt.right, env, ev):
            check.shown_left, check.shown_right = inline_calls(stmt.left, env), inline_calls(stmt.right, env)
        return check
    if isinstance(stmt, N.FunctionDef):
        ev.try_function(stmt, env)
        step = FunctionStep(name=stmt.name, expr=stmt.expr, value=None, description=stmt.description,
                            span=stmt.span, params=tuple((p.name, p.unit_text) for p in stmt.params),
                            unit_text=stmt.unit_text, anchor="f-" + stmt.name)
        env[stmt.name] = SheetFunction(stmt)
        ev.sheet_functions = True
        return step
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
    step.after = list(ev.lookups)
    if _calls_sheet_function(step.expr, env, ev):
        step.shown_expr = inline_calls(step.expr, env)
    env[stmt.name] = step.value
    display[stmt.name] = step.display_unit
    return step


def _calls_sheet_function(expr, env, ev: "Evaluator | None" = None) -> bool:
    if ev is not None and ev.sheet_functions is False:
        return False  # the run has bound no sheet function (None: not known, so look)
    return expr is not None and any(isinstance(n, N.Call) and isinstance(env.get(n.func), SheetFunction)
                                    for n in N.walk(expr))


def inline_calls(expr: N.Expr, env) -> N.Expr:
    """The expression with each call of a sheet function replaced by its body, the parameters by the
    arguments (bracketed where they need it): what the substitution line of a hand calculation shows."""

    def sub(node, params):
        if isinstance(node, N.Name) and node.id in params:
            return params[node.id]
        if isinstance(node, N.Call) and isinstance(env.get(node.func), SheetFunction):
            fd = env[node.func].fd
            args = [sub(a, params) for a in node.args]
            inner = {p: (a if isinstance(a, (N.Name, N.Number, N.Paren, N.FieldAccess)) else N.Paren(a, span=a.span))
                     for p, a in zip(fd.param_names, args)}
            return N.Paren(sub(fd.expr, inner), span=node.span)
        changes = {}
        for fname in node._children:
            value = getattr(node, fname)
            if isinstance(value, tuple):
                changes[fname] = tuple(sub(v, params) if isinstance(v, N.Node) else v for v in value)
            elif isinstance(value, N.Node):
                changes[fname] = sub(value, params)
        return dataclasses.replace(node, **changes) if changes else node

    out = sub(expr, {})
    return out.inner if isinstance(out, N.Paren) and isinstance(expr, N.Call) else out


def literal_unit(expr: N.Expr):
    """An input written as a single literal keeps the unit it was written in."""
    expr = strip_sign(expr)
    if isinstance(expr, N.ListExpr) and expr.items:  # a list of literals keeps its first element's unit
        expr = strip_sign(expr.items[0])
    if isinstance(expr, N.Number) and expr.unit:
        return U.build_unit(expr.unit)
    return None


# ---------------------------------------------------------------- tables


def table_record(tv: B.TableValue, rows=None, title: str | None = None) -> SheetTable:
    """A table (or some of its rows) as the package prints it."""
    reg = U.registry()
    rows = range(tv.n_rows) if rows is None else rows
    if tv.info.two_way:
        rk, ck = tv.info.keys
        cols = [f"{rk} \\ {ck}", *(_num(k) + _unit_suffix(tv.units[1]) for k in tv.col_keys)]
        units = [tv.units[0], *([tv.units[2]] * len(tv.col_keys))]
        body = [[reg.Quantity(float(tv.data[i, 0]), tv.units[0]),
                 *(reg.Quantity(float(x), tv.units[2]) for x in tv.data[i, 1:])] for i in rows]
    else:
        cols = [c for c, _ in tv.info.columns]
        units = list(tv.units)
        body = [[reg.Quantity(float(x), u) for x, u in zip(tv.data[i], tv.units)] for i in rows]
    where = f" (read from {tv.node.source})" if tv.node is not None and tv.node.source else ""
    return SheetTable(title or f"table {tv.info.name}{where}", cols, body, units, anchor="t-" + tv.info.name)


def _fmt(v) -> str:
    """A key or value in a lookup's working: '120 mm', '0.925'."""
    return f"{float(v.magnitude):.4g}{_unit_suffix(v.units)}"


def _num(x: float) -> str:
    return f"{x:g}"


def _unit_suffix(unit) -> str:
    text = str(unit)
    return "" if text in ("", "dimensionless") else " " + f"{unit:~}"


def _interp_step(name: str, key: str, y1, y2, x, x1, x2, value, unit, key_unit) -> Step:
    """``y = y_1 + (y_2 − y_1)·(x − x_1)/(x_2 − x_1)`` with its values: the line a checker recomputes."""
    n = lambda s: N.Name(id=s)  # noqa: E731
    formula = N.Add(n(f"{name}_1"), N.Div(
        N.Mul(N.Paren(N.Sub(n(f"{name}_2"), n(f"{name}_1"))), N.Paren(N.Sub(n(key), n(f"{key}_1")))),
        N.Paren(N.Sub(n(f"{key}_2"), n(f"{key}_1")))))
    used = {f"{name}_1": (y1, unit), f"{name}_2": (y2, unit), key: (x, key_unit), f"{key}_1": (x1, key_unit),
            f"{key}_2": (x2, key_unit)}
    return Step(name=name, expr=formula, value=value, display_unit=unit, used=used)


def lookup_working(tv: B.TableValue, column: str | None, given: dict, clamp: bool):
    """The value at the keys, and its working: the rows around the key and the interpolation formula with
    its substitution (two-way: along the rows at both bracketing columns, then between them)."""
    reg = U.registry()
    info = tv.info

    def q(m, unit):
        return reg.Quantity(float(m), unit)

    def shown_in(unit):
        return lambda m: _fmt(q(m, unit))

    rk = info.keys[0]
    xq, kw = given[rk]
    x = float(xq.m_as(tv.units[0]))
    xs = tv.data[:, 0]
    b = B.bracket(xs, x, clamp, rk, info, shown_in(tv.units[0]), kw.value)
    items: list = []
    if not info.two_way:
        k = [c for c, _ in info.columns].index(column)
        ys, unit = tv.data[:, k], tv.units[k]
        y = B.interpolate(float(ys[b.i]), float(ys[b.i + 1]), b.t)
        items.append(table_record(tv, [b.i, b.i + 1], f"rows of {info.name} around {rk} = {_fmt(xq)}"))
        if b.clamped:
            items.append(Note(f"{rk} = {_fmt(xq)} is outside the table ({shown_in(tv.units[0])(xs[0])} to "
                              f"{shown_in(tv.units[0])(xs[-1])}): clamp takes the end value, {_fmt(q(y, unit))}",
                              kind="warning"))
        else:
            items.append(_interp_step(column, rk, q(ys[b.i], unit), q(ys[b.i + 1], unit), q(x, tv.units[0]),
                                      q(xs[b.i], tv.units[0]), q(xs[b.i + 1], tv.units[0]), q(y, unit), unit,
                                      tv.units[0]))
        return q(y, unit), Working(f"lookup of {column} in {info.name}", items)
    ck = info.keys[1]
    zq, kw2 = given[ck]
    z = float(zq.m_as(tv.units[1]))
    c = B.bracket(tv.col_keys, z, clamp, ck, info, shown_in(tv.units[1]), kw2.value)
    grid, unit = tv.data[:, 1:], tv.units[2]
    name = info.name
    ya = B.interpolate(float(grid[b.i, c.i]), float(grid[b.i + 1, c.i]), b.t)
    yb = B.interpolate(float(grid[b.i, c.i + 1]), float(grid[b.i + 1, c.i + 1]), b.t)
    y = B.interpolate(ya, yb, c.t)
    corner = SheetTable(f"values of {name} around {rk} = {_fmt(xq)}, {ck} = {_fmt(zq)}",
                        [f"{rk} \\ {ck}", _num(tv.col_keys[c.i]) + _unit_suffix(tv.units[1]),
                         _num(tv.col_keys[c.i + 1]) + _unit_suffix(tv.units[1])],
                        [[q(xs[r], tv.units[0]), q(grid[r, c.i], unit), q(grid[r, c.i + 1], unit)]
                         for r in (b.i, b.i + 1)], [tv.units[0], unit, unit])
    items.append(corner)
    if b.clamped or c.clamped:
        items.append(Note(f"the keys fall outside the table: clamp takes the end values ({rk} = {_fmt(xq)}, "
                          f"{ck} = {_fmt(zq)})", kind="warning"))
    xq1, xq2 = q(xs[b.i], tv.units[0]), q(xs[b.i + 1], tv.units[0])
    xv = q(x, tv.units[0]) if not b.clamped else (xq1 if b.t == 0 else xq2)
    for j, (label, yy) in enumerate(((f"{name}_a", ya), (f"{name}_b", yb))):
        step = _interp_step(label, rk, q(grid[b.i, c.i + j], unit), q(grid[b.i + 1, c.i + j], unit), xv, xq1, xq2,
                            q(yy, unit), unit, tv.units[0])
        step.description = f"along {rk}, at {ck} = {_num(tv.col_keys[c.i + j])}{_unit_suffix(tv.units[1])}"
        items.append(step)
    zq1, zq2 = q(tv.col_keys[c.i], tv.units[1]), q(tv.col_keys[c.i + 1], tv.units[1])
    zv = q(z, tv.units[1]) if not c.clamped else (zq1 if c.t == 0 else zq2)
    last = _interp_step(name, ck, q(ya, unit), q(yb, unit), zv, zq1, zq2, q(y, unit), unit, tv.units[1])
    last.expr = N.Add(N.Name(id=f"{name}_a"), N.Div(
        N.Mul(N.Paren(N.Sub(N.Name(id=f"{name}_b"), N.Name(id=f"{name}_a"))),
              N.Paren(N.Sub(N.Name(id=ck), N.Name(id=f"{ck}_1")))),
        N.Paren(N.Sub(N.Name(id=f"{ck}_2"), N.Name(id=f"{ck}_1")))))
    last.used = {f"{name}_a": (q(ya, unit), unit), f"{name}_b": (q(yb, unit), unit), ck: (zv, tv.units[1]),
                 f"{ck}_1": (zq1, tv.units[1]), f"{ck}_2": (zq2, tv.units[1])}
    last.description = f"between the two, along {ck}"
    items.append(last)
    return q(y, unit), Working(f"lookup in {name}", items)
