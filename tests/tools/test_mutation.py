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
