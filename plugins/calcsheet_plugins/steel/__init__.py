"""steel: member design to AISC 360-16 (LRFD/ASD) and EN 1993-1-1:2005+AC:2009, every step traced to its clause.

Sheet syntax::

    w18 = steel_design.shape(name="W18X50", form="I", A=14.7 in^2, d=18.0 in, …)   -- or section.rolled(…)
    mat = material.steel(grade="A992")
    b   = steel_design.aisc_beam(section=w18, material=mat, L_b=11.67 ft, C_b=1.01, M_rx=266 kip*ft, V_r=30 kip)
    check b.util <= 1
    c   = steel_design.ec3_column(section=hea, material=s355, L=4 m, N_Ed=900 kN)
    ch  = steel_design.aisc_beam(section=section.rolled(designation="C15X33.9"), material=mat, L_b=5 ft,
                                 beam=b_solved, x_start=10 ft, x_end=15 ft)   -- C_b from the beam's moments

Forms: I (doubly and singly symmetric), C, T, L, RHS, CHS. LRFD/ASD once per sheet with the front matter's
``design_method:`` key.

(The namespace is ``steel_design``: ``steel`` is a value name sheets already use.)

Factors, limits, buckling curves and moment-shape coefficients live in TOML
files beside this module, each naming its source and edition. See
docs/plugins/steel.md for every clause covered and what is out of scope.
"""
from calcsheet.plugin import Namespace

namespace = Namespace(
    "steel_design", version="0.2.0",
    doc="Steel member design: AISC 360-16 (LRFD/ASD) and EN 1993-1-1:2005+AC:2009, traced to the clause",
    standards=("AISC 360-16", "EN 1993-1-1:2005+AC:2009"),
)

from . import shape as _shape  # noqa: E402,F401  (registers the functions)
from . import aisc as _aisc  # noqa: E402,F401
from . import ec3 as _ec3  # noqa: E402,F401
