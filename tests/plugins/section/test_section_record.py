"""A section record carries its own geometry: a hidden payload on the Record, no process-wide cache."""
import dataclasses
import pickle

import pytest

from calcsheet.plugin import Record
from calcsheet_plugins.section import functions as F
from calcsheet_plugins.section import shapes as S


def errors(result):
    return [d for d in result.diagnostics if d.severity == "error"]


def test_the_payload_is_not_a_field_and_is_never_printed_or_compared():
    a = Record(type="section", fields={"A": 1}, payload=object())
    b = Record(type="section", fields={"A": 1}, payload=None)
    assert "payload" not in a.fields
    assert a == b  # two records with equal fields are equal whatever they carry
    assert "object" not in repr(a)


def test_the_payload_travels_where_a_record_is_copied():
    geom = S.rectangle(100.0, 10.0)
    rec = Record(type="section", fields={"A": 1}, payload=geom)
    assert dataclasses.replace(rec).payload is geom
    assert pickle.loads(pickle.dumps(rec)).payload.label == geom.label


def test_a_section_record_holds_its_outline(run):
    r = run("s = section.rectangle(b=100 mm, h=10 mm)\n")
    rec = r.values["s"]
    assert isinstance(rec.payload, S.Shape) and rec.payload.label.startswith("rectangle")


def test_there_is_no_process_wide_geometry_cache(run):
    assert not hasattr(F, "_GEOMETRY")
    # building many sections leaves nothing behind in the plugin module
    before = {k: len(v) for k, v in vars(F).items() if isinstance(v, (dict, list))}
    for k in range(5):
        run(f"s = section.rectangle(b={100 + k} mm, h=10 mm)\np = section.part(shape=s)\n")
    after = {k: len(v) for k, v in vars(F).items() if isinstance(v, (dict, list))}
    assert before == after


def test_an_incremental_rebuild_reuses_records_with_their_outlines():
    # the plate's record is reused untouched; the built-up section after the edit still finds its outline
    import calcsheet
    from calcsheet.incremental import rebuild

    sheet = ("y0 = 10 mm\n"
             "p = section.rectangle(b=100 mm, h=10 mm)\n"
             "s = section.built_up(parts=[section.part(shape=p), section.part(shape=p, y=y0)])\n")
    first = calcsheet.run(sheet)
    out = rebuild(first, sheet.replace("y0 = 10 mm", "y0 = 20 mm"))
    assert not out.full, out.reason
    assert "p" not in out.recomputed and "s" in out.recomputed
    f = out.result.values["s"].fields
    # two 100 × 10 plates, centroids 5 and 25 mm: I_x = 2·(100·10³/12) + 2·1000·10² (parallel-axis theorem)
    assert f["I_x"].m_as("mm^4") == pytest.approx(2 * 100 * 10**3 / 12 + 2 * 1000 * 10**2, rel=1e-12)
