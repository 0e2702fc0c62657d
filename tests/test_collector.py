"""The collector's two policies: none during a run, a check, a rebuild or a printer's walk of a result (they
make no cycles); seldom during a PDF layout (which does)."""
import gc
import weakref

from calcsheet import collector, engine

def test_a_run_puts_the_garbage_collector_back_as_it_found_it():
    before = gc.get_threshold()
    inside = []
    with collector.run_pause():
        inside.append(gc.isenabled())
        with collector.run_pause():  # nested or concurrent runs: put back once, by the last
            pass
        inside.append(gc.isenabled())
    assert engine.run("x = 1 m\ncheck x <= 2 m\n").ok
    assert engine.run("x = 1 m\ncheck x <= 2 m\n", evaluate=False).ok  # a static check too
    assert inside == [False, False]  # no collection walks the run's objects while it runs
    assert gc.get_threshold() == before and gc.isenabled() and gc.get_freeze_count() == 0


def test_a_run_leaves_a_collector_switched_off_off_and_objects_frozen_by_others_frozen():
    gc.disable()
    try:
        assert engine.run("x = 1 m\n").ok
        assert engine.run("x = 1 m\n", evaluate=False).ok
        assert not gc.isenabled()
    finally:
        gc.enable()
    gc.freeze()  # e.g. a server before it forks
    try:
        frozen = gc.get_freeze_count()
        assert frozen > 0 and engine.run("x = 1 m\n").ok
        kept = [[i] for i in range(collector.RUN_GC_THRESHOLD)]
        with collector.run_pause():
            kept += [[i] for i in range(collector.RUN_GC_THRESHOLD)]  # large, yet unfreeze() would thaw them all
        assert gc.get_freeze_count() == frozen and gc.isenabled()
    finally:
        gc.unfreeze()


class _Cycle:
    pass


def _cycle():
    a = _Cycle()
    a.me = a
    return weakref.ref(a)


def test_what_a_large_run_made_waits_for_a_full_collection_where_its_cycles_are_freed():
    with collector.run_pause():
        ref = _cycle()
        kept = [[i] for i in range(collector.RUN_GC_THRESHOLD)]  # a large run's trees and records
    assert gc.get_count()[0] < 1000  # moved to the oldest generation: the young counts start again
    gc.collect(1)
    assert ref() is not None  # young collections no longer walk it
    gc.collect()
    assert ref() is None and len(kept) == collector.RUN_GC_THRESHOLD


def test_what_a_large_sheet_holds_is_left_in_the_oldest_generation_for_the_next_collection_to_skip():
    gc.collect()
    result = engine.run("".join(f"x_{i} = {i + 1} m\ncheck x_{i} <= 1 km\n" for i in range(3000)))
    assert result.ok
    assert gc.get_count()[0] < 50  # the young generation starts empty again
    step = result.steps["x_7"]
    assert gc.is_tracked(step) and not any(step is o for o in gc.get_objects(generation=0))


def test_what_a_small_run_made_stays_young():
    gc.collect()
    with collector.run_pause():
        ref = _cycle()
    gc.collect(0)
    assert ref() is None


def test_a_layout_runs_with_few_collections_and_puts_the_collector_back():
    before = (gc.get_threshold(), gc.get_freeze_count())
    with collector.layout_pause():
        # what lived before is frozen (never walked during the layout); the thresholds are raised
        assert gc.get_freeze_count() > 0
        assert gc.get_threshold() == collector.LAYOUT_THRESHOLDS
        assert gc.get_threshold()[0] > before[0][0]
    assert (gc.get_threshold(), gc.get_freeze_count()) == before


def test_printing_a_result_runs_with_the_collector_off_and_puts_it_back(monkeypatch):
    from calcsheet.render.json import JsonPrinter
    from calcsheet.render.page import PackageDocument

    result = engine.run("x = 1 m\ncheck x <= 2 m\n")
    seen = []
    value = JsonPrinter.value
    monkeypatch.setattr(JsonPrinter, "value", lambda self, *a: seen.append(gc.isenabled()) or value(self, *a))
    JsonPrinter().result(result)
    title_block = PackageDocument.title_block
    monkeypatch.setattr(PackageDocument, "title_block", lambda self: seen.append(gc.isenabled()) or title_block(self))
    PackageDocument(result).html()
    assert seen and not any(seen) and gc.isenabled()
