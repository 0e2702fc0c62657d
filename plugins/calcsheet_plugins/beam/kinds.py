"""Every beam load kind, one class each: what the sheet writes, and everything the solver and the working need.

Why one file and one protocol: a new load kind is one class here, decorated
with ``@kind``. The sheet function ``beam.<name>`` is registered from the class
(its ``params``, ``fields`` and ``record``); the model reads it back with
``from_record``; the solver only ever asks a load for its *parts* (point
forces, couples and linear line loads on one span, in local coordinates), its
breakpoints, a scaled copy and a snapped copy; the traced working asks for its
force and moment terms as formula text; the loads table asks for its row; the
beam figure draws it by its ``glyph``. Nothing outside this file dispatches on
the kind of a load.

Units: the solver form holds SI floats (N, m, N·m, N/m) in beam coordinates.
Signs: forces and line loads act downward when positive, couples are clockwise
positive.
"""
from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from typing import Callable, ClassVar

from calcsheet.plugin import Field, Param

KINDS: dict[str, type["Load"]] = {}
FAMILY = "load"  # the family of the kinds' record types: beam.solve's loads= takes a record of any kind


def kind(cls):
    """Register a load class under its sheet name (``beam.<name>``); its record type is ``beam.<name>_load``,
    one type per kind (each kind has fields of its own), all of the family ``load``."""
    KINDS[cls.name] = cls
    cls.record_type = f"beam.{cls.name}_load"
    return cls


CASE_PARAM = Param("case", kind="text", doc="load case name, e.g. \"D\" or \"L\"", default="")
SPAN_PARAM = Param("span", doc="measure positions from the left support of this span (1, 2, …)", default=None)
COMMON_FIELDS = [
    Field("kind", kind="text", doc="point, moment, udl, varying or axial"),
    Field("case", kind="text", doc="load case"),
    Field("span", doc="span the positions are measured in (0: from the left end of the beam)"),
]
EXTENT_PARAMS = [Param("start", "[length]", "where the load starts (default: the left end)", default=None),
                 Param("end", "[length]", "where it ends (default: the right end)", default=None)]
EXTENT_FIELDS = [Field("start", "[length]", "start (when extent is partial)"),
                 Field("end", "[length]", "end (when extent is partial)"),
                 Field("extent", kind="text", doc="full, from, to or partial")]

# the units each SI magnitude is read in
SI = dict(force="N", moment="N*m", length="m", line="N/m")


def si(q, what: str) -> float:
    return float(q.m_as(SI[what]))


# ---------------------------------------------------------------- sheet-record helpers (shared by the kinds)


def check_case(work, case: str) -> str:
    from .combos import CASE_NAME

    if case and not CASE_NAME.match(case):
        work.fail(f"case name {case!r} must be a letter followed by letters or digits, e.g. \"D\", \"L\", \"W1\"",
                  param="case")
    return case


def check_span(work, span):
    if span is None:
        return work.q(0, "")
    k = float(span.m_as(""))
    if k < 1 or not k.is_integer():
        work.fail(f"span must be a whole number 1, 2, …, got {k:g}", param="span")
    return work.q(int(k), "")


def check_nonneg(work, q, name):
    if q.magnitude < 0:
        work.fail(f"{name} is negative; give positions measured from the left", param=name)


def check_extent(work, start, end) -> dict:
    zero = work.q(0, "m")
    if start is not None:
        check_nonneg(work, start, "start")
    if end is not None:
        check_nonneg(work, end, "end")
    if start is not None and end is not None and end.m_as("m") <= start.m_as("m"):
        work.fail("end must lie beyond start", param="end")
    extent = {(False, False): "full", (True, False): "from", (False, True): "to", (True, True): "partial"}[
        (start is not None, end is not None)]
    return {"start": start if start is not None else zero, "end": end if end is not None else zero,
            "extent": extent}


