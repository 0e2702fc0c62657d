"""Mutation testing of the engineering modules: plant one small bug at a time, see whether a test fails.

Why our own script: the plugins live outside the ``calcsheet`` package (``plugins/``) and several modules
keep their formulas as strings in sheet syntax (``work.calc("r_x", "sqrt(I_x/A)")``), which a generic tool
would not mutate. The mutants are curated, AST-based and one at a time:

* comparisons ``<``/``<=``, ``>``/``>=``, ``==``/``!=``, ``is``/``is not``, ``in``/``not in`` swapped;
* arithmetic ``+``/``-``, ``*``/``/``, ``**`` → ``*``, ``//`` → ``/`` (also in ``+=`` and friends);
* ``and``/``or`` swapped, ``not`` dropped, a unary minus dropped, ``True``/``False`` swapped;
* a number changed (an integer n → n + 1; a float x → 2x, 0.0 → 1.0); tolerances (|x| < 1e-6) are left
  alone, their mutants being equivalent in all but contrived cases;
* inside a formula string (a call argument that parses as a sheet expression): each operator swapped as
  above, each number changed, one at a time.

Text that is only a message (``raise``, ``work.fail/note/warn``, ``desc=``/``note=``/``hint=`` arguments,
f-strings, docstrings) is not mutated; neither is a line marked ``# pragma: no mutate``.

Every mutant runs in a scratch copy of the project (so the working tree is never touched), with the tests
that mirror its module, stopping at the first failure, under a per-mutant time limit (a mutant that runs
past it counts as killed, reported apart). Golden rendering tests are left out on purpose: a regenerated
golden would accept the bug, so a mutant must be killed by a test that names its source.

    python tools/mutation.py                          # every target (slow: hours on two cores)
    python tools/mutation.py column material          # some targets
    python tools/mutation.py section --limit 80       # an evenly spread sample of 80 mutants
    python tools/mutation.py beam --sample 300        # a seeded random sample of 300 (--seed, default 19)
    python tools/mutation.py --list evaluator         # list the mutants without running them
    python tools/mutation.py beam --survivors out/mutation.json --select all   # recheck survivors, every test
    python tools/mutation.py beam --where query.py:113 "working.py:258:0 → 1"  # named mutants (no report kept)
    python tools/mutation.py --combine out/first.json out/rerun.json           # a run scored with its reruns

Making a large target affordable (the beam: ~1,600 mutants, a minute of tests): with ``--select coverage``
(the default for targets whose entry says ``"select": "coverage"``) the target's tests run once under a
line tracer (tools/mutation_cover.py; the result is kept in out/ until a source or test file changes), and
each mutant then runs only the tests that reach its statement, quickest first; a mutant on a line that runs
at import (a table, a default argument) runs every test, and one on a line no test reaches survives without
a run. The selection is exact for killing — a test that never runs the mutated statement cannot see it — so
the score is the same as with every test. Each run is a fork of tools/mutation_server.py, which has imported
numpy, pint, scipy and sympy once (``--no-fork`` starts a fresh pytest instead).

Prints each result, the kill rate per target and overall, and the surviving mutants; writes them all to
``--report`` (JSON) as well.
"""
from __future__ import annotations

import argparse
import ast
import contextlib
import copy
import json
import os
import queue
import re
import shutil
import signal
import subprocess
import sys
import tempfile
import threading
import time
from concurrent.futures import ThreadPoolExecutor
from dataclasses import asdict, dataclass
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
P = "plugins/calcsheet_plugins"

# target -> (source files [, only these functions], tests that mirror them)
TARGETS: dict[str, dict] = {
    "section": {
        "sources": [f"{P}/section/{m}.py" for m in ("shapes", "properties", "polygon", "report", "builtup",
                                                     "functions")],
        "tests": ["tests/plugins/section", "tests/plugins/test_traced_fields.py", "tests/plugins/test_defaults.py",
                  "tests/test_golden_values.py"],
        "k": "not column_ and not material_ and not concrete and not custom",
    },
    "beam": {
        # diagrams.py (the SVG figures) is left out: its mutants move lines of a drawing, no value
        "sources": [f"{P}/beam/{m}.py" for m in ("solver", "kinds", "analysis", "handbook", "loads", "model",
                                                  "combos", "results", "query", "working")],
        "tests": ["tests/plugins/beam", "tests/test_golden_values.py"],
        "select": "coverage",  # ~1,600 mutants × a minute of tests: each mutant runs only the tests that reach it
    },
    "column": {"sources": [f"{P}/column/buckling.py"],
               "tests": ["tests/plugins/column", "tests/plugins/test_traced_fields.py",
                         "tests/plugins/test_defaults.py", "tests/test_golden_values.py"],
               "k": "column or mezzanine"},
    "material": {"sources": [f"{P}/material/functions.py", f"{P}/material/library.py"],
                 "tests": ["tests/plugins/material", "tests/plugins/test_traced_fields.py",
                           "tests/plugins/test_defaults.py", "tests/test_golden_values.py"],
                 "k": "material or concrete or custom or golden"},
    "evaluator": {
        # the evaluator's check and unit logic: its own walk, the rules table it shares with the checker, and the
        # plugin host's argument checks
        "sources": ["calcsheet/evaluator.py", "calcsheet/builtins.py", "calcsheet/plugin_host.py"],
        "functions": {
            "calcsheet/evaluator.py": ["_finite", "_eval_BinOp", "_eval_Call", "_eval_if", "evaluate_definition",
                                       "evaluate_check"],
            "calcsheet/plugin_host.py": ["coerce_argument", "_check_dim", "make_record"],
        },
        # builtins.py holds the rules the checker applies too, and the sheet functions' rules: their tests count
        "tests": ["tests/test_evaluator_rules.py", "tests/test_builtins_rules_direct.py",
                  "tests/test_plugin_host_fields.py", "tests/test_evaluator.py", "tests/test_builtins.py",
                  "tests/test_evaluator_oracle.py", "tests/test_engine.py", "tests/test_units.py",
                  "tests/test_functions.py", "tests/test_checker.py", "tests/test_agreement.py",
                  # tables (lookup, interpolation), lists, the size limits, finiteness and the plugin host's checks
                  # live in these modules too
                  "tests/test_tables.py", "tests/test_lists.py", "tests/test_limits.py", "tests/test_finiteness.py",
                  "tests/test_plugin.py", "tests/test_lint.py"],  # lint folds names through builtins.fold
    },
    "units": {"sources": ["calcsheet/units.py"],
              "tests": ["tests/test_units.py", "tests/test_units_words.py", "tests/test_evaluator_rules.py",
                        "tests/test_engine.py"]},
}
# Each target's tests run in the order listed (the tests that mirror the module first), stopping at the first
# failure; "k" narrows the cross-cutting files to the tests about that target (pytest -k, matched on test and
# module names). Golden rendering tests (tests/test_sheets.py) are never used to kill a mutant.

