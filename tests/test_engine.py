"""Evaluation: values, the dependency graph, and every error with its place."""
import math

import pint
import pytest

import calcsheet
from calcsheet.plugin import Field, Namespace, Param, PluginRegistry



def codes(result):
    return [(d.code, d.span.line, d.span.col) for d in result.errors]


def test_values_are_pint_quantities_in_their_display_units(run):
    r = run("""
        s = 0.8 m
        w_D = 0.65 kPa * s
        w [kN/m] = 1.2*w_D
        L = 6.0 m
        M [kN*m] = w*L^2/8
    """)
    assert r.ok, r.format_diagnostics()
    # hand calculation: w = 1.2 × 0.65 kN/m² × 0.8 m = 0.624 kN/m; M = wL²/8 = 0.624 × 36 / 8 = 2.808 kN·m
    assert r.values["w"].m_as("kN/m") == pytest.approx(0.624)
    assert r.values["M"].m_as("kN*m") == pytest.approx(2.808)
    assert str(r.values["M"].units) in ("kilonewton * meter", "kN * m")


def test_dependency_graph(run):
    r = run("""
        a = 1 m
        b = 2 m
        c = a + b
        d = c * 2
        check d <= 10 m
    """)
    assert r.precedents["c"] == ["a", "b"]
    assert r.dependents["a"] == ["c"]
    assert r.resolution.downstream("a") == ["c", "d", "check@5"]
    assert r.inputs == ["a", "b"]


def test_checks_record_ratio_and_status(run):
    r = run("""
        s = 123 MPa
        f = 150 MPa
        check s <= f
        check f >= 200 MPa
    """)
    c1, c2 = r.checks
    assert c1.ok and c1.ratio == pytest.approx(123 / 150)
    assert not c2.ok and c2.ratio == pytest.approx(200 / 150)  # demand on the right for >=


def test_angles_are_converted_before_trig(run):
    # PITFALLS: math.sin of 30 deg's magnitude is -0.988; the right answer is 0.5
    r = run("t = 30 deg\nx = sin(t)\ny = cos(0.5*pi*1 rad)\nz = atan(1)\n")
    assert r.values["x"].m_as("") == pytest.approx(0.5)
    assert r.values["y"].m_as("") == pytest.approx(0.0, abs=1e-12)
    assert r.values["z"].m_as("deg") == pytest.approx(45.0)


def test_ratios_are_reduced(run):
    r = run("a = 5 mm\nb = 1 m\nk = a/b\n")
    assert r.values["k"].m_as("") == pytest.approx(0.005)  # not 5.0 (pint keeps mm/m unreduced)


def test_builtin_functions(run):
    r = run("a = sqrt(16 m^2)\nb = max(2 m, 300 cm)\nc = min(2 m, 300 cm)\nd = abs(-3 kN)\n"
            "e = ln(exp(2))\nf = log10(1000)\ng = ceil(2.1)\nh = floor(2.9)\n")
    assert r.ok, r.format_diagnostics()
    assert r.values["a"].m_as("m") == 4 and r.values["b"].m_as("m") == 3 and r.values["c"].m_as("m") == 2
    assert r.values["d"].m_as("kN") == 3 and r.values["e"].m_as("") == pytest.approx(2)
    assert r.values["f"].m_as("") == pytest.approx(3) and r.values["g"].m_as("") == 3 and r.values["h"].m_as("") == 2


# ------------------------------------------------------------------ errors, each with line and column

@pytest.mark.parametrize("sheet, code, line, col", [
    ("L = 6 m\nM = w*L\n", "undefined-name", 2, 5),
    ("M = w*2\nw = 3 kN/m\n", "use-before-definition", 1, 5),
    ("a = 1\na = 2\n", "redefinition", 2, 1),
    ("a = 1 m + 2 kN\n", "dimension-mismatch", 1, 5),
    ("a = 1 m\nb = 2 kN\ncheck a <= b\n", "dimension-mismatch", 3, 1),
    ("w = 2 kN/m\nL = 3 m\nM [kN*m] = w*L\n", "declared-unit-mismatch", 3, 4),
    ("x = sin(30)\n", "not-an-angle", 1, 9),
    ("x = sin(3 m)\n", "not-an-angle", 1, 9),
    ("a = 0 m\nb = 2 kN / a\n", "division-by-zero", 2, 12),
    ("x = 3 kNm\n", "unknown-unit", 1, 7),
    ("x = sqr(4)\n", "unknown-function", 1, 5),
    ("x = nosuch.thing(a=1)\n", "unknown-plugin", 1, 5),
    ("x = 2 m ^ 1 m\n", "dimension-mismatch", 1, 11),
    ("x = sqrt(-4 m^2)\n", "not-finite", 1, 10),
    ("x = 1e308 m * 10\n", "not-finite", 1, 5),
    ("x = (-8)^0.5\n", "not-finite", 1, 5),
    ("x = 10^10^10\n", "not-finite", 1, 5),
    ("pi = 3\n", "redefinition", 1, 1),
])
def test_errors_have_code_line_and_column(run, sheet, code, line, col):
    r = run(sheet)
    assert not r.ok
    assert codes(r)[0] == (code, line, col), r.format_diagnostics()