class Place:
    """Maps a sheet position (measured in a span, or from the beam's left end) to beam x, checking it lies inside."""

    def __init__(self, x0: float, x1: float, where: str, region: str, tol: float, error: Callable):
        self.x0, self.x1, self.where, self.region, self.tol, self.error = x0, x1, where, region, tol, error

    def __call__(self, q, name: str) -> float:
        v = si(q, "length")
        if v > self.x1 - self.x0 + self.tol:
            raise self.error(f"{self.where}: {name} = {v:g} m lies outside {self.region}", "loads")
        return self.x0 + v


# ---------------------------------------------------------------- the protocol


@dataclass(frozen=True)
class Load:
    """Base of every load kind (solver form). Subclasses set the class attributes and implement the methods."""

    name: ClassVar[str] = ""  # sheet function beam.<name>, and the record's kind
    record_type: ClassVar[str] = ""  # set by @kind: beam.<name>_load, of the family FAMILY
    title: ClassVar[str] = ""  # one-line doc of the sheet function
    params: ClassVar[list] = []
    fields: ClassVar[list] = []
    glyph: ClassVar[str] = ""  # "point", "couple" or "line": how the beam figure draws it

    @classmethod
    def record(cls, work, **args) -> dict:  # pragma: no cover - every kind defines its own signature
        raise NotImplementedError

    @classmethod
    def from_record(cls, rec, place: Place, error) -> "Load":
        raise NotImplementedError

    # what the solver asks
    def validate(self, L: float, tol: float, error) -> None:
        raise NotImplementedError

    def breakpoints(self) -> list[float]:
        raise NotImplementedError

    def snapped(self, snap: Callable[[float], float]) -> "Load":
        raise NotImplementedError

    def scaled(self, f: float) -> "Load":
        raise NotImplementedError

    def on_span(self, x0: float, x1: float, last: bool, tol: float) -> "Load | None":
        """The part of this load on the span [x0, x1] (a span owns what lies at its left support; the last span
        also what lies at its right end), as a load of the same kind, or None."""
        raise NotImplementedError

    def axial(self) -> list[tuple[float, float]]:
        """Forces along the member it applies: (x, F) with F positive toward +x. Most loads have none."""
        return []

    def parts(self, x0: float, x1: float, tol: float) -> list[tuple]:
        """This load's parts on the span [x0, x1], local coordinates: ('P', a, 0, P, 0) a downward force,
        ('M', a, 0, M, 0) a clockwise couple, ('w', a, b, w_a, w_b) a downward linear line load."""
        raise NotImplementedError

    # what statics and the working ask
    def force(self) -> float:
        """Total downward force."""
        raise NotImplementedError

    def moment_about(self, x_ref: float) -> float:
        """Clockwise moment about x_ref."""
        raise NotImplementedError

    def terms(self, x_ref: float, lit) -> tuple[str | None, str]:
        """(total force term or None, moment-about-x_ref term), as formula text in display units."""
        raise NotImplementedError

    def start(self) -> float:
        raise NotImplementedError

    def left_term(self, x0: float, xn: str, lit, tol: float) -> str | None:
        """Its contribution to the moment at x0 (named xn in the working) from its part left of x0."""
        raise NotImplementedError

    def row(self, lit, num) -> tuple[str, str, float, float | None]:
        """Loads table: (type, value text, from x, to x or None)."""
        raise NotImplementedError


