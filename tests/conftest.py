import textwrap

import pytest

import calcsheet


@pytest.fixture
def run():
    """Run a sheet given as (dedented) text."""

    def _run(text, **kw):
        return calcsheet.run(textwrap.dedent(text).lstrip("\n"), **kw)

    return _run
