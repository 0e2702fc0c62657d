"""The structure of a printed formula, shared by the text and HTML printers.

``MathPrinter`` decides what goes where (brackets, fractions, powers, which
value replaces which symbol); subclasses only supply the markup hooks.
"""
from __future__ import annotations

import dataclasses
import math

import pint

from .. import nodes as N
from ..builtins import FUNCTIONS, OPERATORS, print_form
from ..names import dotted, strip_sign, unparen
from ..display import shown, split_number
from ..plugin import Record
from .base import ATOM, PRECEDENCE, Printer, precedence, value_precedence


class MathPrinter(Printer):
    """Prints an expression symbolically, or with each symbol's value substituted."""

    default_settings = {"sigfigs": 3, "stacked_fractions": False}

    # ------------------------------------------------------------ public
    def expr(self, node: N.Expr, values: dict | None = None, link=None, *, exact: dict | None = None,
             result=None) -> str:
        """``values`` maps a symbol ('L', 'sec.A') to (value, display unit) for substitution.

        ``exact`` maps an input's name to its literal: it is printed as the sheet wrote it. With
        ``result`` (value, display unit), calculated values are printed with as many significant
        figures as recomputing the formula from the printed numbers needs to give the printed result.
        """
        self._values = values
        self._link = link
        self._exact = exact or {}
        self._digits = 0
        if values is not None and result is not None:
            self._digits = reproducing_sigfigs(node, values, self._exact, result, self.settings["sigfigs"])
        try:
            return self._print(node, 0)
        finally:
            self._exact, self._digits = {}, 0

    def _substituted(self, key):
        if key in self._exact:  # an input, as the sheet wrote it
            literal = self._exact[key]
            if isinstance(literal, N.Neg) and isinstance(literal.operand, N.Number):
                return self.m_neg(self._print(literal.operand, ATOM))  # "−2 kN", not "−(2 kN)"
            return self._print(literal, 0)
        v, unit = self._values[key]
        return self.value(v, unit, sigfigs=self._digits or None)

    def value(self, value, unit=None, sigfigs: int | None = None) -> str:
        """A result: '23.4 kN·m', '1.23×10⁵ mm³', 'OK'."""
        if isinstance(value, pint.Quantity):
            value = shown(value, unit)
            mag = value.magnitude
            try:
                mag = float(mag)
            except TypeError:
                return self.list_value(value, sigfigs)
            text, exp = split_number(mag, self.settings["sigfigs"])
            if sigfigs and sigfigs > self.settings["sigfigs"]:  # extra figures, but no trailing zeros
                more = split_number(mag, sigfigs)
                for fewer_figures in range(sigfigs - 1, self.settings["sigfigs"] - 1, -1):
                    fewer = split_number(mag, fewer_figures)
                    if float(_num(*fewer)) != float(_num(*more)):
                        break
                    more = fewer
                text, exp = more
            number = self.m_number(text, exp)
            unit_markup = self.m_unit(value.units) if not _is_dimensionless(value.units) else ""
            return self.m_quantity(number, unit_markup)
        if isinstance(value, str):
            return self.m_string(value)
        if isinstance(value, Record):
            return self.m_text(f"{value.source} result")
        if isinstance(value, tuple):
            return self.m_list([self.value(v) for v in value])
        return self.m_text(str(value))

    def list_value(self, value: pint.Quantity, sigfigs: int | None = None, most: int = 8):
        """A list of quantities: '[3.60, 4.20, 4.80] m'; a long one shows its first and last elements."""
        mags = [float(m) for m in value.magnitude]
        digits = max(sigfigs or 0, self.settings["sigfigs"])
        shown_mags = mags if len(mags) <= most else mags[:most - 2] + [None] + mags[-1:]
        items = [self.m_text("…") if m is None else self.m_number(*split_number(m, digits)) for m in shown_mags]
        unit_markup = self.m_unit(value.units) if not _is_dimensionless(value.units) else ""
        out = self.m_quantity(self.m_list(items), unit_markup)
        return out if len(mags) <= most else out + self.m_text(f" ({len(mags)} values)")

    # ------------------------------------------------------------ nodes
    def _wrap(self, child, ctx: int, strict: bool = False) -> str:
        inner = self._print(child, precedence(child))
        p = self._child_precedence(child)
        if p < ctx or (strict and p == ctx):
            return self.m_paren(inner)
        return inner

    def _child_precedence(self, child) -> int:
        if self._values is not None:
            key = dotted(child)
            if key is not None and key in self._values:
                return value_precedence(self._values[key][0])
        if isinstance(child, N.Paren):
            return ATOM
        return precedence(child)

    def _print_Number(self, node: N.Number, ctx):
        from ..units import build_unit

        mant, _, exp = node.text.lower().partition("e")
        number = self.m_number(mant, int(exp)) if exp else self.m_number(node.text, None)
        if node.unit:
            return self.m_quantity(number, self.m_unit(build_unit(node.unit)))
        return number

    def _print_Text(self, node, ctx):
        return self.m_string(node.value)

    def _print_Name(self, node: N.Name, ctx):
        if self._values is not None and node.id in self._values:
            return self._substituted(node.id)
        return self.m_name(node.id, link=self._link(node.id) if self._link else None)

    def _print_FieldAccess(self, node: N.FieldAccess, ctx):
        key = dotted(node)
        if self._values is not None and key in self._values:
            return self._substituted(key)
        return self.m_field(self._print(node.obj, ATOM), node.field_name,
                            link=self._link(key) if self._link and key else None)

    def _print_Paren(self, node: N.Paren, ctx):
        inner = self._print(node.inner, 0)
        if self._child_precedence(node.inner) >= ATOM:
            return inner
        return self.m_paren(inner)

    def _print_Neg(self, node: N.Neg, ctx):
        return self.m_neg(self._wrap(node.operand, PRECEDENCE[N.Neg]))

    def _print_Add(self, node, ctx):
        return self.m_binary(self._wrap(node.left, 10), OPERATORS["+"].printed, self._wrap(node.right, 10))

    def _print_Sub(self, node, ctx):
        return self.m_binary(self._wrap(node.left, 10), OPERATORS["-"].printed, self._wrap(node.right, 10, strict=True))

    def _print_Mul(self, node, ctx):
        return self.m_binary(self._wrap(node.left, 20), OPERATORS["*"].printed, self._wrap(node.right, 20, strict=isinstance(
            node.right, N.Div) and not self.settings["stacked_fractions"]))

    def _print_Div(self, node: N.Div, ctx):
        if self.settings["stacked_fractions"]:
            return self.m_frac(self._print(unparen(node.left), 0), self._print(unparen(node.right), 0))
        return self.m_binary(self._wrap(node.left, 20), OPERATORS["/"].printed, self._wrap(node.right, 20, strict=True))

    def _print_Pow(self, node: N.Pow, ctx):
        base = self._wrap(node.left, PRECEDENCE[N.Pow] + 1)
        exponent_values = self._values
        if not any(isinstance(n, (N.Name, N.FieldAccess)) for n in N.walk(node.right)):
            self._values = None  # a number exponent is printed as written; a named one is substituted
        try:
            exponent = self._print(unparen(node.right), 0)
        finally:
            self._values = exponent_values
        return self.m_pow(base, exponent)

    def _print_Compare(self, node: N.Compare, ctx):
        return self.m_compare(self._print(node.left, 0), node.op, self._print(node.right, 0))

    def _print_Call(self, node: N.Call, ctx):
        form = print_form(node)  # the built-ins table says how each function is shown
        args = [self._print(unparen(a), 0) for a in node.args if not isinstance(a, N.Flag)]
        if node.kwargs or len(args) < len(node.args):  # lookup(tab.k, h=…, clamp): keys, then flags
            args += [self.m_keyword(kw.name, self._print(kw.value, 0)) for kw in node.kwargs]
            args += [self.m_text(a.name) for a in node.args if isinstance(a, N.Flag)]
        if form == "cases":
            cond, then, otherwise = args
            return self.m_cases(then, cond, otherwise)
        if form == "call":  # a sheet's own function is named like a symbol (M_ss: M with subscript ss)
            return self.m_call(node.func if node.func in FUNCTIONS else self.m_name(node.func), args)
        return getattr(self, "m_" + form)(*args)

    def _print_PluginCall(self, node: N.PluginCall, ctx):
        args = [self.m_keyword(kw.name, self._print(kw.value, 0)) for kw in node.kwargs]
        return self.m_call(f"{node.namespace}.{node.func}", args, plugin=True)

    def _print_ListExpr(self, node, ctx):
        return self.m_list([self._print(i, 0) for i in node.items])

    def _print_TupleExpr(self, node, ctx):
        return self.m_tuple([self._print(i, 0) for i in node.items])

    # ------------------------------------------------------------ markup hooks
    def m_text(self, text): raise NotImplementedError
    def m_string(self, text): raise NotImplementedError
    def m_name(self, name, link=None): raise NotImplementedError
    def m_field(self, obj, field, link=None): raise NotImplementedError
    def m_number(self, text, exp): raise NotImplementedError
    def m_unit(self, unit): raise NotImplementedError
    def m_quantity(self, number, unit): raise NotImplementedError
    def m_paren(self, inner): raise NotImplementedError
    def m_neg(self, inner): raise NotImplementedError
    def m_binary(self, left, op, right): raise NotImplementedError
    def m_frac(self, num, den): raise NotImplementedError
    def m_pow(self, base, exponent): raise NotImplementedError
    def m_sqrt(self, inner): raise NotImplementedError
    def m_abs(self, inner): raise NotImplementedError
    def m_call(self, func, args, plugin=False): raise NotImplementedError
    def m_keyword(self, name, value): raise NotImplementedError
    def m_list(self, items): raise NotImplementedError
    def m_tuple(self, items): raise NotImplementedError
    def m_compare(self, left, op, right): raise NotImplementedError
    def m_cases(self, then, cond, otherwise): raise NotImplementedError




