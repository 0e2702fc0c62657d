"""HTML math printer: stacked fractions, superscripts, subscripts, Greek, radicals.

Every hook returns ``Html`` (a typed markup string, see ``markup``): plain
strings handed to it are escaped on the way in, so no sheet text reaches the
page unescaped; nothing from a sheet lands in an attribute other than an
``href="#..."`` built by ``anchor_id`` from a checked name.
"""
from __future__ import annotations

import re

from ..display import unit_factors
from ..trace import CheckResult, FunctionStep, Step
from .base import split_name
from .markup import Html, anchor_id, esc
from .math import MathPrinter, is_literal

__all__ = ["HtmlMathPrinter", "Html", "anchor_id", "esc"]

_CMP = {"<=": Html("≤"), ">=": Html("≥"), "<": Html("&lt;"), ">": Html("&gt;")}


def _symbol(head: str, subs: list[str]) -> Html:
    return Html("<var>{}</var>").format(head) + (Html("<sub>{}</sub>").format(",".join(subs)) if subs else Html())


class HtmlMathPrinter(MathPrinter):
    default_settings = {"sigfigs": 3, "stacked_fractions": True}

    def m_text(self, text):
        return esc(text)

    def m_string(self, text):
        return Html('<span class="str">“{}”</span>').format(text)

    def m_name(self, name, link=None):
        body = _symbol(*split_name(name))
        if link:
            return Html('<a class="sym" href="#{}">{}</a>').format(anchor_id(link), body)
        return Html('<span class="sym">{}</span>').format(body)

    def m_field(self, obj, field, link=None):
        inner = Html('<span class="owner">{}.</span>{}').format(obj, _symbol(*split_name(field)))
        if link:
            return Html('<a class="sym" href="#{}">{}</a>').format(anchor_id(link), inner)
        return Html('<span class="sym">{}</span>').format(inner)

    def m_number(self, text, exp):
        text = esc(text).replace("-", "−")
        if exp is None:
            return Html('<span class="num">{}</span>').format(text)
        return Html('<span class="num">{}×10<sup>{}</sup></span>').format(text, esc(str(exp)).replace("-", "−"))

    def m_unit(self, unit):
        num, den = unit_factors(unit)

        def part(items):
            return Html("·").join(esc(s) + (Html("<sup>{}</sup>").format(_exp(e)) if e != 1 else Html())
                                  for s, e in items)

        top = part(num) or (Html("1") if den else Html())
        if den:
            bottom = part(den)
            text = Html("{}/({})").format(top, bottom) if len(den) > 1 else Html("{}/{}").format(top, bottom)
        else:
            text = top
        return Html('<span class="unit">{}</span>').format(text)

    def m_quantity(self, number, unit):
        if not unit:
            return number
        if ">°<" in unit:
            return Html('<span class="qty">{}{}</span>').format(number, unit)
        return Html('<span class="qty">{}&#8239;{}</span>').format(number, unit)

    def m_paren(self, inner):
        return Html('<span class="paren">(</span>{}<span class="paren">)</span>').format(inner)

    def m_neg(self, inner):
        return Html("−{}").format(inner)

    def m_binary(self, left, op, right):
        if op == "·":
            return Html('{}<span class="op dot">·</span>{}').format(left, right)
        return Html('{}<span class="op">{}</span>{}').format(left, op, right)

    def m_frac(self, num, den):
        return Html('<span class="frac"><span class="fn">{}</span><span class="fd">{}</span></span>').format(num, den)

    def m_pow(self, base, exponent):
        return Html("{}<sup>{}</sup>").format(base, exponent)

    def m_sqrt(self, inner):
        return Html('<span class="sqrt"><span class="radic">√</span><span class="radicand">{}</span></span>'
                    ).format(inner)

    def m_abs(self, inner):
        return Html('<span class="abs">|</span>{}<span class="abs">|</span>').format(inner)

    def m_call(self, func, args, plugin=False):
        sep = Html('<span class="comma">, </span>')
        return Html('<span class="{}">{}</span>{}').format("plugin" if plugin else "fn", func,
                                                            self.m_paren(sep.join(args)))

    def m_keyword(self, name, value):
        return Html('<span class="kw">{}&#8201;=&#8201;{}</span>').format(self.m_name(name), value)

    def m_list(self, items):
        return Html("[{}]").format(Html(", ").join(items))

    def m_tuple(self, items):
        return self.m_paren(Html(", ").join(items))

    def m_compare(self, left, op, right):
        return Html('{}<span class="op">{}</span>{}').format(left, _CMP[op], right)

    def m_cases(self, then, cond, otherwise):
        return Html('<span class="cases"><span class="brace">{{</span><span class="rows">'
                    '<span class="row">{}<span class="when">if</span>{}</span>'
                    '<span class="row">{}<span class="when">otherwise</span></span></span></span>'
                    ).format(then, cond, otherwise)

    # ------------------------------------------------------------ trace records
    def step_parts(self, step: Step, link=None, exact: dict | None = None) -> list[Html]:
        """The chain symbol = formula = substitution = result, each already HTML."""
        if isinstance(step, FunctionStep):  # a sheet function: its definition, once
            params = [self.m_name(p) + (Html('&#8201;<span class="unit">[{}]</span>').format(u) if u is not None
                                        else Html()) for p, u in step.params]
            head = self.m_call(self.m_name(step.name), params)
            if step.unit_text:
                head += Html('&#8201;<span class="unit">[{}]</span>').format(step.unit_text)
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

    def check_parts(self, check: CheckResult, link=None, exact: dict | None = None) -> tuple[Html, Html]:
        cmp = Html('<span class="op">{}</span>').format(_CMP[check.op])
        sym = self.expr(check.left, link=link) + cmp + self.expr(check.right, link=link)
        sub = (self.expr(check.shown_left or check.left, values=check.used, exact=exact) + cmp
               + self.expr(check.shown_right or check.right, values=check.used, exact=exact))
        return sym, sub


def _plain(markup: str) -> str:
    return re.sub(r"<[^>]+>", "", str(markup)).replace("&#8239;", " ")


def _exp(e) -> str:
    return str(int(e)) if float(e).is_integer() else f"{e:g}"
