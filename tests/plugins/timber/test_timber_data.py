"""The timber data files, spot-checked against the published tables they transcribe.

Values quoted here are read from the standards as recalled (``# from memory``); the structural facts (a class
is named for its bending strength, k_mod grows as the load gets shorter) are facts of the standards' layout.
"""
import re

import pytest

from calcsheet_plugins.timber import data as D
from calcsheet_plugins.timber import namespace


def test_the_plugin_declares_the_standards_and_editions_it_implements():
    std = " ".join(namespace.standards)
    for name in ("EN 1995-1-1:2004+AC:2006+A1:2008", "EN 338:2009", "EN 14080:2013", "NDS-2018"):
        assert name in std


def test_every_class_of_en338_and_en14080_is_present():
    g = D.ec5_grades()
    soft = [f"C{n}" for n in (14, 16, 18, 20, 22, 24, 27, 30, 35, 40, 45, 50)]      # EN 338:2009 Table 1
    hard = [f"D{n}" for n in (18, 24, 30, 35, 40, 50, 60, 70)]                      # EN 338:2009 Table 1
    glulam = [f"GL{n}{t}" for n in (20, 22, 24, 26, 28, 30, 32) for t in "hc"]      # EN 14080:2013 Tables 4, 5
    assert set(soft + hard + glulam) <= set(g)
    assert all(g[n]["edition"] == "EN 338:2009" for n in soft + hard)
    assert all(g[n]["edition"] == "EN 14080:2013" for n in glulam)


def test_a_class_is_named_for_its_characteristic_bending_strength():
    # EN 338 and EN 14080 name each class by f_m,k in N/mm² (C24: f_m,k = 24 N/mm²)
    for name, row in D.ec5_grades().items():
        assert row["f_m_k"] == int(re.sub(r"\D", "", name)), name


@pytest.mark.parametrize("name, key, value", [
    # EN 338:2009 Table 1 (from memory)
    ("C16", "f_c_90_k", 2.2), ("C16", "E_0_mean", 8.0), ("C16", "E_0_05", 5.4), ("C16", "rho_k", 310),
    ("C24", "f_t_0_k", 14), ("C24", "f_c_0_k", 21), ("C24", "f_c_90_k", 2.5), ("C24", "f_v_k", 4.0),
    ("C24", "E_0_mean", 11.0), ("C24", "E_0_05", 7.4), ("C24", "G_mean", 0.69), ("C24", "rho_k", 350),
    ("D30", "f_c_90_k", 8.0), ("D30", "E_0_mean", 11.0), ("D30", "rho_k", 530),
    # EN 14080:2013 Table 5 and Table 4 (from memory)
    ("GL24h", "E_0_mean", 11.5), ("GL24h", "f_c_0_k", 24), ("GL24h", "f_v_k", 3.5), ("GL24h", "rho_k", 385),
    ("GL28c", "f_t_0_k", 19.5), ("GL28c", "E_0_mean", 12.5),
])
def test_spot_values_match_the_published_tables(name, key, value):
    assert D.ec5_grades()[name][key] == pytest.approx(value)


def test_strength_and_stiffness_grow_with_the_class():
    g = D.ec5_grades()
    for series in ([f"C{n}" for n in (14, 16, 18, 20, 22, 24, 27, 30, 35, 40, 45, 50)],
                   [f"D{n}" for n in (18, 24, 30, 35, 40, 50, 60, 70)]):
        for key in ("f_c_0_k", "E_0_mean", "E_0_05", "rho_k"):
            vals = [g[n][key] for n in series]
            assert vals == sorted(vals), (series[0], key)
    for row in g.values():
        assert row["E_0_05"] < row["E_0_mean"]          # a 5th percentile is below the mean
        assert row["rho_k"] < row["rho_mean"]


