"""section.rolled, the families added to the catalogue: UPN channels (tapered flanges with toe radii), double
angles, MT and ST tees; and the compact working every catalogue section shows by default."""
import math

import numpy as np
import pytest

from calcsheet.trace import Figure, Step, Table
from calcsheet_plugins.section import catalogue as C
from calcsheet_plugins.section import fillets as FL
from calcsheet_plugins.section.properties import green, tabular

IN = 25.4


def errors(result):
    return [d for d in result.diagnostics if d.severity == "error"]


def warnings(result):
    return [d for d in result.diagnostics if d.severity == "warning"]


def rolled(run, designation, extra=""):
    r = run(f's = section.rolled(designation="{designation}"{extra})\n')
    assert not errors(r), r.diagnostics
    return r, r.values["s"]


def upn(name):
    g = C.lookup(name).dims
    return FL.tapered_channel(g["h"], g["b"], g["t_f"], g["t_w"], g["r"], g["slope"], g["r_toe"], g["u"])


# ---------------------------------------------------------------- UPN channels

@pytest.mark.parametrize("typed", ["UPN200", "UPN 200", "upn 200", "Upn200"])
def test_upn_designations_are_matched_forgivingly(typed):
    assert C.lookup(typed).designation == "UPN 200"


def test_an_unknown_upn_is_a_located_error_naming_its_neighbours(run):
    text = 's = section.rolled(designation="UPN 210")\n'
    (e,) = errors(run(text))
    assert e.span.line == 1 and text[e.span.col - 1:].startswith("designation")
    assert "UPN 200" in e.hint or "UPN 220" in e.hint


def test_upn_dimensions_and_flange_slopes_follow_din_1026_1():
    # DIN 1026-1 UPN 200: h 200, b 75, t_w 8.5, t = 11.5, r1 = 12, r2 = 6 mm; inner flange faces at 8 % up to
    # h = 300 mm, 5 % above (# from memory)
    g = C.lookup("UPN 200").dims
    assert (g["h"], g["b"], g["t_w"], g["t_f"], g["r"], g["r_toe"]) == (200, 75, 8.5, 11.5, 12, 6)
    assert g["slope"] == 0.08 and g["u"] == 75 / 2  # t measured b/2 from the back of the web
    g = C.lookup("UPN 320").dims
    assert g["slope"] == 0.05 and g["u"] == pytest.approx((100 - 14) / 2)


@pytest.mark.parametrize("name, A, I_y, I_z, e", [
    # published UPN properties, cm² cm⁴ cm⁴ cm (e: centroid from the back of the web) (# from memory: the
    # producers' section tables for DIN 1026-1 channels)
    ("UPN 100", 13.5, 206, 29.3, 1.55),
    ("UPN 200", 32.2, 1910, 148, 2.01),
    ("UPN 300", 58.8, 8030, 495, 2.70),
])
def test_upn_model_reproduces_published_properties(name, A, I_y, I_z, e):
    b = green(upn(name).rings)
    assert b.A / 100 == pytest.approx(A, rel=0.005)
    assert b.I_x / 1e4 == pytest.approx(I_y, rel=0.005)
    assert b.I_y / 1e4 == pytest.approx(I_z, rel=0.015)  # UPN 100: 28.98 against 29.3 recalled, 1.1 %
    assert b.x_c / 10 == pytest.approx(e, rel=0.01)