@kind
@dataclass(frozen=True)
class PointLoad(Load):
    x: float
    P: float  # downward
    case: str = ""

    name: ClassVar[str] = "point"
    title: ClassVar[str] = "A concentrated force."
    glyph: ClassVar[str] = "point"
    params: ClassVar[list] = [Param("P", "[force]", "downward force (negative acts upward)"),
                              Param("x", "[length]", "position from the left end (or from the span's left support)"),
                              CASE_PARAM, SPAN_PARAM]
    fields: ClassVar[list] = COMMON_FIELDS + [Field("P", "[force]", "force"), Field("x", "[length]", "position")]

    @classmethod
    def record(cls, work, P, x, case="", span=None):
        """A concentrated force."""
        check_nonneg(work, x, "x")
        return {"kind": cls.name, "case": check_case(work, case), "span": check_span(work, span), "P": P, "x": x}

    @classmethod
    def from_record(cls, rec, place, error):
        return cls(place(rec.get("x"), "x"), si(rec.get("P"), "force"), rec.get("case"))

    def validate(self, L, tol, error):
        if not (-tol <= self.x <= L + tol):
            raise error(f"a load at x = {self.x:g} m lies outside the beam (0 to {L:g} m)", "loads")

    def breakpoints(self):
        return [self.x]

    def snapped(self, snap):
        x = snap(self.x)
        return self if x == self.x else dataclasses.replace(self, x=x)

    def scaled(self, f):
        return dataclasses.replace(self, P=f * self.P)

    def on_span(self, x0, x1, last, tol):
        inside = x0 - tol <= self.x < x1 - tol or (last and abs(self.x - x1) <= tol)
        return self if inside else None

    def parts(self, x0, x1, tol):
        return [("P", self.x - x0, 0.0, self.P, 0.0)]

    def force(self):
        return self.P

    def moment_about(self, x_ref):
        return self.P * (self.x - x_ref)

    def terms(self, x_ref, lit):
        return lit(self.P, "force"), f"{lit(self.P, 'force')}*{lit(self.x - x_ref, 'length')}"

    def start(self):
        return self.x

    def left_term(self, x0, xn, lit, tol):
        if self.x < x0 - tol:
            return f"- {lit(self.P, 'force')}*({xn} - {lit(self.x, 'length')})"
        return None

    def row(self, lit, num):
        return "point", f"P = {num(lit.value(self.P, 'force'))} {lit.units['force']}", self.x, None


@kind
@dataclass(frozen=True)
class MomentLoad(Load):
    x: float
    M: float  # clockwise
    case: str = ""

    name: ClassVar[str] = "moment"
    title: ClassVar[str] = "An applied couple (clockwise positive)."
    glyph: ClassVar[str] = "couple"
    params: ClassVar[list] = [Param("M", "[force]*[length]", "applied couple, clockwise positive"),
                              Param("x", "[length]", "position"), CASE_PARAM, SPAN_PARAM]
    fields: ClassVar[list] = COMMON_FIELDS + [Field("M", "[force]*[length]", "couple"),
                                              Field("x", "[length]", "position")]

    @classmethod
    def record(cls, work, M, x, case="", span=None):
        """An applied couple (clockwise positive)."""
        check_nonneg(work, x, "x")
        return {"kind": cls.name, "case": check_case(work, case), "span": check_span(work, span), "M": M, "x": x}

    @classmethod
    def from_record(cls, rec, place, error):
        return cls(place(rec.get("x"), "x"), si(rec.get("M"), "moment"), rec.get("case"))

    validate = PointLoad.validate
    breakpoints = PointLoad.breakpoints
    snapped = PointLoad.snapped
    start = PointLoad.start
    on_span = PointLoad.on_span

    def scaled(self, f):
        return dataclasses.replace(self, M=f * self.M)

    def parts(self, x0, x1, tol):
        return [("M", self.x - x0, 0.0, self.M, 0.0)]

    def force(self):
        return 0.0

    def moment_about(self, x_ref):
        return self.M

    def terms(self, x_ref, lit):
        return None, lit(self.M, "moment")

    def left_term(self, x0, xn, lit, tol):
        # a clockwise couple exactly at x₀ counts (the maximum is the value just after its upward jump),
        # an anticlockwise one does not (the maximum is the value just before it)
        if self.x < x0 - tol or (abs(self.x - x0) <= tol and self.M > 0):
            return f"+ {lit(self.M, 'moment')}"
        return None

    def row(self, lit, num):
        return ("couple (clockwise +)", f"M = {num(lit.value(self.M, 'moment'))} {lit.units['moment']}",
                self.x, None)


