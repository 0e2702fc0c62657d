"""The section working prints round-off dust as 0 and no "mass = 0" when no density (material) was given."""
import pytest

import calcsheet
from calcsheet.trace import Step, Table
from calcsheet import units as U
from calcsheet_plugins.section import report


def _items(r, name):
    return r.values[name].working.items


@pytest.fixture(scope="module")
def run():
    r = calcsheet.run('g = section.ishape(h=16 in, b=7 in, t_f=0.5 in, t_w=0.3 in, detail="brief")\n'
                      'f = section.rolled(designation="W21X50", detail="full")\n'  # the full working: the compact default shows the table row
                      'm = section.rectangle(b=100 mm, h=200 mm, rho=7850 kg/m^3)\n')
    assert not r.errors, [d.message for d in r.errors]
    return r


@pytest.mark.parametrize("name", ["g", "f"])
def test_a_doubly_symmetric_sections_shear_centre_offset_is_exactly_zero(run, name):
    # a doubly symmetric section's shear centre is its centroid (common practice): x_0 = y_0 = 0, not 1e-14 mm
    f = run.values[name].fields
    assert f["x_0"].m_as("mm") == 0.0 and f["y_0"].m_as("mm") == 0.0
    for item in _items(run, name):
        cells = [c for row in item.rows for c in row] if isinstance(item, Table) else \
            [item.value] if isinstance(item, Step) else []
        for c in cells:
            if hasattr(c, "dimensionality") and dict(c.dimensionality) == {"[length]": 1}:
                assert c.m_as("mm") == 0.0 or abs(c.m_as("mm")) > 1e-9 * 406


def test_without_a_density_the_mass_step_says_no_material(run):
    for name in ("g", "f"):
        steps = [i for i in _items(run, name) if isinstance(i, Step) and i.name == "mass"]
        brief = [i for i in _items(run, name) if isinstance(i, Table) and i.title == "Further properties"]
        assert all("no material" in s.description for s in steps)
        assert steps or brief  # full: a step that says so; brief: the listed value
    # with a density the mass is worked: ρ·A = 7850 kg/m³ × 0.02 m² = 157 kg/m
    step = next(i for i in _items(run, "m") if isinstance(i, Step) and i.name == "mass")
    assert step.value.m_as("kg/m") == pytest.approx(157.0)


def test_the_noise_tolerance_is_relative_to_the_section_and_the_power_of_length():
    Q = U.registry().Quantity
    size = 300.0  # mm
    assert report._noise_free(Q(1.4e-14, "mm"), size).m_as("mm") == 0.0
    assert report._noise_free(Q(-4.8e-7, "mm^4"), size).m_as("mm^4") == 0.0  # 1e-9 · 300⁴ = 8.1 mm⁴
    assert report._noise_free(Q(1e-3, "mm"), size).m_as("mm") == 1e-3  # a real (small) dimension stays
    assert report._noise_free(Q(20.0, "mm^4"), size).m_as("mm^4") == 20.0
    assert report._noise_free(Q(1e-15, "kg/m"), size).m_as("kg/m") == 1e-15  # not a length power: untouched


@pytest.mark.parametrize("value, unit", [(1.0, "mm^4"), (-5.0, "mm^4"), (5e-5, "mm^2"), (2e-2, "mm^3")])
def test_the_noise_bound_grows_with_the_power_of_length_not_with_the_power_itself(value, unit):
    # NOISE·D^k with D = 300 mm: 8.1 mm⁴, 9e-5 mm², 2.7e-2 mm³ — each value here is below its bound (dust);
    # a bound of NOISE·D·k (1.2e-6 mm⁴ …) would keep it
    Q = U.registry().Quantity
    assert report._noise_free(Q(value, unit), 300.0).m_as(unit) == 0.0
