"""The printers of a diff: the terminal report and the \"changes since\" page."""
from pathlib import Path

import calcsheet
from calcsheet.diff import diff_results, diff_specs
from calcsheet.render.diff import changes_page, text, to_json

BEAM = (Path(__file__).parents[1] / "diff" / "joist.calc").read_text(encoding="utf-8")  # a simply supported timber joist


def deeper(text: str, h: str = "250 mm") -> str:
    return text.replace("h = 200 mm", f"h = {h}")


def _write(path: Path, text: str) -> str:
    path.write_text(text, encoding="utf-8")
    return str(path)


def test_the_text_report_reads_old_to_new():
    report = text(diff_results(calcsheet.run(BEAM, path="joist.calc"), calcsheet.run(deeper(BEAM), path="joist.calc")))
    assert report.startswith("changes from rev B (old) to rev B (new)\ninputs changed:\n")
    assert "h: 200.0 mm → 250.0 mm  +25.00 %" in report
    assert "sigma <= f: NG → OK" in report
    assert "M:" not in report


def test_changes_page_escapes_sheet_text(tmp_path):
    old = _write(tmp_path / "<b>old&.calc", BEAM.replace("rev: B", "rev: <i>B</i>"))
    d = diff_specs(old, _write(tmp_path / "new.calc", deeper(BEAM)))
    page = changes_page(d)
    assert "<b>" not in page and "<i>" not in page
    assert "&lt;i&gt;B&lt;/i&gt;" in page


def test_the_json_document_lists_every_change_with_units_pint_reads_back():
    import pint

    d = diff_results(calcsheet.run(BEAM), calcsheet.run(deeper(BEAM)))
    doc = to_json(d)
    h = next(c for c in doc["inputs"] if c["name"] == "h")
    assert (h["old"]["value"], h["new"]["value"], h["percent"]) == (200.0, 250.0, 25.0)
    assert pint.UnitRegistry().Quantity(h["new"]["value"], h["new"]["unit"]).to("m").magnitude == 0.25
    assert [c["text"] for c in doc["checks"]["flipped"]] == ["sigma <= f"]
    assert doc["checks"]["flipped"][0]["old"]["status"] == "NG" and doc["checks"]["flipped"][0]["new"]["status"] == "OK"
