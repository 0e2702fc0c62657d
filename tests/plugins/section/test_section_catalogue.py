"""section.rolled: published table rows, forgiving designations, and each row against its own geometric model."""
import math

import pytest

from calcsheet.trace import Table
from calcsheet_plugins.section import catalogue as C
from calcsheet_plugins.section import fillets as FL
from calcsheet_plugins.section import shapes as S
from calcsheet_plugins.section.properties import green

IN = 25.4


def errors(result):
    return [d for d in result.diagnostics if d.severity == "error"]


def warnings(result):
    return [d for d in result.diagnostics if d.severity == "warning"]


def model_value(cell: str, unit: str) -> float:
    """A model cell of the comparison table ("1.6883×10⁶ cm⁶") as a number in its printed unit."""
    number, printed = cell.rsplit(" ", 1)
    assert printed == unit
    if "×10" in number:
        mant, exp = number.split("×10")
        return float(mant) * 10 ** int(exp.translate(str.maketrans("⁰¹²³⁴⁵⁶⁷⁸⁹⁻", "0123456789-")))
    return float(number)


def rolled(run, designation):
    r = run(f's = section.rolled(designation="{designation}")\n')
    assert not errors(r), r.diagnostics
    return r, r.values["s"]


# ---------------------------------------------------------------- the done-when designations

@pytest.mark.parametrize("designation, warned", [("W18X50", None), ("IPE 300", None), ("HE 300 B", "C_w"),
                                                  ("HSS8X8X1/2", None), ("RHS 150x100x6.3", None)])
def test_the_designations_of_the_brief_build_with_table_and_model_side_by_side(run, designation, warned):
    r, rec = rolled(run, designation)
    (cmp,) = [it for it in rec.working.items if isinstance(it, Table) and it.title.endswith("geometric model")]
    assert designation in cmp.title
    props = [row[0] for row in cmp.rows]
    assert {"A", "I_x", "I_y", "S_x", "Z_x", "J"} <= set(props)
    assert all(row[3].endswith("%") for row in cmp.rows)
    assert any(isinstance(it, Table) and it.title.startswith("Dimensions of the model") for it in rec.working.items)
    assert rec.fields["source"] and rec.fields["designation"]
    found = [w.message for w in warnings(r) if "deviates" in w.message]
    if warned is None:
        assert not found
    else:
        # the HE 300 B I_w of the shipped table is 2.4 % below I_z·(h − t_f)²/4; the producers' tables give
        # 1688 ×10³ cm⁶ (# from memory), which the model reproduces
        (msg,) = found
        assert warned in msg
        assert rec.fields["C_w"].m_as("cm^6") == pytest.approx(1651e3)
        (row,) = [row for row in cmp.rows if row[0] == "C_w"]
        assert model_value(row[2], "cm⁶") == pytest.approx(1688e3, rel=3e-3)


# ---------------------------------------------------------------- spot rows against the published tables

def test_w18x50_is_the_published_row():
    # AISC Shapes Database v16.0, W18X50 (# from memory, matches the AISC Manual 16th ed. Table 1-1)
    e = C.lookup("W18X50")
    v = e.values
    assert v["A"] == pytest.approx(14.7 * IN**2)
    assert v["d"] == pytest.approx(18.0 * IN) and v["b_f"] == pytest.approx(7.50 * IN)
    assert v["t_f"] == pytest.approx(0.570 * IN) and v["t_w"] == pytest.approx(0.355 * IN)
    assert v["I_x"] == pytest.approx(800 * IN**4) and v["S_x"] == pytest.approx(88.9 * IN**3)
    assert v["Z_x"] == pytest.approx(101 * IN**3) and v["I_y"] == pytest.approx(40.1 * IN**4)
    assert v["J"] == pytest.approx(1.24 * IN**4) and v["C_w"] == pytest.approx(3040 * IN**6)
    assert v["r_ts"] == pytest.approx(1.98 * IN) and v["h_o"] == pytest.approx(17.4 * IN)
    assert v["mass"] == pytest.approx(50 * 0.45359237 / 0.3048)


def test_hss8x8x1_2_is_the_published_row():
    # AISC Shapes Database v16.0, HSS8X8X1/2: t_des = 0.93·t_nom = 0.465 in (AISC 360-16 B4.2) (# from memory)
    v = C.lookup("HSS8X8X1/2").values
    assert v["t"] == pytest.approx(0.465 * IN)
    assert v["A"] == pytest.approx(13.5 * IN**2) and v["I_x"] == pytest.approx(125 * IN**4)
    assert v["S_x"] == pytest.approx(31.2 * IN**3) and v["J"] == pytest.approx(204 * IN**4)


