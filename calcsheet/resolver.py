"""Names: what each statement reads, where it is defined, and the dependency graph.

A paper calculation reads top to bottom, so a name must be defined above
its first use; the graph of precedents and dependents is still kept, for
the diff, the cross-references and the overrides.
"""
from __future__ import annotations

from dataclasses import dataclass, field

from . import nodes as N
from .errors import (
    CalcError,
    Span,
    Diagnostic,
    PluginArgumentError,
    RedefinitionError,
    UndefinedNameError,
    UnknownFunctionError,
    UnknownPluginError,
    UseBeforeDefinitionError,
)
from .builtins import CONSTANTS, FUNCTIONS, is_builtin
from .names import did_you_mean
from .plugin import PluginRegistry


def check_key(stmt: N.Check) -> str:
    """Checks have no name; they are keyed by their line."""
    if stmt.span is not None and stmt.span.path:
        return f"check@{stmt.span.path}:{stmt.span.line}"
    return f"check@{stmt.span.line if stmt.span else 0}"


@dataclass
class Resolution:
    defined_at: dict[str, int] = field(default_factory=dict)  # name -> line
    def_spans: dict[str, Span] = field(default_factory=dict)  # name -> span (its file, for includes)
    statements: dict[str, N.Statement] = field(default_factory=dict)  # key -> statement
    precedents: dict[str, list[str]] = field(default_factory=dict)  # key -> names it reads
    dependents: dict[str, list[str]] = field(default_factory=dict)  # name -> keys reading it
    inputs: list[str] = field(default_factory=list)  # definitions reading no other value
    broken: set[str] = field(default_factory=set)  # keys with an error (themselves or upstream)
    diagnostics: list[Diagnostic] = field(default_factory=list)

    def downstream(self, name: str) -> list[str]:
        """Every key that depends on ``name``, directly or not, in sheet order."""
        seen: set[str] = set()
        stack = [name]
        while stack:
            for key in self.dependents.get(stack.pop(), ()):
                if key not in seen:
                    seen.add(key)
                    stack.append(key)
        order = list(self.statements)
        return sorted(seen, key=order.index)


def _reads(expr: N.Expr) -> list[N.Name]:
    return [n for n in N.walk(expr) if isinstance(n, N.Name)]


def resolve(sheet: N.Sheet, plugins: PluginRegistry) -> Resolution:
    res = Resolution()
    path = sheet.path
    all_defs: dict[str, int] = {}
    for stmt in sheet.body:
        if isinstance(stmt, N.Definition) and stmt.name not in all_defs:
            all_defs[stmt.name] = stmt.span
    for stmt in sheet.body:
        if isinstance(stmt, N.Definition):
            key = stmt.name
            exprs = [stmt.expr]
        elif isinstance(stmt, N.Check):
            key = check_key(stmt)
            exprs = [stmt.left, stmt.right]
        else:
            continue
        errors: list[CalcError] = []
        if isinstance(stmt, N.Definition):
            if stmt.name in res.defined_at:
                errors.append(RedefinitionError(
                    f"'{stmt.name}' is already defined on {res.def_spans[stmt.name].where()}", stmt.name_span,
                    hint="give the new value its own name (e.g. a subscript: M_2)"))
            elif is_builtin(stmt.name):
                errors.append(RedefinitionError(f"'{stmt.name}' is a built-in name", stmt.name_span,
                                                hint="choose another name"))
            elif plugins.is_namespace(stmt.name):
                errors.append(RedefinitionError(f"'{stmt.name}' is the name of a plugin", stmt.name_span,
                                                hint="choose another name"))
        reads: list[str] = []
        for expr in exprs:
            for node in N.walk(expr):
                err = _check_node(node, res, all_defs, plugins, key)
                if err is not None:
                    errors.append(err)
                if isinstance(node, N.Name) and node.id not in CONSTANTS and node.id in res.defined_at:
                    if node.id not in reads:
                        reads.append(node.id)
        res.statements[key] = stmt
        res.precedents[key] = reads
        for name in reads:
            res.dependents.setdefault(name, []).append(key)
        if isinstance(stmt, N.Definition):
            res.defined_at.setdefault(stmt.name, stmt.span.line)
            res.def_spans.setdefault(stmt.name, stmt.span)
            if not reads and not any(isinstance(n, N.PluginCall) for n in N.walk(stmt.expr)):
                res.inputs.append(stmt.name)
        if errors:
            res.broken.add(key)
            res.diagnostics.append(errors[0].diagnostic(path))
        elif any(r in res.broken for r in reads):
            res.broken.add(key)  # upstream error: reported once, at its root
    return res


def _check_node(node, res: Resolution, all_defs, plugins: PluginRegistry, key) -> CalcError | None:
    if isinstance(node, N.Name):
        if node.id in res.defined_at or node.id in CONSTANTS:
            if node.id == key:
                return UndefinedNameError(f"'{node.id}' is used in its own definition", node.span)
            return None
        if node.id in all_defs:
            if node.id == key:
                return UseBeforeDefinitionError(f"'{node.id}' is used in its own definition", node.span)
            return UseBeforeDefinitionError(
                f"'{node.id}' is used before its definition on {all_defs[node.id].where()}", node.span,
                hint="a sheet reads top to bottom: move the definition above this line")
        if plugins.is_namespace(node.id):
            return UndefinedNameError(f"'{node.id}' is a plugin; call one of its functions: {node.id}.name(…)",
                                      node.span)
        return UndefinedNameError(f"'{node.id}' is not defined", node.span,
                                  hint=did_you_mean(node.id, [*res.defined_at, *CONSTANTS]))
    if isinstance(node, N.Call):
        if node.func not in FUNCTIONS:
            return UnknownFunctionError(f"unknown function '{node.func}'", node.func_span or node.span,
                                        hint=did_you_mean(node.func, FUNCTIONS) or
                                        "functions: " + ", ".join(sorted(FUNCTIONS)))
    if isinstance(node, N.PluginCall):
        try:
            plugins.function(node.namespace, node.func)
        except UnknownPluginError as exc:
            return exc.with_span(node.func_span or node.span)
        except Exception as exc:  # a broken plugin is reported at the call
            return UnknownPluginError(str(exc), node.func_span or node.span)
        if node.args:
            return PluginArgumentError(f"{node.namespace}.{node.func} takes named arguments only",
                                       node.args[0].span, hint="write name=value for each argument")
    return None
