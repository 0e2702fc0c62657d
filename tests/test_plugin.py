"""The plugin contract, registration side: what a plugin must declare, checked when it registers."""
from __future__ import annotations

import pytest

from calcsheet.engine import run
from calcsheet.errors import PluginDefinitionError, PluginInputError
from calcsheet.plugin import Field, Namespace, Param, PluginRegistry, default_registry
from calcsheet.plugin_host import Work
from calcsheet import units as U


def registry(*namespaces):
    reg = PluginRegistry(blocked=set())
    reg._entry_points = {}  # only the namespaces given here
    for ns in namespaces:
        reg.register(ns)
    return reg


# ---------------------------------------------------------------- parameters and fields


def test_a_parameter_the_function_lacks_is_refused_naming_the_plugin():
    ns = Namespace("t1")
    with pytest.raises(PluginDefinitionError, match=r"plugin t1\.f: declares parameter\(s\) \['b'\]"):
        @ns.function("f", params=[Param("a", "[length]"), Param("b", "[length]")], returns="t1.f")
        def f(work, a):
            return {}


def test_an_undeclared_python_parameter_is_refused():
    ns = Namespace("t2")
    with pytest.raises(PluginDefinitionError, match=r"takes parameter\(s\) \['b'\] that are not declared"):
        @ns.function("f", params=[Param("a", "[length]")], returns="t2.f")
        def f(work, a, b=None):
            return {}


@pytest.mark.parametrize("field, words", [
    (Field("x", kind="table"), "field x has unknown kind 'table'"),
    (Field("x", kind="record"), "record field x needs a record type"),
    (Field("x", "[lenght]"), "field x has a bad dimension"),
])
def test_field_kinds_and_dimensions_are_validated(field, words):
    ns = Namespace("t3")
    with pytest.raises(PluginDefinitionError, match=words):
        @ns.function("f", fields=[field], returns="t3.f")
        def f(work):
            return {}


@pytest.mark.parametrize("param, words", [
    (Param("a", kind="vector"), "unknown kind 'vector'"),
    (Param("a", kind="quantity"), "needs a dimension"),
    (Param("a", kind="record"), "needs a record type"),
    (Param("a", "[length]", record="section"), "names a record type but is a quantity"),
    (Param("a", "[length]", choices=("x",)), "has choices but is a quantity"),
    (Param("a", "[length]", kind="number"), "is a number and takes no dimension"),
])
def test_parameter_kinds_are_validated(param, words):
    ns = Namespace("t4")
    with pytest.raises(PluginDefinitionError, match=words):
        @ns.function("f", params=[param], returns="t4.f")
        def f(work, a):
            return {}


# ---------------------------------------------------------------- record types


def test_every_function_declares_the_record_type_it_returns():
    ns = Namespace("t5")
    with pytest.raises(PluginDefinitionError, match=r"plugin t5\.f: declare the record type it returns, "
                                                   r"e\.g\. returns=\"t5\""):
        @ns.function("f", fields=[Field("L", "[length]")])
        def f(work):
            return {}
    with pytest.raises(PluginDefinitionError, match=r"plugin t5\.g: family must name a family"):
        @ns.function("g", fields=[], returns="t5.g", family="")
        def g(work):
            return {}
    with pytest.raises(PluginDefinitionError, match=r"record type t5\.h cannot be its own family"):
        @ns.function("h", fields=[], returns="t5.h", family="t5.h")
        def h(work):
            return {}


def _maker(ns, name, fields, returns="t5.thing", family=None):
    @ns.function(name, fields=fields, returns=returns, family=family)
    def make(work):
        return {}


