"""Per-function standards: a function may name the standards it relies on; the design basis lists, for each
function a sheet calls, its own list (else its namespace's) — not every standard of every plugin loaded."""
from __future__ import annotations

import pytest

import calcsheet
from calcsheet.errors import PluginDefinitionError
from calcsheet.plugin import Field, Namespace
from calcsheet.render.page import functions_called, standards_used


def _declare(standards):
    ns = Namespace("t_std", standards=("EN 1990:2002",))

    @ns.function("f", fields=[Field("x")], returns="t_std", standards=standards)
    def f(work):
        return {"x": work.q(1.0, "")}

    return ns


def test_a_function_declares_its_own_standards_or_inherits_the_namespaces():
    assert _declare(("AISC 360-16",)).functions["f"].standards == ("AISC 360-16",)
    assert _declare(None).functions["f"].standards is None  # the namespace's list applies
    assert _declare(()).functions["f"].standards == ()  # relies on no standard


@pytest.mark.parametrize("bad, why", [
    ("AISC 360-16", "must be a list"),
    (("",), "non-empty"),
    ((360,), "non-empty name"),
    (("AISC specification",), "names no edition"),
    (("AISC 360-16", "AISC 360-16"), "listed twice"),
])
def test_a_bad_standards_declaration_is_refused_at_registration_naming_the_plugin(bad, why):
    with pytest.raises(PluginDefinitionError, match=rf"plugin t_std\.f: .*{why}"):
        _declare(bad)




def test_the_mezzanine_sheet_lists_the_eurocode_it_uses_and_not_the_american_code():
    from pathlib import Path

    r = calcsheet.run(Path(__file__).resolve().parents[1] / "sheets" / "member_mezzanine_beam.calc")
    assert "ec3_column" in functions_called(r)["steel_design"]
    used = dict(standards_used(r))
    assert "EN 1993-1-1:2005+AC:2009" in used and "steel_design.ec3_column" in used["EN 1993-1-1:2005+AC:2009"]
    assert "AISC 360-16" not in used


def test_an_aisc_sheet_lists_aisc_and_not_the_eurocode():
    r = calcsheet.run("from_w = steel_design.aisc_Cb(M_max=100 kip*ft, M_A=50 kip*ft, M_B=100 kip*ft, "
                      "M_C=50 kip*ft)\n")
    assert not r.errors, [d.message for d in r.errors]
    used = dict(standards_used(r))
    assert used.get("AISC 360-16", "").endswith("steel_design.aisc_Cb")
    assert "EN 1993-1-1:2005+AC:2009" not in used
