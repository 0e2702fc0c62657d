"""beam: exact Euler–Bernoulli analysis of a member on any supports, traced like a hand calculation.

Sheet syntax (signs: loads act downward when positive, applied moments are
clockwise positive, M is sagging positive, deflection δ is downward positive)::

    b = beam.solve(spans=[6 m, 6 m], supports="pinned, roller, roller",
                   E=mat.E, I=sec.I_x,
                   loads=[beam.udl(w=w_D, case="D"),
                          beam.point(P=10 kN, x=3 m, case="L"),
                          beam.udl(w=4 kN/m, span=2, case="L")],
                   combos=[beam.combo(name="ULS", factors="1.2 D + 1.6 L"),
                           beam.combo(name="SLS", factors="D + L")],
                   limit=360)
    st = beam.stresses(member=b, section=sec)
    check b.delta_max <= b.delta_allow
    check st.sigma_max <= 0.66*F_y

Supports: one per span end, each "pinned", "roller", "fixed", "free",
"guided" (no rotation, free to slide), "hinge" (an internal moment release
with no support) or "spring" (``springs=[beam.spring(at="B", k=…)]``);
``settlement=[beam.settlement(at="B", delta=…)]`` moves a support. Loads: one
class each in kinds.py — ``beam.point(P, x)``, ``beam.moment(M, x)``,
``beam.udl(w, start, end)``, ``beam.varying(w_1, w_2, start, end)`` and
``beam.axial(F, x)``; each takes ``case="D"`` and ``span=k``. Standard
combination sets come from ``loads.combinations`` (``combinations=[…]``).
Results: reactions and support moments by support letter (R_A, M_B; R_1,
M_sup_1 … remain), envelope extremes with their governing combination and
concurrent actions, per-span maxima; ``beam.result`` gives one combination,
``beam.at`` the values at any x; see docs/plugins/beam.md.
"""
from calcsheet.plugin import Namespace

namespace = Namespace(
    "beam",
    version="0.1.0",
    doc="Beams on any supports: reactions, shear, moment, slope and deflection, solved exactly, with diagrams",
)

from . import loads as _loads  # noqa: E402,F401  (registers the load functions)
from . import analysis as _analysis  # noqa: E402,F401  (registers solve and stresses)
from . import query as _query  # noqa: E402,F401  (registers at and result)