def test_ipe_300_is_the_published_row():
    # EN 10365:2017 dimensions; properties as in the producers' tables (# from memory: ArcelorMittal sales programme)
    v = C.lookup("IPE 300").values
    assert (v["d"], v["b_f"], v["t_w"], v["t_f"], v["r"]) == (300, 150, 7.1, 10.7, 15)
    assert v["A"] == pytest.approx(53.81e2) and v["I_x"] == pytest.approx(8356e4)
    assert v["S_x"] == pytest.approx(557.1e3) and v["Z_x"] == pytest.approx(628.4e3)
    assert v["I_y"] == pytest.approx(603.8e4) and v["A_vz"] == pytest.approx(25.68e2)


def test_he_300_b_is_the_published_row():
    # EN 10365:2017 dimensions (# from memory: A 149.1 cm², I_y 25170 cm⁴, W_pl,y 1869 cm³, I_z 8563 cm⁴)
    v = C.lookup("HE 300 B").values
    assert (v["d"], v["b_f"], v["t_w"], v["t_f"], v["r"]) == (300, 300, 11, 19, 27)
    assert v["A"] == pytest.approx(149.1e2, rel=1e-3) and v["I_x"] == pytest.approx(25170e4)
    assert v["Z_x"] == pytest.approx(1869e3) and v["I_y"] == pytest.approx(8563e4)


def test_chs_168_3x6_3_is_the_published_row():
    # EN 10210-2:2019, CHS 168.3 × 6.3 (# from memory: A 32.1 cm², I 1053 cm⁴, W_el 125 cm³, W_pl 165 cm³)
    v = C.lookup("CHS 168.3x6.3").values
    assert v["A"] == pytest.approx(32.1e2, rel=2e-3) and v["I_x"] == pytest.approx(1053e4)
    assert v["S_x"] == pytest.approx(125e3) and v["Z_x"] == pytest.approx(165e3)


# ---------------------------------------------------------------- forgiving designations

@pytest.mark.parametrize("typed, found", [
    ("W18x50", "W18X50"), ("W 18X50", "W18X50"), ("w18x50", "W18X50"),
    ("IPE300", "IPE 300"), ("ipe 300", "IPE 300"),
    ("HE 300 B", "HE 300 B"), ("HEB300", "HE 300 B"), ("HEB 300", "HE 300 B"), ("HE300B", "HE 300 B"),
    ("HSS8X8X1/2", "HSS8X8X1/2"), ("HSS 8x8x1/2", "HSS8X8X1/2"),
    ("RHS 150x100x6.3", "RHS 150x100x6.3"), ("RHS150X100X6.3", "RHS 150x100x6.3"), ("RHS 150 x 100 x 6,3", "RHS 150x100x6.3"),
    ("L4X4X1/2", "L4X4X1/2"), ("L12X12X1-3/8", "L12X12X1-3/8"), ("Pipe3-1/2STD", "Pipe3-1/2STD"),
    ("M12.5X12.4", "M12.5X12.4"), ("HSS6.625X0.280", "HSS6.625X0.280"), ("WT9X25", "WT9X25"),
])
def test_designations_are_matched_forgivingly(typed, found):
    e = C.lookup(typed)
    assert e is not None and e.designation == found


def test_an_unknown_designation_is_a_located_error_naming_the_nearest(run):
    text = 's = section.rolled(designation="W18X51")\n'
    (e,) = errors(run(text))
    assert "W18X51" in e.message
    assert e.span.line == 1 and text[e.span.col - 1:].startswith("designation")
    assert "W18X50" in (e.hint or "")


# ---------------------------------------------------------------- every family against its geometric model

def _model(e):
    g = e.dims
    if e.model == "I":
        return FL.ishape(g["h"], g["b"], g["t_f"], g["t_w"], g["r"])
    if e.model == "I-tapered":
        return FL.tapered_ishape(g["h"], g["b"], g["t_f"], g["t_w"], g["r"], g["slope"], g.get("r_toe", 0.0))
    if e.model == "C-tapered":
        return FL.tapered_channel(g["h"], g["b"], g["t_f"], g["t_w"], g["r"], g["slope"], g.get("r_toe", 0.0),
                                  g.get("u"))
    if e.model == "T-tapered":
        return FL.tapered_tee(g["h"], g["b"], g["t_f"], g["t_w"], g["r"], g["slope"], r_toe=g.get("r_toe", 0.0))
    if e.model == "C":
        return FL.channel(g["h"], g["b"], g["t_f"], g["t_w"], g["r"])
    if e.model == "T":
        return FL.tee(g["h"], g["b"], g["t_f"], g["t_w"], g["r"])
    if e.model == "L":
        return FL.angle(g["h"], g["b"], g["t"], g["r"])
    if e.model.startswith("box"):
        ro, ri = C.hollow_radii("AISC" if e.model == "box-aisc" else "EN 10210-2", g["t"])
        return FL.box(g["b"], g["h"], g["t"], ro, ri)
    return S.tube(g["d"], g["t"])


