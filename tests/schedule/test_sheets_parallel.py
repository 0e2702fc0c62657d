"""build A.calc B.calc -j 2: the same files and messages as -j 1."""
from calcsheet.cli import main

from .conftest import BEAM, tree


def test_several_sheets_on_two_workers_equal_one(tmp_path, capsys):
    a = tmp_path / "a.calc"
    a.write_text(BEAM)
    b = tmp_path / "b.calc"
    b.write_text(BEAM.replace("L = 3 m", "L = 5 m"))
    bad = tmp_path / "c.calc"
    bad.write_text("w = 2 kN/m\nM [kN*m] = w\n")
    runs = {}
    for j in ("1", "2"):
        out = tmp_path / f"o{j}"
        status = main(["build", str(a), str(b), str(bad), "-o", str(out), "--format", "html,json", "-j", j,
                       "--fail-on-ng"])
        cap = capsys.readouterr()
        runs[j] = (status, (cap.out.replace(str(out), "OUT"), cap.err), tree(out))
    assert runs["1"][0] == runs["2"][0] == 1  # c.calc has an error
    assert runs["1"][1] == runs["2"][1]  # the same messages, in the same order
    assert runs["1"][2] == runs["2"][2] and set(runs["2"][2]) == {"a.html", "a.json", "b.html", "b.json"}
    assert "[3/3]" in runs["2"][1][1] and "c.calc: not built (1 error(s))" in runs["2"][1][1]
