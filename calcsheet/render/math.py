"""The structure of a printed formula, shared by the text and HTML printers.

``MathPrinter`` decides what goes where (brackets, fractions, powers, which
value replaces which symbol); subclasses only supply the markup hooks.
"""
from __future__ import annotations

import pint

from .. import nodes as N
from ..builtins import OPERATORS, print_form
from ..names import dotted, strip_sign, unparen
from ..display import shown, split_number
from ..plugin import Record
from .base import ATOM, PRECEDENCE, Printer, precedence, value_precedence


class MathPrinter(Printer):
    """Prints an expression symbolically, or with each symbol's value substituted."""

    default_settings = {"sigfigs": 3, "stacked_fractions": False}

    # ------------------------------------------------------------ public
    def expr(self, node: N.Expr, values: dict | None = None, link=None) -> str:
        """``values`` maps a symbol ('L', 'sec.A') to (value, display unit) for substitution."""
        self._values = values
        self._link = link
        return self._print(node, 0)

    def value(self, value, unit=None) -> str:
        """A result: '23.4 kN·m', '1.23×10⁵ mm³', 'OK'."""
        if isinstance(value, pint.Quantity):
            value = shown(value, unit)
            mag = value.magnitude
            try:
                mag = float(mag)
            except TypeError:
                return self.m_text(f"array of {len(mag)} values")
            text, exp = split_number(mag, self.settings["sigfigs"])
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
            v, unit = self._values[node.id]
            return self.value(v, unit)
        return self.m_name(node.id, link=self._link(node.id) if self._link else None)

    def _print_FieldAccess(self, node: N.FieldAccess, ctx):
        key = dotted(node)
        if self._values is not None and key in self._values:
            v, unit = self._values[key]
            return self.value(v, unit)
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
        self._values = None  # exponents are printed as written (they are plain numbers)
        try:
            exponent = self._print(unparen(node.right), 0)
        finally:
            self._values = exponent_values
        return self.m_pow(base, exponent)

    def _print_Compare(self, node: N.Compare, ctx):
        return self.m_compare(self._print(node.left, 0), node.op, self._print(node.right, 0))

    def _print_Call(self, node: N.Call, ctx):
        form = print_form(node)  # the built-ins table says how each function is shown
        args = [self._print(unparen(a), 0) for a in node.args]
        if form == "cases":
            cond, then, otherwise = args
            return self.m_cases(then, cond, otherwise)
        if form == "call":
            return self.m_call(node.func, args)
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




def _is_dimensionless(unit) -> bool:
    return not unit._units


def is_literal(node) -> bool:
    """A value written directly (``6.0 m``, ``-2 kN``): its formula is its result."""
    return isinstance(strip_sign(node), (N.Number, N.Text))
