"""--size NAME --from FAMILY: the lightest catalogue section with every check OK, and the next lighter one."""
import json

import pytest

catalogue = pytest.importorskip("calcsheet_plugins.section.catalogue")

from calcsheet.cli import main  # noqa: E402

SHEET = """\
---
project: Sizing tests
subject: Floor beam
date: 2026-01-05
---
desig = "W18X50"                -- section designation
sec = section.rolled(designation=desig)
F_y = 345 MPa
L = 8 m
w = 30 kN/m
M [kN*m] = w*L^2/8              -- mid-span moment
check M <= 0.9*F_y*sec.Z_x      -- bending
"""


@pytest.fixture
def sized(tmp_path):
    p = tmp_path / "beam.calc"
    p.write_text(SHEET)
    return p


def _oracle(family, need_mm3):
    """Brute force over the published table: the lightest section whose plastic modulus is enough."""
    rows = sorted((e.values["mass"], e.designation, e.values["Z_x"]) for e in catalogue.entries().values()
                  if e.family == family)
    for i, (mass, desig, z) in enumerate(rows):
        if z >= need_mm3:
            return rows[i], rows[i - 1] if i else None


def test_the_lightest_ipe_with_enough_plastic_modulus_is_chosen(sized, tmp_path, capsys):
    out = tmp_path / "o"
    assert main(["build", str(sized), "--size", "desig", "--from", "IPE", "-o", str(out), "--format", "html,json",
                 "-j", "1"]) == 0
    M = 30 * 8 ** 2 / 8 * 1e6  # N·mm, wL²/8 (common practice)
    need = M / (0.9 * 345)  # mm³
    (mass, desig, z), (l_mass, l_desig, l_z) = _oracle("IPE", need)
    # from memory (EN 10365 tables): W_pl,y of IPE 300 is 628 cm³ and of IPE 330 is 804 cm³, so 773 cm³ needs IPE 330
    assert (desig, l_desig) == ("IPE 330", "IPE 300")
    data = json.loads((out / "beam.json").read_text())
    assert data["values"]["desig"]["text"] == "IPE 330"
    s = data["sizing"]
    assert s["chosen"]["designation"] == desig and s["next_lighter"]["designation"] == l_desig
    assert s["next_lighter"]["fails"][0]["utilisation"] == pytest.approx(need / l_z, rel=1e-9)
    assert data["checks"][0]["ratio"] == pytest.approx(need / z, rel=1e-9)
    html = (out / "beam.html").read_text()
    assert "Section selection: desig" in html and "The next lighter section, IPE 300, fails: bending (1.23)" in html
    assert "IPE 330 (49.1 kg/m), the lightest IPE section with every check OK" in capsys.readouterr().out


def test_sizing_on_two_workers_chooses_the_same(sized, tmp_path):
    for j in ("1", "2"):
        assert main(["build", str(sized), "--size", "desig", "--from", "IPE", "-o", str(tmp_path / j),
                     "--format", "json", "-j", j]) == 0
    assert (tmp_path / "1" / "beam.json").read_bytes() == (tmp_path / "2" / "beam.json").read_bytes()


@pytest.mark.parametrize("args,message", [
    (["--size", "F_y", "--from", "IPE"], "'F_y' must be a text input holding a designation"),
    (["--size", "desig", "--from", "IPX"], "no catalogue family 'IPX' (did you mean IPE?)"),
    (["--size", "M", "--from", "IPE"], "'M' is not an input of the sheet"),
])
def test_sizing_mistakes_are_reported(sized, tmp_path, capsys, args, message):
    assert main(["build", str(sized), *args, "-o", str(tmp_path / "o"), "-j", "1"]) == 1
    assert message in capsys.readouterr().err


def test_no_section_is_enough(sized, tmp_path, capsys):
    assert main(["build", str(sized), "--size", "desig", "--from", "IPE", "--set", "w=3000 kN/m",
                 "-o", str(tmp_path / "o"), "-j", "1", "--format", "json"]) == 1
    assert "no IPE section satisfies every check" in capsys.readouterr().err
