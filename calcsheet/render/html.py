"""HTML math printer: stacked fractions, superscripts, subscripts, Greek, radicals.

Every piece of sheet text passes through ``esc``; nothing from a sheet ever
lands in an attribute other than an ``href="#..."`` built from a checked name.
"""
from __future__ import annotations

import html
import re

from ..display import unit_factors
from ..trace import CheckResult, Step
from .base import split_name
from .math import MathPrinter, is_literal


def esc(text) -> str:
    return html.escape(str(text), quote=True)


_ANCHOR_SAFE = re.compile(r"[^A-Za-z0-9_.\-]")


def anchor_id(text: str) -> str:
    """An id/href fragment from a name; anything unexpected is replaced."""
    return _ANCHOR_SAFE.sub("-", text)


class HtmlMathPrinter(MathPrinter):
    default_settings = {"sigfigs": 3, "stacked_fractions": True}

    def m_text(self, text):
        return esc(text)

    def m_string(self, text):
        return f'<span class="str">“{esc(text)}”</span>'

    def m_name(self, name, link=None):
        head, subs = split_name(name)
        body = f'<var>{esc(head)}</var>' + (f"<sub>{esc(','.join(subs))}</sub>" if subs else "")
        if link:
            return f'<a class="sym" href="#{anchor_id(link)}">{body}</a>'
        return f'<span class="sym">{body}</span>'

    def m_field(self, obj, field, link=None):
        head, subs = split_name(field)
        body = f'<var>{esc(head)}</var>' + (f"<sub>{esc(','.join(subs))}</sub>" if subs else "")
        inner = f'<span class="owner">{obj}.</span>{body}'
        if link:
            return f'<a class="sym" href="#{anchor_id(link)}">{inner}</a>'
        return f'<span class="sym">{inner}</span>'

    def m_number(self, text, exp):
        text = esc(text).replace("-", "−")
        if exp is None:
            return f'<span class="num">{text}</span>'
        return f'<span class="num">{text}×10<sup>{esc(str(exp)).replace("-", "−")}</sup></span>'

    def m_unit(self, unit):
        num, den = unit_factors(unit)

        def part(items):
            return "·".join(esc(s) + (f"<sup>{_exp(e)}</sup>" if e != 1 else "") for s, e in items)

        top = part(num) or ("1" if den else "")
        if den:
            bottom = part(den)
            text = f"{top}/({bottom})" if len(den) > 1 else f"{top}/{bottom}"
        else:
            text = top
        return f'<span class="unit">{text}</span>'

    def m_quantity(self, number, unit):
        if not unit:
            return number
        if ">°<" in unit:
            return f'<span class="qty">{number}{unit}</span>'
        return f'<span class="qty">{number}&#8239;{unit}</span>'

    def m_paren(self, inner):
        return f'<span class="paren">(</span>{inner}<span class="paren">)</span>'

    def m_neg(self, inner):
        return f"−{inner}"

    def m_binary(self, left, op, right):
        if op == "·":
            return f'{left}<span class="op dot">·</span>{right}'
        return f'{left}<span class="op">{esc(op)}</span>{right}'

    def m_frac(self, num, den):
        return (f'<span class="frac"><span class="fn">{num}</span>'
                f'<span class="fd">{den}</span></span>')

    def m_pow(self, base, exponent):
        return f"{base}<sup>{exponent}</sup>"

    def m_sqrt(self, inner):
        return f'<span class="sqrt"><span class="radic">√</span><span class="radicand">{inner}</span></span>'

    def m_abs(self, inner):
        return f'<span class="abs">|</span>{inner}<span class="abs">|</span>'

    def m_call(self, func, args, plugin=False):
        cls = "plugin" if plugin else "fn"
        sep = '<span class="comma">, </span>'
        return f'<span class="{cls}">{esc(func)}</span>{self.m_paren(sep.join(args))}'

    def m_keyword(self, name, value):
        return f'<span class="kw">{self.m_name(name)}&#8201;=&#8201;{value}</span>'

    def m_list(self, items):
        return "[" + ", ".join(items) + "]"

    def m_compare(self, left, op, right):
        sym = {"<=": "≤", ">=": "≥", "<": "&lt;", ">": "&gt;"}[op]
        return f'{left}<span class="op">{sym}</span>{right}'

    def m_cases(self, then, cond, otherwise):
        return (f'<span class="cases"><span class="brace">{{</span><span class="rows">'
                f'<span class="row">{then}<span class="when">if</span>{cond}</span>'
                f'<span class="row">{otherwise}<span class="when">otherwise</span></span></span></span>')

    # ------------------------------------------------------------ trace records
    def step_parts(self, step: Step, link=None) -> list[str]:
        """The chain symbol = formula = substitution = result, each already HTML."""
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
        if step.used:
            sub = self.expr(step.expr, values=step.used)
            if _plain(sub) != _plain(sym):
                parts.append(sub)
        if _plain(result) != _plain(parts[-1]):
            parts.append(result)
        return parts

    def check_parts(self, check: CheckResult, link=None) -> tuple[str, str]:
        cmp = {"<=": "≤", ">=": "≥", "<": "&lt;", ">": "&gt;"}[check.op]
        sym = f'{self.expr(check.left, link=link)}<span class="op">{cmp}</span>{self.expr(check.right, link=link)}'
        sub = (f'{self.expr(check.left, values=check.used)}<span class="op">{cmp}</span>'
               f'{self.expr(check.right, values=check.used)}')
        return sym, sub


def _plain(markup: str) -> str:
    return re.sub(r"<[^>]+>", "", markup).replace("&#8239;", " ")


def _exp(e) -> str:
    return str(int(e)) if float(e).is_integer() else f"{e:g}"
