"""The material library cites standard, edition and table for every value, and the values match the tables."""
import re

import pytest

import calcsheet
from calcsheet.trace import Table
from calcsheet_plugins.material import library
from calcsheet_plugins.timber import data as timber_data

EDITION = re.compile(r"\b(19|20)\d\d\b|\b\d{3}-\d{2}\b|\d+(st|nd|rd|th) ed\.")


def _v(cat, key, prop, unit):
    q, source = library.value(library.entry(cat, key)[prop])
    return q.m_as(unit), source


@pytest.mark.parametrize("cat", ["steel", "aluminium", "timber"])
def test_every_source_names_an_edition_or_says_it_was_not_checked(cat):
    for key in library.grades(cat):
        for prop in library.PROPERTIES:
            _, source = library.value(library.entry(cat, key)[prop])
            assert EDITION.search(source) or "from memory" in source, (key, prop, source)


@pytest.mark.parametrize("grade, f_y, f_u", [
    # EN 1993-1-1:2005+AC:2009 Table 3.1, hot-rolled, EN 10025-2, t ≤ 40 mm (the corrigendum set S355 f_u = 490)
    ("S235", 235, 360), ("S275", 275, 430), ("S355", 355, 490)])
def test_en_steels_match_en_1993_1_1_table_3_1(grade, f_y, f_u):
    fy, src_y = _v("steel", grade, "f_y", "MPa")
    fu, src_u = _v("steel", grade, "f_u", "MPa")
    assert (fy, fu) == (f_y, f_u)
    for src in (src_y, src_u):
        assert "EN 1993-1-1:2005+AC:2009, Table 3.1" in src and "from memory" not in src
    E, src = _v("steel", grade, "E", "MPa")
    assert E == 210000 and "3.2.6(1)" in src  # EN 1993-1-1 3.2.6(1)


@pytest.mark.parametrize("grade, F_y, F_u", [
    # AISC Steel Construction Manual, 15th ed., Table 2-4 (preferred specifications for each shape)
    ("A992", 50, 65), ("A36", 36, 58), ("A500C", 50, 62), ("A500C-round", 46, 62), ("A53B", 35, 60)])
def test_astm_steels_match_aisc_manual_table_2_4(grade, F_y, F_u):
    fy, src_y = _v("steel", grade, "f_y", "ksi")
    fu, src_u = _v("steel", grade, "f_u", "ksi")
    assert (fy, fu) == (F_y, F_u)
    assert "Table 2-4" in src_y and "Table 2-4" in src_u and "from memory" not in src_y + src_u


def test_c24_agrees_with_the_timber_plugins_en_338_2009_table():
    """Two data files kept by different plugins, both EN 338:2009 Table 1, must not disagree."""
    row = timber_data.ec5_grades()["C24"]
    assert _v("timber", "C24", "f_y", "MPa")[0] == row["f_m_k"] == 24
    assert _v("timber", "C24", "f_u", "MPa")[0] == row["f_t_0_k"]
    assert _v("timber", "C24", "E", "GPa")[0] == row["E_0_mean"] == 11
    assert _v("timber", "C24", "G", "GPa")[0] == row["G_mean"] == 0.69
    assert _v("timber", "C24", "rho", "kg/m^3")[0] == row["rho_mean"] == 420


def test_the_package_shows_each_values_citation():
    r = calcsheet.run('m = material.steel(grade="S355")\n')
    table = next(i for i in r.values["m"].working.items if isinstance(i, Table))
    assert table.columns[-1] == "Source"
    f_u = next(row for row in table.rows if row[1] == "f_u")
    assert "EN 1993-1-1:2005+AC:2009, Table 3.1" in f_u[3]
    # every S355 value was checked against a published table: no "recalled" warning
    assert not [d for d in r.diagnostics if "recalled" in d.message]