# Survivors judged equivalent (no input can tell them apart from the original) or cosmetic (they move a line of a
# figure, no value), keyed by the source line's text and the mutation, with the reason. They are listed apart in
# the report and left out of the adjusted rate.
EQUIVALENT = {
    ("if slenderness >= transition_slenderness(E, F_y):", ">= → >"):
        "at KL/r = C_c exactly Euler and Johnson both give F_y/2 (the parabola is tangent there)",
    ("if lam >= cc:", ">= → >"):
        "same tangent point: the two formulas agree at KL/r = C_c; only a label at an exact float tie differs",
    ('elastic_ok = se.m_as("Pa") <= sc["f_pl"].m_as("Pa")', "<= → <"):
        "changes only the wording of a note at an exact float tie σ_e = f_pl",
    ('word = "add" if sign > 0 else "subtract"', "> → >="): "sign is +1 or −1, never 0",
    ('work.calc("G", "E/(2*(1 + nu))", unit="GPa" if E.m_as("GPa") > 0 else None,', "> → >="):
        "E > 0 is already enforced a few lines above, so E = 0 never reaches this line",
    ("solid = [r for r in rings if r.sign > 0]", "> → >="): "a ring's sign is +1 (solid) or −1 (hole), never 0",
    ("for rb in (r for r in b.rings if r.sign > 0):", "> → >="): "a ring's sign is +1 (solid) or −1 (hole), never 0",
    ("dims=[Dimension(x0, y0, x0 + W, y0, _fmt(W), -1), Dimension(x0, y0 + H, x0, y0, _fmt(H), -1)],", "1 → 2"):
        "cosmetic: the offset of a dimension line in the polygon's drawing",
    # section
    ('["Property", "Table", "Model", "Deviation", "Tolerance"], rows, units=[None] * 5,', "5 → 6"):
        "cosmetic: a sixth 'no unit' for a column that does not exist; the renderers pair a table's units with its "
        "columns (render/page.py zips them, render/text.py pads them), so the extra entry is never read",
    ("Dimension(xc - bb / 2, 0, xc + bb / 2, 0, _fmt(bb), -1),", "/ → *"):
        "cosmetic: where the bottom flange's dimension line is drawn in the section's figure (its label is "
        "_fmt(bb), unchanged)",
    ("s = min(roots, key=lambda r: abs(r - np.clip(r, 0, 1)) + (0 if 0 <= r <= 1 else 1))", "<= → <"):
        "only a root exactly at s = 0 or 1 changes its key (0 → 1); the area above a level falls monotonically "
        "across the bracket, so the quadratic's other root lies outside [0, 1] with a key of its distance + 1 > 1 "
        "and the same root is chosen",
    ("for ra in (r for r in a.rings if r.sign > 0):", "> → >="): "a ring's sign is +1 (solid) or −1 (hole), never 0",
    ("def _circle_points(cx, cy, r, start=0.0, stop=2 * math.pi, closed_arc=False):", "False → True"):
        "the default is used only for full circles (0 to 2π): with it True the outline gets the first point again "
        "at t = 2π (linspace with n + 1 points and the endpoint has the same spacing), an edge of zero length that "
        "changes no integral and no line of the drawing",
    ("if A2 < 0:", "< → <="):
        "differs only for a ring of zero area (A2 = 0): a polygon of no area is refused before ('no area'), and "
        "both versions divide by that zero area on the next lines anyway",
    ("if abs(dev) > tol:", "> → >="):
        "a catalogue row whose model deviates from the table by exactly the tolerance, to the last bit (a float "
        "tie): it is then listed among the worst deviations or not; the table of deviations is the same",
    ("builtup.py:241", "for j in range(i + 1, len(solids)):", "+ → -"):
        "the overlap and connectivity loops then also pair a part with itself and with the one before it (j = i − 1, "
        "for i = 0 the last): pairs already seen the other way round, and a part 'touching' itself; the overlap "
        "test of a part with itself is not reached for the connectivity loop (the union is symmetric and "
        "idempotent), so the groups are the same",
    # the same loop on line 200 of the reports made before the overlap fix and the merge of main moved it
    ("builtup.py:200", "for j in range(i + 1, len(solids)):", "+ → -"):
        "the overlap and connectivity loops then also pair a part with itself and with the one before it (j = i − 1, "
        "for i = 0 the last): pairs already seen the other way round, and a part 'touching' itself; the overlap "
        "test of a part with itself is not reached for the connectivity loop (the union is symmetric and "
        "idempotent), so the groups are the same",
    ("if r.sign < 0:", "0 → 1"): "a ring's sign is +1 (solid) or −1 (hole): < 0 and < 1 pick the same rings",
    ("where = np.full(len(px), -1)", "1 → 2"):
        "−1 or −2 both mean 'in no part yet': every use asks where < 0, and the values themselves are read only "
        "when none is negative",
    ("tol = 1e-6 * size", "* → /"):
        "the overlap tolerance of a built-up section, 1e-6·D or 1e-6/D mm (D its size, 10–1000 mm): both far "
        "above the round-off of placed coordinates (1e-13 mm) and far below any dimension a drawing states "
        "(0.1 mm); they differ only for parts overlapping by less than a micrometre",
    ('how = ("to rounding (every relative difference below 1e-14)" if worst < 1e-14 else', "< → <="):
        "the wording of the agreement note at a difference of exactly 1e-14 (a float tie)",
    ('shown=_model_cell(entry, "r", g.get("r", 0.0), 4) if derived else None)', "4 → 5"):
        "cosmetic: the digits a derived root radius is shown with (four or five); its value is the same",
    ("if r.sign <= 0 or len(r.y) == 0:", "or → and"):
        "the beam's materials of a transformed section: a hole's ring carries the n of the part it cuts and lies "
        "inside that material (a hole not wholly in material is refused), so adding its y-range to the material's "
        "extent changes nothing; and no ring has zero points",
    ("if not (-1e-9 * L <= xs <= L * (1 + 1e-9)):", "* → /"):
        "the tolerance for a queried place left of the beam, 1e-9·L or 1e-9/L m below 0: both take x = 0 and "
        "refuse any negative place a sheet writes; they differ only for x a fraction of a nanometre below 0",
    ('Field("n_{i}", doc="modular ratio E_i/E_ref of material i (transformed sections)", optional=True),',
     "True → False"):
        "a numbered field is never required: the plugin host skips names with {i} when it checks the returned "
        "fields (plugin_host.make_record), so the flag only marks it optional in the plugins reference",
    # evaluator
    ("return Bracket(0, 0.0, True) if x < lo else Bracket(len(xs) - 2, 1.0, True)", "< → <="):
        "this line is reached only for a key outside the table (not lo <= x <= hi), where x < lo and x <= lo are "
        "the same",
    ("@dataclass(frozen=True, eq=False)", "False → True"):
        "TableValue defines its own __eq__ and sets __hash__ = None in its body; dataclass(eq=True) does not "
        "replace a class's own __eq__, so equality is the same either way",
    ("spans = list(td.cell_spans[1]) if len(td.cell_spans) > 1 else [td.span] * len(texts)", "1 → 2"):
        "a table reaching this line has its header, its unit row and at least two rows of values (the parser "
        "refuses fewer), so len(cell_spans) > 1 and > 2 are both true",
    # units
    ("return tuple(sorted((k, v) for k, v in out.items() if abs(v) > 1e-12))", "> → >="):
        "drops an exponent of exactly 1e-12 (a float tie); the exponents a sheet makes are whole numbers, halves "
        "and thirds, or round-off near 0",
    ("return tuple(sorted((k, v * p) for k, v in a if abs(v * p) > 1e-12))", "> → >="):
        "likewise for a power: only an exponent of exactly 1e-12 differs",
    ('names = sorted((n for n in VOCABULARY if re.fullmatch(r"[^\\W\\d]\\w*", n)), key=len, reverse=True)',
     "True → False"):
        "the order of the unit names in the grammar's alternation; each name is followed by the lookahead "
        "(?![\\w.(]), so a shorter name that is a prefix of the text (m in mm) fails there and the regex "
        "backtracks to the longer one: the same tokens either way, only the matching is slower",
    ('(("[length]", 1),): "length",', "1 → 2"):
        "the mutated key (length², 'length') is overwritten by the next line's (length², 'area') in the same dict "
        "literal, and length¹ is then described by the general rule, also as 'length'",
    # beam
    ("if lo * hi < 0 or abs(lo) < 1e-9 * scale <= abs(hi) or abs(hi) < 1e-9 * scale <= abs(lo):", "<= → <"):
        "differs only when a moment equals the round-off threshold 1e-9 × the largest moment exactly (a float tie)",
    ("lo = min(max(bisect.bisect_right(Xl, min(bp)) - 2, 0), nspan - 1)", "2 → 3"):
        "starts the search for the spans a load touches one span further left; _on_span gives nothing on a span "
        "the load does not reach, so only time changes",
    ("if kind == \"w\" and a <= ls + tol and b >= lt - tol and b > a:", "<= → <"):
        "the pieces are cut at every load's ends, so a line load's start a equals a piece start ls exactly; "
        "the two differ only when a = ls + tol to the last bit",
    ("if kind == \"w\" and a <= ls + tol and b >= lt - tol and b > a:", ">= → >"):
        "likewise at the piece end: b equals lt exactly, never lt − tol to the last bit",
    ("if ld.x1 <= tol and ld.x2 >= L - tol and abs(ld.w1 - ld.w2) <= 1e-12 * max(abs(ld.w1), 1e-300):", "<= → <"):
        "a full-length load starts at x1 = 0 (< tol as well); they differ only for x1 = tol = 1e-9 L exactly "
        "(the line's other <=, |w1 − w2| ≤ 1e-12·|w1|, holds strictly too: a uniform load's difference is 0)",
    ("if ld.x1 <= tol and ld.x2 >= L - tol and abs(ld.w1 - ld.w2) <= 1e-12 * max(abs(ld.w1), 1e-300):", ">= → >"):
        "a full-length load ends at x2 = L (> L − tol as well); they differ only for x2 = L − tol exactly",
    ("others = sorted(x for x in a.others + [b.x] + b.others if abs(x - a.x) > tol)", "> → >="):
        "two places of a tie exactly 1e-9 L apart, to the last bit: a tolerance's own boundary",
    ("return 0.0 if abs(v) < 1e-9 * max(scale, 1e-300) else v", "< → <="):
        "a value exactly equal to the round-off threshold 1e-9 × the largest value (a float tie) is kept or zeroed",
    ("and kinds[2] == \"free\" and abs(points[0].x - model.length) <= 1e-9 * model.length):", "* → /"):
        "the tolerance of 'the load is at the tip' becomes 1e-9/L instead of 1e-9·L: both accept a load at the tip "
        "to round-off and nothing a sheet can place (the case's own cross-check compares it with the solver)",
    ("and kinds[2] == \"free\" and abs(points[0].x - model.length) <= 1e-9 * model.length):", "<= → <"):
        "differs only for a load exactly 1e-9·L from the tip (a float tie)",
    ("lo = np.searchsorted(grid, x0 + 1e-12 * m.length, side=\"right\")", "* → /"):
        "the grid holds the nodes exactly, so any offset between 0 and a fraction of the shortest piece (1e-12·L "
        "or 1e-12/L) cuts the span at the same grid points",
    ("ld.validate(L, 1e-9 * L, BeamInputError)", "* → /"):
        "a second check of positions the model already placed within 1e-9·L of the beam (model._load): a "
        "tolerance of 1e-9/L instead changes nothing a sheet can reach",
    ("inside = x0 - tol <= self.x < x1 - tol or (last and abs(self.x - x1) <= tol)", "<= → <"):
        "a load at a span's left support has x = x0 exactly, inside both ways; only x = x0 − tol to the last bit "
        "differs (a float tie)",
    ("merged = [x for i, x in enumerate(others) if i == 0 or x - others[i - 1] > tol]", "> → >="):
        "two tied places exactly 1e-9·L apart to the last bit (a float tie)",
    ("if kind == \"w\" and a <= ls + tol and b >= lt - tol and b > a:", "> → >="):
        "a line-load part never has b = a: on_span and parts drop any part of length ≤ tol before it gets here",
    ("rel = max(abs(R - W) / (abs(W) + 1e3), abs(MR - MW) / (abs(MW) + 1e3))", "1000.0 → 2000.0"):
        "the guard against dividing by a zero load (1 kN or 2 kN) only rescales round-off residuals of ~1e-12; "
        "the equilibrium check holds either way",
    ("if not (-tol <= self.x <= L + tol):", "<= → <"):
        "a load at the very end has x = 0 or x = L exactly, inside both ways; only x = −tol or L + tol to the last "
        "bit differs",
    ("I_spans, I = None, Quantity(1.0, \"m^4\")", "1.0 → 2.0"):
        "a placeholder I for a beam solved by statics alone: its forces do not depend on it and its deflection "
        "and EI fields are absent, so no output can show it",
    ("E = E if E is not None else Quantity(1.0, \"Pa\")  # any value: statics does not read it", "1.0 → 2.0"):
        "likewise the placeholder E of a beam solved by statics alone",
    ("if worst is None or rel > worst[0]:", "> → >="):
        "which of several combinations with exactly equal round-off residuals is printed as the worst; the two "
        "checks below hold for every row of the table either way",
    ("if abs(self.w1 - self.w2) <= 1e-12 * max(abs(self.w1), abs(self.w2), 1e-300):", "* → /"):
        "chooses how a uniform stretch's resultant is printed (w·L or ½(w₁ + w₂)·L, equal values); a uniform load "
        "and its parts have w₁ = w₂ exactly, inside either tolerance",
    ("and abs(points[0].x - L / 2) > 1e-9 * L and 0 < points[0].x < L):", "< → <="):
        "a force exactly on a support also fits the off-centre case's formulas (R = P, M = 0, δ = 0 at a = 0): the "
        "printed cross-check agrees with the solver either way",
    ("if self.x < x0 - tol or (abs(self.x - x0) <= tol and self.M > 0):", "<= → <"):
        "a couple at the section has x = x0 exactly (|x − x0| = 0 < tol too); only a distance of exactly tol differs",
    ("if self.x1 < -tol or self.x2 > L + tol:", "> → >="):
        "a line load ending at the beam's end has x2 = L exactly; only x2 = L + tol to the last bit differs",
    ("while pos < len(text):", "< → <="):
        "at pos = len(text) the loop's first line finds nothing left (text[pos:].strip() is empty) and breaks",
    ("if -tol <= r <= h + tol:", "<= → <"):
        "a root of a piece's moment at the piece's own end is r = 0 or r = h (inside both ways); only a root of "
        "exactly −tol or h + tol (tol = 1e-9·L) to the last bit differs (a float tie)",
    ('side = "left" if i == len(X) - 1 else "right"', "- → +"):
        "no support is then read from the left, but the last support's 'right' is the last piece as well "
        "(Solution.at clips the piece index; every piece starts before L), so θ there is the same value",
    ("handbook.py", "tol = 1e-9 * L", "* → /"):
        "which loads count as full-length for the handbook cross-check: 1e-9/L instead of 1e-9·L m, both far "
        "above round-off and far below any length a sheet writes; they differ only for a load starting or ending "
        "a fraction of a nanometre from the beam's end, which then prints or omits a cross-check — the solver's "
        "values are the same either way",
    ("lo = min(max(bisect.bisect_right(Xl, min(bp)) - 2, 0), nspan - 1)", "1 → 2"):
        "caps the first span searched one lower (with one span: index −1, the same last element, whose _on_span "
        "gives nothing since a point's home span is never −1 and a line load's extent there is empty)",
}



