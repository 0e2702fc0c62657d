"""Our own fuzzer, run in CI: generated and mutated sheets, overrides and saved results through `check`,
`build --format json` and `diff`, in-process via the CLI's main function (issue 16, part 6).

The oracle (harness.expect_sound): no Python traceback or internal error, no case past the per-case
CPU budget (a signal timer), and every error line located as file:line:col. Examples are derandomized so CI
is repeatable and no saved example database is used; CALCSHEET_FUZZ_SCALE=10 runs ten times as many
(and CALCSHEET_FUZZ_RANDOM=1 draws fresh ones) for a longer fuzzing session.
"""
from __future__ import annotations

import json
import os

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from . import harness, strategies as S
from .harness import expect_sound, run_cli

SCALE = float(os.environ.get("CALCSHEET_FUZZ_SCALE", "1"))


def fuzz(n: int):
    return settings(max_examples=max(1, int(n * SCALE)), deadline=None, database=None,
                    derandomize=not os.environ.get("CALCSHEET_FUZZ_RANDOM"),
                    suppress_health_check=list(HealthCheck))


@pytest.fixture(scope="module")
def work(tmp_path_factory):
    mp = pytest.MonkeyPatch()
    mp.setattr(os, "fsync", lambda fd: None)  # durability is tests/test_atomic.py's business; here it is time
    d = tmp_path_factory.mktemp("fuzz")
    (d / "x.calc").write_text("q = 2 kN/m\n")  # what generated `include "x.calc"` lines find
    yield d
    mp.undo()
    c = harness.COUNTS
    print(f"\nfuzz: {c['cases']} cases, {c['clean']} clean, {c['located']} located errors, "
          f"{c['crash']} crashes, {c['hang']} hangs, {c['stalled']} stalled, {c['unlocated']} unlocated")


def write(path, data) -> str:
    path.write_bytes(data if isinstance(data, bytes) else data.encode("utf-8", "surrogatepass"))
    return str(path)


@fuzz(900)
@given(text=S.sheets(), fmt=st.sampled_from(["human", "line", "json"]))
def test_generated_sheets_through_check(work, text, fmt):
    expect_sound(run_cli(["check", write(work / "g.calc", text), "--format", fmt]))


@fuzz(350)
@given(text=S.sheets(), sets=st.lists(st.builds(lambda n, e: f"{n}={e}", st.sampled_from(S.NAMES),
                                                S.expressions(max_leaves=4)), max_size=2))
def test_generated_sheets_through_build_json(work, text, sets):
    argv = ["build", write(work / "g.calc", text), "-o", work / "out", "--format", "json"]
    for s in sets:
        argv += ["--set", s]
    expect_sound(run_cli(argv))


@fuzz(450)
@given(data=S.demo_mutations(), command=st.sampled_from(["check", "build"]))
def test_mutated_demo_sheets_through_check_and_build(work, data, command):
    path = write(work / "m.calc", data)
    argv = ["check", path] if command == "check" else ["build", path, "-o", work / "out", "--format", "json"]
    expect_sound(run_cli(argv))


@fuzz(100)
@given(old=S.demo_mutations(), new=S.demo_mutations(), fmt=st.sampled_from(["text", "json"]))
def test_mutated_sheets_through_diff(work, old, new, fmt):
    outcome = run_cli(["diff", write(work / "old.calc", old), write(work / "new.calc", new), "--format", fmt])
    expect_sound(outcome)
    if fmt == "json" and outcome.status in (0, 1) and outcome.text.lstrip().startswith("{"):
        json.loads(outcome.text[:outcome.text.rindex("}") + 1], parse_constant=lambda c: pytest.fail(c))


@pytest.fixture(scope="module")
def saved_results(work):
    out = []
    for i, demo in enumerate(S.DEMOS):
        src = work / f"demo{i}.calc"
        src.write_bytes(demo)
        run_cli(["build", src, "-o", work / "saved", "--format", "json"])
        out.append((work / "saved" / f"demo{i}.json").read_bytes())
    return out


@fuzz(200)
@given(data=st.data())
def test_mutated_saved_results_through_diff(work, saved_results, data):
    blob = data.draw(S.mutated(saved_results))
    expect_sound(run_cli(["diff", write(work / "old.json", blob), work / "demo0.calc"]))


@fuzz(60)
@given(toml=S.mutated([b'L = "7.5 m"\nw = 2\nE = "210 GPa"\n', b'[t]\na = 1\n', b"x = [[[1]]]\n"]))
def test_mutated_set_files_through_build(work, toml):
    sheet = write(work / "s.calc", "L = 3 m\nw = 1\nM = w * L\n")
    expect_sound(run_cli(["build", sheet, "--set-file", write(work / "o.toml", toml), "-o", work / "out",
                          "--format", "json"]))
