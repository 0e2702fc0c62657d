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

import weakref
from collections import ChainMap
from collections.abc import Mapping
from dataclasses import dataclass
from functools import cached_property
from typing import Any

import pint

from . import builtins as B
from . import nodes as N
from . import units as U
from . import lint
from .errors import (
    CalcError,
    DeclaredUnitError,
    Diagnostic,
    OffsetTemperatureError,
    PluginArgumentError,
    TypeMismatchError,
    UnknownFieldError,
    UnknownFunctionError,
    UnknownUnitError,
)
from .names import did_you_mean, operand as _operand
from .plugin import PluginFunction, PluginRegistry, Record, check_argument_kinds, takes_record
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
    many: bool = False  # a list of quantities (one quantity over an array)
    table: Any = None  # for kind 'table': the sheet's table (its columns and their dimensions)

    @cached_property
    def arg(self) -> B.Arg | None:
        """What the built-in rules know of this type (None: not known)."""
        return B.Arg(self.dim, self.offset) if self.kind == "q" else None

    @staticmethod
    def of(arg: B.Arg | None, many: bool = False) -> "T":
        """The quantity type of a rule's result (one shared instance per result)."""
        if arg is None:
            return ANY
        t = _OF.get((arg, many))
        if t is None:
            t = _OF[(arg, many)] = T("q", arg.dim, offset=arg.offset, many=many)
            _SHARED.add(id(t))
        return t

    def word(self):
        """This type as ``builtins.rule_if`` compares it: an Arg, a word, or None (unknown)."""
        if self.kind == "any":
            return None
        return self.arg if self.kind == "q" else self.describe()

    def describe(self) -> str:
        if self.kind == "q":
            return (("list of " if self.many else "") + U.describe_dim(self.dim)
                    + (" on an offset scale (°C/°F)" if self.offset else ""))
        if self.kind == "record":
            return f"{self.record_type} record"
        return self.kind


_OF: dict = {}
ANY = T("any")
TEXT = T("text")
NUMBER = T("q", U.DIMENSIONLESS)
# the ids of the types that live as long as the process (those of T.of, and the constants above): a type
# is one of these whenever inference has it from a rule, so a cache may be keyed by their ids (never reused)
_SHARED: set[int] = {id(ANY), id(TEXT), id(NUMBER)}
_BINOP_TYPES: dict = {}  # (operator, id of left type, id of right type) -> result type, for shared types
_DECLARED_ARGS: dict = {}  # a declared unit's factors -> its Arg (units that read; errors are never kept)
_DECLARED_TYPES: dict = {}  # (id of a shared type, declared unit's factors) -> the definition's type


class ValueTypes(Mapping):
    """The static types of evaluated values, by name: the evaluator asks the checker for the dimension
    of an ``if`` branch it does not take, reading the names it has values for."""

    def __init__(self, env: dict, plugins: PluginRegistry):
        self.env = env
        self.plugins = plugins

    def __getitem__(self, name: str) -> T:
        return type_of_value(self.env[name], self.plugins)

    def __contains__(self, name) -> bool:
        return name in self.env

    def __iter__(self):
        return iter(self.env)

    def __len__(self) -> int:
        return len(self.env)


def type_of_value(value, plugins: PluginRegistry) -> T:
    """The static type an evaluated value has."""
    if isinstance(value, pint.Quantity):
        arg = B.arg_of(value)
        return T("q", arg.dim, offset=arg.offset, many=B.is_list(value))
    if isinstance(value, str):
        return TEXT
    if isinstance(value, Record):
        pf = None
        if value.source and "." in value.source:
            try:
                pf = plugins.function(*value.source.split(".", 1))
            except CalcError:
                pf = None
        return T("record", record=pf, record_type=value.type)
    if isinstance(value, tuple):
        return T("list", item=type_of_value(value[0], plugins) if value else ANY)
    if isinstance(value, B.TableValue):
        return T("table", table=value.info)
    return ANY