def test_upn_model_against_an_independent_tapered_channel_of_sectionproperties():
    # sectionproperties (test-only oracle) builds its own tapered-flange channel outline, t_f at the middle of the
    # outstand: UPN 200's t_f (measured at b/2) is moved there along the 8 % slope
    ss = pytest.importorskip("sectionproperties.pre.library.steel_sections")
    from sectionproperties.analysis import Section

    g = C.lookup("UPN 200").dims
    o = g["b"] - g["t_w"]
    t_mid = g["t_f"] + g["slope"] * (o / 2 - g["u"])
    geom = ss.tapered_flange_channel(d=g["h"], b=g["b"], t_f=t_mid, t_w=g["t_w"], r_r=g["r"], r_f=g["r_toe"],
                                     alpha=math.degrees(math.atan(g["slope"])), n_r=64)
    sec = Section(geom.create_mesh(mesh_sizes=[40.0]))
    sec.calculate_geometric_properties()
    ixx, iyy, _ = sec.get_ic()
    mine = green(upn("UPN 200").rings)
    assert mine.A == pytest.approx(sec.get_area(), rel=2e-5)
    assert mine.I_x == pytest.approx(ixx, rel=2e-5) and mine.I_y == pytest.approx(iyy, rel=2e-5)


def test_upn_parts_table_agrees_with_its_outline():
    # the traced rows (rectangles, taper triangles, kites less sectors at roots and toes) against Green's theorem
    for name in ("UPN 50", "UPN 200", "UPN 400"):
        s = upn(name)
        a, b = tabular(s.rows), green(s.rings)
        assert a.A == pytest.approx(b.A, rel=1e-6) and a.I_x == pytest.approx(b.I_x, rel=1e-6)
        assert a.I_y == pytest.approx(b.I_y, rel=1e-6) and a.x_c == pytest.approx(b.x_c, rel=1e-6)


def test_a_upn_record_is_its_model_with_the_nominal_mass(run):
    r, rec = rolled(run, "UPN 200")
    f = rec.fields
    assert f["designation"] == "UPN 200" and "DIN 1026-1" in f["source"]
    assert f["A"].m_as("cm^2") == pytest.approx(32.2, rel=0.005)
    # nominal mass 25.3 kg/m (DIN 1026-1, # from memory) = 7850 kg/m³ × A
    assert f["mass"].m_as("kg/m") == pytest.approx(25.3, rel=0.005)
    assert f["x_s"].m_as("mm") < 0  # the shear centre lies behind the back of the web (common practice)
    assert [t for t in rec.working.items if isinstance(t, Table) and "dimensions only" in t.title]
    assert not warnings(r)


# ---------------------------------------------------------------- tapered flanges: root radius from k

@pytest.mark.parametrize("slope", [0.0, 0.08, 2 / 12])
def test_the_root_radius_from_k_puts_the_fillet_toe_at_k(slope):
    # build the channel with r from k and read, on its outline, where the fillet leaves the web face
    h, b, t_f, t_w, k = 254.0, 69.6, 11.07, 9.63, 25.4
    o = b - t_w
    r = FL.root_radius_from_k(k, t_f + slope * o / 2, slope)
    ring = FL.tapered_channel(h, b, t_f, t_w, r, slope).rings[0]
    on_web = (np.abs(ring.x - t_w) < 1e-9) & (ring.y < h / 2)
    assert ring.y[on_web].min() == pytest.approx(k, abs=1e-6)


def test_aisc_s_and_c_root_radii_now_account_for_the_taper():
    # C10X20: k_des = 1.00 in, t_f = 0.436 in, b_f = 2.739 in, t_w = 0.379 in (AISC v16.0): the flange is
    # t_f + (2/12)·(b_f − t_w)/2 thick at the web, so r < k − t_f
    g = C.lookup("C10X20").dims
    assert g["r"] < (1.00 - 0.436) * IN
    assert g["slope"] == pytest.approx(2 / 12)


# ---------------------------------------------------------------- double angles, MT, ST

@pytest.mark.parametrize("typed, found", [
    ("2L6X4X1/2X3/8LLBB", "2L6X4X1/2X3/8LLBB"), ("2L6x4x1/2x3/8 LLBB", "2L6X4X1/2X3/8LLBB"),
    ("2L4X4X1/2", "2L4X4X1/2"), ("2L 4x4x1/2", "2L4X4X1/2"), ("2L4X4X1/2X3/4", "2L4X4X1/2X3/4"),
    ("MT6.25X6.2", "MT6.25X6.2"), ("ST12X53", "ST12X53"), ("st 12x53", "ST12X53"),
])
def test_new_aisc_designations_are_matched_forgivingly(typed, found):
    assert C.lookup(typed).designation == found


