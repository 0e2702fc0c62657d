"""Units: one registry, exact trade units, a curated vocabulary."""
import numpy as np
import pint
import pytest

from calcsheet import units as U
from calcsheet.errors import UnknownUnitError


def q(v, name):
    return U.registry().Quantity(v, U.unit_named(name))


def test_one_registry_for_the_process():
    assert U.registry() is U.registry()


# NIST Special Publication 811 (2008), Appendix B: 1 in = 2.54 cm exactly; 1 lbf = 4.448 221 615 260 5 N.
def test_inch_is_exactly_25_4_mm():
    assert q(1, "in").m_as("mm") == pytest.approx(25.4, rel=1e-15)
    assert q(1, "ft").m_as("mm") == pytest.approx(304.8, rel=1e-15)


def test_pound_force_and_kip():
    assert q(1, "lbf").m_as("N") == pytest.approx(4.4482216152605, rel=1e-14)
    assert q(1, "kip").m_as("lbf") == pytest.approx(1000.0, rel=1e-15)  # common practice: 1 kip = 1000 lbf


def test_psi_and_ksi():
    # NIST SP 811: 1 psi = 6.894 757 kPa (rounded); from the exact parts lbf/in²:
    assert q(1, "psi").m_as("Pa") == pytest.approx(4.4482216152605 / 0.0254**2, rel=1e-12)
    assert q(1, "ksi").m_as("psi") == pytest.approx(1000.0, rel=1e-15)


@pytest.mark.parametrize("name, exact_si", [
    ("psf", 4.4482216152605 / 0.3048**2),          # lbf/ft² in Pa
    ("ksf", 1000 * 4.4482216152605 / 0.3048**2),   # kip/ft² in Pa
    ("plf", 4.4482216152605 / 0.3048),             # lbf/ft in N/m
    ("klf", 1000 * 4.4482216152605 / 0.3048),      # kip/ft in N/m
    ("pcf", 4.4482216152605 / 0.3048**3),          # lbf/ft³ in N/m³
])
def test_trade_units_pint_lacks_are_exact(name, exact_si):
    unit = {"psf": "Pa", "ksf": "Pa", "plf": "N/m", "klf": "N/m", "pcf": "N/m^3"}[name]
    from calcsheet.units import split_unit

    assert q(1, name).to(U.build_unit(split_unit(unit))).magnitude == pytest.approx(exact_si, rel=1e-12)


@pytest.mark.parametrize("bad, hint", [("kNm", "kN*m"), ("lb", "lbf"), ("Mpa", "MPa"), ("ton", "tonne")])
def test_surprising_spellings_are_refused_with_a_hint(bad, hint):
    with pytest.raises(UnknownUnitError) as exc:
        U.unit_named(bad)
    assert hint in exc.value.hint


def test_unknown_unit_suggests_a_close_one():
    with pytest.raises(UnknownUnitError) as exc:
        U.unit_named("kPaa")
    assert "kPa" in exc.value.hint


def test_angles_have_their_own_dimension():
    assert U.dim_of(q(30, "deg")) == U.ANGLE
    assert U.dim_of(q(1, "rad")) == U.ANGLE
    assert U.dim_of(U.registry().Quantity(0.5)) == U.DIMENSIONLESS


def test_describe_dim_reads_like_an_engineer():
    from calcsheet.units import split_unit

    def d(text):
        return U.describe_dim(U.dim_of(U.build_unit(split_unit(text))))

    assert d("kN/m") == "force/length (line load)"
    assert d("kPa") == "pressure (stress, area load)"
    assert d("kN*m") == "force × length (moment)"
    assert d("mm^4") == "length⁴ (second moment of area)"


def test_parse_dimension_of_plugin_declarations():
    assert U.parse_dimension("[length]") == (("[length]", 1),)
    assert U.parse_dimension("[force]/[length]") == (("[mass]", 1), ("[time]", -2))
    assert U.parse_dimension("[angle]") == U.ANGLE
    assert U.parse_dimension("") == U.DIMENSIONLESS


def test_split_unit():
    from calcsheet.units import split_unit

    assert split_unit("kN*m/s^2") == (("kN", 1.0), ("m", 1.0), ("s", -2.0))
    assert split_unit("mm⁴") == (("mm", 4.0),)


def test_declared_unit_text_is_read_here_and_bad_text_is_a_located_syntax_error():
    from calcsheet.errors import SheetSyntaxError, Span
    from calcsheet.units import parse_unit_text

    assert parse_unit_text(" kN*m ") == (("kN", 1.0), ("m", 1.0))
    assert parse_unit_text("N/mm^2") == (("N", 1.0), ("mm", -2.0))
    assert parse_unit_text("1") == parse_unit_text("-") == ()
    span = Span(3, 5, 3, 9)
    with pytest.raises(SheetSyntaxError) as exc:
        parse_unit_text("kN 2", span)
    assert exc.value.span == span and "not a unit" in exc.value.message


