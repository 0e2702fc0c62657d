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
    functions: dict[str, N.FunctionDef] = field(default_factory=dict)  # the sheet's own functions, by name
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
        return self.in_order(seen)

    def in_order(self, keys) -> list[str]:
        """``keys`` in sheet order (one position lookup each: no ``list.index`` scans)."""
        pos = self.positions()
        return sorted(keys, key=pos.__getitem__)

    def positions(self) -> dict[str, int]:
        """Each statement key's place in the sheet, built once per set of statements."""
        cached = self.__dict__.get("_positions")
        if cached is None or cached[0] is not self.statements or cached[1] != len(self.statements):
            cached = (self.statements, len(self.statements), {k: i for i, k in enumerate(self.statements)})
            self.__dict__["_positions"] = cached
        return cached[2]

    def input_set(self) -> frozenset[str]:
        """The inputs as a set, for membership tests (built once per length of ``inputs``)."""
        cached = self.__dict__.get("_input_set")
        if cached is None or cached[0] is not self.inputs or cached[1] != len(self.inputs):
            cached = (self.inputs, len(self.inputs), frozenset(self.inputs))
            self.__dict__["_input_set"] = cached
        return cached[2]


def _reads(expr: N.Expr) -> list[N.Name]:
    return [n for n in N.walk(expr) if isinstance(n, N.Name)]


def resolve(sheet: N.Sheet, plugins: PluginRegistry) -> Resolution:
    res = Resolution()
    path = sheet.path
    all_defs: dict[str, int] = {}
    all_functions: set[str] = set()
    for stmt in sheet.body:
        if type(stmt) is N.Check:
            continue
        if isinstance(stmt, (N.Definition, N.FunctionDef, N.TableDef)) and stmt.name not in all_defs:
            all_defs[stmt.name] = stmt.span
            if isinstance(stmt, N.FunctionDef):
                all_functions.add(stmt.name)
    defined_at, functions, statements, precedents = res.defined_at, res.functions, res.statements, res.precedents
    dependents, broken, def_spans = res.dependents, res.broken, res.def_spans
    Definition, Check, Number, Name = N.Definition, N.Check, N.Number, N.Name
    binops = frozenset(N.BINOPS.values())
    for stmt in sheet.body:
        params: tuple[str, ...] = ()
        cls = type(stmt)
        if cls is Definition or isinstance(stmt, (N.Definition, N.FunctionDef)):
            key = stmt.name
            exprs = (stmt.expr,)
            if isinstance(stmt, N.FunctionDef):
                params = stmt.param_names
        elif isinstance(stmt, N.TableDef):
            key = stmt.name
            exprs = ()
        elif cls is Check or isinstance(stmt, N.Check):
            key = check_key(stmt)
            exprs = (stmt.left, stmt.right)
        else:
            continue
        errors: list[CalcError] = []
        if cls is not Definition and isinstance(stmt, N.FunctionDef):
            errors.extend(_param_errors(stmt, plugins))
        if cls is not Check and isinstance(stmt, (N.Definition, N.FunctionDef, N.TableDef)):
            name = stmt.name
            if name in defined_at:
                if (name in functions) != isinstance(stmt, N.FunctionDef):
                    was = "a function" if name in functions else "a value"
                    errors.append(RedefinitionError(
                        f"'{name}' is already {was} (defined on {def_spans[name].where()}); "
                        f"a name is either a function or a value", stmt.name_span,
                        hint="give one of them another name"))
                else:
                    errors.append(RedefinitionError(
                        f"'{name}' is already defined on {def_spans[name].where()}", stmt.name_span,
                        hint="give the new value its own name (e.g. a subscript: M_2)"))
            elif name in FUNCTIONS or name in CONSTANTS:  # builtins.is_builtin
                errors.append(RedefinitionError(f"'{name}' is a built-in name", stmt.name_span,
                                                hint="choose another name"))
            elif plugins.is_namespace(name):
                errors.append(RedefinitionError(f"'{name}' is the name of a plugin", stmt.name_span,
                                                hint="choose another name"))
        reads: list[str] = []
        calls_plugin = False
        # every node of the expressions, in source order (nodes.walk, written out: most nodes are the
        # operators, names and numbers of an everyday formula, handled without a generator or a call)
        stack = [exprs[0]] if len(exprs) == 1 else list(reversed(exprs))
        pop, push = stack.pop, stack.append
        while stack:
            node = pop()
            ncls = type(node)
            if ncls is Number:
                continue  # a literal names nothing
            if ncls is Name:
                nid = node.id
                if nid in defined_at and nid != key and nid not in functions and nid not in CONSTANTS and \
                        nid not in params:  # the everyday read of an earlier value
                    if nid not in reads:
                        reads.append(nid)
                    continue
            elif ncls in binops:
                push(node.right)
                push(node.left)
                continue
            else:
                names = node._children
                for attr in reversed(names):
                    value = getattr(node, attr)
                    if isinstance(value, tuple):
                        for v in reversed(value):
                            if isinstance(v, N.Node):
                                push(v)
                    elif isinstance(value, N.Node):
                        push(value)
            if isinstance(node, N.PluginCall):
                calls_plugin = True
            if isinstance(node, N.Name) and node.id in params:
                continue  # a parameter of the function being defined
            err = _check_node(node, res, all_defs, plugins, key, all_functions)
            if err is not None:
                errors.append(err)
            if isinstance(node, N.Name) and node.id not in CONSTANTS and node.id in defined_at:
                if node.id not in reads:
                    reads.append(node.id)
            if isinstance(node, N.Call) and node.func in functions and node.func not in reads:
                reads.append(node.func)  # a call depends on the function (and what its body reads)
        statements[key] = stmt
        precedents[key] = reads
        for name in reads:
            dep = dependents.get(name)
            if dep is None:
                dependents[name] = [key]
            else:
                dep.append(key)
        if cls is Definition:
            defined_at.setdefault(key, stmt.span.line)
            def_spans.setdefault(key, stmt.span)
            if not reads and not calls_plugin:
                res.inputs.append(key)
        elif isinstance(stmt, N.FunctionDef):
            if stmt.name not in defined_at:
                functions[stmt.name] = stmt
            defined_at.setdefault(stmt.name, stmt.span.line)
            def_spans.setdefault(stmt.name, stmt.span)
        elif isinstance(stmt, (N.Definition, N.TableDef)):
            defined_at.setdefault(stmt.name, stmt.span.line)
            def_spans.setdefault(stmt.name, stmt.span)
            if isinstance(stmt, N.Definition) and not reads and not calls_plugin:
                res.inputs.append(stmt.name)
        if errors:
            broken.add(key)
            res.diagnostics.append(errors[0].diagnostic(path))
        elif broken:
            for r in reads:
                if r in broken:
                    broken.add(key)  # upstream error: reported once, at its root
                    break
    return res


