"""A handbook cross-check is offered only where its case applies: every cross-check printed for a beam its case
does not describe would disagree with the solver and show as a failed check in the package. Each beam below
is one a case almost fits (a fixed end where the case needs a simple one, two loads where it needs one, a
load just off the tip); none may print a failing cross-check, and the ones that do fit still get theirs.
The cases themselves: AISC Steel Construction Manual Table 3-23 (from memory), as in handbook.toml.
"""
import pytest

import calcsheet
from calcsheet.trace import CheckResult

NEAR_MISSES = [
    ('spans=[6 m, 2 m], supports="fixed, roller, free"', "beam.point(P=10 kN, x=8 m)"),
    ('spans=[6 m, 2 m], supports="pinned, roller, free"', "beam.point(P=10 kN, x=7.5 m)"),
    ('spans=[6 m, 2 m], supports="pinned, roller, free"', "beam.point(P=10 kN, x=8 m), beam.udl(w=1 kN/m)"),
    ('spans=[6 m], supports="pinned, roller"', "beam.point(P=10 kN, x=2 m), beam.point(P=10 kN, x=4 m)"),
    ('spans=[6 m], supports="pinned, roller"', "beam.point(P=10 kN, x=1 m), beam.point(P=5 kN, x=3 m)"),
    ('spans=[6 m], supports="fixed, roller"', "beam.point(P=10 kN, x=3 m)"),
    ('spans=[5 m, 6 m], supports="pinned, roller, roller"', "beam.udl(w=8 kN/m)"),
    ('spans=[5 m, 5 m], supports="pinned, roller, fixed"', "beam.udl(w=8 kN/m)"),
    ('spans=[6 m], supports="pinned, roller"', "beam.udl(w=8 kN/m, end=5 m)"),
    ('spans=[6 m], supports="pinned, roller"', "beam.varying(w_1=8 kN/m, w_2=4 kN/m)"),
]


def checks(beam, loads):
    r = calcsheet.run(f"b = beam.solve({beam}, E=200 GPa, I=1e8 mm^4, loads=[{loads}])\n")
    assert r.ok, r.diagnostics
    return [c for c in r.values["b"].working.items if isinstance(c, CheckResult)]


@pytest.mark.parametrize("beam, loads", NEAR_MISSES)
def test_no_cross_check_is_printed_for_a_beam_its_case_does_not_describe(beam, loads):
    bad = [c for c in checks(beam, loads) if not c.ok]
    assert not bad, [(c.description, c.ratio) for c in bad]


def test_loads_at_one_point_add_up_to_the_central_point_case():
    # two forces at mid-span are one force P₁ + P₂ there: the central point case (P·L/4) still applies
    both = checks('spans=[6 m], supports="pinned, roller"', "beam.point(P=4 kN, x=3 m), beam.point(P=6 kN, x=3 m)")
    single = checks('spans=[6 m], supports="pinned, roller"', "beam.point(P=10 kN, x=3 m)")
    assert both and all(c.ok for c in both)
    assert [c.description for c in both] == [c.description for c in single]