def test_double_angle_rows_are_the_published_rows_and_follow_the_parallel_axis_theorem():
    # AISC Shapes Database v16.0: 2L6X4X1/2 LLBB at 0, 3/8 and 3/4 in: A 9.50 in², I_x 34.6 in⁴, I_y 21.7, 25.6,
    # 29.8 in⁴ (as shipped); the single L6X4X1/2: A 4.75 in², I_y 6.22 in⁴, x̄ 0.981 in
    rows = {s: C.lookup(f"2L6X4X1/2{s}LLBB") for s in ("", "X3/8", "X3/4")}
    assert sorted(e.dims["gap"] for e in rows.values()) == pytest.approx([0.0, 0.375 * IN, 0.75 * IN])
    for s, I_y in (("", 21.7), ("X3/8", 25.6), ("X3/4", 29.8)):
        v = rows[s].values
        assert v["A"] == pytest.approx(9.50 * IN**2) and v["I_x"] == pytest.approx(34.6 * IN**4)
        gap = rows[s].dims["gap"] / IN
        # parallel-axis theorem (common practice): I_y = 2·(I_y,L + A_L·(x̄ + s/2)²)
        assert v["I_y"] / IN**4 == pytest.approx(2 * (6.22 + 4.75 * (0.981 + gap / 2) ** 2), rel=0.01)
        assert v["I_y"] / IN**4 == pytest.approx(I_y)


def test_double_angle_model_against_the_single_angle_and_the_table(run):
    # the model's two angles are each the single angle's model, moved: A and I_x double exactly
    g = C.lookup("2L6X4X1/2X3/8LLBB").dims
    pair = green(FL.double_angle(g["h"], g["b"], g["t"], g["r"], g["gap"]).rings)
    one = green(FL.angle(g["h"], g["b"], g["t"], g["r"]).rings)
    assert pair.A == pytest.approx(2 * one.A, rel=1e-12) and pair.I_x == pytest.approx(2 * one.I_x, rel=1e-9)
    assert pair.I_y == pytest.approx(2 * (one.I_y + one.A * (one.x_c + g["gap"] / 2) ** 2), rel=1e-9)
    r, rec = rolled(run, "2L6X4X1/2X3/8LLBB")
    (cmp,) = [t for t in rec.working.items if isinstance(t, Table) and t.title.endswith("geometric model")]
    by = {row[0]: float(row[3].split()[0]) for row in cmp.rows}
    assert abs(by["A"]) < 2 and abs(by["I_y"]) < 2 and abs(by["r_o"]) < 2  # % (toe radii are not modelled)
    assert rec.fields["y_s"].m_as("mm") == pytest.approx(g["t"] / 2)


@pytest.mark.parametrize("family, worst", [("2L", 0.035), ("MT", 0.05), ("ST", 0.045)])
def test_new_families_agree_with_their_geometric_models(family, worst):
    # the same spread as the families they come from (L, M, S): k_des-based fillets, toe radii not modelled
    rows = [e for e in C.entries().values() if e.family == family][::5]
    assert rows
    for e in rows:
        g = e.dims
        s = (FL.double_angle(g["h"], g["b"], g["t"], g["r"], g["gap"]) if family == "2L" else
             FL.tee(g["h"], g["b"], g["t_f"], g["t_w"], g["r"]) if family == "MT" else
             FL.tapered_tee(g["h"], g["b"], g["t_f"], g["t_w"], g["r"], g["slope"]))
        b = green(s.rings)
        devs = [abs(m / e.values[n] - 1) for n, m in (("A", b.A), ("I_x", b.I_x), ("I_y", b.I_y))]
        assert max(devs) <= worst, (e.designation, devs)