def explained(m: "Mutant") -> str | None:
    """The reason ``m`` is equivalent, if EQUIVALENT gives one: keyed by (line text, mutation), or by (file
    name, line text, mutation) where the same text means something else in another file, or by ("file:line",
    line text, mutation) where it does in the same file (an edit that moves the line makes the mutant open
    again: the safe way to fail)."""
    name = Path(m.path).name
    return (EQUIVALENT.get((f"{name}:{m.line}", m.source_line, m.what))
            or EQUIVALENT.get((name, m.source_line, m.what)) or EQUIVALENT.get((m.source_line, m.what)))


QUIET = {"raise"}
MESSAGE_CALLS = {"fail", "note", "warn", "figure", "caption", "get_close_matches", "format", "join"}
UNIT_CALLS = {"q", "_q", "m_as", "to", "Unit", "Quantity", "unit", "build_unit", "parse_units", "parse_dimension"}
MESSAGE_KEYWORDS = {"desc", "note", "doc", "hint", "caption", "title", "kind", "prefix", "suffix"}
TOLERANCE = 1e-6
COMPARE_SWAP = {ast.Lt: ast.LtE, ast.LtE: ast.Lt, ast.Gt: ast.GtE, ast.GtE: ast.Gt, ast.Eq: ast.NotEq,
                ast.NotEq: ast.Eq, ast.Is: ast.IsNot, ast.IsNot: ast.Is, ast.In: ast.NotIn, ast.NotIn: ast.In}
