"""docs/diagnostics.md: one entry per code, and each entry's examples do what it says."""
from __future__ import annotations

import re
from pathlib import Path

import pytest

import calcsheet
from calcsheet.suppress import known_codes

DOC = (Path(__file__).parents[2] / "docs" / "diagnostics.md").read_text(encoding="utf-8")
ENTRIES = dict(re.findall(r"^## `([a-z0-9-]+)`\n(.*?)(?=^## |\Z)", DOC, re.M | re.S))
BLOCK = re.compile(r"(Mistake|Fixed):\n```(\w+)\n(.*?)```", re.S)


def test_every_code_has_exactly_one_entry():
    assert len(re.findall(r"^## `", DOC, re.M)) == len(ENTRIES)
    assert set(ENTRIES) == known_codes()


def examples():
    for code, body in ENTRIES.items():
        blocks = {label: (lang, text) for label, lang, text in BLOCK.findall(body)}
        assert set(blocks) == {"Mistake", "Fixed"}, code
        if blocks["Mistake"][0] == "calc":
            yield code, blocks["Mistake"][1], blocks["Fixed"][1]


@pytest.mark.parametrize("code, bad, good", list(examples()), ids=[e[0] for e in examples()])
def test_the_mistake_raises_the_code_and_the_fix_does_not(code, bad, good):
    def codes(text):
        return {d.code for d in calcsheet.run(text).diagnostics if not d.suppressed}

    assert code in codes(bad)
    assert code not in codes(good)