def test_undefined_name_suggests_the_close_one(run):
    r = run("sigma_b = 3 MPa\nx = sigma_v * 2\n")
    assert r.diagnostics[0].hint == "did you mean 'sigma_b'?"


def test_error_report_has_path_line_col_source_and_caret(run):
    r = run("w = 2 kN/m\nL = 3 m\nM [kN*m] = w*L\n", path="beam.calc")
    text = r.format_diagnostics()
    assert text.splitlines()[0].startswith("beam.calc:3:4: error: M is declared [kN*m]")
    assert "M [kN*m] = w*L" in text
    assert "   ^~~~" in text


def test_all_errors_reported_and_no_cascade(run):
    r = run("a = 1 m + 1 kN\nb = a * 2\nc = 2 m + 1 s\nd = c + b\n")
    assert [c[0:2] for c in codes(r)] == [("dimension-mismatch", 1), ("dimension-mismatch", 3)]


def test_offset_temperature_in_arithmetic_is_an_error(run):
    r = run("T = 20 degC\nx = T * 2\n")
    assert not r.ok and r.diagnostics[0].span.line == 2


# ------------------------------------------------------------------ overrides

def test_override_replaces_an_input_and_is_marked(run):
    r = run("L = 6 m\nw = 2 kN/m\nM [kN*m] = w*L^2/8\n", overrides={"L": "8 m"})
    assert r.ok
    assert r.values["M"].m_as("kN*m") == pytest.approx(2 * 64 / 8)
    assert r.steps["L"].overridden.m_as("m") == 6
    assert r.overrides["L"][1].m_as("m") == 8


@pytest.mark.parametrize("overrides, fragment", [
    ({"Q": "1 m"}, "defines no 'Q'"),
    ({"M": "3 kN*m"}, "not an input"),
    ({"L": "3 kN"}, "the override is force"),
    ({"L": "w"}, "not refer to other names"),
])
def test_bad_overrides_are_clear_errors(run, overrides, fragment):
    r = run("L = 6 m\nw = 2 kN/m\nM [kN*m] = w*L^2/8\n", overrides=overrides)
    assert not r.ok
    assert fragment in r.errors[0].message


# ------------------------------------------------------------------ plugins through the engine

def _toy_registry():
    ns = Namespace("toy", version="9.9")

    @ns.function("plate", params=[Param("b", "[length]"), Param("t", "[length]"),
                                 Param("kind", kind="text", choices=("steel", "alu"), default="steel")],
                 fields=[Field("A", "[length]**2"), Field("kind", kind="text")], returns="ns.plate")
    def plate(work, b, t, kind="steel"):
        if t.m_as("mm") <= 0:
            work.fail("the thickness must be positive", param="t")
        work.calc("A", "b*t", unit="mm^2", desc="area")
        return {"A": work["A"], "kind": kind}

    reg = PluginRegistry()
    reg.register(ns)
    return reg


def test_plugin_call_traces_its_working(run):
    r = run("p = toy.plate(b=100 mm, t=10 mm)\nA2 = p.A * 2\n", plugins=_toy_registry())
    assert r.ok, r.format_diagnostics()
    assert r.values["A2"].m_as("mm^2") == 2000
    (step,) = r.steps["p"].working.items
    assert step.name == "A" and step.value.m_as("mm^2") == 1000 and step.used["b"][0].m_as("mm") == 100
    assert r.plugin_versions == {"toy": "9.9"}


@pytest.mark.parametrize("call, code, col, fragment", [
    ("toy.plate(b=100, t=10 mm)", "plugin-argument", 17, "needs length, got dimensionless"),
    ("toy.plate(b=100 mm^2, t=10 mm)", "plugin-argument", 17, "needs length, got area"),
    ("toy.plate(b=100 mm)", "plugin-argument", 5, "needs 't'"),
    ("toy.plate(b=100 mm, t=1 mm, q=2)", "plugin-argument", 33, "no parameter 'q'"),
    ('toy.plate(b=100 mm, t=1 mm, kind="wood")', "plugin-argument", 38, "one of"),
    ("toy.plat(b=100 mm, t=1 mm)", "unknown-plugin", 5, "no function 'plat'"),
    ("toy.plate(b=100 mm, t=-1 mm)", "plugin-input", 25, "must be positive"),
])
def test_plugin_errors_point_at_the_argument(run, call, code, col, fragment):
    r = run(f"p = {call}\n", plugins=_toy_registry())
    assert not r.ok
    d = r.errors[0]
    assert (d.code, d.span.line, d.span.col) == (code, 1, col), r.format_diagnostics()
    assert fragment in d.message