# family -> (largest deviation of A, I_x, I_y allowed, share of rows within 1 %): the parallel-flange and hollow
# families reproduce their tables to the tables' own rounding; angles lack their toe radii; AISC Pipe areas
# are not all consistent with the tabulated OD and t_des (Pipe10STD: −3.3 %). S, C, MC and M take root and toe
# radii (and an MC its slope) derived from the table's own A, I_x, I_y (and x̄), so these three agree to the fit's
# residual (aisc_v16_derived.csv, at most 1.4 %); ST and MT take the radii of the S or M they are cut from, so for
# them A, I_x and I_y are an independent check (ST1.5X2.85: I_x +3.5 %, the worst).
FAMILIES = {"S": (0.01, 1.0), "C": (0.015, 0.9), "MC": (0.01, 1.0), "M": (0.01, 1.0), "ST": (0.035, 0.6),
            "MT": (0.01, 1.0), "W": (0.02, 0.85), "HP": (0.035, 0.75), "WT": (0.02, 0.8), "HSS": (0.01, 1.0),
            "HSS_R": (0.02, 0.9), "PIPE": (0.035, 0.7), "L": (0.035, 0.5), "IPE": (0.01, 1.0), "HEA": (0.01, 1.0),
            "HEB": (0.01, 1.0), "HEM": (0.01, 1.0), "RHS": (0.01, 1.0), "SHS": (0.01, 1.0), "CHS": (0.01, 1.0)}


@pytest.mark.parametrize("family", sorted(FAMILIES))
def test_every_family_agrees_with_its_geometric_model(family):
    worst_allowed, share = FAMILIES[family]
    rows = [e for e in C.entries().values() if e.family == family][::4]  # every fourth row keeps the test fast
    assert rows
    within = 0
    for e in rows:
        b = green(_model(e).rings)
        devs = [abs(m / e.values[n] - 1) for n, m in (("A", b.A), ("I_x", b.I_x), ("I_y", b.I_y)) if n in e.values]
        assert max(devs) <= worst_allowed, (e.designation, devs)
        within += max(devs) <= 0.01
    assert within >= share * len(rows)


def test_a_deviating_model_is_a_warning_at_the_designation(run):
    # an AISC C channel's tabulated C_w is the parallel-flange closed form (AISC Design Guide 9), about 20 % above
    # the warping analysis of its tapered flanges (test_section_sectorial.py): the package warns about C_w only
    r = run('s = section.rolled(designation="C10X15.3")\n')
    assert not errors(r)
    (w,) = [w for w in warnings(r) if "deviates" in w.message]
    assert "C_w" in w.message and "I_y" not in w.message and "A " not in w.message
    assert r.source[w.span.col - 1:].startswith(('designation', '"C10X15.3"'))  # located at the designation


def test_the_record_takes_the_tables_values_and_the_european_aliases(run):
    _, rec = rolled(run, "IPE 300")
    f = rec.fields
    assert f["I_x"].m_as("cm^4") == pytest.approx(8356)
    assert f["W_pl_y"].m_as("cm^3") == pytest.approx(628.4) and f["I_z"].m_as("cm^4") == pytest.approx(603.8)
    assert f["i_z"].m_as("cm") == pytest.approx(3.35) and f["I_t"].m_as("cm^4") == f["J"].m_as("cm^4")
    assert f["h"].m_as("mm") == 300 and f["b"].m_as("mm") == 150 and f["r"].m_as("mm") == 15


def test_hollow_section_corner_radii_follow_the_product_standards():
    # EN 10210-2: 1.5 t outside, 1.0 t inside; EN 10219-2: 2 t / 2.5 t / 3 t outside, inside one t less;
    # AISC: 2 t_des outside (# from memory, each)
    assert C.hollow_radii("EN 10210-2", 6.3) == pytest.approx((9.45, 6.3))
    assert C.hollow_radii("EN 10219-2", 5.0) == pytest.approx((10.0, 5.0))
    assert C.hollow_radii("EN 10219-2", 8.0) == pytest.approx((20.0, 12.0))
    assert C.hollow_radii("EN 10219-2", 12.0) == pytest.approx((36.0, 24.0))
    assert C.hollow_radii("AISC", 0.465 * IN) == pytest.approx((0.93 * IN, 0.465 * IN))


def test_rhs_area_is_the_product_standards_formula():
    # EN 10210-2 Annex: A = 2t(B + H − 2t) − (4 − π)(r_o² − r_i²)
    t, B, H = 6.3, 100.0, 150.0
    ro, ri = 1.5 * t, t
    b = green(FL.box(B, H, t, ro, ri).rings)
    assert b.A == pytest.approx(2 * t * (B + H - 2 * t) - (4 - math.pi) * (ro**2 - ri**2), rel=1e-5)