def test_functions_returning_one_record_type_declare_the_same_fields():
    ns = Namespace("t5")
    _maker(ns, "a", [Field("L", "[length]"), Field("P", "[force]")])
    _maker(ns, "b", [Field("P", "[force]"), Field("L", "[length]")])  # the same fields, in any order
    with pytest.raises(PluginDefinitionError) as exc:
        _maker(ns, "c", [Field("L", "[length]"), Field("M", "[force]*[length]")])
    assert str(exc.value) == (
        "plugin t5.c: returns a t5.thing record like t5.a but lacks field(s) P and adds field(s) M; every "
        "function returning one record type declares the same fields (give a kind with fields of its own a "
        "record type of its own, in a family)")
    with pytest.raises(PluginDefinitionError, match="but lacks field\\(s\\) P; every function"):
        _maker(ns, "d", [Field("L", "[length]")])
    with pytest.raises(PluginDefinitionError, match="but adds field\\(s\\) Q; every function"):
        _maker(ns, "e", [Field("L", "[length]"), Field("P", "[force]"), Field("Q", "[force]")])
    assert set(ns.functions) == {"a", "b"}  # a refused function is not registered


@pytest.mark.parametrize("field, words", [
    (Field("P", "[length]"), "declares field P as length, not force"),
    (Field("P", kind="text"), "declares field P as text, not force"),
    (Field("P", "[force]", optional=True), "declares field P as force, optional, not force"),
    (Field("P", kind="record", record="t5.other"), "declares field P as a t5.other record, not force"),
])
def test_functions_returning_one_record_type_declare_each_field_alike(field, words):
    ns = Namespace("t5")
    _maker(ns, "a", [Field("L", "[length]"), Field("P", "[force]")])
    with pytest.raises(PluginDefinitionError, match=r"plugin t5\.b: returns a t5\.thing record like t5\.a but "
                                                   + words.replace("(", r"\(")):
        _maker(ns, "b", [Field("L", "[length]"), field])


def test_a_record_type_belongs_to_one_family():
    ns = Namespace("t5")
    _maker(ns, "a", [Field("L", "[length]")], family="t5.kinds")
    with pytest.raises(PluginDefinitionError, match="puts it in family None, not 't5.kinds'"):
        _maker(ns, "b", [Field("L", "[length]")])


def test_a_mismatched_record_type_across_namespaces_is_found_once_all_are_loaded():
    one, two = Namespace("t12"), Namespace("t13")
    _maker(one, "a", [Field("A", "[length]**2")], returns="shared.shape")
    _maker(two, "b", [Field("A", "[length]")], returns="shared.shape")  # each namespace alone is fine
    assert registry(one, two).check_contract() == [
        "plugin t13.b: returns a shared.shape record like t12.a but declares field A as "
        f"{U.describe_dim(U.parse_dimension('[length]'))}, not {U.describe_dim(U.parse_dimension('[length]**2'))}; "
        "every function returning one record type declares each field alike"]


def test_a_parameter_naming_a_family_takes_a_record_of_any_type_in_it(run):
    ns = Namespace("t14")
    @ns.function("push", fields=[Field("F", "[force]")], returns="t14.push", family="t14.action")
    def push(work):
        return {"F": work.q(1.0, "kN")}

    @ns.function("twist", fields=[Field("M", "[force]*[length]")], returns="t14.twist", family="t14.action")
    def twist(work):
        return {"M": work.q(1.0, "kN*m")}

    @ns.function("other", fields=[Field("F", "[force]")], returns="t14.other")
    def other(work):
        return {"F": work.q(1.0, "kN")}

    @ns.function("count", params=[Param("actions", kind="list", record="t14.action"),
                                  Param("one", kind="record", record="t14.action", default=None)],
                 fields=[Field("n")], returns="t14.count")
    def count(work, actions, one=None):
        return {"n": work.q(len(actions), "")}

    reg = registry(ns)
    assert reg.check_contract() == []  # a family some function's type belongs to is a known record name
    r = run("a = t14.push()\nb = t14.twist()\nc = t14.count(actions=[a, b, t14.push()], one=b)\nn = c.n\n",
            plugins=reg)
    assert r.ok, r.diagnostics
    assert r.values["n"].m_as("") == 3
    assert r.values["a"].family == "t14.action" and r.values["a"].type == "t14.push"
    # a record of a type outside the family is refused, statically and when evaluated
    for text in ("c = t14.count(actions=[t14.push(), t14.other()])\n", "c = t14.count(actions=[], one=t14.other())\n"):
        for evaluate in (False, True):
            bad = run(text, plugins=reg, evaluate=evaluate)
            assert [d.code for d in bad.errors] == ["plugin-argument"], (text, evaluate, bad.diagnostics)
            assert "t14.action record" in bad.errors[0].message and "t14.other" in bad.errors[0].message


