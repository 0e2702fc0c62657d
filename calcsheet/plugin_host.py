"""The plugin host: what stands between the evaluator and a plugin function.

It looks the function up, checks each argument against its declared kind
and dimension (``coerce_argument``), hands the function a ``Work`` to write
its working into, calls it (a plugin bug becomes a located error, never a
traceback), and turns the fields it returns into a ``Record``.

The host needs only a small protocol of the evaluator (``FormulaEvaluator``:
evaluate an expression in a scope, evaluate a check, and the display
policy), so the formulas a plugin writes with ``work.calc`` are evaluated and
traced exactly like the sheet's own.
"""
from __future__ import annotations

from typing import Any, Callable, Protocol

import pint

from . import nodes as N
from . import units as U
from .errors import CalcError, PluginArgumentError, PluginInputError
from .names import did_you_mean
from .plugin import PluginFunction, PluginRegistry, Record, check_argument_kinds, takes_record
from .trace import CheckResult, Figure, Note, Step, Table, Working


class FormulaEvaluator(Protocol):
    """What the host needs of an evaluator."""

    policy: Any  # a DisplayPolicy

    def eval(self, node: N.Expr, env: dict, used: dict | None = None) -> Any: ...

    def evaluate_check(self, stmt: N.Check, env: dict, unit_of: Callable | None = None) -> CheckResult: ...


def kind_of(v) -> str:
    """A value's kind in words, for messages."""
    if isinstance(v, pint.Quantity):
        return "quantity"
    if isinstance(v, str):
        return "text"
    if isinstance(v, Record):
        return f"{v.type} record"
    if isinstance(v, tuple):
        return "list"
    return type(v).__name__


def show(q) -> str:
    """A value as a message shows it: '2.5 kN'."""
    if isinstance(q, pint.Quantity):
        from .display import plain_number, unit_text

        return f"{plain_number(float(q.magnitude), 4)} {unit_text(q.units)}".strip()
    return kind_of(q)


class Work:
    """What a plugin function receives: its arguments, and its working recorder."""

    def __init__(self, pf: PluginFunction, args: dict[str, Any], settings: dict[str, Any], host: "PluginHost"):
        self.plugin = pf
        self.scope: dict[str, Any] = dict(args)
        self.settings = settings
        self.working = Working(title=pf.qualname)
        self.warnings: list[tuple[str, str | None]] = []
        self._host = host

    # --- reading arguments
    def __getitem__(self, name: str):
        return self.scope[name]

    def __contains__(self, name: str) -> bool:
        return name in self.scope

    # --- traced working
    def calc(self, name: str, formula: str, unit: str | None = None, desc: str | None = None, note: str | None = None):
        """Evaluate ``formula`` (sheet syntax) in this call's scope; trace and bind it."""
        step = self._host.formula_step(self, name, formula, unit, desc)
        step.note = note
        self.working.items.append(step)
        self.scope[name] = step.value
        return step.value

    def let(self, name: str, value, unit: str | None = None, desc: str | None = None, note: str | None = None):
        """Record a result found by a method rather than a formula (say which in ``note``)."""
        step = Step(name=name, expr=None, value=value, description=desc, note=note)
        step.display_unit = self._host.display_unit_for(value, unit)
        self.working.items.append(step)
        self.scope[name] = value
        return value

    def check(self, text: str, desc: str | None = None) -> CheckResult:
        """A pass/fail inside the working (e.g. the two-method agreement)."""
        result = self._host.formula_check(self, text, desc)
        self.working.items.append(result)
        return result

    def table(self, title: str, columns: list[str], rows: list[list[Any]], units=None, footer=None, note=None):
        units = [self._host.display_unit_for(None, u) if isinstance(u, str) else u for u in (units or [])] or None
        self.working.items.append(Table(title, list(columns), rows, units, footer, note))

    def figure(self, svg: str, caption: str = ""):
        self.working.items.append(Figure(svg, caption))

    def note(self, text: str, kind: str = "note"):
        self.working.items.append(Note(text, kind))

    def warn(self, message: str, param: str | None = None):
        """A warning shown at the call (and in the working)."""
        self.warnings.append((message, param))
        self.working.items.append(Note(message, "warning"))

    def fail(self, message: str, param: str | None = None, hint: str | None = None):
        """Refuse the input; the error points at ``param`` in the call."""
        raise PluginInputError(f"{self.plugin.qualname}: {message}", hint=hint, param=param)

    def q(self, value, unit: str):
        """A quantity from a plugin's own number (trusted text)."""
        return U.Quantity(value, unit)


