import textwrap

import pytest

import calcsheet


@pytest.fixture
def run():
    """Run a sheet given as (dedented) text."""

    def _run(text, **kw):
        return calcsheet.run(textwrap.dedent(text).lstrip("\n"), **kw)

    return _run


@pytest.fixture
def sheet(tmp_path):
    """Write a sheet file into the test's folder: sheet(text, name="s.calc") -> path."""

    def make(text, name="s.calc"):
        p = tmp_path / name
        p.write_text(text, encoding="utf-8")
        return p

    return make
