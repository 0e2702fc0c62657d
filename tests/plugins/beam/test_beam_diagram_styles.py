"""Beam diagrams: every combination drawn in its own style with a legend entry, the governing one marked; the
deflection figure marks the deflection its check uses (serviceability), not the ultimate peak."""
import re

import pytest

import calcsheet
from calcsheet.trace import Figure
from calcsheet_plugins.beam import diagrams

E, I, L, w = 200e9, 8.0e-5, 6.0, 10e3  # Pa, m^4, m, N/m


def _sheet(n_combos: int, deflection: str | None = None) -> str:
    combos = ", ".join(f'beam.combo(name="ULS {k + 1}", factors="{1.35 + 0.05 * k:.2f} G")' for k in range(n_combos))
    combos += ', beam.combo(name="SLS", factors="1.0 G")'
    extra = f', deflection="{deflection}"' if deflection else ""
    return (f'b = beam.solve(spans=[{L} m], supports="pinned, roller", loads=[beam.udl(w={w / 1e3} kN/m, case="G")], '
            f"combos=[{combos}], E=200 GPa, I=8.0e7 mm^4{extra})\n")


def _figures(text):
    r = calcsheet.run(text)
    assert not r.errors, [d.message for d in r.errors]
    return r, {f.caption.split(" of ")[0].split(";")[0]: f.svg for f in r.values["b"].working.items
               if isinstance(f, Figure)}


def _curve_styles(svg):
    out = []
    for tag in re.findall(r'<polyline [^>]*fill="none"[^>]*/>', svg):
        dash = re.search(r'stroke-dasharray="([^"]+)"', tag)
        out.append((re.search(r' stroke="([^"]+)"', tag).group(1), dash.group(1) if dash else None))
    return out


def test_styles_are_distinct_for_as_many_combinations_as_the_palette_allows():
    styles = {diagrams.curve_style(k) for k in range(diagrams.STYLES)}
    assert len(styles) == diagrams.STYLES >= 20


@pytest.mark.parametrize("n", [6, 11])
def test_each_combination_has_its_own_curve_style_and_legend_entry(n):
    _, figs = _figures(_sheet(n))
    svg = figs["Bending moment diagram"]
    styles = _curve_styles(svg)
    assert len(styles) == n + 1 and len(set(styles)) == n + 1  # a sixth (and eleventh) combination too
    for k in range(n):
        assert f">ULS {k + 1}" in svg
    # the largest factor governs the moment: its legend entry says so and its curve is drawn bold
    assert f">ULS {n} (governs)<" in svg
    assert svg.count("(governs)") == 1


def test_deflection_figure_marks_the_serviceability_value_the_check_uses():
    r, figs = _figures(_sheet(3, deflection="SLS"))
    svg = figs["Deflection diagram"]
    delta_sls = 5 * w * L**4 / (384 * E * I)  # simply supported, uniform load: 5wL⁴/(384EI), any mechanics text
    assert r.values["b"].fields["delta_gov"].m_as("mm") == pytest.approx(delta_sls * 1e3, rel=1e-9)
    mark = re.search(r">δ = ([\d.]+) mm at x = ([\d.]+) m \(SLS\), used by the deflection check<", svg)
    assert mark, svg
    assert float(mark.group(1)) == pytest.approx(delta_sls * 1e3, abs=0.05)
    assert float(mark.group(2)) == pytest.approx(L / 2, abs=0.01)
    # the ultimate peak (factor 1.45) is not what the figure marks: only the check's combinations are drawn
    assert "ULS" not in svg
    caption = next(f.caption for f in r.values["b"].working.items
                   if isinstance(f, Figure) and f.caption.startswith("Deflection"))
    assert "SLS" in caption


def test_without_a_named_deflection_combination_the_largest_is_marked_and_named():
    r, figs = _figures(_sheet(2))
    svg = figs["Deflection diagram"]
    peak = 1.40 * 5 * w * L**4 / (384 * E * I)  # the largest factor, 1.40 G
    mark = re.search(r">δ = ([\d.]+) mm at x = [\d.]+ m \(ULS 2\), used by the deflection check<", svg)
    assert mark and float(mark.group(1)) == pytest.approx(peak * 1e3, abs=0.05)