BINOP_SWAP = {ast.Add: ast.Sub, ast.Sub: ast.Add, ast.Mult: ast.Div, ast.Div: ast.Mult, ast.Pow: ast.Mult,
              ast.FloorDiv: ast.Div}
SYMBOL = {ast.Lt: "<", ast.LtE: "<=", ast.Gt: ">", ast.GtE: ">=", ast.Eq: "==", ast.NotEq: "!=", ast.Is: "is",
          ast.IsNot: "is not", ast.In: "in", ast.NotIn: "not in", ast.Add: "+", ast.Sub: "-", ast.Mult: "*",
          ast.Div: "/", ast.Pow: "**", ast.FloorDiv: "//", ast.And: "and", ast.Or: "or"}
FORMULA_CHARS = re.compile(r"^[A-Za-z0-9_ .+\-*/^(),]+$")
FORMULA_TOKEN = re.compile(r"(?<![A-Za-z_0-9.])(\d+(?:\.\d+)?(?:[eE][-+]?\d+)?)(?![A-Za-z_0-9.])|([-+*/^])")
FORMULA_SWAP = {"+": "-", "-": "+", "*": "/", "/": "*", "^": "*"}


@dataclass
class Mutant:
    target: str
    path: str  # relative to the project root
    index: int  # among this file's mutation points
    line: int
    what: str  # e.g. "<= → <"
    source_line: str
    lines: tuple[int, int] = (0, 0)  # the statement (or compound statement's header) holding the mutant
    status: str = ""  # killed | survived | timeout | error
    seconds: float = 0.0
    killed_by: str = ""

    @property
    def where(self) -> str:
        return f"{self.path}:{self.line}"


# ---------------------------------------------------------------- finding and applying mutants


def _number_mutant(value):
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return None
    if isinstance(value, int):
        return value + 1
    if value == 0.0:
        return 1.0
    if abs(value) < TOLERANCE:
        return None
    return value * 2


def _formula_variants(text: str) -> list[tuple[str, str]]:
    """(mutated text, description) for each operator and number in a formula string."""
    out = []
    for m in FORMULA_TOKEN.finditer(text):
        if m.group(1):
            old = m.group(1)
            try:
                new_num = _number_mutant(int(old) if old.isdigit() else float(old))
            except ValueError:  # pragma: no cover
                continue
            if new_num is None:
                continue
            new = repr(new_num)
        else:
            old = m.group(2)
            if old == "-" and (m.start() == 0 or text[:m.start()].rstrip()[-1:] in "(,+-*/^"):
                continue  # a unary minus
            new = FORMULA_SWAP[old]
        mutated = text[:m.start()] + new + text[m.end():]
        out.append((mutated, f'formula "{text}" → "{mutated}"'))
    return out


def _is_formula(text: str) -> bool:
    if not FORMULA_CHARS.match(text) or not re.search(r"[-+*/^]", text) or not re.search(r"[A-Za-z]", text):
        return False
    try:
        from calcsheet.parser import parse_expression
        parse_expression(text)
    except Exception:
        return False
    return True


