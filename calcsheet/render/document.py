"""The walk over trace records that every document format shares, and the numbering pass.

A document printer dispatches on the record's class up its MRO
(``_print_Step``, ``_print_CheckResult``, ``_print_Table`` ...), the way the
math printers dispatch on nodes; a format supplies one method per record
class and how to join the pieces. A record class a format has no method for
prints nothing.
"""
from __future__ import annotations


from .. import nodes as N
from ..trace import CheckResult, Heading, Step, copied
from .base import Printer
from .math import is_literal


class DocumentPrinter(Printer):
    """Base of the text and HTML document printers: ``items`` prints records in order."""

    default_settings: dict = {"sigfigs": 3}
    empty = ""

    def record(self, item, **context):
        return self._print(item, **context)

    def empty_printer(self, item):
        return self.empty

    def items(self, items, **context):
        return self.join([self.record(item, **context) for item in items])

    def join(self, pieces):
        raise NotImplementedError


def number_items(items: list) -> list:
    """New records with section numbers on headings (1, 1.1) and step numbers on steps and checks (1.3).

    A pure pass: the records given are not changed. A plugin's working inside a step is not numbered.
    """
    counters = [0, 0, 0, 0]
    step_no = 0
    current = "0"
    out = []
    for item in items:
        if isinstance(item, Heading):
            level = min(max(item.level, 1), 4)
            counters[level - 1] += 1
            for i in range(level, 4):
                counters[i] = 0
            current = ".".join(str(c) for c in counters[:level])
            step_no = 0
            item = copied(item, number=current, anchor="s-" + current)
        elif isinstance(item, (Step, CheckResult)):
            step_no += 1
            item = copied(item, number=f"{current}.{step_no}" if current != "0" else str(step_no))
        out.append(item)
    return out


def exact_inputs(items: list) -> dict:
    """The sheet's own inputs as it wrote them: name -> literal, for substitution exactly as written.

    Only the sheet's top-level inputs (not a plugin's working, not a value set on the command line).
    """
    return {i.name: i.expr for i in items
            if isinstance(i, Step) and i.is_input and not i.namespace and i.overridden is None
            and i.expr is not None and is_literal(i.expr) and not isinstance(i.expr, N.ListExpr)}  # a list: its
    # values (a check over a list substitutes the governing element's)
