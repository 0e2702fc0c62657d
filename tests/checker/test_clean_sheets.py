"""Correct sheets of every plugin, and the demo sheets: the checker raises no false alarm."""
from __future__ import annotations

from pathlib import Path

import pytest

from calcsheet.engine import run
from calcsheet.plugin import default_registry

HERE = Path(__file__).parent
REPO = HERE.parent.parent
CLEAN = sorted((HERE / "clean").glob("*.calc"))
DEMOS = sorted((REPO / "sheets").glob("*.calc"))


def test_every_built_in_plugin_has_a_clean_sheet():
    used = set()
    for sheet in CLEAN:
        text = sheet.read_text(encoding="utf-8")
        used |= {ns for ns in default_registry().names() if f"{ns}." in text}
    assert {"section", "beam", "column", "material"} <= used


@pytest.mark.parametrize("sheet", CLEAN + DEMOS, ids=[s.name for s in CLEAN + DEMOS])
def test_correct_sheet_checks_without_a_single_diagnostic(sheet):
    result = run(sheet, evaluate=False)
    assert [d for d in result.diagnostics if not d.suppressed] == [], result.format_diagnostics()


@pytest.mark.parametrize("sheet", CLEAN, ids=[s.name for s in CLEAN])
def test_correct_sheet_also_evaluates(sheet):
    result = run(sheet)
    assert result.ok, result.format_diagnostics()
    assert result.checks and result.all_checks_ok


def test_the_static_types_agree_with_the_evaluated_dimensions():
    """Every value the checker typed has the dimension evaluation produced (the inference is sound)."""
    from calcsheet import units as U
    from calcsheet.checker import Checker
    from calcsheet.parser import parse_sheet
    from calcsheet.resolver import resolve

    for sheet in CLEAN + DEMOS:
        evaluated = run(sheet)
        parsed, _ = parse_sheet(sheet.read_text(encoding="utf-8"), str(sheet))
        reg = default_registry()
        checker = Checker(reg, str(sheet))
        checker.check_sheet(parsed, resolve(parsed, reg))
        for name, value in evaluated.values.items():
            t = checker.types[name]
            if t.kind == "q":
                assert U.without_angle(t.dim) == U.without_angle(U.dim_of(value)), (sheet.name, name)