class _Points(ast.NodeTransformer):
    """Walks a module; counts mutation points; applies the one numbered ``target`` (or none, when -1)."""

    def __init__(self, lines: list[str], functions: list[str] | None, target: int = -1):
        self.lines = lines
        self.functions = set(functions) if functions else None
        self.target = target
        self.found: list[tuple[int, str]] = []  # (line, description)
        self._func: list[str] = []
        self._quiet = 0

    # -- bookkeeping
    def _active(self, node) -> bool:
        if self._quiet:
            return False
        if self.functions is not None and not (set(self._func) & self.functions):
            return False
        line = getattr(node, "lineno", 0)
        return not (0 < line <= len(self.lines) and "pragma: no mutate" in self.lines[line - 1])

    def _point(self, node, what: str) -> bool:
        """Record a point; True when it is the one to apply."""
        self.found.append((getattr(node, "lineno", 0), what))
        return len(self.found) - 1 == self.target

    @contextlib.contextmanager
    def _silenced(self):
        self._quiet += 1
        try:
            yield
        finally:
            self._quiet -= 1

    # -- scopes that are not mutated
    def visit_FunctionDef(self, node):
        self._func.append(node.name)
        if ast.get_docstring(node) is not None:
            node.body = node.body[:1] + [self.visit(s) for s in node.body[1:]]
            node.body = [s for s in node.body if s is not None]
            for k in ("args", "returns"):  # decorators (caches, registration) are not mutated
                v = getattr(node, k)
                if isinstance(v, list):
                    setattr(node, k, [self.visit(x) for x in v])
                elif v is not None:
                    setattr(node, k, self.visit(v))
        else:
            node.body = [s for s in (self.visit(s) for s in node.body) if s is not None]
            node.args = self.visit(node.args)
        self._func.pop()
        return node

    visit_AsyncFunctionDef = visit_FunctionDef

    def visit_Raise(self, node):
        return node

    def visit_JoinedStr(self, node):
        return node

    def visit_Assert(self, node):
        return node

    def visit_Expr(self, node):
        if isinstance(node.value, ast.Constant) and isinstance(node.value.value, str):
            return node  # a docstring or a bare string
        return self.generic_visit(node)

    def visit_Call(self, node):
        name = node.func.attr if isinstance(node.func, ast.Attribute) else getattr(node.func, "id", "")
        if name in MESSAGE_CALLS:
            return node
        node.func = self.visit(node.func)
        new_args = []
        for a in node.args:
            if isinstance(a, ast.Constant) and isinstance(a.value, str) and name not in UNIT_CALLS \
                    and self._active(a) and _is_formula(a.value):
                for mutated, what in _formula_variants(a.value):
                    if self._point(a, what):
                        a = ast.copy_location(ast.Constant(mutated), a)
                new_args.append(a)
            else:
                new_args.append(self.visit(a))
        node.args = new_args
        for kw in node.keywords:
            if kw.arg in MESSAGE_KEYWORDS:
                continue
            kw.value = self.visit(kw.value)
        return node

    # -- the mutation operators
    def visit_Compare(self, node):
        self.generic_visit(node)
        if self._active(node):
            for k, op in enumerate(node.ops):
                new = COMPARE_SWAP.get(type(op))
                if new and self._point(node, f"{SYMBOL[type(op)]} → {SYMBOL[new]}"):
                    node.ops[k] = new()
        return node

    def visit_BinOp(self, node):
        if isinstance(node.op, ast.Mod) and isinstance(node.left, ast.Constant):
            return node  # "%" formatting
        self.generic_visit(node)
        new = BINOP_SWAP.get(type(node.op))
        if new and self._active(node) and self._point(node, f"{SYMBOL[type(node.op)]} → {SYMBOL[new]}"):
            node.op = new()
        return node

    def visit_AugAssign(self, node):
        self.generic_visit(node)
        new = BINOP_SWAP.get(type(node.op))
        if new and self._active(node) and self._point(node, f"{SYMBOL[type(node.op)]}= → {SYMBOL[new]}="):
            node.op = new()
        return node

    def visit_BoolOp(self, node):
        self.generic_visit(node)
        new = ast.Or if isinstance(node.op, ast.And) else ast.And
        if self._active(node) and self._point(node, f"{SYMBOL[type(node.op)]} → {SYMBOL[new]}"):
            node.op = new()
        return node

    def visit_UnaryOp(self, node):
        self.generic_visit(node)
        if isinstance(node.op, (ast.USub, ast.Not)) and self._active(node):
            if isinstance(node.op, ast.USub) and isinstance(node.operand, ast.Constant):
                return node  # a negative literal: its number is mutated instead
            word = "not" if isinstance(node.op, ast.Not) else "unary -"
            if self._point(node, f"{word} dropped"):
                return node.operand
        return node

    def visit_Constant(self, node):
        if not self._active(node):
            return node
        v = node.value
        if isinstance(v, bool):
            if self._point(node, f"{v} → {not v}"):
                return ast.copy_location(ast.Constant(not v), node)
            return node
        new = _number_mutant(v)
        if new is not None and self._point(node, f"{v!r} → {new!r}"):
            return ast.copy_location(ast.Constant(new), node)
        return node

    def visit_Subscript(self, node):
        node.value = self.visit(node.value)
        if isinstance(node.slice, ast.Constant) and isinstance(node.slice.value, str):
            return node
        node.slice = self.visit(node.slice)
        return node

    def visit_keyword(self, node):
        if node.arg in MESSAGE_KEYWORDS:
            return node
        return self.generic_visit(node)


def functions_for(target: str, rel: str) -> list[str] | None:
    """The functions of ``rel`` to mutate (None: all of the file)."""
    return (TARGETS[target].get("functions") or {}).get(rel)


def find_all(target: str) -> list[Mutant]:
    return [m for rel in TARGETS[target]["sources"]
            for m in find_mutants(target, ROOT / rel, rel, functions_for(target, rel))]


def find_mutants(target: str, path: Path, rel: str, functions: list[str] | None = None) -> list[Mutant]:
    text = path.read_text(encoding="utf-8")
    lines = text.splitlines()
    walker = _Points(lines, functions)
    walker.visit(ast.parse(text))
    spans = statement_spans(text)
    return [Mutant(target, rel, k, line, what, lines[line - 1].strip() if 0 < line <= len(lines) else "",
                   spans.get(line, (line, line)))
            for k, (line, what) in enumerate(walker.found)]


def statement_spans(text: str) -> dict[int, tuple[int, int]]:
    """Line -> (first, last) line of the innermost statement holding it; for a compound statement (if, for,
    def, with …) only its header counts (its body's statements are their own). A mutant on a line is
    reached by a test exactly when the test runs some line of that span."""
    spans: dict[int, tuple[int, int]] = {}
    for node in ast.walk(ast.parse(text)):
        if not isinstance(node, ast.stmt):
            continue
        first, last = node.lineno, node.end_lineno or node.lineno
        body = getattr(node, "body", None)
        if isinstance(body, list) and body and isinstance(body[0], ast.stmt):
            last = max(first, body[0].lineno - 1)
        for line in range(first, last + 1):
            old = spans.get(line)
            if old is None or old[1] - old[0] > last - first:
                spans[line] = (first, last)
    return spans


def mutated_source(text: str, index: int, functions: list[str] | None = None) -> str:
    tree = ast.parse(text)
    walker = _Points(text.splitlines(), functions, target=index)
    tree = walker.visit(tree)
    if index >= len(walker.found):
        raise IndexError(f"no mutation point {index}")
    return ast.unparse(ast.fix_missing_locations(tree)) + "\n"


