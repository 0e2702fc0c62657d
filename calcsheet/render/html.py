"""HTML math printer: stacked fractions, superscripts, subscripts, Greek, radicals.

Every hook returns ``Html`` (a typed markup string, see ``markup``). Inside a
hook the pieces are plain strings joined once: an argument that is not already
``Html`` is escaped by ``_m`` on the way in (a hook's result is ``Html``, a
name, number or operator from the sheet is text), so no sheet text reaches the
page unescaped and nothing is escaped twice. Nothing from a sheet lands in an
attribute other than an ``href="#..."`` built by ``anchor_id`` from a checked
name.

A formula is mostly text: numbers, units, operators and brackets are plain
characters, so the typesetter sees a few long runs, not one box per token.
Elements are kept only for structure: ``<var>`` (an italic symbol), ``<sub>``
and ``<sup>``, links, fractions, radicals and cases. Spacing is by character:
a no-break space before an operator or ``=`` and a breakable thin or ordinary
space after it, ", " between arguments, so a long formula or plugin call wraps
after an operator, an ``=`` or at an argument boundary, never inside a symbol
or between a number and its unit.
"""
from __future__ import annotations

import re

from ..display import superscript, unit_factors
from ..trace import CheckResult, FunctionStep, Step
from .base import split_name
from .markup import Html, anchor_id, esc, piece as _m, wrap as _wrap
from .math import MathPrinter, is_literal

__all__ = ["HtmlMathPrinter", "Html", "anchor_id", "esc"]

_CMP = {"<=": "≤", ">=": "≥", "<": "&lt;", ">": "&gt;"}
NNBSP = "&#8239;"  # narrow no-break space: between a number and its unit, before an operator
THIN = "&#8201;"   # thin space, a line may break after it: after an operator
EQ = "&#8239;&#160;=&#8194;"  # the "=" between the terms of a step: a line may break after it (en space), not before
COMMA = ", "       # between arguments: where a long call wraps
_join = "".join    # str.join: joins markup and escaped text as they are (``+`` on Html would escape again)


def _cat(*parts) -> Html:
    """Our own literals and pieces that went through ``_m``, as one ``Html``."""
    return _wrap(_join(parts))


def _symbol(head: str, subs: list[str]) -> str:
    if subs:
        return _join(("<var>", _m(head), "</var><sub>", _m(",".join(subs)), "</sub>"))
    return _join(("<var>", _m(head), "</var>"))


def _link(body: str, link) -> str:
    return _join(('<a href="#', anchor_id(link), '">', body, "</a>"))


def _op(op: str) -> str:
    if op == "·":
        return "·"
    return _join((NNBSP, _m(op), THIN))


def _args(items) -> str:
    return COMMA.join([_m(i) for i in items])