def _num(text: str, exp) -> str:
    return text if exp is None else f"{text}e{exp}"


def _is_dimensionless(unit) -> bool:
    return not unit._units


def is_literal(node) -> bool:
    """A value written directly (``6.0 m``, ``-2 kN``, ``[3.6 m, 4.2 m]``): its formula is its result."""
    node = strip_sign(node)
    if isinstance(node, N.ListExpr) and node.items:
        return all(isinstance(strip_sign(i), N.Number) for i in node.items)
    return isinstance(node, (N.Number, N.Text))


# ------------------------------------------------------------------ reproducible substitution

_MAX_SIGFIGS = 15
_EVALUATOR = None


def _evaluator():
    global _EVALUATOR
    if _EVALUATOR is None:
        from ..evaluator import Evaluator

        _EVALUATOR = Evaluator()
    return _EVALUATOR


def _printed_scalar(value, unit):
    """(magnitude, units, quantity class) of a scalar value in the unit it is printed in, or None."""
    if isinstance(value, (int, float)) and not isinstance(value, bool):
        value = _evaluator().number(value)
    if not isinstance(value, pint.Quantity):
        return None
    q = shown(value, unit)
    try:
        mag = float(q.magnitude)
    except TypeError:
        return None
    if not math.isfinite(mag):
        return None
    return mag, q.units, q.__class__