@contextlib.contextmanager
def applied(path: Path, index: int, functions: list[str] | None = None):
    """Write mutant ``index`` into ``path``; restore the original bytes afterwards, whatever happens."""
    original = path.read_bytes()
    try:
        path.write_text(mutated_source(original.decode("utf-8"), index, functions), encoding="utf-8")
        _drop_bytecode(path)
        yield path
    finally:
        path.write_bytes(original)
        _drop_bytecode(path)


def _drop_bytecode(path: Path) -> None:
    cache = path.parent / "__pycache__"
    if cache.is_dir():
        for pyc in cache.glob(path.stem + ".*.pyc"):
            pyc.unlink(missing_ok=True)


# ---------------------------------------------------------------- running


def scratch_copy(dest: Path) -> Path:
    """The project's sources and tests copied into ``dest`` (the working tree is never mutated)."""
    for part in ("calcsheet", "plugins", "tests", "sheets", "docs", "tools"):  # tools: tests run some of them
        src = ROOT / part
        if src.exists():
            shutil.copytree(src, dest / part, ignore=shutil.ignore_patterns("__pycache__", ".hypothesis",
                                                                            "*.egg-info"))
    for f in ("pyproject.toml", "README.md", "DEVELOPERS.md"):
        if (ROOT / f).exists():
            shutil.copy2(ROOT / f, dest / f)
    return dest


def _env(copy_root: Path) -> dict:
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join([str(copy_root), str(copy_root / "plugins")])
    env["PYTHONDONTWRITEBYTECODE"] = "1"
    return env


class Server:
    """tools/mutation_server.py in the scratch copy's environment: each run is a fork of a process that has
    already imported the heavy libraries (numpy, pint, scipy, sympy …), several seconds saved per mutant."""

    def __init__(self, copy_root: Path):
        self.proc = subprocess.Popen([sys.executable, str(ROOT / "tools" / "mutation_server.py")], cwd=copy_root,
                                     env=_env(copy_root), stdin=subprocess.PIPE, stdout=subprocess.PIPE, text=True)
        if not json.loads(self.proc.stdout.readline() or "{}").get("ready"):
            raise SystemExit("the mutation test server did not start")

    def run(self, args: list[str], timeout: float) -> dict:
        self.proc.stdin.write(json.dumps({"args": args, "timeout": timeout}) + "\n")
        self.proc.stdin.flush()
        return json.loads(self.proc.stdout.readline())

    def close(self) -> None:
        """Stop the server and a run it may be in (a stopped mutation run leaves no process behind)."""
        with contextlib.suppress(Exception):
            self.proc.terminate()
            self.proc.wait(timeout=10)


def run_tests(copy_root: Path, tests: list[str], timeout: float, k: str | None = None,
              server: Server | None = None) -> tuple[str, float, str]:
    """('passed' | 'failed' | 'timeout', seconds, first failing test)."""
    args = ["-x", "-q", "--no-header", "-p", "no:cacheprovider", "--hypothesis-seed=0", *(["-k", k] if k else []),
            *tests]
    # no example saved by an earlier mutant's failure is replayed: every mutant meets the same examples
    shutil.rmtree(copy_root / ".hypothesis", ignore_errors=True)
    if server is not None:
        answer = server.run(args, timeout)
        status, dt, out = answer["status"], answer["seconds"], answer["output"]
    else:
        t0 = time.monotonic()
        try:
            proc = subprocess.run([sys.executable, "-m", "pytest", *args], cwd=copy_root, env=_env(copy_root),
                                  capture_output=True, text=True, timeout=timeout, start_new_session=True)
        except subprocess.TimeoutExpired:
            return "timeout", time.monotonic() - t0, ""
        dt, out = time.monotonic() - t0, proc.stdout
        status = "passed" if proc.returncode == 0 else "failed"
    if status != "failed":
        return status, dt, ""
    failed = re.findall(r"^(?:FAILED|ERROR) (\S+)", out, re.M)
    return "failed", dt, failed[0] if failed else out.strip().splitlines()[-1:][0] if out.strip() else ""


def _check_copy_is_used(copy_root: Path) -> None:
    code = "import calcsheet, calcsheet_plugins.section as s; print(calcsheet.__file__); print(s.__file__)"
    out = subprocess.run([sys.executable, "-c", code], cwd=copy_root, env=_env(copy_root), capture_output=True,
                         text=True, check=True).stdout.split()
    if not all(Path(p).resolve().is_relative_to(copy_root.resolve()) for p in out):
        raise SystemExit(f"the scratch copy is not the code under test: {out}")


class Coverage:
    """Which test reaches which line of a target's sources (one traced run of its tests, tools/mutation_cover.py)."""

    def __init__(self, data: dict):
        self.order: list[str] = data["order"]
        self.seconds: dict[str, float] = data["seconds"]
        self.imported = {tuple(x) for x in data["import"]}
        self.by_line: dict[tuple[str, int], set[str]] = {}
        for test, lines in data["tests"].items():
            for path, line in lines:
                self.by_line.setdefault((path, line), set()).add(test)
        for module, lines in data["setup"].items():  # what a fixture made once, every test of its file uses
            tests = {t for t in self.order if t.split("::", 1)[0] == module}
            for path, line in lines:
                self.by_line.setdefault((path, line), set()).update(tests)

    @classmethod
    def measure(cls, copy_root: Path, target: str, tests: list[str], k: str | None,
                stale_ok: bool = False) -> "Coverage":
        """Trace the target's tests once; kept in out/ and reused while no source or test file changes."""
        import hashlib

        digest = hashlib.sha256()
        for folder in ("calcsheet", "plugins", "tests"):
            for f in sorted((copy_root / folder).rglob("*.py")):
                digest.update(str(f.relative_to(copy_root)).encode() + b"\0" + f.read_bytes())
        digest.update(json.dumps([tests, k]).encode())
        cache = ROOT / "out" / f"mutation-cover-{target}.json"
        if cache.exists():
            data = json.loads(cache.read_text())
            if data.get("key") == digest.hexdigest() or stale_ok:
                # stale: tests added since are not chosen for a mutant (never a false kill; rerun the survivors)
                return cls(data)
        out = copy_root / f".cover-{target}.json"
        env = _env(copy_root)
        env["PYTHONPATH"] += os.pathsep + str(ROOT / "tools")
        env["CALCSHEET_COVER_FILES"] = json.dumps([str(copy_root / s) for s in TARGETS[target]["sources"]])
        env["CALCSHEET_COVER_ROOT"] = str(copy_root)
        env["CALCSHEET_COVER_OUT"] = str(out)
        cmd = [sys.executable, "-m", "pytest", "-q", "--no-header", "-p", "no:cacheprovider", "-p", "mutation_cover",
               "--hypothesis-seed=0", *(["-k", k] if k else []), *tests]
        shutil.rmtree(copy_root / ".hypothesis", ignore_errors=True)
        proc = subprocess.run(cmd, cwd=copy_root, env=env, capture_output=True, text=True)
        if proc.returncode != 0 or not out.exists():
            raise SystemExit(f"{target}: the traced run of its tests failed:\n{proc.stdout[-3000:]}{proc.stderr[-3000:]}")
        data = json.loads(out.read_text())
        data["key"] = digest.hexdigest()
        cache.parent.mkdir(parents=True, exist_ok=True)
        cache.write_text(json.dumps(data))
        return cls(data)

    def tests_for(self, m: Mutant) -> list[str] | None:
        """The tests that reach mutant ``m``, quickest first (a mutant most tests kill dies in the first
        seconds); None: every test (the line runs at import)."""
        span = range(m.lines[0] or m.line, (m.lines[1] or m.line) + 1)
        if any((m.path, line) in self.imported for line in span):
            return None
        reach = set().union(*(self.by_line.get((m.path, line), set()) for line in span))
        return sorted((t for t in self.order if t in reach), key=lambda t: self.seconds.get(t, 0.0))

    def time_of(self, tests: list[str] | None) -> float:
        return sum(self.seconds.get(t, 0.0) for t in (self.order if tests is None else tests))