def test_unknown_field_is_an_error_with_a_suggestion(run):
    r = run("p = toy.plate(b=100 mm, t=10 mm)\nx = p.Area\n", plugins=_toy_registry())
    d = r.errors[0]
    assert (d.code, d.span.line, d.span.col) == ("unknown-field", 2, 7)


def test_run_accepts_a_path(tmp_path):
    p = tmp_path / "s.calc"
    p.write_text("x = 2 m\n")
    r = calcsheet.run(p)
    assert r.path == str(p) and r.values["x"].m_as("m") == 2


def test_json_has_the_documented_shape_and_reads_back_into_pint(run):
    r = run("---\nproject: P\n---\nM [kN*m] = 22.5 kN*m\nS = 1.5e5 mm^3\ns [MPa] = M/S\ncheck s <= 250 MPa\n")
    j = r.to_json()
    assert set(j) >= {"meta", "values", "checks", "diagnostics"}
    assert j["meta"] == {"project": "P"}
    m = j["values"]["M"]
    assert m["line"] == 4 and m["value"] == pytest.approx(22.5)
    back = pint.Quantity(m["value"], m["unit"])
    assert back.to("N*m").magnitude == pytest.approx(22500)
    for name, entry in j["values"].items():
        pint.Quantity(entry["value"], entry["unit"])  # every unit string parses back
    (c,) = j["checks"]
    assert c == {**c, "line": 7, "text": "s <= 250 MPa", "ok": True}
    assert c["ratio"] == pytest.approx(150 / 250)


def test_an_optional_field_may_be_absent_and_reading_it_says_why(run):
    ns = Namespace("opt")

    @ns.function("f", params=[Param("a", "[length]"), Param("b", "[length]", default=None)],
                 fields=[Field("x", "[length]"), Field("y", "[length]", doc="give b to get y", optional=True)], returns="ns.f")
    def f(work, a, b=None):
        return {"x": a} if b is None else {"x": a, "y": b}

    reg = PluginRegistry()
    reg.register(ns)
    assert run("r = opt.f(a=1 m, b=2 m)\ny = r.y\n", plugins=reg).values["y"].m_as("m") == 2
    r = run("r = opt.f(a=1 m)\ny = r.y\n", plugins=reg)
    d = r.errors[0]
    assert (d.code, d.span.line) == ("unknown-field", 2) and d.hint == "give b to get y"


def test_plugin_contract_is_checked_when_a_function_registers():
    from calcsheet.errors import PluginDefinitionError

    ns = Namespace("bad")
    with pytest.raises(PluginDefinitionError, match="plugin bad.f.*'zz'"):
        @ns.function("f", params=[Param("a", "[length]"), Param("zz", "[length]")], returns="ns.f")
        def f(work, a):
            return {}
    with pytest.raises(PluginDefinitionError, match="not declared"):
        @ns.function("g", params=[], returns="ns.g")
        def g(work, a):
            return {}
    with pytest.raises(PluginDefinitionError, match="bad dimension"):
        @ns.function("h", params=[Param("a", "[lenght]")], returns="ns.h")
        def h(work, a):
            return {}


def test_a_plugin_can_be_blocked_by_name(monkeypatch, run):
    monkeypatch.setenv("CALCSHEET_BLOCK_PLUGINS", "section")
    r = run("s = section.rectangle(b=1 mm, h=2 mm)\n", plugins=PluginRegistry())
    assert r.errors[0].code == "unknown-plugin" and "blocked" in (r.errors[0].hint or "")


# ------------------------------------------------------------------ conditionals

def test_if_picks_the_branch_its_condition_selects(run):
    # depth factor in the style of a timber code: k_h = 1 for h <= 150 mm, else (150/h)^0.2 (invented limits)
    r = run("h = 220 mm\nk_h = if(h <= 150 mm, 1.0, (150 mm / h)^0.2)\n"
            "g = 120 mm\nk_g = if(g <= 150 mm, 1.0, (150 mm / g)^0.2)\n")
    assert r.ok, r.format_diagnostics()
    assert r.values["k_h"].m_as("") == pytest.approx((150 / 220) ** 0.2)
    assert r.values["k_g"].m_as("") == pytest.approx(1.0)


@pytest.mark.parametrize("sheet, code, col", [
    ("h = 2 m\nk = if(h <= 3 kN, 1, 2)\n", "dimension-mismatch", 8),
    ("h = 2 m\nk = if(h <= 3 m, 1, 2 m)\n", "dimension-mismatch", 5),
    ("h = 2 m\nk = if(h, 1, 2)\n", "type-mismatch", 8),
    ("h = 2 m\nk = if(h <= 3 m, 1)\n", "type-mismatch", 5),
    ("h = 2 m\nk = max(h <= 3 m, 1)\n", "type-mismatch", 9),
])
def test_if_errors(run, sheet, code, col):
    r = run(sheet)
    assert (r.errors[0].code, r.errors[0].span.line, r.errors[0].span.col) == (code, 2, col), r.format_diagnostics()