@kind
@dataclass(frozen=True)
class LineLoad(Load):
    """A linearly varying line load (triangular or trapezoidal) from x1 to x2."""

    x1: float
    x2: float
    w1: float  # downward intensity at x1
    w2: float  # downward intensity at x2
    case: str = ""

    name: ClassVar[str] = "varying"
    title: ClassVar[str] = "A linearly varying load: triangular (one end zero) or trapezoidal."
    glyph: ClassVar[str] = "line"
    params: ClassVar[list] = [Param("w_1", "[force]/[length]", "intensity at the start"),
                              Param("w_2", "[force]/[length]", "intensity at the end")] + EXTENT_PARAMS + [
        CASE_PARAM, SPAN_PARAM]
    fields: ClassVar[list] = COMMON_FIELDS + [Field("w_1", "[force]/[length]", "intensity at start"),
                                              Field("w_2", "[force]/[length]", "intensity at end")] + EXTENT_FIELDS

    @classmethod
    def record(cls, work, w_1, w_2, start=None, end=None, case="", span=None):
        """A linearly varying load: triangular (one end zero) or trapezoidal."""
        return {"kind": cls.name, "case": check_case(work, case), "span": check_span(work, span), "w_1": w_1,
                "w_2": w_2, **check_extent(work, start, end)}

    @classmethod
    def from_record(cls, rec, place, error):
        extent = rec.get("extent")
        a = place(rec.get("start"), "start") if extent in ("from", "partial") else place.x0
        b = place(rec.get("end"), "end") if extent in ("to", "partial") else place.x1
        if b <= a:
            raise error(f"{place.where}: it ends at or before its start", "loads")
        return cls(a, b, si(rec.get("w_1"), "line"), si(rec.get("w_2"), "line"), rec.get("case"))

    @property
    def total(self) -> float:
        return 0.5 * (self.w1 + self.w2) * (self.x2 - self.x1)

    @property
    def centroid(self) -> float:
        a, b, L = self.w1, self.w2, self.x2 - self.x1
        if abs(a + b) < 1e-300:
            return 0.5 * (self.x1 + self.x2)
        return self.x1 + L * (a + 2 * b) / (3 * (a + b))

    def at(self, x: float) -> float:
        """Intensity at x."""
        if self.x2 <= self.x1:
            return self.w1
        return self.w1 + (self.w2 - self.w1) * (x - self.x1) / (self.x2 - self.x1)

    def validate(self, L, tol, error):
        if self.x2 < self.x1:
            raise error(f"a line load ends (x = {self.x2:g} m) before it starts (x = {self.x1:g} m)", "loads")
        if self.x1 < -tol or self.x2 > L + tol:
            raise error(f"a line load from x = {self.x1:g} m to {self.x2:g} m runs outside the beam "
                        f"(0 to {L:g} m)", "loads")

    def breakpoints(self):
        return [self.x1, self.x2]

    def snapped(self, snap):
        a, b = snap(self.x1), snap(self.x2)
        return self if (a, b) == (self.x1, self.x2) else dataclasses.replace(self, x1=a, x2=b)

    def scaled(self, f):
        return dataclasses.replace(self, w1=f * self.w1, w2=f * self.w2)

    def on_span(self, x0, x1, last, tol):
        a, b = max(self.x1, x0), min(self.x2, x1)
        if b - a <= tol:
            return None
        return dataclasses.replace(self, x1=a, x2=b, w1=self.at(a), w2=self.at(b))

    def parts(self, x0, x1, tol):
        a, b = max(self.x1, x0), min(self.x2, x1)
        if b - a <= tol:
            return []
        return [("w", a - x0, b - x0, self.at(a), self.at(b))]

    def force(self):
        return self.total

    def moment_about(self, x_ref):
        return self.total * (self.centroid - x_ref)

    def _W(self, lit) -> str:
        length = self.x2 - self.x1
        if abs(self.w1 - self.w2) <= 1e-12 * max(abs(self.w1), abs(self.w2), 1e-300):
            return f"{lit(self.w1, 'line')}*{lit(length, 'length')}"
        return f"0.5*({lit(self.w1, 'line')} + {lit(self.w2, 'line')})*{lit(length, 'length')}"

    def terms(self, x_ref, lit):
        W = self._W(lit)
        return W, f"{W}*{lit(self.centroid - x_ref, 'length')}"

    def start(self):
        return self.x1

    def left_term(self, x0, xn, lit, tol):
        if not self.x1 < x0 - tol:
            return None
        b = min(self.x2, x0)
        part = LineLoad(self.x1, b, self.w1, self.at(b))
        return f"- {part._W(lit)}*({xn} - {lit(part.centroid, 'length')})"

    def row(self, lit, num):
        w1, w2 = num(lit.value(self.w1, "line")), num(lit.value(self.w2, "line"))
        u = lit.units["line"]
        what = f"w = {w1} {u}" if self.w1 == self.w2 else f"w = {w1} → {w2} {u}"
        name = "uniform" if self.w1 == self.w2 else ("triangular" if 0 in (self.w1, self.w2) else "trapezoidal")
        return name, what, self.x1, self.x2


