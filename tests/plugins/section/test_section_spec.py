"""Section shapes at the edges of what they accept: thick walls, walls that close the void."""
import pytest

import calcsheet


def make(call):
    return calcsheet.run(f"s = {call}\n")


@pytest.mark.parametrize("call, I_x", [
    # hollow rectangle: I = (B·H³ − b·h³)/12 (any section handbook — common practice)
    ("section.box(b=100 mm, h=120 mm, t=40 mm)", (100 * 120**3 - 20 * 40**3) / 12),
    ("section.box(b=100 mm, h=120 mm, t_f=10 mm, t_w=45 mm)", (100 * 120**3 - 10 * 100**3) / 12),
    ("section.box(b=100 mm, h=120 mm, t_f=55 mm, t_w=10 mm)", (100 * 120**3 - 80 * 10**3) / 12),
])
def test_thick_walls_short_of_closing_the_void_are_accepted(call, I_x):
    r = make(call)
    assert r.ok, r.format_diagnostics()
    assert r.values["s"].fields["I_x"].m_as("mm^4") == pytest.approx(I_x, rel=1e-12)


@pytest.mark.parametrize("call, param", [
    ("section.box(b=100 mm, h=120 mm, t=50 mm)", "t"),
    ("section.box(b=100 mm, h=120 mm, t_f=10 mm, t_w=50 mm)", "t_w"),
    ("section.box(b=100 mm, h=120 mm, t_f=60 mm, t_w=10 mm)", "t_f"),
])
def test_walls_that_close_the_void_are_refused_naming_the_wall(call, param):
    r = make(call)
    assert not r.ok and f"wall {param} =" in r.errors[0].message


def test_the_product_of_area_table_splits_own_products_from_transfer_terms():
    from calcsheet.trace import Table

    r = make("section.angle(h=150 mm, b=90 mm, t=10 mm)")
    assert r.ok
    rec = r.values["s"]
    table = next(i for i in rec.working.items if isinstance(i, Table) and "product of area" in i.title)
    own = [row[1].m_as("mm^4") for row in table.rows]
    transfer = [row[4].m_as("mm^4") for row in table.rows]
    # the angle's parts are rectangles, each symmetric about its own axes: no product of its own
    assert own == pytest.approx([0.0] * len(own), abs=1e-6)
    # parallel-axis theorem: I_xy = Σ I_o,xy + Σ A·d_x·d_y
    assert sum(own) + sum(transfer) == pytest.approx(rec.fields["I_xy"].m_as("mm^4"), rel=1e-12)
