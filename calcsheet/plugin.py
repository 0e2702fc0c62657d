"""The plugin contract: declare, validate, load and call plugin functions.

A plugin is a ``Namespace`` object exposed through the ``calcsheet.plugins``
entry-point group. Each function declares its parameters and result fields
with their dimensions, so the checker can catch a wrong unit at a call
without running anything. The contract is checked when a function registers:
a parameter the Python signature lacks (or the reverse) is an error naming
the plugin.

A function receives a ``Work`` first: the scope holding its arguments, and
the recorder of its traced working (formulas the engine evaluates, tables,
figures, notes). It returns a dict of its declared fields.
"""
from __future__ import annotations

import inspect
import os
from dataclasses import dataclass, field
from importlib import metadata
from typing import Any, Callable

from .errors import (
    PluginArgumentError,
    PluginDefinitionError,
    UnknownFieldError,
    UnknownPluginError,
)
from .names import did_you_mean
from .trace import Working
from . import units as U
from .suggest import closest

ENTRY_POINT_GROUP = "calcsheet.plugins"
KINDS = ("quantity", "number", "text", "record", "list", "points", "flag")
REQUIRED = inspect.Parameter.empty


@dataclass(frozen=True)
class Param:
    """A declared parameter.

    kind: 'quantity' (give ``dim``), 'number' (dimensionless), 'text'
    (optionally one of ``choices``), 'record' (a record of type ``record``),
    'list' (of quantities of ``dim``, or of records of type ``record``),
    'points' (a list of (x, y) pairs of ``dim``), 'flag' (true/false text).
    """

    name: str
    dim: str | None = None
    doc: str = ""
    kind: str | None = None
    default: Any = REQUIRED
    choices: tuple[str, ...] | None = None
    record: str | None = None

    @property
    def kind_(self) -> str:
        if self.kind:
            return self.kind
        return "quantity" if self.dim is not None else "number"

    @property
    def required(self) -> bool:
        return self.default is REQUIRED

    @property
    def dimension(self) -> U.Dim | None:
        return U.parse_dimension(self.dim) if self.dim is not None else None

    @property
    def wanted(self) -> U.Dim:
        """The dimension each value of this parameter must have (a quantity, a list item, a coordinate):
        the one rule the checker and the plugin host both apply."""
        return U.parse_dimension(self.dim) if self.dim is not None else U.DIMENSIONLESS

    def describe(self) -> str:
        k = self.kind_
        if k == "quantity":
            what = U.describe_dim(self.dimension)
        elif k == "record":
            what = f"{self.record} record"
        elif k == "list":
            what = f"list of {self.record + ' records' if self.record else U.describe_dim(self.dimension)}"
        elif k == "points":
            what = f"list of (x, y) points, {U.describe_dim(self.dimension)}"
        elif k == "text" and self.choices:
            what = "one of " + ", ".join(f'"{c}"' for c in self.choices)
        else:
            what = k
        if not self.required:
            what += f", optional (default {self.default!r})" if self.default is not None else ", optional"
        return what


@dataclass(frozen=True)
class Field:
    """A declared result field. kind: 'quantity', 'number', 'text' or 'record'.

    An ``optional`` field may be left out of a result (e.g. stresses only when a
    section is given); reading it then is an error that says why it is absent.
    """

    name: str
    dim: str | None = None
    doc: str = ""
    kind: str | None = None
    record: str | None = None
    optional: bool = False

    @property
    def kind_(self) -> str:
        if self.kind:
            return self.kind
        return "quantity" if self.dim is not None else "number"

    @property
    def dimension(self) -> U.Dim | None:
        return U.parse_dimension(self.dim) if self.dim is not None else None


