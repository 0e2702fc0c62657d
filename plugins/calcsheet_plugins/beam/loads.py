"""Load and combination records for beam.solve: each just remembers what the sheet said.

Why separate records: a sheet builds its load list once, names the cases, and
can reuse it; positions are checked against the beam when it is solved.
"""
from __future__ import annotations

from calcsheet.plugin import Field, Param

from . import namespace
from .combos import parse_factors
from .kinds import FAMILY, KINDS

for _cls in KINDS.values():  # one record type per kind, all of one family (beam.solve's loads= takes any)
    namespace.function(_cls.name, params=list(_cls.params), fields=list(_cls.fields), returns=_cls.record_type,
                       family=FAMILY)(_cls.record)


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


@namespace.function(
    "spring",
    params=[Param("at", kind="text", doc="the support, by letter (A, B, …)"),
            Param("k", "[force]/[length]", "translational stiffness (force per unit deflection)", default=None),
            Param("k_theta", "[force]*[length]", "rotational stiffness, moment per radian (write kN*m)",
                  default=None)],
    fields=[Field("at", kind="text", doc="support"), Field("k", "[force]/[length]", "translational stiffness"),
            Field("k_theta", "[force]*[length]", "rotational stiffness per radian")],
    returns="spring",
)
def spring(work, at, k=None, k_theta=None):
    """An elastic support: a translational spring (on a "spring" support) and/or a rotational one."""
    if k is None and k_theta is None:
        work.fail("give k (translational) or k_theta (rotational), or both", param="k")
    for name, q in (("k", k), ("k_theta", k_theta)):
        if q is not None and not q.magnitude > 0:
            work.fail(f"{name} must be greater than zero", param=name)
    return {"at": at.strip(), "k": k if k is not None else work.q(0, "kN/m"),
            "k_theta": k_theta if k_theta is not None else work.q(0, "kN*m")}


@namespace.function(
    "settlement",
    params=[Param("at", kind="text", doc="the support, by letter (A, B, …)"),
            Param("delta", "[length]", "downward movement of the support (negative: upward)")],
    fields=[Field("at", kind="text", doc="support"), Field("delta", "[length]", "downward movement")],
    returns="settlement",
)
def settlement(work, at, delta):
    """A prescribed movement of a support that holds the beam up (it acts in every combination)."""
    return {"at": at.strip(), "delta": delta}