def spread(items: list, limit: int | None) -> list:
    """An evenly spread, deterministic sample of ``limit`` items (all when None)."""
    if limit is None or limit >= len(items):
        return list(items)
    step = len(items) / limit
    return [items[int(k * step)] for k in range(limit)]


def sample(items: list, size: int | None, seed: int) -> list:
    """A seeded random sample of ``size`` items (all when None), in the sample's random order: a run stopped
    early (a time limit) has still run a random sample, not the first files' mutants."""
    if size is None:
        return list(items)
    import random

    return random.Random(seed).sample(items, min(size, len(items)))


def _at(m: Mutant, where: str) -> bool:
    """Whether mutant ``m`` is the one ``where`` names: FILE:LINE or FILE:LINE:WHAT (FILE: a path's tail)."""
    path, _, rest = where.partition(":")
    line, _, what = rest.partition(":")
    return (m.path == path or m.path.endswith("/" + path)) and str(m.line) == line.strip() \
        and (not what or m.what == what.strip())


def tests_for(target: str, copy_root: Path) -> list[str]:
    return [p for p in TARGETS[target]["tests"] if (copy_root / p).exists()]


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("targets", nargs="*", default=[], metavar="TARGET",
                    help=f"any of {', '.join(TARGETS)} (default: all)")
    ap.add_argument("--limit", type=int, default=None, help="at most this many mutants per target (spread evenly)")
    ap.add_argument("--timeout", type=float, default=None,
                    help="seconds per mutant (default: 3 × the unmutated run, at least 60)")
    ap.add_argument("--list", action="store_true", help="list the mutants, run nothing")
    ap.add_argument("--report", type=Path, default=ROOT / "out" / "mutation.json")
    ap.add_argument("--keep", action="store_true", help="keep the scratch copy")
    ap.add_argument("--sample", type=int, default=None,
                    help="a seeded random sample of this many mutants per target (see --seed)")
    ap.add_argument("--seed", type=int, default=19, help="seed of --sample (default 19)")
    ap.add_argument("--survivors", type=Path, default=None,
                    help="run only the mutants a previous --report lists as survived (after adding tests)")
    ap.add_argument("--select", choices=("coverage", "all"), default=None,
                    help="coverage: each mutant runs only the tests that reach its line (default for targets "
                         "that say so, e.g. beam); all: every test of the target")
    ap.add_argument("--jobs", "-j", type=int, default=1,
                    help="mutants run at a time, each in its own scratch copy (default 1)")
    ap.add_argument("--resume", type=Path, default=None,
                    help="a report of a stopped run of the same plan: its mutants are not run again")
    ap.add_argument("--stale-cover", action="store_true",
                    help="reuse the kept coverage map even if tests changed since (new tests are then not chosen; "
                         "rerun the survivors with a fresh map)")
    ap.add_argument("--also", nargs="*", default=[],
                    help="test files run first for every mutant whatever the coverage map says (with --stale-cover: "
                         "the tests written since the map was traced)")
    ap.add_argument("--skip-equivalent", action="store_true",
                    help="do not run mutants already explained in EQUIVALENT (they count as explained)")
    ap.add_argument("--where", nargs="*", default=[], metavar="FILE:LINE[:WHAT]",
                    help="run only the mutants on these lines (FILE may be the file's name alone; WHAT, e.g. "
                         "'<= → <', narrows to that mutation): a rerun of named survivors when no report is kept")
    ap.add_argument("--combine", nargs="+", type=Path, default=None, metavar="REPORT",
                    help="run nothing: the mutants of the first report, each killed if any later report (a rerun of "
                         "its survivors with new tests) killed it, scored as one run (the source files unchanged)")
    ap.add_argument("--no-fork", action="store_true",
                    help="start a fresh pytest per mutant instead of forking tools/mutation_server.py")
    args = ap.parse_args(argv)
    if args.combine:
        combine(args.combine)
        return 0
    targets = args.targets or list(TARGETS)
    unknown = [t for t in targets if t not in TARGETS]
    if unknown:
        ap.error(f"unknown target(s) {', '.join(unknown)}; choose from {', '.join(TARGETS)}")

    plan: dict[str, list[Mutant]] = {}
    for t in targets:
        plan[t] = sample(spread(find_all(t), args.limit), args.sample, args.seed)
    if args.survivors:
        earlier = json.loads(args.survivors.read_text())["mutants"]
        # matched by file, line text and mutation, so lines moved by an edit since are still found
        keep = {(m["path"], m["source_line"], m["what"]) for m in earlier if m["status"] == "survived"}
        plan = {t: [m for m in find_all(t) if (m.path, m.source_line, m.what) in keep]
                for t in plan}
    if args.where:
        plan = {t: [m for m in find_all(t) if any(_at(m, w) for w in args.where)] for t in plan}
    if args.list:
        for t, ms in plan.items():
            for m in ms:
                print(f"{t:10s} {m.where:55s} {m.what}")
            print(f"{t}: {len(ms)} mutants")
        return 0

    earlier: list[Mutant] = []
    if args.resume and args.resume.exists():  # carry over what a stopped run of the same plan has done
        done = {}
        for d in json.loads(args.resume.read_text())["mutants"]:
            d["lines"] = tuple(d.get("lines") or (0, 0))
            done[(d["path"], d["line"], d["source_line"], d["what"])] = Mutant(**d)
        for t in plan:
            earlier += [done[key] for m in plan[t] if (key := (m.path, m.line, m.source_line, m.what)) in done]
            plan[t] = [m for m in plan[t] if (m.path, m.line, m.source_line, m.what) not in done]
        print(f"resuming: {len(earlier)} mutants done already, {sum(map(len, plan.values()))} to run", flush=True)
    if args.skip_equivalent:
        for t in plan:
            for m in plan[t]:
                if explained(m):
                    m.status, m.killed_by = "survived", "(explained in EQUIVALENT, not run)"
                    earlier.append(m)
            plan[t] = [m for m in plan[t] if not explained(m)]

    # a time limit (timeout, make's SIGTERM) still restores, cleans up and reports what ran so far
    signal.signal(signal.SIGTERM, lambda *_: sys.exit(143))
    work = Path(tempfile.mkdtemp(prefix="calcsheet-mutation-"))
    results: list[Mutant] = list(earlier)
    slots: queue.Queue = queue.Queue()  # (scratch copy, its server): one per job, each mutant takes one
    servers: list[Server] = []
    stop = threading.Event()
    pool = None
    try:
        for j in range(max(1, args.jobs)):
            root = scratch_copy(work / f"project{j}")
            _check_copy_is_used(root)
            server = None if args.no_fork else Server(root)
            servers += [server] if server else []
            slots.put((root, server))
        copy_root, server = slots.queue[0]
        pool = ThreadPoolExecutor(max_workers=max(1, args.jobs))
        for t, ms in plan.items():
            tests = tests_for(t, copy_root)
            k = TARGETS[t].get("k")
            cover = None
            if (args.select or TARGETS[t].get("select")) == "coverage":
                # the traced run is also the check that the unmutated tests pass (it refuses otherwise)
                t0 = time.monotonic()
                cover = Coverage.measure(copy_root, t, tests, k, stale_ok=args.stale_cover)
                base = cover.time_of(None)
                print(f"{t}: traced which of {len(cover.order)} tests reach which line "
                      f"({time.monotonic() - t0:.0f} s)", flush=True)
            else:
                status, base, first = run_tests(copy_root, tests, timeout=3600, k=k, server=server)
                if status != "passed":
                    print(f"{t}: the unmutated tests do not pass ({first}); skipped", flush=True)
                    continue
            timeout = args.timeout or max(60.0, 3 * base)
            print(f"== {t}: {len(ms)} mutants, tests {' '.join(tests)} ({base:.0f} s unmutated, "
                  f"limit {timeout:.0f} s each{', tests chosen by coverage' if cover else ''}, "
                  f"{max(1, args.jobs)} at a time)", flush=True)

            def one(m: Mutant, t=t, tests=tests, k=k, cover=cover, timeout=timeout) -> None:
                if stop.is_set():
                    return
                chosen, limit = tests, timeout
                if cover is not None:
                    reach = cover.tests_for(m)
                    if reach == [] and not args.also:  # no test runs this line: nothing to run, it survives
                        m.status, m.killed_by = "survived", "(no test reaches this line)"
                        results.append(m)
                        print(f"{'UNCOVERED':9s} {m.where:55s} {m.what}   | {m.source_line[:70]}", flush=True)
                        return
                    if reach is not None:
                        chosen, limit = reach, args.timeout or max(60.0, 30 + 3 * cover.time_of(reach))
                    if args.also:
                        chosen = [*args.also, *(chosen if reach is not None else tests)]
                root, srv = slots.get()
                try:
                    with applied(root / m.path, m.index, functions_for(t, m.path)):
                        outcome, dt, first = run_tests(root, chosen, limit, k if chosen is tests else None,
                                                       server=srv)
                finally:
                    slots.put((root, srv))
                if stop.is_set():  # stopped mid-run: the outcome is not the mutant's
                    return
                m.seconds = round(dt, 1)
                m.status = {"failed": "killed", "passed": "survived", "timeout": "timeout"}[outcome]
                m.killed_by = first
                results.append(m)
                print(f"{m.status.upper():9s} {m.where:55s} {m.what}   | {m.source_line[:70]}"
                      f"{f'   [{len(chosen)} tests, {dt:.0f} s]' if chosen is not tests else ''}", flush=True)

            for f in [pool.submit(one, m) for m in ms]:
                f.result()
    finally:
        stop.set()
        for srv in servers:
            srv.close()
        if pool is not None:
            pool.shutdown(wait=True, cancel_futures=True)
        if not args.keep:
            shutil.rmtree(work, ignore_errors=True)
        summary = report(results)
        args.report.parent.mkdir(parents=True, exist_ok=True)
        args.report.write_text(json.dumps({"summary": summary, "mutants": [asdict(m) for m in results]},
                                          indent=2, ensure_ascii=False) + "\n")
    return 0


