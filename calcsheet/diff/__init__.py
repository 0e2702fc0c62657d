"""What changed between two revisions of a sheet, so a reviewer re-checks only what moved.

Each side is a sheet file, a git revision of one (``REV:path``) or a saved
JSON result (``sources``). Both are reduced to a ``Snapshot`` (``model``:
values by name, checks with the names they read) and compared by name and by
dependency, never by line number (``compare``): inserting a line elsewhere
changes nothing that did not move. The printers (text, JSON, the "changes
since" page) are in ``calcsheet.render.diff``.
"""
from .compare import CheckChange, SheetDiff, ValueChange, diff_results, diff_snapshots, diff_specs
from .model import CheckEntry, DiffSourceError, Entry, Snapshot, show_quantity
from .sources import git_show, load_result, load_side, quantity_from_json, snapshot_of_json, snapshot_of_result

__all__ = ["CheckChange", "CheckEntry", "DiffSourceError", "Entry", "SheetDiff", "Snapshot", "ValueChange",
           "diff_results", "diff_snapshots", "diff_specs", "git_show", "load_result", "load_side",
           "quantity_from_json", "show_quantity", "snapshot_of_json", "snapshot_of_result"]
