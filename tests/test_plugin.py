"""The plugin contract, registration side: what a plugin must declare, checked when it registers."""
from __future__ import annotations

import pytest

from calcsheet.engine import run
from calcsheet.errors import PluginDefinitionError, PluginInputError
from calcsheet.plugin import Field, Namespace, Param, PluginRegistry, default_registry
from calcsheet.plugin_host import Work


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
        @ns.function("f", params=[Param("a", "[length]"), Param("b", "[length]")])
        def f(work, a):
            return {}


def test_an_undeclared_python_parameter_is_refused():
    ns = Namespace("t2")
    with pytest.raises(PluginDefinitionError, match=r"takes parameter\(s\) \['b'\] that are not declared"):
        @ns.function("f", params=[Param("a", "[length]")])
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
        @ns.function("f", fields=[field])
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
        @ns.function("f", params=[param])
        def f(work, a):
            return {}


# ---------------------------------------------------------------- record types


def test_functions_returning_one_record_type_declare_each_field_alike():
    ns = Namespace("t5")

    @ns.function("a", fields=[Field("L", "[length]"), Field("P", "[force]")], returns="t5.thing")
    def a(work):
        return {}

    @ns.function("b", fields=[Field("L", "[length]"), Field("M", "[force]*[length]")], returns="t5.thing")
    def b(work):  # a variant with a field of its own is fine
        return {}

    with pytest.raises(PluginDefinitionError, match="declares field L differently"):
        @ns.function("c", fields=[Field("L", "[force]")], returns="t5.thing")
        def c(work):
            return {}


def test_a_referenced_record_type_must_be_returned_by_some_plugin_once_all_are_loaded():
    maker = Namespace("t6")

    @maker.function("make", fields=[Field("A", "[length]**2")], returns="t6.shape")
    def make(work):
        return {}

    user = Namespace("t7")

    @user.function("use", params=[Param("s", kind="record", record="t6.shape"),
                                  Param("ps", kind="list", record="t6.part", default=None)])
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

    @ns.function("double", params=[Param("L", "[length]")], fields=[Field("y", "[length]")], shared=True)
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

    @ns.function("f", params=[Param("a", "[length]"), Param("b", "[length]")], fields=[Field("c", "[length]")])
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