@dataclass
class PluginFunction:
    namespace: str
    name: str
    func: Callable
    params: tuple[Param, ...]
    fields: tuple[Field, ...]
    doc: str
    returns: str  # record type of the result
    version: str
    family: str | None = None  # the family of record types its record belongs to (e.g. every beam load kind)

    @property
    def qualname(self) -> str:
        return f"{self.namespace}.{self.name}"

    def param(self, name: str) -> Param | None:
        return next((p for p in self.params if p.name == name), None)

    def field(self, name: str) -> Field | None:
        """Exact name, or a numbered pattern: Field('R_{i}') matches R_1, R_2, ..."""
        for f in self.fields:
            if f.name == name:
                return f
            if "{i}" in f.name:
                head, tail = f.name.split("{i}", 1)
                mid = name[len(head): len(name) - len(tail) if tail else None]
                if name.startswith(head) and name.endswith(tail) and mid.isdigit():
                    return f
        return None


class Namespace:
    """A group of plugin functions under one name (``section``, ``beam``).

    ``shared`` parameters are declared once for the namespace (or later with ``share``) and validated
    once; a function registered with ``shared=True`` takes them after its own, and its Python function
    may receive them by name or all together through ``**kwargs``. ``standards`` names the published
    standards (with edition) a design plugin implements, e.g. ("AISC 360-16",).
    """

    def __init__(self, name: str, version: str = "0", doc: str = "", shared: list[Param] | tuple[Param, ...] = (),
                 standards: tuple[str, ...] = ()):
        self.name = name
        self.version = version
        self.doc = doc
        # the published standards (with edition) a design plugin implements, e.g. ("AISC 360-16",)
        self.standards = tuple(standards)
        self.functions: dict[str, PluginFunction] = {}
        self.shared: tuple[Param, ...] = ()
        self._record_types: dict[str, RecordType] = {}  # record type -> its declaration, from its first maker
        if shared:
            self.share(*shared)

    def share(self, *params: Param) -> None:
        """Declare parameters every ``shared=True`` function of this namespace takes."""
        for p in params:
            _validate_param(p, f"plugin {self.name} (shared parameters)")
        names = [p.name for p in (*self.shared, *params)]
        if len(set(names)) != len(names):
            raise PluginDefinitionError(f"plugin {self.name}: a shared parameter is declared twice")
        self.shared = (*self.shared, *params)

    def function(
        self,
        name: str | None = None,
        *,
        params: list[Param] | tuple[Param, ...] = (),
        fields: list[Field] | tuple[Field, ...] = (),
        returns: str | None = None,
        doc: str | None = None,
        shared: bool = False,
        family: str | None = None,
    ):
        def register(func: Callable) -> Callable:
            fname = name or func.__name__
            _declares_its_record_type(self.name, fname, returns, family)
            pf = PluginFunction(
                namespace=self.name,
                name=fname,
                func=func,
                params=tuple(params) + (self.shared if shared else ()),
                fields=tuple(fields),
                doc=(doc or inspect.getdoc(func) or "").strip(),
                returns=returns,
                version=self.version,
                family=family,
            )
            validate(pf, collective={p.name for p in self.shared} if shared else set())
            same_record_type(self._record_types, pf)
            self.functions[fname] = pf
            return func

        return register


def _validate_param(p: Param, where: str) -> None:
    if p.kind_ not in KINDS:
        raise PluginDefinitionError(f"{where}: parameter {p.name} has unknown kind {p.kind_!r}")
    if p.kind_ in ("quantity", "points") and p.dim is None:
        raise PluginDefinitionError(f"{where}: parameter {p.name} needs a dimension")
    if p.kind_ == "record" and not p.record:
        raise PluginDefinitionError(f"{where}: record parameter {p.name} needs a record type")
    if p.record and p.kind_ not in ("record", "list"):
        raise PluginDefinitionError(f"{where}: parameter {p.name} names a record type but is a {p.kind_}")
    if p.dim is not None and p.kind_ in ("number", "text", "flag", "record"):
        raise PluginDefinitionError(f"{where}: parameter {p.name} is a {p.kind_} and takes no dimension")
    if p.choices is not None and p.kind_ not in ("text", "flag"):
        raise PluginDefinitionError(f"{where}: parameter {p.name} has choices but is a {p.kind_}")
    if p.dim is not None:
        try:
            U.parse_dimension(p.dim)
        except Exception as exc:
            raise PluginDefinitionError(f"{where}: parameter {p.name} has a bad dimension {p.dim!r}: {exc}")


