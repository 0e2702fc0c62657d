"""Load and combination records for beam.solve: each just remembers what the sheet said.

Why separate records: a sheet builds its load list once, names the cases, and
can reuse it; positions are checked against the beam when it is solved.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import namespace
from .combos import parse_factors
from .kinds import KINDS

for _cls in KINDS.values():
    namespace.function(_cls.name, params=list(_cls.params), fields=list(_cls.fields), returns="load")(_cls.record)


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
