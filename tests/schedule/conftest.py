import textwrap

import pytest

# A simply supported beam under a uniform load: M = w L^2 / 8, V = w L / 2 (common practice).
BEAM = textwrap.dedent("""\
    ---
    project: Schedule tests
    subject: Floor beam
    date: 2026-01-05
    ---
    w = 2 kN/m          -- line load
    L = 3 m             -- span
    M [kN*m] = w*L^2/8  -- mid-span moment
    V [kN] = w*L/2      -- end shear
    check M <= 5 kN*m   -- bending
    check V <= 6 kN     -- shear
    """)


@pytest.fixture
def beam(tmp_path):
    p = tmp_path / "beam.calc"
    p.write_text(BEAM, encoding="utf-8")
    return p


@pytest.fixture
def table(tmp_path):
    def make(text, name="members.csv"):
        p = tmp_path / name
        p.write_text(textwrap.dedent(text), encoding="utf-8")
        return p

    return make


def tree(folder):
    """Every file under ``folder`` (relative name -> bytes)."""
    return {p.relative_to(folder).as_posix(): p.read_bytes() for p in sorted(folder.rglob("*")) if p.is_file()}