# ---------------------------------------------------------------- record types


@dataclass(frozen=True)
class RecordType:
    """A record type as its first maker declared it: the fields every function returning it must declare.

    Record types are explicit: each plugin function names the type it returns (``returns=``), and every
    function returning one type declares the same fields, each alike (kind, dimension, record type,
    optional), so a reader of ``rec.x`` can rely on ``x`` whichever function made the record. Kinds of one
    thing with different fields (a point load has P, a couple M) are different record types of one
    *family* (``family="load"``); a parameter that names the family takes a record of any of its types."""

    name: str
    family: str | None
    fields: dict[str, tuple]  # field name -> (kind, dimension, record type, optional)
    maker: str  # the first function declaring it, for messages

    @classmethod
    def of(cls, pf: PluginFunction) -> "RecordType":
        return cls(pf.returns, pf.family, {f.name: _field_signature(f) for f in pf.fields}, pf.qualname)


def _field_signature(f: Field) -> tuple:
    return (f.kind_, f.dimension, f.record, f.optional)


def _describe_signature(sig: tuple) -> str:
    kind, dim, record, optional = sig
    what = U.describe_dim(dim) if kind == "quantity" else f"a {record} record" if kind == "record" else kind
    return what + (", optional" if optional else "")


def _declares_its_record_type(namespace: str, fname: str, returns: str | None, family: str | None) -> None:
    where = f"plugin {namespace}.{fname}"
    if not returns or not isinstance(returns, str):
        raise PluginDefinitionError(f"{where}: declare the record type it returns, e.g. returns=\"{namespace}\" "
                                    "(every function returning one type declares the same fields)")
    if family is not None and (not isinstance(family, str) or not family):
        raise PluginDefinitionError(f"{where}: family must name a family of record types, e.g. family=\"load\"")
    if family == returns:
        raise PluginDefinitionError(f"{where}: record type {returns} cannot be its own family")


def same_record_type(known: dict[str, RecordType], pf: PluginFunction) -> None:
    """Check ``pf`` against the record type it returns as declared so far in ``known`` (and add it): the same
    fields, each declared alike, and the same family. A refusal names both functions and the difference."""
    first = known.setdefault(pf.returns, RecordType.of(pf))
    mine = RecordType.of(pf)
    head = f"plugin {pf.qualname}: returns a {pf.returns} record like {first.maker} but"
    missing = [n for n in first.fields if n not in mine.fields]
    extra = [n for n in mine.fields if n not in first.fields]
    if missing or extra:
        parts = ([f"lacks field(s) {', '.join(missing)}"] if missing else []) + \
            ([f"adds field(s) {', '.join(extra)}"] if extra else [])
        raise PluginDefinitionError(
            f"{head} {' and '.join(parts)}; every function returning one record type declares the same fields "
            "(give a kind with fields of its own a record type of its own, in a family)")
    for n, sig in mine.fields.items():
        if first.fields[n] != sig:
            raise PluginDefinitionError(
                f"{head} declares field {n} as {_describe_signature(sig)}, not "
                f"{_describe_signature(first.fields[n])}; every function returning one record type declares "
                "each field alike")
    if mine.family != first.family:
        raise PluginDefinitionError(f"{head} puts it in family {mine.family!r}, not {first.family!r}")


def takes_record(wanted: str, record_type: str, family: str | None) -> bool:
    """A parameter (or list item) naming ``wanted`` takes a record of ``record_type`` in ``family``: the type
    itself, or any type of the family of that name."""
    return record_type == wanted or (family is not None and family == wanted)


FIELD_KINDS = ("quantity", "number", "text", "record")