def test_the_beam_load_kinds_are_one_record_type_each_of_the_load_family():
    beam = default_registry().namespace("beam")
    from calcsheet_plugins.beam.kinds import KINDS
    for name in KINDS:
        pf = beam.functions[name]
        assert (pf.returns, pf.family) == (f"beam.{name}_load", "load")
    assert beam.functions["solve"].param("loads").record == "load"


def test_a_referenced_record_type_must_be_returned_by_some_plugin_once_all_are_loaded():
    maker = Namespace("t6")

    @maker.function("make", fields=[Field("A", "[length]**2")], returns="t6.shape")
    def make(work):
        return {}

    user = Namespace("t7")

    @user.function("use", params=[Param("s", kind="record", record="t6.shape"),
                                  Param("ps", kind="list", record="t6.part", default=None)], returns="t7.use")
    def use(work, s, ps=None):
        return {}

    # each namespace registers on its own; the reference is checked when every plugin is loaded
    assert registry(maker, user).check_contract() == [
        "plugin t7.use: parameter ps needs a t6.part record, which no loaded plugin function returns"]
    assert registry(user).check_contract()[0].startswith("plugin t7.use: parameter s needs a t6.shape record")


def test_the_installed_plugins_keep_the_contract():
    assert default_registry().check_contract() == []


# ---------------------------------------------------------------- shared parameters


def test_shared_parameters_are_declared_once_and_reach_the_function_through_kwargs(run):
    ns = Namespace("t8", shared=[Param("scale", doc="a factor", default=1.0),
                                 Param("label", kind="text", default="")])

    @ns.function("double", params=[Param("L", "[length]")], fields=[Field("y", "[length]")], shared=True,
                 returns="t8.double")
    def double(work, L, **common):
        work.calc("y", "2*L*scale")
        assert set(common) == {"scale", "label"}
        return {"y": work["y"]}

    assert [p.name for p in ns.functions["double"].params] == ["L", "scale", "label"]
    reg = registry(ns)
    r = run("d = t8.double(L=3 m, scale=2)\ny = d.y\n", plugins=reg)
    assert r.ok and r.values["y"].to("m").magnitude == pytest.approx(12)
    bad = run("d = t8.double(L=3 m, scale=2 m)\n", plugins=reg, evaluate=False)
    assert [d.code for d in bad.errors] == ["plugin-argument"]


def test_a_shared_parameter_is_validated_when_declared():
    with pytest.raises(PluginDefinitionError, match=r"t9 \(shared parameters\): parameter rho needs a dimension"):
        Namespace("t9", shared=[Param("rho", kind="quantity")])
    ns = Namespace("t10", shared=[Param("k")])
    with pytest.raises(PluginDefinitionError, match="declared twice"):
        ns.share(Param("k"))


def test_the_section_shapes_share_rho_x_ref_y_ref_and_detail():
    section = default_registry().namespace("section")
    shared = [p.name for p in section.shared]
    assert shared == ["rho", "x_ref", "y_ref", "detail"]
    for name in ("rectangle", "circle", "tee", "polygon"):
        assert [p.name for p in section.functions[name].params][-4:] == shared


# ---------------------------------------------------------------- refusing input


def test_work_fail_points_at_the_parameter(run):
    ns = Namespace("t11")

    @ns.function("f", params=[Param("a", "[length]"), Param("b", "[length]")], fields=[Field("c", "[length]")],
                 returns="t11.f")
    def f(work, a, b):
        if b.m_as("m") <= 0:
            work.fail("b must be positive", param="b")
        return {"c": a + b}

    r = run("x = t11.f(a=1 m, b=-1 m)\n", plugins=registry(ns))
    (d,) = r.errors
    assert (d.code, d.span.col, d.message) == ("plugin-input", 18, "t11.f: b must be positive")
    with pytest.raises(PluginInputError) as exc:
        Work(ns.functions["f"], {}, {}, None).fail("no", param="a")
    assert exc.value.param == "a"
