"""column: flexural buckling of a column about both axes, traced.

Sheet syntax::

    c = column.buckling(L=3.6 m, ends="pinned-pinned", ends_y="fixed-pinned",
                        section=sec, material=mat)            -- or E=…, F_y=…, A=…, I_x=…, I_y=…
    check P_u <= 0.9*c.P_cr

For each axis: K from the named end conditions ("design" values by default,
``K_basis="theoretical"`` for the ideal ones; or give K_x / K_y), slenderness
KL/r, Euler load P_e = π²EI/(KL)² and stress σ_e = π²E/(KL/r)²; the elastic
(Euler) range is checked against the proportional limit (F_y/2 unless given),
and below the transition slenderness C_c = √(2π²E/F_y) the Johnson parabola
σ_cr = F_y − F_y²(KL/r)²/(4π²E) applies. The axis with the smaller critical
stress governs. See docs/plugins/column.md.
"""
from calcsheet.plugin import Namespace

namespace = Namespace("column", version="0.1.0", doc="Column flexural buckling: Euler and Johnson, both axes")

from . import buckling as _buckling  # noqa: E402,F401  (registers the function)
