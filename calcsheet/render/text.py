"""Plain-text printer, for the terminal: 'M = w·L²/8 = 5.20 kN/m · (6.00 m)² / 8 = 23.4 kN·m'."""
from __future__ import annotations


from ..display import split_number, superscript, unit_text
from ..trace import CheckResult, Figure, FunctionStep, Heading, Note, Prose, SheetTable, Step, Table, Working
from .base import split_name
from .document import DocumentPrinter, exact_inputs
from .math import MathPrinter, is_literal


class TextPrinter(MathPrinter):
    default_settings = {"sigfigs": 3, "stacked_fractions": False}

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
    def m_tuple(self, items): return "(" + ", ".join(items) + ")"

    def m_compare(self, left, op, right):
        return f"{left} {({'<=': '≤', '>=': '≥'}).get(op, op)} {right}"

    def m_cases(self, then, cond, otherwise):
        return f"({then} if {cond}, else {otherwise})"


class TextDocument(DocumentPrinter):
    """Trace records as terminal text, one line per step; a plugin's working indented under its call."""

    empty = None  # a record with no text form adds no line

    def __init__(self, **settings):
        super().__init__(**settings)
        self.math = TextPrinter(sigfigs=self.settings["sigfigs"])

    def join(self, pieces):
        return "\n".join(p for p in pieces if p is not None)

    def items(self, items, indent=""):
        if not indent:  # the sheet's own records: its inputs are substituted as written
            self.exact = exact_inputs(items)
        return super().items(items, indent=indent)

    def _print_Heading(self, item: Heading, indent=""):
        return "\n" + indent + ("#" * item.level) + " " + (item.number + " " if item.number else "") + item.text

    def _print_Prose(self, item: Prose, indent=""):
        return indent + item.text

    def _print_Step(self, item: Step, indent=""):
        line = indent + self.step(item, nested=bool(indent)) + (f"   -- {item.description}" if item.description else "")
        if item.working is not None:
            line += "\n" + self.items(item.working.items, indent=indent + "    ")
        return line + self._after(item, indent)

    def _after(self, item, indent=""):
        """The records a step or check carries to be printed right after it (tables, a lookup's working)."""
        if not getattr(item, "after", None):
            return ""
        return "\n" + self.items(item.after, indent=indent + "    ")

    def _print_CheckResult(self, item: CheckResult, indent=""):
        desc = f"   -- {item.description}" if item.description else ""
        return indent + self.check(item, nested=bool(indent)) + desc + self._after(item, indent)

    def _print_Table(self, item: Table, indent=""):
        return indent + f"[table: {item.title}, {len(item.rows)} rows]"

    def _print_SheetTable(self, item: SheetTable, indent=""):
        """A table the sheet shows in full (its own tables, a check over a list): columns aligned."""
        return text_table(item, self.math, indent)

    def _print_Note(self, item: Note, indent=""):
        return indent + ("warning: " if item.kind == "warning" else "") + item.text

    def _print_Figure(self, item: Figure, indent=""):
        return indent + f"[figure: {item.caption}]"

    def _print_Working(self, item: Working, indent=""):
        return self.items(item.items, indent=indent + "    ")

    def step(self, step: Step, nested: bool = False) -> str:
        """symbol = formula = substitution = result."""
        m = self.math
        if isinstance(step, FunctionStep):  # a sheet function: its definition, once
            params = [m.m_name(p) + (f" [{u}]" if u is not None else "") for p, u in step.params]
            head = m.m_call(m.m_name(step.name), params) + (f" [{step.unit_text}]" if step.unit_text else "")
            return f"{head} = {m.expr(step.expr)}"
        lhs = m.m_name(step.name)
        result = m.value(step.value, step.display_unit)
        if step.expr is None:
            line = f"{lhs} = {result}"
            return line + (f"   ({step.note})" if step.note else "")
        sym = m.expr(step.expr)
        if hasattr(step.value, "working") or step.working is not None:
            return f"{lhs} = {sym}"
        parts = [lhs, sym]
        if is_literal(step.expr) and step.overridden is None:
            return f"{lhs} = {sym}"
        if step.used or step.shown_expr is not None:
            sub = m.expr(step.shown_expr or step.expr, values=step.used,
                         exact=None if nested else getattr(self, "exact", {}),
                         result=(step.value, step.display_unit))
            if sub != sym:
                parts.append(sub)
        if result != parts[-1]:
            parts.append(result)
        line = " = ".join(parts)
        if step.overridden is not None:
            line += f"   [set on the command line; sheet has {m.value(step.overridden, step.display_unit)}]"
        return line

    def check(self, check: CheckResult, nested: bool = False) -> str:
        m = self.math
        left = m.expr(check.left)
        right = m.expr(check.right)
        status = "OK" if check.ok else "NG"
        ratio = f"  ratio {check.ratio:.2f}" if check.ratio is not None else ""
        exact = None if nested else getattr(self, "exact", {})
        lv = m.expr(check.shown_left or check.left, values=check.used, exact=exact)
        rv = m.expr(check.shown_right or check.right, values=check.used, exact=exact)
        cmp = {"<=": "≤", ">=": "≥"}.get(check.op, check.op)
        where = f"  (element {check.governing} governs)" if check.governing is not None else ""
        return f"check {left} {cmp} {right}:  {lv} {cmp} {rv}  →  {status}{ratio}{where}"


def text_table(item: Table, math: TextPrinter, indent: str = "") -> str:
    """A table as aligned text: a header row (with each column's unit), a rule, the rows."""
    units = list(item.units or []) + [None] * len(item.columns)
    head = [c + (f" [{unit_text(u)}]" if u is not None and unit_text(u) else "") for c, u in zip(item.columns, units)]

    def cell(v, u):
        if hasattr(v, "magnitude"):
            if u is not None:
                try:
                    return math.m_number(*split_number(float(v.to(u).magnitude), math.settings["sigfigs"]))
                except Exception:  # a cell in another unit than its column's: shown with its own
                    pass
            return math.value(v)
        if isinstance(v, float):
            return math.m_number(*split_number(v, math.settings["sigfigs"]))
        return str(v)

    rows = [[cell(v, u) for v, u in zip(r, units)] for r in item.rows]
    widths = [max(len(x) for x in col) for col in zip(head, *rows)]
    line = lambda cells: indent + "  " + " | ".join(c.rjust(w) for c, w in zip(cells, widths))  # noqa: E731
    out = [indent + item.title, line(head), indent + "  " + "-+-".join("-" * w for w in widths)]
    out += [line(r) for r in rows]
    if item.note:
        out.append(indent + "  " + item.note)
    return "\n".join(out)