@pytest.mark.parametrize("value, src, dst", [
    (1.2, "kN/m", "N/mm"), (7.5, "kN*m", "N*mm"), (0.3, "m", "mm"), (12.0, "ft", "m"), (3.3, "kip*ft", "kN*m"),
    (250.0, "MPa", "psi"), (1e-7, "mm^4", "m^4"), (2.0, "kPa*m", "kN/m"), (45.0, "deg", "rad"),
    (5.0, "percent", ""), (1.0, "lbf/in^2", "ksi"), (9.81, "m/s^2", "ft/s^2"),
])
def test_convert_gives_exactly_what_pint_gives(value, src, dst):
    reg = U.registry()
    q = reg.Quantity(value, reg.Unit(src))
    for _ in range(2):  # the first asks pint for the factor, the second reuses it
        got, want = U.convert(q, reg.Unit(dst)), q.to(reg.Unit(dst))
        assert got.magnitude == want.magnitude and got.units == want.units
    arr = reg.Quantity(np.array([value, 2 * value]), reg.Unit(src))
    assert np.array_equal(U.convert(arr, reg.Unit(dst)).magnitude, arr.to(reg.Unit(dst)).magnitude)


def test_convert_leaves_temperatures_on_a_scale_to_pint_and_refuses_another_dimension():
    reg = U.registry()
    t = reg.Quantity(20.0, reg.Unit("degC"))
    assert U.convert(t, reg.Unit("degF")).magnitude == pytest.approx(68.0)  # 20 °C = 68 °F (common practice)
    assert U.convert(t, reg.Unit("K")).magnitude == pytest.approx(293.15)
    with pytest.raises(pint.DimensionalityError):
        U.convert(reg.Quantity(1.0, reg.Unit("m")), reg.Unit("s"))


def test_convert_to_units_equal_to_its_own_gives_the_quantity_itself():
    reg = U.registry()
    m = reg.Unit("m")
    q2 = reg.Quantity(4.0, m**2)
    for _ in range(2):  # the first meeting of the pair decides; the second is remembered
        assert U.convert(q2, m**2.0) is q2 and U.convert(q2, (m**2)._units) is q2


def test_the_conversion_memory_stays_bounded_and_answers_alike_after_it_starts_again():
    reg = U.registry()
    q = reg.Quantity(1500.0, reg.Unit("mm"))
    first = U.convert(q, reg.Unit("m"))
    for i in range(U._KEEP + 5):  # new containers each time: each a pair of its own
        U.convert(reg.Quantity(1.0, reg.Unit("mm")._units * reg.Unit("s")._units), reg.Unit("m") * reg.Unit("s"))
    assert len(U._CONVERSIONS) <= U._KEEP
    again = U.convert(q, reg.Unit("m"))
    assert again.magnitude == first.magnitude == q.to("m").magnitude and again.units == first.units


def test_quantity_makes_what_pints_constructor_makes():
    reg = U.registry()
    units = U.build_unit((("kN", 1.0), ("m", -1.0)))._units
    fast, slow = U.quantity(2.5, units), reg.Quantity(2.5, units)
    assert type(fast) is type(slow) and vars(fast) == vars(slow)
    assert fast == slow and f"{fast:~P}" == f"{slow:~P}" and fast.to("N/mm").magnitude == slow.to("N/mm").magnitude


@pytest.mark.parametrize("text, plain", [
    ("kN*m", True), ("mm^4", True), ("deg", True), ("%", True), ("degC", False), ("degF", False),
])
def test_multiplicative_says_which_units_pint_computes_with_by_plain_multiplication(text, plain):
    assert U.multiplicative(U.build_unit(U.split_unit(text))._units) is plain
    assert U.multiplicative(U.registry().Unit("delta_degC")._units) is False  # pint's sums treat it apart


def test_units_op_is_pints_units_arithmetic():
    reg = U.registry()
    a, b = reg.Unit("kN")._units, (reg.Unit("m") ** 2.0)._units
    for _ in range(2):
        assert U.units_op("*", a, b) == a * b and U.units_op("/", a, b) == a / b
        assert U.units_op("inv", b, None) == 1 / b and U.units_op("^", b, 0.5) == b**0.5
        assert dict(U.units_op("^", b, 0.5)) == {"meter": 1.0}
