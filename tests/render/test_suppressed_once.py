"""An allowed finding is one fact: off the console, marked in the JSON, listed once in the package."""
import json

import calcsheet
from calcsheet.render.page import PackageDocument

SHEET = 'm = material.aluminium(alloy="6061-T6")  // allow plugin-warning: values verified against the ADM tables\n'


def test_allowed_warning_is_not_printed_on_the_console():
    r = calcsheet.run(SHEET)
    assert any(d.suppressed for d in r.diagnostics)
    assert r.format_diagnostics() == ""


def test_allowed_warning_is_marked_suppressed_with_its_reason_in_the_json():
    r = calcsheet.run(SHEET)
    diags = json.loads(json.dumps(r.to_json()))["diagnostics"]
    (d,) = [d for d in diags if d["code"] == "plugin-warning"]
    assert d["suppressed"] is True and d["reason"] == "values verified against the ADM tables"


def test_allowed_warning_is_listed_not_repeated_inline():
    r = calcsheet.run(SHEET)
    (d,) = [d for d in r.diagnostics if d.suppressed]
    h = str(PackageDocument(r).html())
    assert 'class="note warning"' not in h
    assert h.count("values verified against the ADM tables") == 1