class HtmlMathPrinter(MathPrinter):
    default_settings = {"sigfigs": 3, "stacked_fractions": True}

    def __init__(self, **settings):
        super().__init__(**settings)
        self._names: dict = {}  # (name, link) -> markup: a sheet names the same symbols again and again
        self._units: dict = {}  # pint Unit -> markup

    def m_text(self, text):
        return esc(text)

    def m_string(self, text):
        return _cat("“", _m(text), "”")

    def m_name(self, name, link=None):
        key = (name, link)
        done = self._names.get(key)
        if done is None:
            body = _symbol(*split_name(name))
            done = self._names[key] = _wrap(_link(body, link) if link else body)
        return done

    def m_field(self, obj, field, link=None):
        inner = _join(('<span class="owner">', _m(obj), ".</span>", _symbol(*split_name(field))))
        return _wrap(_link(inner, link) if link else inner)

    def m_number(self, text, exp):
        text = _m(text).replace("-", "−")
        if exp is None:
            return _wrap(text)
        return _cat(text, "×10", _power(str(exp)))

    def m_unit(self, unit):
        done = self._units.get(unit)
        if done is None:
            num, den = unit_factors(unit)

            def part(items):
                return "·".join([_join((_m(s), _power(_exp(e)))) if e != 1 else _m(s) for s, e in items])

            top = part(num) or ("1" if den else "")
            if den:
                bottom = part(den)
                text = _join((top, "/(", bottom, ")")) if len(den) > 1 else _join((top, "/", bottom))
                # a line may break after "/"; a unit is one word: kip/ft never ends a line at "kip/"
                text = _join(('<span class="nb">', text, "</span>"))
            else:
                text = top
            done = self._units[unit] = _wrap(text)
        return done

    def m_quantity(self, number, unit):
        if not unit:
            return number
        unit = _m(unit)
        if unit.startswith("°"):
            return _cat(_m(number), unit)
        return _cat(_m(number), NNBSP, unit)

    def m_paren(self, inner):
        return _cat("(", _m(inner), ")")

    def m_neg(self, inner):
        return _cat("−", _m(inner))

    def m_binary(self, left, op, right):
        return _cat(_m(left), _op(op), _m(right))

    def m_frac(self, num, den):
        return _cat('<span class="frac"><span class="fn">', _m(num), '</span><span class="fd">', _m(den),
                    "</span></span>")

    def m_pow(self, base, exponent):
        return _cat(_m(base), _power(exponent))

    def m_sqrt(self, inner):
        return _cat('<span class="sqrt">√<span class="radicand">', _m(inner), "</span></span>")

    def m_abs(self, inner):
        return _cat("|", _m(inner), "|")

    def m_call(self, func, args, plugin=False):
        if plugin:
            return _cat('<span class="plugin">', _m(func), "</span>(", _args(args), ")")
        return _cat(_m(func), "(", _args(args), ")")

    def m_keyword(self, name, value):
        return _cat(self.m_name(name), NNBSP, "=", NNBSP, _m(value))

    def m_list(self, items):
        return _cat("[", _args(items), "]")

    def m_tuple(self, items):
        return _cat("(", _args(items), ")")

    def m_compare(self, left, op, right):
        return _cat(_m(left), NNBSP, _CMP[op], THIN, _m(right))

    def m_cases(self, then, cond, otherwise):
        return _cat('<span class="cases"><span class="brace">{</span><span class="rows"><span class="row">',
                    _m(then), '<span class="when">if</span>', _m(cond), '</span><span class="row">',
                    _m(otherwise), '<span class="when">otherwise</span></span></span></span>')

    # ------------------------------------------------------------ trace records
    def step_parts(self, step: Step, link=None, exact: dict | None = None) -> list[Html]:
        """The chain symbol = formula = substitution = result, each already HTML."""
        if isinstance(step, FunctionStep):  # a sheet function: its definition, once
            params = [_cat(self.m_name(p), THIN, "[", _m(u), "]") if u is not None else self.m_name(p)
                      for p, u in step.params]
            head = self.m_call(self.m_name(step.name), params)
            if step.unit_text:
                head = _cat(head, THIN, "[", _m(step.unit_text), "]")
            return [head, self.expr(step.expr, link=link)]
        lhs = self.m_name(step.name)
        result = self.value(step.value, step.display_unit)
        if step.expr is None:
            return [lhs, result]
        sym = self.expr(step.expr, link=link)
        if step.working is not None:
            return [lhs, sym]
        if is_literal(step.expr) and step.overridden is None:
            return [lhs, sym]
        parts = [lhs, sym]
        if step.used or step.shown_expr is not None:
            sub = self.expr(step.shown_expr or step.expr, values=step.used, exact=exact,
                            result=(step.value, step.display_unit))
            if _plain(sub) != _plain(sym):
                parts.append(sub)
        if _plain(result) != _plain(parts[-1]):
            parts.append(result)
        return parts

    def check_symbol(self, check: CheckResult, link=None) -> Html:
        """The check as the sheet wrote it: ``left ≤ right``."""
        cmp = _join((NNBSP, _CMP[check.op], THIN))
        return _cat(_m(self.expr(check.left, link=link)), cmp, _m(self.expr(check.right, link=link)))

    def check_parts(self, check: CheckResult, link=None, exact: dict | None = None) -> tuple[Html, Html]:
        """The check as written, and with its values substituted."""
        cmp = _join((NNBSP, _CMP[check.op], THIN))
        sym = self.check_symbol(check, link)
        sub = _cat(_m(self.expr(check.shown_left or check.left, values=check.used, exact=exact)), cmp,
                   _m(self.expr(check.shown_right or check.right, values=check.used, exact=exact)))
        return sym, sub


_TAG = re.compile(r"<[^>]+>")


def _plain(markup: str) -> str:
    return _TAG.sub("", str(markup)).replace(NNBSP, " ").replace(THIN, " ")


_WHOLE = re.compile(r"[−-]?[0-9]+")


def _power(exponent) -> str:
    """An exponent: a whole number as superscript characters (m², 10⁻³: part of the text, not a box of its
    own for the typesetter), anything else raised in a ``<sup>``."""
    text = str(exponent)
    if _WHOLE.fullmatch(text):
        return superscript(int(text.replace("−", "-")))
    return _join(("<sup>", _m(exponent), "</sup>"))


def _exp(e) -> str:
    return str(int(e)) if float(e).is_integer() else f"{e:g}"