def validate(pf: PluginFunction, collective: set[str] = frozenset()) -> None:
    """The contract, checked at registration; each failure names the plugin.

    ``collective``: shared parameters the Python function may take through ``**kwargs``.
    """
    where = f"plugin {pf.qualname}"
    sig = inspect.signature(pf.func)
    names = list(sig.parameters)
    if not names:
        raise PluginDefinitionError(f"{where}: its first parameter must receive the Work")
    rest = list(sig.parameters.values())[1:]
    py_params = [p.name for p in rest if p.kind not in (p.VAR_KEYWORD, p.VAR_POSITIONAL)]
    takes_kwargs = any(p.kind == p.VAR_KEYWORD for p in rest)
    declared = [p.name for p in pf.params]
    if len(set(declared)) != len(declared):
        raise PluginDefinitionError(f"{where}: a parameter is declared twice")
    extra = [n for n in declared if n not in py_params and not (takes_kwargs and n in collective)]
    missing = [n for n in py_params if n not in declared]
    if extra:
        raise PluginDefinitionError(f"{where}: declares parameter(s) {extra} its function does not take")
    if missing:
        raise PluginDefinitionError(f"{where}: function takes parameter(s) {missing} that are not declared")
    for p in pf.params:
        _validate_param(p, where)
    seen = set()
    for f in pf.fields:
        if f.name in seen:
            raise PluginDefinitionError(f"{where}: field {f.name} is declared twice")
        seen.add(f.name)
        if f.kind_ not in FIELD_KINDS:
            raise PluginDefinitionError(f"{where}: field {f.name} has unknown kind {f.kind_!r} "
                                        f"(kinds: {', '.join(FIELD_KINDS)})")
        if f.kind_ == "record" and not f.record:
            raise PluginDefinitionError(f"{where}: record field {f.name} needs a record type")
        if f.dim is not None:
            try:
                U.parse_dimension(f.dim)
            except Exception as exc:
                raise PluginDefinitionError(f"{where}: field {f.name} has a bad dimension {f.dim!r}: {exc}")


@dataclass
class Record:
    """A plugin's result: named fields plus the working that produced them."""

    type: str
    fields: dict[str, Any]
    working: Working | None = None
    source: str = ""  # "section.rectangle"
    family: str | None = None  # its record type's family ("load"), when it has one
    declared: dict[str, Field] = field(default_factory=dict)
    optional: dict[str, str] = field(default_factory=dict)  # absent optional field -> why
    # What the plugin needs to take this record back as an argument (a section's outline), kept
    # beside the fields: never a field, never printed or compared, copied with the record.
    payload: Any = field(default=None, repr=False, compare=False)

    def get(self, name: str):
        if name in self.fields:
            return self.fields[name]
        if name in self.optional:
            raise UnknownFieldError(f"{self.source or self.type} did not produce '{name}' for these arguments",
                                    hint=self.optional[name] or None)

        close = [c for c in [closest(name, self.fields)] if c]
        hint = f"did you mean '{close[0]}'?" if close else f"fields: {', '.join(self.fields)}"
        raise UnknownFieldError(f"{self.source or self.type} result has no field '{name}'", hint=hint)

    def __repr__(self) -> str:
        return f"<{self.source or self.type} record>"


# ---------------------------------------------------------------- registry