def _load(path: Path) -> list[Mutant]:
    out = []
    for d in json.loads(path.read_text())["mutants"]:
        d["lines"] = tuple(d.get("lines") or (0, 0))
        out.append(Mutant(**d))
    return out


def combine(paths: list[Path]) -> dict:
    """The first report's mutants, with the outcome of any later rerun of them (matched by file, mutation
    point and mutation: valid while the source files are unchanged)."""
    base = _load(paths[0])
    later = {}
    for path in paths[1:]:
        for m in _load(path):
            if m.status in ("killed", "timeout"):
                later[(m.path, m.index, m.what)] = m
    for m in base:
        k = later.get((m.path, m.index, m.what))
        if m.status == "survived" and k is not None:
            m.status, m.killed_by = k.status, k.killed_by
    print(f"combined: {len(base)} mutants of {paths[0]}, outcomes of {len(paths) - 1} later run(s)")
    return report(base)


def report(results: list[Mutant]) -> dict:
    summary = {}
    print("\n== kill rate")
    for t in dict.fromkeys(m.target for m in results):
        ms = [m for m in results if m.target == t]
        killed = sum(m.status in ("killed", "timeout") for m in ms)
        summary[t] = {"mutants": len(ms), "killed": killed, "timeouts": sum(m.status == "timeout" for m in ms),
                      "rate": round(killed / len(ms), 4) if ms else None}
        print(f"{t:10s} {killed:4d}/{len(ms):<4d} {100 * killed / len(ms):5.1f} %"
              f"  ({summary[t]['timeouts']} by time limit)")
    total = len(results)
    killed = sum(m.status in ("killed", "timeout") for m in results)
    if total:
        print(f"{'all':10s} {killed:4d}/{total:<4d} {100 * killed / total:5.1f} %")
    summary["all"] = {"mutants": total, "killed": killed, "rate": round(killed / total, 4) if total else None}
    survivors = [m for m in results if m.status == "survived"]
    equivalent = [m for m in survivors if explained(m)]
    if total:
        adjusted = killed / (total - len(equivalent)) if total > len(equivalent) else 1.0
        print(f"{'adjusted':10s} {killed:4d}/{total - len(equivalent):<4d} {100 * adjusted:5.1f} %"
              f"  (leaving out {len(equivalent)} equivalent mutants)")
        summary["all"]["adjusted_rate"] = round(adjusted, 4)
    if equivalent:
        print("\n== equivalent or cosmetic mutants (explained in tools/mutation.py EQUIVALENT)")
        for m in equivalent:
            print(f"{m.where:55s} {m.what}   | {explained(m)}")
    unexplained = [m for m in survivors if m not in equivalent]
    if unexplained:
        print("\n== surviving mutants")
        for m in unexplained:
            print(f"{m.where:55s} {m.what}   | {m.source_line[:70]}")
    return summary


if __name__ == "__main__":
    sys.exit(main())
