"""tools/mutation.py: the mechanics of planting one bug and taking it out again."""
import ast
import importlib.util
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[2]


def _tool():
    spec = importlib.util.spec_from_file_location("calcsheet_mutation_tool", ROOT / "tools" / "mutation.py")
    mod = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = mod
    spec.loader.exec_module(mod)
    return mod


M = _tool()

SOURCE = '''"""A module docstring is left alone."""


def check(a, b):
    """So is a function docstring: 1 + 1."""
    if a <= b and b > 0:
        return a * 2 - 1
    raise ValueError(f"no: {a + 1}")


def traced(work):
    work.calc("r", "sqrt(I/A) + 2")
    work.note("prose 1 + 2 is a message")
    return work.q(1.0, "kg/m^3")
'''


def test_every_operator_of_the_menu_is_found_and_messages_are_not(tmp_path):
    p = tmp_path / "m.py"
    p.write_text(SOURCE)
    whats = [m.what for m in M.find_mutants("t", p, "m.py")]
    assert "<= → <" in whats and "> → >=" in whats and "and → or" in whats
    assert "* → /" in whats and "- → +" in whats and "2 → 3" in whats and "1 → 2" in whats
    assert any(w.startswith('formula "sqrt(I/A) + 2" → "sqrt(I*A) + 2"') for w in whats)
    assert any(w.endswith('"sqrt(I/A) + 3"') for w in whats)
    # nothing inside the raise, the docstrings, the note or the unit text
    assert not any("kg" in w for w in whats)
    assert {m.line for m in M.find_mutants("t", p, "m.py")} == {6, 7, 12, 14}  # 14: the number 1.0


def test_a_mutant_is_applied_then_the_file_is_restored_byte_for_byte(tmp_path):
    p = tmp_path / "m.py"
    p.write_text(SOURCE + "# a comment ast.unparse would drop\n")
    before = p.read_bytes()
    ms = M.find_mutants("t", p, "m.py")
    k = next(m.index for m in ms if m.what == "<= → <")
    with M.applied(p, k):
        mutated = p.read_text()
        assert "if a < b and b > 0" in mutated
        ast.parse(mutated)
    assert p.read_bytes() == before


def test_the_file_is_restored_when_the_run_fails(tmp_path):
    p = tmp_path / "m.py"
    p.write_text(SOURCE)
    before = p.read_bytes()
    with pytest.raises(RuntimeError):
        with M.applied(p, 0):
            assert p.read_bytes() != before
            raise RuntimeError("the test run died")
    assert p.read_bytes() == before


def test_only_the_named_functions_are_mutated(tmp_path):
    p = tmp_path / "m.py"
    p.write_text(SOURCE)
    ms = M.find_mutants("t", p, "m.py", functions=["traced"])
    assert ms and {m.line for m in ms} == {12, 14}


def test_a_formula_mutant_changes_one_token_at_a_time():
    variants = [v for v, _ in M._formula_variants("F_y - F_y^2*L/(4*pi^2*E)")]
    assert "F_y + F_y^2*L/(4*pi^2*E)" in variants
    assert "F_y - F_y^2*L/(5*pi^2*E)" in variants
    assert "F_y - F_y^3*L/(4*pi^2*E)" in variants
    assert all(v.count(" ") == 2 for v in variants)
    assert [v for v, _ in M._formula_variants("-x + 1")] == ["-x - 1", "-x + 2"]  # a unary minus stays


def test_the_sample_is_spread_and_deterministic():
    assert M.spread(list(range(10)), 5) == [0, 2, 4, 6, 8]
    assert M.spread(list(range(3)), None) == [0, 1, 2]


def test_every_target_names_files_and_tests_that_exist():
    for name, spec in M.TARGETS.items():
        for rel in spec["sources"]:
            assert (ROOT / rel).is_file(), (name, rel)
        assert any((ROOT / t).exists() for t in spec["tests"]), name


def test_the_report_counts_timeouts_as_killed_and_sets_equivalent_survivors_apart(capsys):
    line, what = next(iter(M.EQUIVALENT))
    ms = [M.Mutant("t", "a.py", 0, 1, "x", "y", status="killed"), M.Mutant("t", "a.py", 1, 2, "x", "y", status="timeout"),
          M.Mutant("t", "a.py", 2, 3, what, line, status="survived"),
          M.Mutant("t", "a.py", 3, 4, "<= → <", "if a <= b:", status="survived")]
    summary = M.report(ms)
    out = capsys.readouterr().out
    assert summary["t"] == {"mutants": 4, "killed": 2, "timeouts": 1, "rate": 0.5}
    assert summary["all"]["adjusted_rate"] == pytest.approx(2 / 3, abs=1e-4)
    survivors = out.split("== surviving mutants")[1]
    assert "if a <= b:" in survivors and line not in survivors