class PluginHost:
    """Calls plugin functions for one evaluator (one sheet run)."""

    def __init__(self, evaluator: FormulaEvaluator, plugins: PluginRegistry):
        self.evaluator = evaluator
        self.plugins = plugins
        self.warnings: list[tuple[str, Any]] = []  # (message, span) from plugins
        self.versions: dict[str, str] = {}

    # ---------------------------------------------------------------- calls
    def function(self, node: N.PluginCall) -> PluginFunction:
        try:
            pf = self.plugins.function(node.namespace, node.func)
        except CalcError as exc:
            raise exc.with_span(node.func_span or node.span)
        self.versions[node.namespace] = pf.version
        return pf

    def call(self, pf: PluginFunction, node: N.PluginCall, given: dict[str, Any], spans: dict[str, Any]) -> Record:
        """Check the arguments, run the function, make its record."""
        try:
            check_argument_kinds(pf, given)
        except PluginArgumentError as exc:
            raise exc.with_span(spans.get(exc.param) or node.func_span or node.span)
        args = {}
        for p in pf.params:
            args[p.name] = self.coerce_argument(pf, p, given[p.name], spans[p.name]) if p.name in given else p.default
        policy = self.evaluator.policy
        work = Work(pf, args, {"system": policy.system, "sigfigs": policy.sigfigs}, self)
        try:
            out = pf.func(work, **args)
        except PluginInputError as exc:
            raise exc.with_span(spans.get(exc.param) or node.span)
        except CalcError as exc:
            raise exc.with_span(node.span)
        except Exception as exc:  # a plugin bug must not crash the build
            raise PluginInputError(f"{pf.qualname} failed: {type(exc).__name__}: {exc}", node.span) from exc
        for message, param in work.warnings:
            self.warnings.append((message, spans.get(param) or node.span))
        return self.make_record(pf, out, work, node.span)

    def coerce_argument(self, pf: PluginFunction, p, value, span):
        """Check one argument against its declared kind and dimension."""
        kind = p.kind_
        where = f"{pf.qualname}: '{p.name}'"
        if kind in ("quantity", "number"):
            if not isinstance(value, pint.Quantity):
                raise PluginArgumentError(f"{where} needs {p.describe()}, got a {kind_of(value)}", span)
            self._check_dim(where, p, p.wanted, value, span)
            return value
        if kind in ("text", "flag"):
            if not isinstance(value, str):
                raise PluginArgumentError(f"{where} needs a text in quotes, got a {kind_of(value)}", span)
            choices = p.choices or (("yes", "no") if kind == "flag" else None)
            if choices and value not in choices:
                raise PluginArgumentError(f"{where} must be one of " + ", ".join(f'"{c}"' for c in choices),
                                          span, hint=did_you_mean(value, choices))
            return value
        if kind == "record":
            if not isinstance(value, Record) or not takes_record(p.record, value.type, value.family):
                raise PluginArgumentError(f"{where} needs a {p.record} record, got a {kind_of(value)}", span)
            return value
        if kind == "list":
            items = value if isinstance(value, tuple) else (value,)
            for item in items:
                if p.record:
                    if not isinstance(item, Record) or not takes_record(p.record, item.type, item.family):
                        raise PluginArgumentError(f"{where} needs a list of {p.record} records, "
                                                  f"got a {kind_of(item)} in it", span)
                elif not isinstance(item, pint.Quantity):
                    raise PluginArgumentError(f"{where} needs a list of quantities, got a {kind_of(item)} in it", span)
                else:
                    self._check_dim(where, p, p.wanted, item, span)
            return items
        if kind == "points":
            if not isinstance(value, tuple):
                raise PluginArgumentError(f"{where} needs a list of (x, y) points", span)
            for pt in value:
                if not (isinstance(pt, tuple) and len(pt) == 2 and all(isinstance(c, pint.Quantity) for c in pt)):
                    raise PluginArgumentError(f"{where} needs points written (x, y)", span)
                for c in pt:
                    self._check_dim(where, p, p.wanted, c, span)
            return value
        return value  # pragma: no cover

    def _check_dim(self, where, p, want, value, span):
        got = U.dim_of(value)
        if got != want:
            hint = None
            if got == U.DIMENSIONLESS and want != U.DIMENSIONLESS:
                hint = f"give the unit, e.g. {p.name}=… mm" if want == (("[length]", 1),) else "give the value its unit"
            raise PluginArgumentError(
                f"{where} needs {U.describe_dim(want)}, got {U.describe_dim(got)} ({show(value)})", span, hint=hint)

    def make_record(self, pf: PluginFunction, out, work: Work, span) -> Record:
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
                      family=pf.family, declared=declared, optional=absent)

    # ---------------------------------------------------------------- the Work's host side
    def display_unit_for(self, value, unit_text: str | None = None):
        if unit_text:
            from .units import parse_unit_text

            return U.build_unit(parse_unit_text(unit_text))
        return self.evaluator.policy.unit_for(value) if isinstance(value, pint.Quantity) else None

    def formula_step(self, work: Work, name: str, formula: str, unit: str | None, desc: str | None) -> Step:
        """``work.calc``: a formula in sheet syntax, evaluated in the call's scope and traced."""
        from .parser import parse_expression

        used: dict = {}
        try:
            expr = parse_expression(formula)
            value = self.evaluator.eval(expr, work.scope, used)
        except CalcError as exc:
            raise at_the_call(exc, work, f"{name} = {formula}") from None
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
        return self.evaluator.policy.unit_for(value) if isinstance(value, pint.Quantity) else None

    def formula_check(self, work: Work, text: str, desc: str | None) -> CheckResult:
        """``work.check``: a check in sheet syntax inside the working."""
        from .parser import parse_statement

        try:
            stmt = parse_statement("check " + text)
            result = self.evaluator.evaluate_check(stmt, work.scope, lambda k, v: self.unit_of_used(work, k, v))
        except CalcError as exc:
            raise at_the_call(exc, work, f"check {text}") from None
        result.description = desc
        return result


def at_the_call(exc: CalcError, work: Work, formula: str) -> CalcError:
    """An error raised by one of a plugin's own formulas, made to point at the sheet's call.

    The formula's text is the plugin's, not the sheet's: a span inside it (line 1, column 5 of "a + b") means
    nothing in the sheet. The error keeps its class (its code) and hint, names the plugin and the formula in
    its message, and loses that span, so ``PluginHost.call`` locates it at the call (file, line, column)."""
    exc.message = f"{work.plugin.qualname}: in its formula {formula}: {exc.message}"
    exc.args = (exc.message,)
    exc.span = None
    return exc