def test_one_section_of_every_family_builds_in_either_unit_system(run):
    names = ["W18X50", "M12X11.8", "S12X35", "HP12X53", "C10X20", "MC12X31", "L6X4X1/2", "WT9X25", "HSS8X4X1/4",
             "HSS6.625X0.280", "Pipe4STD", "IPE 200", "HE 200 A", "HE 300 B", "HE 300 M", "CHS 168.3x6.3",
             "SHS 100x100x5", "RHS 150x100x6.3"]
    body = "\n".join(f's{k} = section.rolled(designation="{n}")' for k, n in enumerate(names))
    for units in ("SI", "US"):
        r = run(f"---\nunits: {units}\n---\n{body}\n")
        assert not errors(r), r.diagnostics
        for k, n in enumerate(names):
            f = r.values[f"s{k}"].fields
            assert f["designation"] == C.lookup(n).designation
            assert f["A"].m_as("mm^2") > 0 and f["I_x"].m_as("mm^4") > 0


def test_an_overlong_designation_is_refused_before_any_search(run):
    (e,) = errors(run(f's = section.rolled(designation="{"W" * 5000}")\n'))
    assert "short name" in e.message


def test_a_catalogue_section_is_a_part_of_a_built_up_section(run):
    # a W18X50 with a 200 × 12 mm cover plate on its top flange: the parts' own outlines (fillets included) are
    # carried by their records
    r = run("""
        w = section.rolled(designation="W18X50")
        p = section.rectangle(b=200 mm, h=12 mm, detail="brief")
        s = section.built_up(parts=[section.part(shape=w, anchor="bottom-centre"),
                                    section.part(shape=p, y=w.depth, anchor="bottom-centre")])
    """)
    assert not errors(r), r.diagnostics
    A_model = r.values["s"].fields["A"].m_as("mm^2") - 200 * 12
    assert A_model == pytest.approx(14.7 * IN**2, rel=0.01)  # the W18X50's own model, within its table


def test_the_shear_centre_reproduces_the_published_polar_radius(run):
    # AISC Shapes Database v16.0 tabulates r̄_o = √(x_o² + y_o² + (I_x + I_y)/A) (AISC 360-16 E4-9): our shear
    # centres (tee and angle mid-line intersections; channels by the sectorial integration, which the FE oracle
    # confirms) reproduce it within 0.5 % here; the table's channel e_o is the parallel-flange closed form, so
    # for tapered channels the two part by up to 3 % (C3X6: −2.8 %)
    names = ["C10X20", "MC12X31", "L6X4X1/2", "WT9X25"]
    body = "\n".join(f's{k} = section.rolled(designation="{n}")' for k, n in enumerate(names))
    r = run(body + "\n")
    assert not errors(r), r.diagnostics
    for k, n in enumerate(names):
        rec = r.values[f"s{k}"]
        (cmp,) = [it for it in rec.working.items if isinstance(it, Table) and it.title.endswith("geometric model")]
        (row,) = [row for row in cmp.rows if row[0] == "r_o"]
        assert abs(float(row[3].split()[0])) < (1.0 if n.startswith(("C", "MC")) else 0.5), (n, row)


# ---------------------------------------------------------------- the deviation rule of the comparison

# the catalogue issue's rule: a deviation of the model from the table over 1 % is a warning, over 2 % for J,
# C_w (and r_o, which follows from them); the rows span families with and without deviations beyond it
SPEC_TOLERANCE = {"A": 1, "I_x": 1, "I_y": 1, "S_x": 1, "S_y": 1, "Z_x": 1, "Z_y": 1, "r_x": 1, "r_y": 1,
                  "J": 2, "C_w": 2, "r_o": 2}


@pytest.mark.parametrize("designation", ["C3X4.1", "C15X33.9", "MC18X58", "S24X121", "ST12X60.5", "W18X50",
                                         "L6X4X1/2", "HE 300 B"])
def test_a_deviation_beyond_its_tolerance_is_warned_and_none_within_it(run, designation):
    r, rec = rolled(run, designation)
    (cmp,) = [it for it in rec.working.items if isinstance(it, Table) and it.title.endswith("geometric model")]
    beyond, at_the_edge = set(), set()
    for name, _table, _model, dev, tol in cmp.rows:
        assert tol == f"{SPEC_TOLERANCE[name]} %", (name, tol)
        printed = abs(float(dev.rstrip(" %")))
        if abs(printed - SPEC_TOLERANCE[name]) < 0.006:  # "+1.00 %": the two printed decimals cannot tell
            at_the_edge.add(name)
        elif printed > SPEC_TOLERANCE[name]:
            beyond.add(name)
    found = [w.message for w in warnings(r) if "deviates" in w.message]
    warned = set() if not found else {part.split()[0] for part in found[0].split(": ", 1)[1].split(", ")}
    assert warned - at_the_edge == beyond