# ---------------------------------------------------------------- choosing tests by coverage

COMPOUND = '''LIMIT = 3


def f(a,
      b=2):
    if a > LIMIT and \\
            b < 1:
        return a * b
    return (a +
            b)
'''


def test_a_mutant_is_reached_through_its_statement_or_its_compound_statements_header():
    spans = M.statement_spans(COMPOUND)
    assert spans[1] == (1, 1)  # LIMIT = 3
    assert spans[4] == spans[5] == (4, 5)  # the def's header (its default b=2), not its body
    assert spans[6] == spans[7] == (6, 7)  # the if's two-line condition
    assert spans[8] == (8, 8)
    assert spans[9] == spans[10] == (9, 10)


def _coverage():
    return M.Coverage({
        "order": ["t_a.py::slow", "t_a.py::quick", "t_b.py::other", "t_b.py::uses_fixture"],
        "seconds": {"t_a.py::slow": 9.0, "t_a.py::quick": 0.1, "t_b.py::other": 1.0, "t_b.py::uses_fixture": 0.2},
        "import": [["m.py", 1], ["m.py", 4]],
        "tests": {"t_a.py::slow": [["m.py", 6], ["m.py", 8]], "t_a.py::quick": [["m.py", 8]],
                  "t_b.py::other": [["m.py", 9]], "t_b.py::uses_fixture": []},
        "setup": {"t_b.py": [["m.py", 10]]},
    })


def test_a_mutant_runs_only_the_tests_that_reach_its_statement_quickest_first():
    c = _coverage()
    at = lambda line, span: M.Mutant("t", "m.py", 0, line, "x", "", span)  # noqa: E731
    assert c.tests_for(at(8, (8, 8))) == ["t_a.py::quick", "t_a.py::slow"]
    assert c.tests_for(at(7, (6, 7))) == ["t_a.py::slow"]  # line 7 is never traced alone; its statement is
    assert c.tests_for(at(5, (4, 5))) is None  # a default argument runs at import: every test
    assert c.tests_for(at(3, (3, 3))) == []  # nobody runs it: survives without a run
    # a line a fixture ran while setting up t_b.py's first test serves every test of that file
    assert c.tests_for(at(10, (9, 10))) == ["t_b.py::uses_fixture", "t_b.py::other"]
    assert c.time_of(["t_a.py::quick", "t_b.py::other"]) == pytest.approx(1.1)


def test_the_seeded_sample_is_repeatable_and_in_random_order():
    items = list(range(100))
    a, b = M.sample(items, 10, seed=19), M.sample(items, 10, seed=19)
    assert a == b and len(set(a)) == 10 and a != sorted(a)  # stopped early, it is still a random sample
    assert M.sample(items, 10, seed=20) != a
    assert M.sample(items, None, seed=19) == items
    assert sorted(M.sample(items, 500, seed=19)) == items


def test_the_tracer_tells_import_lines_test_lines_and_fixture_lines_apart(tmp_path):
    import json
    import os
    import subprocess

    (tmp_path / "mod.py").write_text("K = 2\n\n\ndef double(x):\n    return K * x\n\n\ndef made():\n    return 7\n")
    (tmp_path / "test_mod.py").write_text(
        "import pytest\nimport mod\n\n\n@pytest.fixture(scope='module')\ndef seven():\n    return mod.made()\n\n\n"
        "def test_double():\n    assert mod.double(2) == 4\n\n\ndef test_seven(seven):\n    assert seven == 7\n\n\n"
        "def test_nothing():\n    pass\n")
    out = tmp_path / "cover.json"
    env = dict(os.environ, PYTHONPATH=os.pathsep.join([str(tmp_path), str(ROOT / "tools")]),
               CALCSHEET_COVER_FILES=json.dumps([str(tmp_path / "mod.py")]), CALCSHEET_COVER_ROOT=str(tmp_path),
               CALCSHEET_COVER_OUT=str(out), PYTHONDONTWRITEBYTECODE="1")
    subprocess.run([sys.executable, "-m", "pytest", "-q", "-p", "no:cacheprovider", "-p", "mutation_cover",
                    "test_mod.py"], cwd=tmp_path, env=env, check=True, capture_output=True)
    data = json.loads(out.read_text())
    assert {tuple(x) for x in data["import"]} >= {("mod.py", 1), ("mod.py", 4), ("mod.py", 8)}
    assert data["tests"]["test_mod.py::test_double"] == [["mod.py", 5]]
    assert data["tests"]["test_mod.py::test_seven"] == [["mod.py", 9]]  # the fixture ran in its setup
    assert data["setup"]["test_mod.py"] == [["mod.py", 9]]
    assert data["tests"]["test_mod.py::test_nothing"] == []
    assert data["order"] == ["test_mod.py::test_double", "test_mod.py::test_seven", "test_mod.py::test_nothing"]