def _at_sigfigs(printed, sigfigs: int):
    """A printed scalar (``_printed_scalar``) rounded to ``sigfigs`` figures as the page prints it."""
    mag, units, cls = printed
    text, exp = split_number(mag, sigfigs)
    return cls(float(text) * (10.0 ** exp if exp else 1.0), units)


def _replace_symbols(node, keys: dict):
    """The formula with each substituted symbol ('L', 'sec.A') replaced by a placeholder name."""
    key = dotted(node) if isinstance(node, (N.Name, N.FieldAccess)) else None
    if key is not None and key in keys:
        return N.Name(keys[key], span=getattr(node, "span", None))
    if not dataclasses.is_dataclass(node) or isinstance(node, type):
        return node
    changes = {}
    for f in dataclasses.fields(node):
        if not f.init or f.name.endswith("span"):
            continue
        v = getattr(node, f.name)
        if isinstance(v, N.Expr) or (dataclasses.is_dataclass(v) and not isinstance(v, type)):
            new = _replace_symbols(v, keys)
        elif isinstance(v, (tuple, list)):
            new = type(v)(_replace_symbols(i, keys) for i in v)
        else:
            continue
        if new is not v:
            changes[f.name] = new
    return dataclasses.replace(node, **changes) if changes else node


def _has_plugin_call(node) -> bool:
    return any(isinstance(n, N.PluginCall) for n in N.walk(node))


def reproducing_sigfigs(node, values: dict, exact: dict, result, sigfigs: int) -> int:
    """The fewest significant figures (at least the sheet's) for the calculated values substituted
    into ``node`` such that recomputing it from the printed numbers (inputs exactly as written) gives
    the printed result to its last digit; 0 when nothing needs it or it cannot be recomputed."""
    value, unit = result
    result_printed = _printed_scalar(value, unit)
    calculated = [k for k in values if k not in exact]
    if result_printed is None or not calculated or _has_plugin_call(node):
        return 0
    keys = {k: f"__sub{i}" for i, k in enumerate(values)}
    formula = _replace_symbols(node, keys)
    ev = _evaluator()
    fixed = {}
    for k in values:
        if k in exact:
            try:
                fixed[keys[k]] = ev.eval(exact[k], {})
            except Exception:
                return 0
    printed = {}  # each calculated value in its printed unit, converted once for every number of figures
    for k in calculated:
        printed[k] = _printed_scalar(values[k][0], values[k][1])
        if printed[k] is None:
            return 0
    want = split_number(result_printed[0], sigfigs)
    for p in range(sigfigs, _MAX_SIGFIGS + 1):
        env = dict(fixed)
        for k in calculated:
            env[keys[k]] = _at_sigfigs(printed[k], p)
        try:
            got = ev.eval(formula, env)
            got = got.to(value.units) if isinstance(got, pint.Quantity) else None
        except Exception:
            return 0
        got_printed = None if got is None else _printed_scalar(got, unit)
        if got_printed is None:
            return 0
        shown_got = got_printed[0]
        # the printed numbers must give the printed result clearly, not by a tie a calculator rounds otherwise
        if all(split_number(shown_got * f, sigfigs) == want for f in (1 - 1e-9, 1.0, 1 + 1e-9)):
            return p if p > sigfigs else 0
    return _MAX_SIGFIGS
