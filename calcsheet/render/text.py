"""Plain-text printer, for the terminal: 'M = w·L²/8 = 5.20 kN/m · (6.00 m)² / 8 = 23.4 kN·m'."""
from __future__ import annotations

import pint

from ..display import superscript, unit_text
from ..trace import CheckResult, Heading, Prose, Step, Table, Working, Note, Figure
from .base import split_name
from .math import MathPrinter, is_literal


class TextPrinter(MathPrinter):
    default_settings = {"sigfigs": 3, "stacked_fractions": False, "width": 100}

    def m_text(self, text): return text
    def m_string(self, text): return f'"{text}"'

    def m_name(self, name, link=None):
        head, subs = split_name(name)
        return head + ("_" + ",".join(subs) if subs else "")

    def m_field(self, obj, field, link=None):
        return f"{obj}.{self.m_name(field)}"

    def m_number(self, text, exp):
        text = text.replace("-", "−")
        return text if exp is None else f"{text}×10{superscript(exp)}"

    def m_unit(self, unit): return unit_text(unit)
    def m_quantity(self, number, unit):
        if not unit:
            return number
        return f"{number}{unit}" if unit == "°" else f"{number} {unit}"
    def m_paren(self, inner): return f"({inner})"
    def m_neg(self, inner): return f"−{inner}"

    def m_binary(self, left, op, right):
        if op in "+−" or self._values is not None:
            return f"{left} {op} {right}"
        return f"{left}{op}{right}"

    def m_frac(self, num, den): return f"({num})/({den})"

    def m_pow(self, base, exponent):
        if exponent.replace("-", "").replace("−", "").isdigit():
            return base + superscript(exponent.replace("−", "-"))
        return f"{base}^({exponent})"

    def m_sqrt(self, inner): return f"√({inner})"
    def m_abs(self, inner): return f"|{inner}|"
    def m_call(self, func, args, plugin=False): return f"{func}({', '.join(args)})"
    def m_keyword(self, name, value): return f"{name}={value}"
    def m_list(self, items): return "[" + ", ".join(items) + "]"

    def m_compare(self, left, op, right):
        return f"{left} {({'<=': '≤', '>=': '≥'}).get(op, op)} {right}"

    def m_cases(self, then, cond, otherwise):
        return f"({then} if {cond}, else {otherwise})"

    # ------------------------------------------------------------ trace records
    def step(self, step: Step) -> str:
        lhs = self.m_name(step.name)
        result = self.value(step.value, step.display_unit)
        if step.expr is None:
            line = f"{lhs} = {result}"
            return line + (f"   ({step.note})" if step.note else "")
        sym = self.expr(step.expr)
        if hasattr(step.value, "working") or step.working is not None:
            return f"{lhs} = {sym}"
        parts = [lhs, sym]
        if is_literal(step.expr) and step.overridden is None:
            return f"{lhs} = {sym}"
        if step.used:
            sub = self.expr(step.expr, values=step.used)
            if sub != sym:
                parts.append(sub)
        if result != parts[-1]:
            parts.append(result)
        line = " = ".join(parts)
        if step.overridden is not None:
            line += f"   [set on the command line; sheet has {self.value(step.overridden, step.display_unit)}]"
        return line

    def check(self, check: CheckResult) -> str:
        left = self.expr(check.left)
        right = self.expr(check.right)
        demand = self.value(check.demand)
        status = "OK" if check.ok else "NG"
        ratio = f"  ratio {check.ratio:.2f}" if check.ratio is not None else ""
        lv = self.expr(check.left, values=check.used)
        rv = self.expr(check.right, values=check.used)
        cmp = {"<=": "≤", ">=": "≥"}.get(check.op, check.op)
        return f"check {left} {cmp} {right}:  {lv} {cmp} {rv}  →  {status}{ratio}"

    def items(self, items, indent: str = "") -> str:
        out = []
        for item in items:
            if isinstance(item, Heading):
                out.append("")
                out.append(indent + ("#" * item.level) + " " + (item.number + " " if item.number else "") + item.text)
            elif isinstance(item, Prose):
                out.append(indent + item.text)
            elif isinstance(item, Step):
                out.append(indent + self.step(item) + (f"   -- {item.description}" if item.description else ""))
                if item.working is not None:
                    out.append(self.items(item.working.items, indent + "    "))
            elif isinstance(item, CheckResult):
                out.append(indent + self.check(item) + (f"   -- {item.description}" if item.description else ""))
            elif isinstance(item, Table):
                out.append(indent + f"[table: {item.title}, {len(item.rows)} rows]")
            elif isinstance(item, Note):
                out.append(indent + ("warning: " if item.kind == "warning" else "") + item.text)
            elif isinstance(item, Figure):
                out.append(indent + f"[figure: {item.caption}]")
            elif isinstance(item, Working):
                out.append(self.items(item.items, indent + "    "))
        return "\n".join(out)
