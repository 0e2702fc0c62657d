"""The plugin host checks the fields a plugin function returns against their declared dimensions.

A field declared [length] that comes back in seconds is a bug in the plugin, reported at the call as one (never
a wrong number printed with a wrong unit). An angle is a plain number in SI (rad = m/m, common practice), so a
field declared [angle] may come back as a plain number, and one declared plain as radians.
"""
import pytest

import calcsheet
from calcsheet.plugin import Field, Namespace, Param, PluginRegistry

fp = Namespace("fieldprobe", version="1.0", doc="returns a field of the unit it is told")


@fp.function("length", params=[Param("unit", kind="text")], fields=[Field("v", "[length]", "a length")],
             returns="fieldprobe.length")
def _length(work, unit):
    return {"v": work.q(2.0, unit)}


@fp.function("angle", params=[Param("unit", kind="text")], fields=[Field("v", "[angle]", "an angle")],
             returns="fieldprobe.angle")
def _angle(work, unit):
    return {"v": work.q(0.5, unit)}


@pytest.fixture(scope="module")
def plugins():
    reg = PluginRegistry()
    reg.register(fp)
    return reg


def run(plugins, call):
    return calcsheet.run(f"r = fieldprobe.{call}\n", plugins=plugins)


@pytest.mark.parametrize("call, unit, value", [
    ('length(unit="mm")', "m", 0.002),
    ('angle(unit="rad")', "rad", 0.5),
    ('angle(unit="")', "rad", 0.5),  # a plain number where an angle is declared: radians
])
def test_a_field_of_its_declared_dimension_is_accepted(plugins, call, unit, value):
    r = run(plugins, call)
    assert r.ok, r.diagnostics
    assert r.values["r"].fields["v"].m_as(unit) == pytest.approx(value)


@pytest.mark.parametrize("call", ['length(unit="s")', 'length(unit="kN")', 'angle(unit="m")'])
def test_a_field_of_another_dimension_is_a_located_plugin_bug_not_a_value(plugins, call):
    r = run(plugins, call)
    (err,) = r.errors
    assert "plugin bug" in err.message and "should be" in err.message, err.message
    assert (err.span.line, err.span.col) == (1, 5)
    assert "r" not in r.values
