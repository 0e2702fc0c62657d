"""Load and combination records for beam.solve: each just remembers what the sheet said.

Why separate records: a sheet builds its load list once, names the cases, and
can reuse it; positions are checked against the beam when it is solved.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import namespace
from .combos import CASE_NAME, parse_factors

_CASE = Param("case", kind="text", doc="load case name, e.g. \"D\" or \"L\"", default="")
_SPAN = Param("span", doc="measure positions from the left support of this span (1, 2, …)", default=None)
_COMMON_FIELDS = [
    Field("kind", kind="text", doc="point, moment, udl or varying"),
    Field("case", kind="text", doc="load case"),
    Field("span", doc="span the positions are measured in (0: from the left end of the beam)"),
]


def _case(work, case: str) -> str:
    if case and not CASE_NAME.match(case):
        work.fail(f"case name {case!r} must be a letter followed by letters or digits, e.g. \"D\", \"L\", \"W1\"",
                  param="case")
    return case


def _span(work, span) -> object:
    if span is None:
        return work.q(0, "")
    k = float(span.m_as(""))
    if k < 1 or not k.is_integer():
        work.fail(f"span must be a whole number 1, 2, …, got {k:g}", param="span")
    return work.q(int(k), "")


def _nonneg(work, q, name):
    if q.magnitude < 0:
        work.fail(f"{name} is negative; give positions measured from the left", param=name)


@namespace.function(
    "point",
    params=[Param("P", "[force]", "downward force (negative acts upward)"),
            Param("x", "[length]", "position from the left end (or from the span's left support)"), _CASE, _SPAN],
    fields=_COMMON_FIELDS + [Field("P", "[force]", "force"), Field("x", "[length]", "position")],
    returns="load",
)
def point(work, P, x, case="", span=None):
    """A concentrated force."""
    _nonneg(work, x, "x")
    return {"kind": "point", "case": _case(work, case), "span": _span(work, span), "P": P, "x": x}


@namespace.function(
    "moment",
    params=[Param("M", "[force]*[length]", "applied couple, clockwise positive"),
            Param("x", "[length]", "position"), _CASE, _SPAN],
    fields=_COMMON_FIELDS + [Field("M", "[force]*[length]", "couple"), Field("x", "[length]", "position")],
    returns="load",
)
def moment(work, M, x, case="", span=None):
    """An applied couple (clockwise positive)."""
    _nonneg(work, x, "x")
    return {"kind": "moment", "case": _case(work, case), "span": _span(work, span), "M": M, "x": x}


_EXTENT = [Param("start", "[length]", "where the load starts (default: the left end)", default=None),
           Param("end", "[length]", "where it ends (default: the right end)", default=None)]
_EXTENT_FIELDS = [Field("start", "[length]", "start (when extent is partial)"),
                  Field("end", "[length]", "end (when extent is partial)"),
                  Field("extent", kind="text", doc="full, from, to or partial")]


def _extent(work, start, end):
    zero = work.q(0, "m")
    if start is not None:
        _nonneg(work, start, "start")
    if end is not None:
        _nonneg(work, end, "end")
    if start is not None and end is not None and end.m_as("m") <= start.m_as("m"):
        work.fail("end must lie beyond start", param="end")
    extent = {(False, False): "full", (True, False): "from", (False, True): "to", (True, True): "partial"}[
        (start is not None, end is not None)]
    return {"start": start if start is not None else zero, "end": end if end is not None else zero,
            "extent": extent}


@namespace.function(
    "udl",
    params=[Param("w", "[force]/[length]", "uniform downward load per length")] + _EXTENT + [_CASE, _SPAN],
    fields=_COMMON_FIELDS + [Field("w_1", "[force]/[length]", "intensity at start"),
                             Field("w_2", "[force]/[length]", "intensity at end")] + _EXTENT_FIELDS,
    returns="load",
)
def udl(work, w, start=None, end=None, case="", span=None):
    """A uniform load over the whole beam (or span), or from start to end."""
    return {"kind": "udl", "case": _case(work, case), "span": _span(work, span), "w_1": w, "w_2": w,
            **_extent(work, start, end)}


@namespace.function(
    "varying",
    params=[Param("w_1", "[force]/[length]", "intensity at the start"),
            Param("w_2", "[force]/[length]", "intensity at the end")] + _EXTENT + [_CASE, _SPAN],
    fields=_COMMON_FIELDS + [Field("w_1", "[force]/[length]", "intensity at start"),
                             Field("w_2", "[force]/[length]", "intensity at end")] + _EXTENT_FIELDS,
    returns="load",
)
def varying(work, w_1, w_2, start=None, end=None, case="", span=None):
    """A linearly varying load: triangular (one end zero) or trapezoidal."""
    return {"kind": "varying", "case": _case(work, case), "span": _span(work, span), "w_1": w_1, "w_2": w_2,
            **_extent(work, start, end)}


@namespace.function(
    "combo",
    params=[Param("name", kind="text", doc="name of the combination, e.g. \"ULS 1\""),
            Param("factors", kind="text", doc="factors and cases, e.g. \"1.2 D + 1.6 L\"")],
    fields=[Field("name", kind="text", doc="name"), Field("factors", kind="text", doc="factor text")],
    returns="combo",
)
def combo(work, name, factors):
    """A factored combination of load cases; beam.solve envelopes the results of all combinations."""
    try:
        parse_factors(factors)
    except ValueError as exc:
        work.fail(str(exc), param="factors")
    if not name.strip():
        work.fail("give the combination a name", param="name")
    return {"name": name, "factors": factors}
