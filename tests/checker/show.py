"""Print a sheet's diagnostics with the text under each span (for writing .expect files by hand)."""
import sys

from calcsheet.engine import run

for path in sys.argv[1:]:
    r = run(path, evaluate=False)
    lines = r.source.splitlines()
    for d in r.diagnostics:
        s = d.span
        under = lines[s.line - 1][s.col - 1:(s.end_col - 1 if s.end_line == s.line else None)]
        print(f"{s.line}:{s.col} {d.severity} {d.code}  <{under}>  {'(allowed) ' if d.suppressed else ''}{d.message}")