def test_tapered_tee_against_sectionproperties_tapered_i_halved():
    # half of sectionproperties' tapered-flange I (its own outline, no toe radius) cut at mid-depth is our tee
    ss = pytest.importorskip("sectionproperties.pre.library.steel_sections")
    shapely = pytest.importorskip("shapely")
    h, b, t_f, t_w, r, slope = 304.8, 129.03, 13.82, 10.87, 13.56, 2 / 12
    geom = ss.tapered_flange_i_section(d=2 * h, b=b, t_f=t_f, t_w=t_w, r_r=r, r_f=0.0,
                                       alpha=math.degrees(math.atan(slope)), n_r=256)
    top = geom.geom.intersection(shapely.box(-1e3, h, 1e3, 3 * h))
    mine = green(FL.tapered_tee(h, b, t_f, t_w, r, slope).rings)
    assert mine.A == pytest.approx(top.area, rel=2e-5)
    assert mine.y_c + h == pytest.approx(top.centroid.y, rel=2e-5)


# ---------------------------------------------------------------- the compact working

def test_the_default_working_is_one_table_row_its_model_and_the_comparison(run):
    _, rec = rolled(run, "W18X50")
    kinds = [type(i).__name__ for i in rec.working.items]
    assert kinds.count("Figure") == 1 and kinds.count("Step") == 0
    titles = [i.title for i in rec.working.items if isinstance(i, Table)]
    assert any(t.startswith("Dimensions of the model") for t in titles)
    assert any(t.endswith("against the geometric model") for t in titles)
    assert not any(t.startswith("Parts table") for t in titles)
    # the comparison comes before the drawing
    cmp_at = max(k for k, i in enumerate(rec.working.items) if isinstance(i, Table))
    fig_at = next(k for k, i in enumerate(rec.working.items) if isinstance(i, Figure))
    assert cmp_at < fig_at


def test_detail_full_adds_the_models_parallel_axis_working_with_the_same_values(run):
    _, compact = rolled(run, "C10X20")
    _, full = rolled(run, "C10X20", ', detail="full"')
    assert any(isinstance(i, Table) and i.title.startswith("Parts table") for i in full.working.items)
    assert any(isinstance(i, Step) for i in full.working.items)
    for name in ("A", "I_x", "J", "C_w", "x_s", "r_o", "I_x_ref"):
        assert compact.fields[name].m_as(full.fields[name].units) == full.fields[name].magnitude


def test_a_reference_axis_is_traced_from_the_records_own_values(run):
    _, rec = rolled(run, "IPE 300", ", y_ref=0 mm")
    (step,) = [i for i in rec.working.items if isinstance(i, Step) and i.name == "I_x_ref"]
    f = rec.fields
    # parallel-axis theorem (common practice), with the table's I and A
    assert f["I_x_ref"].m_as("cm^4") == pytest.approx(8356 + 53.81 * 15.0**2, rel=1e-9)


# ---------------------------------------------------------------- cold-formed hollow sections (EN 10219-2)

@pytest.mark.parametrize("typed, found", [("CFRHS 150x100x6.3", "CFRHS 150x100x6.3"),
                                          ("cfrhs150X100X6,3", "CFRHS 150x100x6.3"),
                                          ("CFSHS 100x100x5", "CFSHS 100x100x5")])
def test_cold_formed_designations_of_any_size(typed, found):
    assert C.lookup(typed).designation == found


def test_a_square_cold_formed_section_has_equal_sides():
    assert C.lookup("CFSHS 100x80x5") is None


@pytest.mark.parametrize("t, ro_t", [(5.0, 2.0), (6.3, 2.5), (8.0, 2.5), (12.5, 3.0)])
def test_cold_formed_corner_radii_lie_mid_band_of_the_standards_tolerance(t, ro_t):
    # EN 10219-2 external corner profile: 1.6t–2.4t (t ≤ 6 mm), 2.0t–3.0t (6 < t ≤ 10 mm), 2.4t–3.6t (t > 10 mm);
    # the values for calculating properties are the middles, the inside radius one t less (# from memory, and
    # the tolerance bands as a stored public page quotes them)
    lo, hi = (1.6, 2.4) if t <= 6 else (2.0, 3.0) if t <= 10 else (2.4, 3.6)
    ro, ri = C.hollow_radii("EN 10219-2", t)
    assert ro == pytest.approx(ro_t * t) and ro / t == pytest.approx((lo + hi) / 2) and ri == pytest.approx(ro - t)