@kind
@dataclass(frozen=True)
class UniformLoad(LineLoad):
    """A uniform line load: a linear one whose two intensities are equal."""

    name: ClassVar[str] = "udl"
    title: ClassVar[str] = "A uniform load over the whole beam (or span), or from start to end."
    params: ClassVar[list] = [Param("w", "[force]/[length]", "uniform downward load per length")] + EXTENT_PARAMS + [
        CASE_PARAM, SPAN_PARAM]
    fields: ClassVar[list] = LineLoad.fields

    @classmethod
    def record(cls, work, w, start=None, end=None, case="", span=None):
        """A uniform load over the whole beam (or span), or from start to end."""
        return {"kind": cls.name, "case": check_case(work, case), "span": check_span(work, span), "w_1": w, "w_2": w,
                **check_extent(work, start, end)}


@kind
@dataclass(frozen=True)
class AxialLoad(Load):
    """A force along the member's axis: it bends nothing, and gives the axial force N of a beam-column."""

    x: float
    F: float  # toward +x (to the right)
    case: str = ""

    name: ClassVar[str] = "axial"
    title: ClassVar[str] = "A force along the member's axis (positive toward +x; pushing into the right end is negative)."
    glyph: ClassVar[str] = "axial"
    params: ClassVar[list] = [Param("F", "[force]", "force along the axis, positive pointing to the right (+x)"),
                              Param("x", "[length]", "position"), CASE_PARAM, SPAN_PARAM]
    fields: ClassVar[list] = COMMON_FIELDS + [Field("F", "[force]", "axial force"), Field("x", "[length]", "position")]

    @classmethod
    def record(cls, work, F, x, case="", span=None):
        """A force along the member's axis (positive toward +x; pushing into the right end is negative)."""
        check_nonneg(work, x, "x")
        return {"kind": cls.name, "case": check_case(work, case), "span": check_span(work, span), "F": F, "x": x}

    @classmethod
    def from_record(cls, rec, place, error):
        return cls(place(rec.get("x"), "x"), si(rec.get("F"), "force"), rec.get("case"))

    validate = PointLoad.validate
    breakpoints = PointLoad.breakpoints
    snapped = PointLoad.snapped
    start = PointLoad.start
    on_span = PointLoad.on_span

    def scaled(self, f):
        return dataclasses.replace(self, F=f * self.F)

    def axial(self):
        return [(self.x, self.F)]

    def parts(self, x0, x1, tol):
        return []

    def force(self):
        return 0.0

    def moment_about(self, x_ref):
        return 0.0

    def terms(self, x_ref, lit):
        return None, None

    def left_term(self, x0, xn, lit, tol):
        return None

    def row(self, lit, num):
        return "axial (→ +)", f"F = {num(lit.value(self.F, 'force'))} {lit.units['force']}", self.x, None
