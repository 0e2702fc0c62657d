"""C_b (AISC 360-16 Eq. F1-1) and C_1 (EN 1993-1-1 6.3.2, quarter-point formula) read from a solved beam's moment
diagram over the unbraced segment, and LRFD/ASD chosen once per sheet.

References: Example F.1-3B of the AISC Design Examples v16.0 (W18×50 braced at mid-span: moments 1.00, 0.438, 0.750,
0.938 of M_max, C_b = 1.30); a simply supported beam under a uniform load braced at its ends has C_b = 1.14
(# common practice: 12.5/(2.5 + 3·0.75 + 4 + 3·0.75)); the moments of a uniform load, wx(L − x)/2, by statics.
"""
import math

import pytest

import calcsheet

from .conftest import IPE300, W18X50, call, errors, f, run

SPAN = 'b = beam.solve(spans=[35 ft], supports="pinned, roller", loads=[beam.udl(w=1.74 kip/ft)])\n'


def test_Cb_over_the_whole_span_of_a_uniform_load_is_1_14():
    r = run(f"s = steel_design.shape({W18X50})\n{SPAN}"
            "out = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=35 ft, beam=b)\n")
    assert f(r.values["out"].fields["C_b"]) == pytest.approx(12.5 / (2.5 + 3 * 0.75 + 4 + 3 * 0.75), rel=1e-9)


def test_F_1_3B_Cb_of_the_half_span_read_from_the_beam():
    r = run(f"s = steel_design.shape({W18X50})\n{SPAN}"
            "out = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=17.5 ft, beam=b, x_start=17.5 ft, x_end=35 ft)\n"
            'asd = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=17.5 ft, beam=b, x_end=17.5 ft, method="ASD")\n')
    out, asd = r.values["out"].fields, r.values["asd"].fields
    # M/M_max at the quarter points of a half span: 7/16, 3/4, 15/16 (statics) → C_b = 1.30 (Example F.1-3B)
    assert f(out["C_b"]) == pytest.approx(12.5 / (2.5 + 3 * 7 / 16 + 4 * 0.75 + 3 * 15 / 16), rel=1e-9)
    assert f(out["C_b"]) == pytest.approx(1.30, abs=0.005)
    assert f(out["M_cx"], "kip*ft") == pytest.approx(288, rel=0.004)   # φ_bM_n = 288 kip-ft
    assert f(asd["M_cx"], "kip*ft") == pytest.approx(192, rel=0.004)   # M_n/Ω_b = 192 kip-ft (either half)


def test_the_working_shows_the_quarter_point_moments_with_where_they_were_read():
    r = run(f"s = steel_design.shape({W18X50})\n{SPAN}"
            "out = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=17.5 ft, beam=b, x_end=17.5 ft)\n")
    steps = {s.name: s for s in r.values["out"].working.items if hasattr(s, "name")}
    M_max = 1.74 * 35**2 / 8
    assert steps["M_max"].value.m_as("kip*ft") == pytest.approx(M_max, rel=1e-9)          # at mid-span
    assert steps["M_A"].value.m_as("kip*ft") == pytest.approx(M_max * 7 / 16, rel=1e-9)   # wx(L − x)/2 at L/8
    assert "x = 4.375" in (steps["M_A"].note or "")


def test_Cb_from_a_continuous_beam_segment_uses_absolute_moments():
    # two equal spans, uniform load: hogging over the middle support; F1-1 takes absolute values
    r = run(f"s = steel_design.shape({W18X50})\n"
            'b = beam.solve(spans=[20 ft, 20 ft], supports="pinned, pinned, roller", E=29000 ksi, '
            'I=800 in^4, loads=[beam.udl(w=2 kip/ft)])\n'
            "out = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=20 ft, beam=b, x_start=0 ft, x_end=20 ft)\n")
    w, L = 2.0, 20.0
    # statics: R_A = 3wL/8, M(x) = 3wLx/8 − wx²/2 in the first span; M_max = wL²/8 at the support
    M = lambda x: 3 * w * L * x / 8 - w * x**2 / 2  # noqa: E731
    Mmax = w * L**2 / 8
    expected = 12.5 * Mmax / (2.5 * Mmax + 3 * abs(M(5)) + 4 * abs(M(10)) + 3 * abs(M(15)))
    assert f(r.values["out"].fields["C_b"]) == pytest.approx(expected, rel=1e-9)


def test_ec3_C1_from_the_beam_is_the_quarter_point_formula():
    r = run(f"s = steel_design.shape({IPE300})\n"
            'b = beam.solve(spans=[6 m], supports="pinned, roller", loads=[beam.udl(w=10 kN/m)])\n'
            "out = steel_design.ec3_beam(section=s, f_y=235 MPa, L_LT=6 m, beam=b, M_y_Ed=45 kN*m)\n"
            'ref = steel_design.ec3_beam(section=s, f_y=235 MPa, L_LT=6 m, C_1=1.13592, M_y_Ed=45 kN*m)\n', units="SI")
    c1 = math.sqrt(35 / (1 + 9 * 0.75**2 + 16 + 9 * 0.75**2))  # Serna et al. (2006) with M/M_max = 3/4, 1, 3/4
    out, ref = r.values["out"].fields, r.values["ref"].fields
    assert f(out["M_cr"], "kN*m") == pytest.approx(f(ref["M_cr"], "kN*m") * c1 / 1.13592, rel=1e-9)
    assert c1 == pytest.approx(1.127, rel=0.01)  # the tabulated C_1 of a uniform load (NCCI SN003a) within 1 %