def test_k_mod_table_3_1():
    # EN 1995-1-1 Table 3.1, solid timber and glulam, as reproduced in the ICE Manual of Structural Design:
    # Buildings (2012), Table 19.9 (read at what-when-how.com, ICE-Manual-of-Structural-Design-Buildings-368)
    assert [D.k_mod("solid", 1, d) for d in D.durations()] == [0.6, 0.7, 0.8, 0.9, 1.1]
    assert [D.k_mod("solid", 3, d) for d in D.durations()] == [0.5, 0.55, 0.65, 0.7, 0.9]
    for product in ("solid", "glulam"):
        for sc in (1, 2, 3):
            row = [D.k_mod(product, sc, d) for d in D.durations()]
            assert row == sorted(row)                   # shorter loads, larger k_mod
            assert all(D.k_mod(product, 3, d) <= D.k_mod(product, sc, d) for d in D.durations())


def test_k_def_and_gamma_M():
    assert [D.k_def("solid", sc) for sc in (1, 2, 3)] == [0.6, 0.8, 2.0]    # EN 1995-1-1 Table 3.2
    assert D.gamma_M("solid")[0] == 1.3 and D.gamma_M("glulam")[0] == 1.25  # EN 1995-1-1 Table 2.3
    assert "UK" in D.annexes()                                              # a National Annex as data


def test_nds_reference_values_table_4a():
    v = D.nds_values()
    dfl = v["Douglas Fir-Larch"]["No.2"]                # NDS Supplement 2018 Table 4A (from memory)
    assert (dfl["F_b"], dfl["F_v"], dfl["F_c_perp"], dfl["F_c"], dfl["E"], dfl["E_min"]) == \
        (900, 180, 625, 1350, 1_600_000, 580_000)
    spf = v["Spruce-Pine-Fir"]["No.1/No.2"]
    assert (spf["F_b"], spf["F_c"], spf["E"]) == (875, 1150, 1_400_000)
    assert v["Glulam DF/DF"]["24F-V4"]["F_b"] == 2400  # Table 5A: "24F" is F_bx = 2400 psi


def test_nds_factor_tables():
    f = D.nds()
    assert f["C_D"]["permanent"] == 0.9 and f["C_D"]["2 months"] == 1.15 and f["C_D"]["10 minutes"] == 1.6  # 2.3.2
    assert D.table_row(f["C_F"]["dimension"], 10)[1] == 1.1      # 2x10 F_b, Table 4A (from memory)
    assert D.table_row(f["C_F"]["dimension"], 4)[4] == 1.15      # 2x4 F_c
    assert f["c"]["sawn"] == 0.8 and f["c"]["glulam"] == 0.9     # 3.7.1
    assert f["C_r"]["value"] == 1.15                             # 4.3.9
    assert f["K_cr"]["seasoned-dry"] == 1.5                      # 3.5.2
    assert D.nds_sizes()["2x10"] == [1.5, 9.25]                  # Table 1B dressed size (common practice)
    assert D.nds_sizes()["4x6"] == [3.5, 5.5]


@pytest.mark.parametrize("name, f_c0k, E_005", [
    # Porteous & Kermani, Structural Timber Design to Eurocode 5: Table 5.3 headings (C24, C27, C30, C35) and
    # two worked examples (a C16 column, a C22 lattice column), as reproduced at eurocode.us/structural-timber-
    # design (pages info-rbu-1, info-fis-1, info-tof). They quote BS EN 338:2003, whose
    # f_c,0,k and E_0,05 are the same as the 2009 edition's for these classes.
    ("C16", 17, 5.4), ("C22", 20, 6.7), ("C24", 21, 7.4), ("C27", 22, 7.7), ("C30", 23, 8.0), ("C35", 25, 8.7),
])
def test_compression_values_match_a_published_design_guide(name, f_c0k, E_005):
    g = D.ec5_grades()[name]
    assert (g["f_c_0_k"], g["E_0_05"]) == (f_c0k, pytest.approx(E_005))
