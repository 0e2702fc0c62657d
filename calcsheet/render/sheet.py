"""Sheet-syntax printer: an expression back as text the parser reads.

Used for round-trip tests (parse, print, parse again, compare) and wherever
a formula must be quoted as the engineer would type it.
"""
from __future__ import annotations

from .. import nodes as N
from .base import ATOM, PRECEDENCE, Printer, precedence


class SheetPrinter(Printer):
    default_settings: dict = {}

    def expr(self, node: N.Expr) -> str:
        return self._print(node)

    def statement(self, stmt: N.Statement) -> str:
        """A definition, check or function definition as the sheet writes it (its description after ``--``)."""
        desc = f"  -- {stmt.description}" if getattr(stmt, "description", None) else ""
        if isinstance(stmt, N.TableDef) and stmt.source is None:  # the description goes on the name's line
            head, _, rows = self._print(stmt).partition("\n")
            return f"{head}{desc}\n{rows}"
        return self._print(stmt) + desc

    @staticmethod
    def _decl(unit_text):
        return f" [{unit_text}]" if unit_text is not None else ""

    def _print_Definition(self, node: N.Definition):
        return f"{node.name}{self._decl(node.unit_text)} = {self._print(node.expr)}"

    def _print_Check(self, node: N.Check):
        return f"check {self._print(node.left)} {node.op} {self._print(node.right)}"

    def _print_FunctionDef(self, node: N.FunctionDef):
        params = ", ".join(p.name + self._decl(p.unit_text) for p in node.params)
        return f"{node.name}({params}){self._decl(node.unit_text)} = {self._print(node.expr)}"

    def _wrap(self, child, ctx: int, strict: bool = False) -> str:
        text = self._print(child)
        p = precedence(child)
        return f"({text})" if p < ctx or (strict and p == ctx) else text

    def _print_Number(self, node: N.Number):
        return f"{node.text} {node.unit_text}" if node.unit_text else node.text

    def _print_Name(self, node):
        return node.id

    def _print_Text(self, node):
        return f'"{node.value}"'

    def _print_Paren(self, node):
        return f"({self._print(node.inner)})"

    def _print_Neg(self, node):
        return "-" + self._wrap(node.operand, PRECEDENCE[N.Neg])

    def _print_BinOp(self, node: N.BinOp):
        p = PRECEDENCE[type(node)]
        if isinstance(node, N.Pow):  # right-associative: a^b^c is a^(b^c)
            return f"{self._wrap(node.left, p + 1)}^{self._wrap(node.right, PRECEDENCE[N.Neg])}"
        return f"{self._wrap(node.left, p)} {node.op} {self._wrap(node.right, p, strict=True)}"

    def _print_Compare(self, node):
        return f"{self._print(node.left)} {node.op} {self._print(node.right)}"

    def _print_Keyword(self, node):
        return f"{node.name}={self._print(node.value)}"

    def _print_Call(self, node):
        flags = [a for a in node.args if isinstance(a, N.Flag)]
        args = [a for a in node.args if not isinstance(a, N.Flag)]
        return f"{node.func}(" + ", ".join(self._print(a) for a in (*args, *node.kwargs, *flags)) + ")"

    def _print_Flag(self, node: N.Flag):
        return node.name

    def _print_TableDef(self, node: N.TableDef):
        """A table as pipe rows under ``name =`` (a table read from a file: ``name = table "file.csv"``)."""
        if node.source is not None:
            return f'{node.name} = table "{node.source}"'
        rows = [node.header, node.units, *node.rows]
        widths = [max(len(r[k]) for r in rows) for k in range(len(node.header))]
        lines = ["| " + " | ".join(c.ljust(w) for c, w in zip(r, widths)) + " |" for r in rows]
        return f"{node.name} =\n" + "\n".join(lines)

    def _print_PluginCall(self, node):
        return f"{node.namespace}.{node.func}(" + ", ".join(self._print(k) for k in node.kwargs) + ")"

    def _print_FieldAccess(self, node):
        return f"{self._wrap(node.obj, ATOM)}.{node.field_name}"

    def _print_ListExpr(self, node):
        return "[" + ", ".join(self._print(i) for i in node.items) + "]"

    def _print_TupleExpr(self, node):
        return "(" + ", ".join(self._print(i) for i in node.items) + ")"