@pytest.mark.parametrize("extra, words", [
    ("C_b=1.2, beam=b", "beam"),
    ("C_b=1.2, x_start=1 ft", "x_start"),
    ("beam=b, x_start=20 ft, x_end=10 ft", "segment"),
])
def test_bad_segment_arguments_are_located_errors(extra, words):
    errs = errors(f"s = steel_design.shape({W18X50})\n{SPAN}"
                  f"out = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=10 ft, {extra})\n")
    assert errs and words in errs[0].message and errs[0].span is not None


# ---------------------------------------------------------------- one design method per sheet
def sheet(front, body):
    return calcsheet.run(f"---\nproject: t\nunits: US\n{front}---\ns = steel_design.shape({W18X50})\n{body}")


def test_the_front_matter_chooses_ASD_for_every_call():
    r = sheet("design_method: ASD\n", "b = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=0 ft)\n"
                                      "c = steel_design.aisc_column(section=s, F_y=50 ksi, L=10 ft)\n")
    assert not [d for d in r.diagnostics if d.severity == "error"]
    assert r.values["b"].fields["method"] == "ASD" and r.values["c"].fields["method"] == "ASD"
    # Example F.1-1A: M_p/Ω_b = 252 kip-ft
    assert f(r.values["b"].fields["M_cx"], "kip*ft") == pytest.approx(252, abs=0.5)


def test_a_call_contradicting_the_sheet_method_is_a_located_error_at_its_method():
    r = sheet("design_method: LRFD\n", 'b = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=0 ft, method="ASD")\n')
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert errs and "contradicts" in errs[0].message
    line = r.source.split("\n")[errs[0].span.line - 1]
    assert line[errs[0].span.col - 1:].startswith('method="ASD"')


def test_an_unknown_sheet_method_is_an_error_naming_it():
    r = sheet("design_method: WSD\n", "b = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=0 ft)\n")
    errs = [d for d in r.diagnostics if d.severity == "error"]
    assert errs and "WSD" in errs[0].message


def test_without_the_key_a_call_may_choose_and_LRFD_is_the_default():
    out = call(W18X50, "aisc_beam", "F_y=50 ksi, L_b=0 ft")
    assert out["method"] == "LRFD"


def test_an_incremental_rebuild_keeps_the_sheet_method():
    from calcsheet.incremental import rebuild

    src = (f"---\nproject: t\nunits: US\ndesign_method: ASD\n---\ns = steel_design.shape({W18X50})\n"
           "L_b = 0 ft\nb = steel_design.aisc_beam(section=s, F_y=50 ksi, L_b=L_b)\n")
    first = calcsheet.run(src)
    again = rebuild(first, src.replace("L_b = 0 ft", "L_b = 1 ft"))
    assert not again.full, again.reason                          # the fast path, which builds its own evaluator
    assert again.result.values["b"].fields["method"] == "ASD"
    assert f(again.result.values["b"].fields["M_cx"], "kip*ft") == pytest.approx(252, abs=0.5)  # M_p/Ω_b, F.1-1A


def test_aisc_Cb_alone_reads_the_beam_too():
    r = run(f"{SPAN}c = steel_design.aisc_Cb(beam=b, x_start=0 ft, x_end=17.5 ft)\n"
            "m = steel_design.aisc_Cb(M_max=1 kip*ft, M_A=0.438 kip*ft, M_B=0.75 kip*ft, M_C=0.938 kip*ft)\n")
    assert f(r.values["c"].fields["C_b"]) == pytest.approx(f(r.values["m"].fields["C_b"]), abs=2e-3)  # F.1-3B: 1.30
    assert errors("c = steel_design.aisc_Cb(M_max=1 kip*ft)")


def test_ec3_beam_column_with_a_diagram_takes_C_my_1_in_annex_B():
    r = run('s = section.rolled(designation="HE 200 B")\n'
            'b = beam.solve(spans=[6 m], supports="pinned, roller", loads=[beam.udl(w=10 kN/m)])\n'
            "x = steel_design.ec3_beam_column(section=s, f_y=235 MPa, L=6 m, L_LT=6 m, beam=b, N_Ed=200 kN, "
            "M_y_Ed=45 kN*m)\n", units="SI")
    out, sec = r.values["x"].fields, r.values["s"].fields
    n_y = 200e3 / (f(out["chi_y"]) * f(sec["A"], "mm^2") * 235)            # Annex B, γ_M1 = 1
    lam = f(out["lambda_y"])
    # EN 1993-1-1 Annex B Table B.1/B.2, class 1: k_yy = C_my·min(1 + (λ̄_y − 0.2)n_y, 1 + 0.8n_y), C_my = 1
    assert f(out["k_yy"]) == pytest.approx(min(1 + (lam - 0.2) * n_y, 1 + 0.8 * n_y), rel=1e-9)