def _param_errors(stmt: N.FunctionDef, plugins: PluginRegistry) -> list[CalcError]:
    """Parameters: distinct names, none of them built in or a plugin."""
    out: list[CalcError] = []
    seen: set[str] = set()
    for p in stmt.params:
        if p.name in seen:
            out.append(RedefinitionError(f"parameter '{p.name}' is listed twice", p.span))
        elif p.name == stmt.name:
            out.append(RedefinitionError(f"parameter '{p.name}' has the function's own name", p.span,
                                         hint="choose another name"))
        elif is_builtin(p.name) or plugins.is_namespace(p.name):
            out.append(RedefinitionError(f"parameter '{p.name}' is a built-in or plugin name", p.span,
                                         hint="choose another name"))
        seen.add(p.name)
    return out


def _check_node(node, res: Resolution, all_defs, plugins: PluginRegistry, key,
                all_functions: set[str] = frozenset()) -> CalcError | None:
    if isinstance(node, N.Name):
        if node.id in res.functions:
            return UndefinedNameError(f"'{node.id}' is a function of this sheet; call it: {node.id}(…)", node.span)
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
    if isinstance(node, N.Call) and node.func not in FUNCTIONS:
        where = node.func_span or node.span
        if node.func in res.functions:
            if node.kwargs:
                return UnknownFunctionError(f"{node.func} takes its arguments in order, without names",
                                            node.kwargs[0].span)
            return None
        if node.func == key and node.func in all_functions:
            return UseBeforeDefinitionError(f"'{node.func}' calls itself; a sheet function cannot be recursive",
                                            where, hint="write the steps out as values")
        if node.func in all_functions:
            return UseBeforeDefinitionError(
                f"function '{node.func}' is used before its definition on {all_defs[node.func].where()}", where,
                hint="a sheet reads top to bottom: move the definition above this line")
        if node.func in res.defined_at or node.func in all_defs:
            return UnknownFunctionError(f"'{node.func}' is a value, not a function", where,
                                        hint="multiply with '*': 2*(a + b)")
    if isinstance(node, N.Call):
        if node.func not in FUNCTIONS:
            return UnknownFunctionError(f"unknown function '{node.func}'", node.func_span or node.span,
                                        hint=did_you_mean(node.func, [*FUNCTIONS, *res.functions]) or
                                        "functions: " + ", ".join(sorted([*FUNCTIONS, *res.functions])))
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