class PluginRegistry:
    """Built-in and third-party namespaces, loaded lazily through entry points."""

    def __init__(self, blocked: set[str] | None = None):
        env_block = {b.strip() for b in os.environ.get("CALCSHEET_BLOCK_PLUGINS", "").split(",") if b.strip()}
        self.blocked = set(blocked or ()) | env_block
        self._entry_points: dict[str, Any] | None = None
        self._loaded: dict[str, Namespace] = {}

    def _eps(self) -> dict[str, Any]:
        if self._entry_points is None:
            eps = metadata.entry_points(group=ENTRY_POINT_GROUP)
            self._entry_points = {ep.name: ep for ep in eps}
        return self._entry_points

    def register(self, ns: Namespace) -> None:
        """Add a namespace directly (tests, embedding)."""
        if not isinstance(ns, Namespace):
            raise PluginDefinitionError(f"{ns!r} is not a calcsheet Namespace")
        self._loaded[ns.name] = ns

    def names(self) -> list[str]:
        return sorted((set(self._eps()) | set(self._loaded)) - self.blocked)

    def namespace(self, name: str) -> Namespace | None:
        if name in self.blocked:
            return None
        if name in self._loaded:
            return self._loaded[name]
        ep = self._eps().get(name)
        if ep is None:
            return None
        try:
            ns = ep.load()
        except PluginDefinitionError:
            raise
        except Exception as exc:  # a broken third-party plugin names itself
            raise PluginDefinitionError(f"plugin {name!r} ({ep.value}) failed to load: {exc}") from exc
        if not isinstance(ns, Namespace):
            raise PluginDefinitionError(f"plugin {name!r} ({ep.value}) is not a calcsheet Namespace")
        if ns.name != name:
            raise PluginDefinitionError(f"plugin entry point {name!r} gives namespace {ns.name!r}")
        self._loaded[name] = ns
        return ns

    def function(self, namespace: str, name: str) -> PluginFunction:
        ns = self.namespace(namespace)
        if ns is None:
            hint = did_you_mean(namespace, self.names()) or f"plugins: {', '.join(self.names())}"
            if namespace in self.blocked:
                hint = "it is blocked (CALCSHEET_BLOCK_PLUGINS)"
            raise UnknownPluginError(f"unknown plugin '{namespace}'", hint=hint)
        pf = ns.functions.get(name)
        if pf is None:
            hint = did_you_mean(name, ns.functions, prefix=f"{namespace}.") or f"functions: {', '.join(ns.functions)}"
            raise UnknownPluginError(f"plugin '{namespace}' has no function '{name}'", hint=hint)
        return pf

    def is_namespace(self, name: str) -> bool:
        return name not in self.blocked and (name in self._loaded or name in self._eps())

    def check_contract(self) -> list[str]:
        """The parts of the contract that need every plugin loaded: each record type a parameter or field
        names is returned by some function, and every function returning one record type, across
        namespaces, declares the same fields. Returns the problems found (empty: none)."""
        problems: list[str] = []
        functions: list[PluginFunction] = []
        for name in self.names():
            try:
                ns = self.namespace(name)
            except PluginDefinitionError as exc:
                problems.append(str(exc))
                continue
            if ns is not None:
                functions.extend(ns.functions.values())
        makers: dict[str, RecordType] = {}
        for pf in functions:
            try:
                same_record_type(makers, pf)
            except PluginDefinitionError as exc:
                problems.append(str(exc))
        families = {t.family for t in makers.values() if t.family}
        for pf in functions:
            wanted = [(f"parameter {p.name}", p.record) for p in pf.params if p.record]
            wanted += [(f"field {f.name}", f.record) for f in pf.fields if f.record]
            for what, record in wanted:
                if record not in makers and record not in families:
                    problems.append(f"plugin {pf.qualname}: {what} needs a {record} record, "
                                    "which no loaded plugin function returns")
        return problems

    def loaded_versions(self) -> dict[str, str]:
        return {n: ns.version for n, ns in self._loaded.items()}


_default_registry: PluginRegistry | None = None


def default_registry() -> PluginRegistry:
    global _default_registry
    if _default_registry is None:
        _default_registry = PluginRegistry()
    return _default_registry


def check_argument_kinds(pf: PluginFunction, given: dict[str, Any]) -> None:
    """Missing and unknown keyword arguments (dimensions are checked by the caller)."""
    for name in given:
        if pf.param(name) is None:
            hint = did_you_mean(name, [p.name for p in pf.params]) or \
                "parameters: " + ", ".join(p.name for p in pf.params)
            raise PluginArgumentError(f"{pf.qualname} has no parameter '{name}'", hint=hint, param=name)
    for p in pf.params:
        if p.required and p.name not in given:
            raise PluginArgumentError(
                f"{pf.qualname} needs '{p.name}' ({p.describe()})",
                hint=f"add {p.name}=… to the call", param=None,
            )