def test_a_cold_formed_rhs_is_the_product_standards_area_and_its_nominal_mass(run):
    _, rec = rolled(run, "CFRHS 150x100x6.3")
    t, B, H = 6.3, 100.0, 150.0
    ro, ri = 2.5 * t, 1.5 * t
    # EN 10219-2 Annex B: A = 2t(B + H − 2t) − (4 − π)(r_o² − r_i²); mass at 7.85 kg/dm³
    A = 2 * t * (B + H - 2 * t) - (4 - math.pi) * (ro**2 - ri**2)
    assert rec.fields["A"].m_as("mm^2") == pytest.approx(A, rel=1e-5)
    assert rec.fields["mass"].m_as("kg/m") == pytest.approx(7850 * A * 1e-6, rel=1e-5)
    assert rec.fields["A_m"].m_as("mm^2") > 0 and "EN 10219-2" in rec.fields["source"]


def test_an_impossible_cold_formed_size_is_a_located_error(run):
    (e,) = errors(run('s = section.rolled(designation="CFRHS 100x100x60")\n'))
    assert e.span.line == 1 and "wall" in e.message


# ---------------------------------------------------------------- the demo sheet, by hand

def test_the_catalogue_demo_sheets_stair_stringer_by_hand(run):
    from pathlib import Path

    text = (Path(__file__).parents[3] / "sheets" / "steel_catalogue_sections.calc").read_text(encoding="utf-8")
    r = run(text)
    assert not errors(r), r.diagnostics
    v = r.values
    # w = 1.35·0.6 + 1.5·1.8 = 3.51 kN/m; M = w·L²/8 = 3.51·3.2²/8 = 4.4928 kN·m (hand calculation)
    assert v["M_s"].m_as("kN*m") == pytest.approx(3.51 * 3.2**2 / 8, rel=1e-12)
    # W_el,y of UPN 200 = 191 cm³ (# from memory, producers' tables): M_el = 191e3 mm³ · 355 MPa ≈ 67.8 kN·m
    assert v["M_el"].m_as("kN*m") == pytest.approx(191e3 * 355 / 1e6, rel=0.005)
    # the platform beam's table values: IPE 300 W_pl,y = 628.4 cm³ → M_pl = 223.1 kN·m (EN 10365 row, as shipped)
    assert v["M_pl"].m_as("kN*m") == pytest.approx(628.4e3 * 355 / 1e6, rel=1e-9)


@pytest.mark.parametrize("typed, near", [("2L4X4X1/2X1/2", "2L4X4X1/2X3/8"), ("ST12X54", "ST12X53"),
                                         ("MT6X5.3", "MT6X5.4")])
def test_an_unknown_designation_of_a_new_family_names_its_nearest(run, typed, near):
    text = f's = section.rolled(designation="{typed}")\n'
    (e,) = errors(run(text))
    assert e.span.line == 1 and text[e.span.col - 1:].startswith("designation")
    assert near in e.hint


def test_upn_channels_can_be_ranked_by_weight_for_sizing():
    # the nominal mass of each UPN is ρ·A of its model (no table ships it): UPN 200 25.3 kg/m, UPN 400 71.8 kg/m
    # (DIN 1026-1, # from memory); the sizing search ranks the family lightest first
    from calcsheet.schedule.sizing import family_sections

    ranked = family_sections("UPN")
    assert ranked[0][0] == "UPN 50" and len(ranked) == 18
    masses = dict((name, m) for name, m, _ in ranked)
    assert masses["UPN 200"] == pytest.approx(25.3, rel=0.005) and masses["UPN 400"] == pytest.approx(71.8, rel=0.005)
    assert [m for _, m, _ in ranked] == sorted(m for _, m, _ in ranked)
