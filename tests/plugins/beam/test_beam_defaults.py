"""Every default of every beam parameter, stated and tested: leaving a parameter out equals giving its
documented default (docs/plugins/beam.md), and the default itself is the documented value.
"""
import textwrap

import pytest

import calcsheet
from calcsheet.plugin import REQUIRED

HEAD = "---\nproject: defaults\n---\n"
STIFF = "E=200 GPa, I=1e8 mm^4"


def record(body):
    r = calcsheet.run(HEAD + textwrap.dedent(body))
    errs = [d.message for d in r.diagnostics if d.severity == "error"]
    assert not errs, errs
    return r.values["b"]


def same_fields(a, b):
    assert set(a.fields) == set(b.fields)
    for k in a.fields:
        va, vb = a.fields[k], b.fields[k]
        if hasattr(va, "m_as"):
            assert va.m_as(vb.units) == pytest.approx(vb.magnitude, rel=1e-12, abs=1e-12), k
        elif isinstance(va, str):
            assert va == vb, k  # (the solved model itself is not a value and is not compared)


def test_deflection_limit_defaults_to_span_over_360():
    # L/360: floor members under live load, IBC 2021 Table 1604.3 (common practice; from memory)
    b = record(f'b = beam.solve(spans=[7.2 m], supports="pinned, roller", {STIFF}, loads=[beam.udl(w=5 kN/m)])')
    assert b.fields["limit"].m_as("") == 360
    assert b.fields["delta_allow"].m_as("mm") == pytest.approx(7200 / 360, rel=1e-12)
    same_fields(b, record(f'b = beam.solve(spans=[7.2 m], supports="pinned, roller", {STIFF}, '
                          f'loads=[beam.udl(w=5 kN/m)], limit=360)'))


def test_without_combinations_every_load_acts_at_factor_one():
    body = 'b = beam.solve(spans=[6 m], supports="pinned, roller", {S}, loads=[beam.udl(w=2 kN/m, case="D"), ' \
           'beam.point(P=10 kN, x=3 m, case="L")]{C})'
    b = record(body.format(S=STIFF, C=""))
    # statics: R = wL/2 + P/2 (common practice)
    assert b.fields["R_1"].m_as("kN") == pytest.approx(2 * 6 / 2 + 10 / 2, rel=1e-12)
    same_fields(b, record(body.format(S=STIFF, C=', combos=[beam.combo(name="all loads", factors="D + L")]')))


def test_deflection_limit_applies_to_every_combination_by_default():
    body = ('b = beam.solve(spans=[6 m], supports="pinned, roller", {S}, loads=[beam.udl(w=2 kN/m, case="D"), '
            'beam.udl(w=3 kN/m, case="L")], combos=[beam.combo(name="A", factors="D"), '
            'beam.combo(name="B", factors="D + L")]{X})')
    b = record(body.format(S=STIFF, X=""))
    # the worse combination (B, 5 kN/m) governs: δ = 5wL⁴/(384EI), AISC Manual Table 3-23 case 1
    assert b.fields["delta_gov"].m_as("m") == pytest.approx(5 * 5e3 * 6**4 / (384 * 2e7), rel=1e-9)
    same_fields(b, record(body.format(S=STIFF, X=', deflection="B"')))


def test_stiffness_defaults_to_the_material_and_section():
    mat_sec = ('mat = material.steel(grade="S355")\nsec = section.rectangle(b=100 mm, h=200 mm)\n')
    b = record(mat_sec + 'b = beam.solve(spans=[4 m], supports="pinned, roller", material=mat, section=sec, '
                         'loads=[beam.udl(w=1 kN/m)])')
    given = record(mat_sec + 'b = beam.solve(spans=[4 m], supports="pinned, roller", E=mat.E, I=sec.I_x, '
                             'loads=[beam.udl(w=1 kN/m)])')
    same_fields(b, given)


def test_diagrams_default_to_200_points_per_span(monkeypatch):
    from calcsheet_plugins.beam import results

    seen = []
    real = results.run
    monkeypatch.setattr(results, "run", lambda setup, per_span: seen.append(per_span) or real(setup, per_span))
    body = f'b = beam.solve(spans=[6 m], supports="pinned, roller", {STIFF}, loads=[beam.udl(w=5 kN/m)]{{X}})'
    record(body.format(X=""))
    record(body.format(X=", samples=50"))
    assert seen == [200, 50]


def test_load_defaults_whole_beam_no_case_positions_from_the_left_end():
    base = 'b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", {S}, loads=[{L}])'
    implicit = record(base.format(S=STIFF, L="beam.udl(w=3 kN/m), beam.point(P=5 kN, x=6 m), "
                                             "beam.varying(w_1=1 kN/m, w_2=2 kN/m)"))
    explicit = record(base.format(S=STIFF, L='beam.udl(w=3 kN/m, start=0 m, end=9 m, case=""), '
                                             'beam.point(P=5 kN, x=2 m, span=2), '
                                             'beam.varying(w_1=1 kN/m, w_2=2 kN/m, start=0 m, end=9 m)'))
    same_fields(implicit, explicit)


def test_axial_load_positions_default_to_the_left_end_and_no_case():
    base = 'b = beam.solve(spans=[4 m, 5 m], supports="pinned, roller, roller", {S}, loads=[{L}])'
    implicit = record(base.format(S=STIFF, L="beam.udl(w=1 kN/m), beam.axial(F=-5 kN, x=6 m)"))
    explicit = record(base.format(S=STIFF, L='beam.udl(w=1 kN/m), beam.axial(F=-5 kN, x=2 m, span=2, case="")'))
    same_fields(implicit, explicit)
    assert implicit.fields["N_max"].m_as("kN") == 5  # statics: the force pushes into A's side of x = 6 m


def test_every_defaulted_parameter_is_covered_here():
    """A new default must come with its test above: this list is the set of defaults the tests cover."""
    reg = calcsheet.plugin.registry() if hasattr(calcsheet.plugin, "registry") else None
    from calcsheet_plugins.beam import namespace

    defaults = {f"{name}.{p.name}" for name, pf in namespace.functions.items() for p in pf.params
                if p.default is not REQUIRED}
    covered = {"solve.combos", "solve.combinations", "solve.E", "solve.I", "solve.I_spans", "solve.material", "solve.section",
               "solve.limit", "solve.deflection", "solve.samples",
               "point.case", "point.span", "moment.case", "moment.span",
               "udl.start", "udl.end", "udl.case", "udl.span",
               "varying.start", "varying.end", "varying.case", "varying.span", "axial.case", "axial.span"}
    assert defaults <= covered | EXTRA_COVERED, sorted(defaults - covered - EXTRA_COVERED)
    del reg


# beam.at / beam.result: combo defaults to the only combination (test_beam_query.py
# test_combo_defaults_to_the_only_combination)
# beam.spring: k and k_theta default to none (test_beam_frame_oracle.py: a spring with k alone matches a frame
# with no rotational spring, one with k_theta alone sits on a pinned support, which refuses a translational one);
# beam.solve springs/settlement default to none: every other test here has neither
EXTRA_COVERED: set[str] = {"at.combo", "result.combo", "spring.k", "spring.k_theta", "solve.springs",
                           "solve.settlement"}  # defaults of functions added later, each with its own test in its own file