_INFER: dict = {}  # checker class -> {node class -> its _infer_ method}
_NUMBER_TYPES: dict = {}  # a literal's unit factors -> its type


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
        # the folder reads the checker back through a weak proxy: no reference cycle, so a finished check is
        # freed at once by reference counting (a cycle left the sheet's whole tree for the cyclic collector,
        # whose pass over it then landed on whatever ran next)
        self.consts = lint.Constants(weakref.proxy(self))
        self.functions: dict[str, N.FunctionDef] = {}  # the sheet's own functions that check clean
        self._dispatch = _INFER.setdefault(type(self), {})  # node class -> this class's _infer_ method

    # ------------------------------------------------------------ statements
    def check_sheet(self, sheet: N.Sheet, res: Resolution) -> list[Diagnostic]:
        self.res = res
        self.defined = res.defined_at
        diags: list[Diagnostic] = []
        broken, types, path = res.broken, self.types, self.path
        definition_findings, check_findings = lint.definition_findings, lint.check_findings
        for stmt in sheet.body:
            cls = type(stmt)
            if cls is N.Definition:  # the everyday statements first (the classes are disjoint)
                key = stmt.name
            elif cls is N.Check:
                key = check_key(stmt)
            elif isinstance(stmt, N.FunctionDef):
                diags.extend(self._function_statement(stmt, res))
                continue
            elif isinstance(stmt, N.TableDef):
                diags.extend(self._table_statement(stmt, res))
                continue
            elif isinstance(stmt, N.Definition):
                key = stmt.name
            elif isinstance(stmt, N.Check):
                key = check_key(stmt)
            else:
                continue
            if key in broken:
                if isinstance(stmt, N.Definition):
                    types.setdefault(stmt.name, ANY)
                continue
            if self._shadows:  # each statement starts with none (an empty list is reused)
                self._shadows = []
            if self._pending:
                self._pending = []
            self.user_calls = 0
            try:
                if isinstance(stmt, N.Definition):
                    t = types[key] = self.definition(stmt)
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
            if self._shadows:
                diags.extend(lint.shadow_warnings(self._shadows, self.defined, self.path))
            if self._pending:
                diags.extend(self._pending)
            found = definition_findings(stmt, t, self, path) if isinstance(stmt, N.Definition) else \
                check_findings(stmt, self, path)
            if found:
                diags.extend(found)
        diags.extend(lint.unused_inputs(res, self.path, skip=self.shadowed))
        return diags

    def _function_statement(self, stmt: N.FunctionDef, res: Resolution) -> list[Diagnostic]:
        """A sheet function: its body is checked now where every parameter has a declared unit, and at
        each call (with the arguments' dimensions) where one has not."""
        if stmt.name in res.broken:
            self.types.setdefault(stmt.name, ANY)
            return []
        self._shadows, self._pending = [], []
        self.user_calls = 0
        try:
            declared = {}
            for p in (*stmt.params, stmt):
                try:
                    declared[p.name] = B.declared_arg(p)
                except CalcError as exc:
                    raise exc.with_span(p.unit_span or p.span)
            want = declared.pop(stmt.name)
            if all(p.unit is not None for p in stmt.params):
                saved = self.types
                self.types = ChainMap({k: T.of(a) for k, a in declared.items()}, saved)  # no copy of the sheet's
                try:
                    t = self._quantity(self.infer(stmt.expr), stmt.expr)
                finally:
                    self.types = saved
                if want is not None:
                    B.rule_declared(t.arg, want, stmt, lambda: DeclaredUnitError(
                        f"{stmt.name} is declared [{stmt.unit_text}] ({U.describe_dim(want.dim)}) "
                        f"but its body gives {U.describe_dim(t.dim)}", stmt.unit_span or stmt.span,
                        hint=_explain(stmt.expr, self)))
        except Broken:
            res.broken.add(stmt.name)
            self.types[stmt.name] = ANY
            return []
        except CalcError as exc:
            res.broken.add(stmt.name)
            self.types[stmt.name] = ANY
            return [self._with_shadow_note(exc).diagnostic(self.path)]
        self.functions[stmt.name] = stmt
        return list(self._pending)

    def _table_statement(self, stmt: N.TableDef, res: Resolution) -> list[Diagnostic]:
        """A table: its units row read (an unknown unit is an error at its cell)."""
        if stmt.name in res.broken:
            self.types.setdefault(stmt.name, ANY)
            return []
        try:
            self.types[stmt.name] = T("table", table=B.table_info(stmt))
        except CalcError as exc:
            res.broken.add(stmt.name)
            self.types[stmt.name] = ANY
            return [exc.diagnostic(self.path)]
        return []

    def _infer_lookup(self, node: N.Call) -> T:
        """``lookup(tab.k, h=…[, clamp])``: the table's own rule (``builtins.rule_lookup``)."""
        table, column, _ = B.check_lookup_shape(node)
        t = self.infer(table)
        if t.kind != "table":
            raise TypeMismatchError(f"lookup() reads a table of the sheet; {_operand(table)} is a {t.describe()}",
                                    table.span)
        keys = []
        for kw in node.kwargs:
            kt = self._quantity(self.infer(kw.value), kw.value)
            keys.append((kw, kt.arg, kt.many))
        return T.of(B.rule_lookup(t.table, column, node.args[0], keys, node))

    def _infer_Flag(self, node: N.Flag) -> T:
        raise TypeMismatchError(f"'{node.name}' stands alone only at the end of a lookup: lookup(tab.k, h=…, "
                                f"{node.name})", node.span)

    def _infer_user_call(self, fd: N.FunctionDef, node: N.Call) -> T:
        """A call of a sheet function: each argument against its parameter, then the body with the
        arguments' types (an error inside the body is reported at this call)."""
        B.check_user_call_shape(fd, node)
        B.count_user_call(self, node)
        local: dict[str, T] = {}
        for p, a in zip(fd.params, node.args):
            t = self.infer(a)
            if p.unit is not None:
                t = T.of(B.rule_user_param(fd, p, self._quantity(t, a).arg, a), many=t.many)
            elif t.kind == "any":
                raise Broken()
            local[p.name] = t
        saved = self.types
        self.types = ChainMap(local, saved)  # the parameters over the sheet's types, without copying them
        try:
            body = self._quantity(self.infer(fd.expr), fd.expr)
        except CalcError as exc:
            raise B.at_call(exc, fd, node)
        finally:
            self.types = saved
        return T.of(B.rule_user_result(fd, body.arg, node), many=body.many)

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
        if stmt.unit is None:
            return t
        shared = id(t) in _SHARED
        if shared:  # a declared unit over a process-lifetime type: the rule's answer depends on the two only
            known = _DECLARED_TYPES.get((id(t), stmt.unit))
            if known is not None:
                return known
        want = _DECLARED_ARGS.get(stmt.unit)
        if want is None:
            try:
                unit = U.build_unit(stmt.unit) if stmt.unit else None
            except CalcError as exc:
                raise exc.with_span(stmt.unit_span or stmt.span)
            want = B.unit_arg(unit) if unit is not None else B.NUMBER
            if len(_DECLARED_ARGS) < 4096:
                _DECLARED_ARGS[stmt.unit] = want
        if t.kind not in ("q", "any"):
            raise DeclaredUnitError(f"{stmt.name} is a {t.describe()}; it cannot have a unit",
                                    stmt.unit_span or stmt.span)

        def mismatch():
            exc = DeclaredUnitError(
                f"{stmt.name} is declared [{stmt.unit_text}] ({U.describe_dim(want.dim)}) "
                f"but the expression gives {U.describe_dim(t.dim)}",
                stmt.unit_span or stmt.span,
                hint=_explain(stmt.expr, self),
            )
            specialise(exc, want.dim, t.dim, _operand(stmt.expr, "the expression"))
            return exc

        result = T.of(B.rule_declared(t.arg, want, stmt, mismatch), many=t.many)
        if shared and len(_DECLARED_TYPES) < 65536:
            _DECLARED_TYPES[(id(t), stmt.unit)] = result  # only a rule that passed is remembered
        return result

    def check(self, stmt: N.Check) -> None:
        a = self._quantity(self.infer(stmt.left), stmt.left)
        b = self._quantity(self.infer(stmt.right), stmt.right)
        if a is b and a.kind == "q":
            return  # one type on both sides: the same dimension (what rule_compare asks)
        B.rule_compare(a.arg, b.arg, stmt, stmt.left, stmt.right)

    # ------------------------------------------------------------ expressions
    def infer(self, node: N.Expr) -> T:
        method = self._dispatch.get(type(node))
        if method is None:  # the first node of its class: find its method up the MRO, once
            for cls in type(node).__mro__:
                method = getattr(type(self), "_infer_" + cls.__name__, None)
                if method:
                    break
            self._dispatch[type(node)] = method
        return method(self, node)

    def _quantity(self, t: T, node) -> T:
        if t.kind in ("q", "any"):
            return t
        raise TypeMismatchError(f"expected a number or quantity, got a {t.describe()}", node.span)

    def _infer_Number(self, node: N.Number) -> T:
        if not node.unit:
            return NUMBER
        defined = self.defined
        for name, _ in node.unit:
            if name in defined:  # a unit name that is also a variable of the sheet (lint words it)
                shadow = lint.shadowing_factor(node, defined)
                self._shadows.append(node)
                self.shadowed.add(shadow[0])
                break
        known = _NUMBER_TYPES.get(node.unit)
        if known is not None:
            return known
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
        t = T.of(B.Arg(U.dim_of(unit), offset))
        if len(_NUMBER_TYPES) < 4096:
            _NUMBER_TYPES[node.unit] = t  # the type of a literal's unit that reads (errors are never kept)
        return t

    def _infer_Text(self, node) -> T:
        return TEXT

    def _infer_Name(self, node: N.Name) -> T:
        t = self.types.get(node.id)
        if t is not None:
            if t.kind == "any":
                raise Broken()
            return t
        if node.id in B.CONSTANTS:
            return T.of(B.CONSTANTS[node.id].arg)
        return NUMBER  # undefined names were reported by the resolver

    def _infer_Paren(self, node) -> T:
        return self.infer(node.inner)

    def _infer_Neg(self, node) -> T:
        t = self._quantity(self.infer(node.operand), node.operand)
        return T.of(B.rule_neg(t.arg, node), many=t.many)

    def _infer_BinOp(self, node: N.BinOp) -> T:
        dispatch = self._dispatch
        left, right = node.left, node.right
        method = dispatch.get(type(left))
        a = method(self, left) if method is not None else self.infer(left)
        if a.kind != "q" and a.kind != "any":
            self._quantity(a, left)
        method = dispatch.get(type(right))
        b = method(self, right) if method is not None else self.infer(right)
        if b.kind != "q" and b.kind != "any":
            self._quantity(b, right)
        op = node.op
        if op == "^":  # the written power matters only for a base with units
            p = B.written_power(node.right) if a.kind == "q" and a.dim != U.DIMENSIONLESS else None
            t = T.of(B.rule_pow(a.arg, b.arg, node, p), many=a.many)
            B.rule_scalar(b.many, node.right, "an exponent")
            return t
        # + - * /: the result depends on the operator and the two types only; a rule that refuses raises
        # (and is asked again next time, so each error keeps its own node), one that passes is remembered
        ia, ib = id(a), id(b)
        if ia in _SHARED and ib in _SHARED:
            key = (op, ia, ib)
            t = _BINOP_TYPES.get(key)
            if t is None:
                t = T.of(B.OPERATORS[op].rule(op, a.arg, b.arg, node), many=a.many or b.many)
                if len(_BINOP_TYPES) < 65536:
                    _BINOP_TYPES[key] = t
            return t
        return T.of(B.OPERATORS[op].rule(op, a.arg, b.arg, node), many=a.many or b.many)

    def _infer_FieldAccess(self, node: N.FieldAccess) -> T:
        obj = self.infer(node.obj)
        if obj.kind == "any":
            return ANY
        if obj.kind == "table":  # a column of a table: a list
            arg = obj.table.column(node.field_name)
            if arg is None:
                names = [c for c, _ in obj.table.columns]
                raise UnknownFieldError(f"table {obj.table.name} has no column '{node.field_name}'",
                                        node.field_span or node.span,
                                        hint=did_you_mean(node.field_name, names) or "columns: " + ", ".join(names))
            return T.of(arg, many=True)
        if obj.kind != "record":
            raise TypeMismatchError(f"a {obj.describe()} has no fields", node.obj.span)
        if obj.record is None:
            return ANY
        f = obj.record.field(node.field_name)
        if f is None:
            names = [x.name for x in obj.record.fields]
            raise UnknownFieldError(f"{obj.record.qualname} result has no field '{node.field_name}'",
                                    node.field_span or node.span,
                                    hint=did_you_mean(node.field_name, names) or "fields: " + ", ".join(names))
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
        if any(t.kind == "q" for t in items) and all(t.kind in ("q", "any") for t in items):
            return T.of(B.rule_list_items([t.arg for t in items], [t.many for t in items], node), many=True)
        return T("list", item=items[0] if items else ANY)

    def _infer_TupleExpr(self, node) -> T:
        items = [self.infer(i) for i in node.items]
        return T("list", item=items[0] if items else ANY)

    def _infer_Compare(self, node: N.Compare) -> T:
        raise TypeMismatchError("a comparison belongs in a check, or as the condition of if(…)", node.span,
                                hint="write if(a <= b, value, otherwise)")

    def _infer_if(self, node: N.Call) -> T:
        cond, then, otherwise = node.args
        if not isinstance(cond, N.Compare):
            raise TypeMismatchError("if() needs a comparison first: if(a <= b, value, otherwise)", cond.span)
        a = self._quantity(self.infer(cond.left), cond.left)
        b = self._quantity(self.infer(cond.right), cond.right)
        B.rule_compare(a.arg, b.arg, cond, cond.left, cond.right, where="the condition")
        B.rule_scalar(a.many, cond.left, "a side of the condition of if()")
        B.rule_scalar(b.many, cond.right, "a side of the condition of if()")
        x, y = self.infer(then), self.infer(otherwise)
        if B.rule_if(x.word(), y.word(), node) is None:
            return ANY
        B.rule_if_shape(x.many, y.many, node)
        return x if x.kind != "any" else y

    def _infer_Call(self, node: N.Call) -> T:
        fn = B.FUNCTIONS.get(node.func)
        if fn is None and node.func in self.functions:
            return self._infer_user_call(self.functions[node.func], node)
        if fn is None and node.func in self.types:
            raise Broken()  # a sheet function with an error of its own, reported at its definition
        if fn is None:  # reported by the resolver; here only for expressions checked on their own
            raise UnknownFunctionError(f"unknown function '{node.func}'", node.func_span or node.span,
                                       hint=did_you_mean(node.func, B.FUNCTIONS))
        if fn.name == "lookup":
            return self._infer_lookup(node)
        B.check_call_shape(fn, node)
        if fn.lazy:
            return self._infer_if(node)
        types = [self._quantity(self.infer(a), a) for a in node.args]
        return T.of(fn.rule([t.arg for t in types], node.args, node), many=B.shape_of_call(fn, [t.many for t in types]))

    def _infer_PluginCall(self, node: N.PluginCall) -> T:
        pf = self.plugins.function(node.namespace, node.func)
        given = {}
        for kw in node.kwargs:
            if kw.name in given:
                raise PluginArgumentError(f"'{kw.name}' is given twice", kw.span)
            given[kw.name] = (self.infer(kw.value), kw)
        try:
            check_argument_kinds(pf, {k: None for k in given})
        except PluginArgumentError as exc:
            raise exc.with_span(given[exc.param][1].span if exc.param in given else node.func_span or node.span)
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
            want = p.wanted
            self._need(where, want, t, kw.value)
            B.rule_plugin_scalar(where, t.many, kw.value)
            self._pending.extend(lint.argument_findings(p.name, kw.value, self, self.path))
        elif kind in ("text", "flag"):
            if t.kind != "text":
                raise PluginArgumentError(f"{where} needs a text in quotes, got a {t.describe()}", kw.value.span)
            choices = p.choices or (("yes", "no") if kind == "flag" else None)
            if choices and isinstance(kw.value, N.Text) and kw.value.value not in choices:
                raise PluginArgumentError(f"{where} must be one of " + ", ".join(f'"{c}"' for c in choices),
                                          kw.value.span, hint=did_you_mean(kw.value.value, choices, quote='"'))
        elif kind == "record":
            if t.kind != "record" or not takes_record(p.record, t.record_type, t.record and t.record.family):
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
                            self._need(f"{where} coordinate", p.wanted, ct, c)
                elif p.record:
                    family = it.record and it.record.family
                    if it.kind != "record" or not takes_record(p.record, it.record_type, family):
                        raise PluginArgumentError(f"{where} needs {p.record} records, got a {it.describe()}",
                                                  item.span)
                else:
                    self._need(f"{where} item", p.wanted, it, item)


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
