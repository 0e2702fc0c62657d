"""include "file.calc": another sheet's body spliced in, only from the sheet's own folder."""
import os

import pytest

import calcsheet
from calcsheet.render.page import PackageDocument


@pytest.fixture
def tree(tmp_path):
    (tmp_path / "common").mkdir()
    (tmp_path / "common" / "loads.calc").write_text(
        "---\nproject: ignored\n---\n# Shared loads\ng_k = 0.55 kPa -- boards\nq_k = 4.0 kPa\ncheck q_k <= 5 kPa\n")
    return tmp_path


def write(folder, name, text):
    p = folder / name
    p.write_text(text)
    return p


def test_included_statements_are_spliced_in_place(tree):
    main = write(tree, "main.calc", 'include "common/loads.calc"\ns = 0.5 m\nw = (g_k + q_k) * s\ncheck w <= 3 kN/m\n')
    r = calcsheet.run(main)
    assert r.ok, r.format_diagnostics()
    assert r.values["w"].m_as("kN/m") == pytest.approx((0.55 + 4.0) * 0.5)
    assert [c.ok for c in r.checks] == [True, True]
    assert len({c.anchor for c in r.checks}) == 2  # a check in each file, both kept
    assert [p for p, _ in r.includes] == [os.path.normpath(str(tree / "common" / "loads.calc"))]
    assert any(d.code == "include" and d.severity == "warning" for d in r.diagnostics)  # its front matter


def test_an_error_in_an_included_file_points_into_that_file(tree):
    write(tree / "common", "bad.calc", "x = 1 m\ny = x + 2 kN\n")
    main = write(tree, "main.calc", 'a = 1\ninclude "common/bad.calc"\n')
    r = calcsheet.run(main)
    (d,) = r.errors
    assert d.path.endswith(os.path.join("common", "bad.calc")) and (d.span.line, d.span.col) == (2, 5)
    assert "y = x + 2 kN" in r.format_diagnostics()


def test_a_name_defined_twice_across_files_says_where(tree):
    main = write(tree, "main.calc", 'include "common/loads.calc"\nq_k = 3 kPa\n')
    (d,) = calcsheet.run(main).errors
    assert d.code == "redefinition" and "loads.calc line 6" in d.message


@pytest.mark.parametrize("line, fragment", [
    ('include "../outside.calc"', "outside the sheet's folder"),
    ('include "/etc/hosts.calc"', "relative to the sheet's folder"),
    ('include "common/loads.txt"', "only .calc"),
    ('include "nothere.calc"', "no such sheet"),
    ('include "main.calc"', "includes itself"),
])
def test_includes_that_are_refused(tree, line, fragment):
    write(tree.parent, "outside.calc", "z = 1\n")
    main = write(tree, "main.calc", line + "\n")
    r = calcsheet.run(main)
    assert r.errors and r.errors[0].code == "include" and fragment in r.errors[0].message
    assert (r.errors[0].span.line, r.errors[0].span.col) == (1, 1)


def test_a_symlink_cannot_reach_outside_the_folder(tree):
    secret = tree.parent / "secret.calc"
    secret.write_text("leak = 1\n")
    (tree / "link.calc").symlink_to(secret)
    r = calcsheet.run(write(tree, "main.calc", 'include "link.calc"\n'))
    assert r.errors[0].code == "include" and "leak" not in r.values


def test_a_sheet_given_as_text_cannot_include():
    r = calcsheet.run('include "loads.calc"\n')
    assert r.errors[0].code == "include"


def test_the_package_stamps_each_included_file_hash(tree):
    import hashlib

    r = calcsheet.run(write(tree, "main.calc", 'include "common/loads.calc"\n'))
    digest = hashlib.sha256((tree / "common" / "loads.calc").read_text().encode()).hexdigest()
    assert digest in PackageDocument(r).html()
    assert r.to_json()["source"]["includes"][0]["sha256"] == digest


def test_rebuilding_a_sheet_with_includes_rereads_them(tree):
    from calcsheet.incremental import rebuild

    main = write(tree, "main.calc", 'include "common/loads.calc"\nw = q_k * 2 m\n')
    first = calcsheet.run(main)
    (tree / "common" / "loads.calc").write_text("q_k = 5.0 kPa\n")
    again = rebuild(first, main.read_text())
    assert again.full and again.result.values["w"].m_as("kN/m") == pytest.approx(10.0)
