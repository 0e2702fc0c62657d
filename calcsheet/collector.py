"""The cyclic garbage collector's policy while calcsheet does large work: one module, two policies.

* ``run_pause``: a run, a static check, a rebuild or a printer's walk of a result. These make many objects
  and no reference cycles, so the collector is off meanwhile and what they made is moved, unwalked, to the
  oldest generation after a large stretch.
* ``layout_pause``: a PDF layout, which does make cycles (WeasyPrint's boxes): what lived before is frozen
  and the thresholds are raised, so the layout's own objects are collected seldom rather than never.
"""
from __future__ import annotations

import gc
import threading
from contextlib import contextmanager

__all__ = ["LAYOUT_THRESHOLDS", "RUN_GC_THRESHOLD", "layout_pause", "run_pause"]

_GC_LOCK = threading.Lock()
_GC_DEPTH = 0
_GC_WAS_ENABLED = True
RUN_GC_THRESHOLD = 50_000  # new objects after which a finished run's objects move to the oldest generation


@contextmanager
def run_pause():
    """While a sheet runs (or is only checked), the cyclic garbage collector does not.

    A run allocates many objects that stay alive to its end (nodes, spans, types, records, quantities) and
    leaves no reference cycles (the folder and the plugin host hold their owners weakly), so a collection
    during a run frees nothing: it only walks the growing heap, again for each generation an object passes
    through (a third of a 3·10⁴-line run, 10 % of a check at 10⁴ lines and near 30 % at 10⁵, a cost that grows
    faster than the sheet). The collector is switched off when the first of any concurrent runs starts and
    put back as it was when the last ends. After a large run (at least ``RUN_GC_THRESHOLD`` new objects)
    ``gc.freeze()`` then ``gc.unfreeze()`` move every tracked object into the oldest generation (a splice of
    lists, no walk, the young counts reset), so the next young collection, in whatever the caller does next,
    does not walk them; a cycle among them is freed by the next full collection. After a small run (the live
    preview's one changed line) the young generation is left as it is, for the next young collection, so a
    watch process does not push each save's garbage out of the young generations. A process that froze
    objects itself (a pre-fork server, a PDF laid out in chunks) keeps them frozen (then nothing is moved).
    """
    global _GC_DEPTH, _GC_WAS_ENABLED
    with _GC_LOCK:
        if _GC_DEPTH == 0:
            _GC_WAS_ENABLED = gc.isenabled()
            gc.disable()
        _GC_DEPTH += 1
    try:
        yield
    finally:
        with _GC_LOCK:
            _GC_DEPTH -= 1
            if _GC_DEPTH == 0:
                if gc.get_count()[0] >= RUN_GC_THRESHOLD and gc.get_freeze_count() == 0:
                    gc.freeze()
                    gc.unfreeze()
                if _GC_WAS_ENABLED:
                    gc.enable()


# While a page is laid out: the young generation collected once per this many new objects, and the older ones
# (whose collection walks every object the layout has made so far) only at every 50th and then never; a
# chunked layout still frees each chunk with its own full collection.
LAYOUT_THRESHOLDS = (100_000, 50, 100)


@contextmanager
def layout_pause():
    """Lay out and write a PDF with few garbage collections.

    A layout makes millions of small objects, nearly all alive until the PDF is written; with the default
    thresholds the collector walks them (and everything the process held before, the sheet's result and the
    unit registry included) again and again, for a quarter or more of the time of a PDF. Here what lives
    before the layout is frozen (never walked) and the thresholds are raised; both are put back after. The
    laid-out document (a web of cycles) is garbage once dropped; the collector frees it on its usual
    schedule after the block, as it would have without it (a chunked layout frees each chunk at once)."""
    freeze = not gc.get_freeze_count()
    old = gc.get_threshold()
    if freeze:
        gc.freeze()
    gc.set_threshold(*LAYOUT_THRESHOLDS)
    try:
        yield
    finally:
        gc.set_threshold(*old)
        if freeze:
            gc.unfreeze()
