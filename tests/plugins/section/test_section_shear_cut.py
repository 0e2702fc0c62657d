"""section.Q_at: the first moment and width at any level; the modular ratio of a transformed section."""
import pytest


def errors(result):
    return [d for d in result.diagnostics if d.severity == "error"]


def test_q_at_a_level_of_a_rectangle_is_the_textbook_value(run):
    # rectangle b × h, cut at y above the base: Q = b·(h − y)·(y + (h − y)/2 − h/2) = b/2·(h²/4 − (y − h/2)²)
    r = run("""
        s = section.rectangle(b=100 mm, h=200 mm)
        c = section.Q_at(shape=s, y=150 mm)
        n = section.Q_at(shape=s, y=100 mm)
    """)
    assert not errors(r), r.diagnostics
    c, n = r.values["c"].fields, r.values["n"].fields
    assert c["Q"].m_as("mm^3") == pytest.approx(100 / 2 * (200**2 / 4 - 50**2), rel=1e-12)
    assert c["t"].m_as("mm") == pytest.approx(100)
    assert n["Q"].m_as("mm^3") == pytest.approx(r.values["s"].fields["Q_x"].m_as("mm^3"), rel=1e-12)


def test_q_at_the_flange_web_junction_of_an_I(run):
    # at the underside of the top flange: Q = b·t_f·(h/2 − t_f/2), t the web (common practice)
    r = run("""
        s = section.ishape(h=300 mm, b=150 mm, t_f=10 mm, t_w=7 mm)
        c = section.Q_at(shape=s, y=290 mm)
    """)
    assert not errors(r), r.diagnostics
    c = r.values["c"].fields
    assert c["Q"].m_as("mm^3") == pytest.approx(150 * 10 * (150 - 5), rel=1e-12)
    assert c["t"].m_as("mm") == pytest.approx(7)


def test_a_cut_outside_the_section_is_refused_at_y(run):
    text = "s = section.rectangle(b=100 mm, h=200 mm)\nc = section.Q_at(shape=s, y=250 mm)\n"
    (e,) = errors(run(text))
    assert "inside the section" in e.message and e.span.line == 2


def test_a_transformed_section_carries_its_modular_ratio(run):
    r = run("""
        a = section.rectangle(b=100 mm, h=10 mm)
        s = section.built_up(parts=[section.part(shape=a, E=200 GPa), section.part(shape=a, y=10 mm, E=10 GPa)])
    """)
    assert not errors(r), r.diagnostics
    f = r.values["s"].fields
    assert f["E_ref"].m_as("GPa") == pytest.approx(200)
    assert f["n_max"].m_as("") == pytest.approx(1.0)  # the stiffer part is the reference: n = 1 and 0.05
    r = run("""
        a = section.rectangle(b=100 mm, h=10 mm)
        s = section.built_up(parts=[section.part(shape=a, E=10 GPa), section.part(shape=a, y=10 mm, E=200 GPa)])
    """)
    assert r.values["s"].fields["n_max"].m_as("") == pytest.approx(20.0)  # n = E_steel/E_timber (common practice)


def test_q_at_the_fillet_toe_of_a_catalogue_I_against_shapely(run):
    import numpy as np
    import shapely

    r = run("""
        s = section.rolled(designation="IPE 300")
        c = section.Q_at(shape=s, y=s.h - s.t_f - s.r)
    """)
    assert not errors(r), r.diagnostics
    ring = r.values["s"].payload.rings[0]
    poly = shapely.Polygon(np.column_stack([ring.x, ring.y]))
    y = 300 - 10.7 - 15
    above = poly.intersection(shapely.box(-1, y, 200, 400))
    q = above.area * (above.centroid.y - poly.centroid.y)  # Q = A'·ȳ' (shapely area and centroids)
    f = r.values["c"].fields
    assert f["Q"].m_as("mm^3") == pytest.approx(q, rel=1e-9)
    assert f["t"].m_as("mm") == pytest.approx(7.1, rel=1e-6)  # the web, below the fillets
