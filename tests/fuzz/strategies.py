"""Hypothesis strategies for sheets: statements drawn from the grammar (calcsheet/grammar.lark), whole
sheets around them (front matter, headings, prose, comments, descriptions, includes), mutations of the
demo sheets in sheets/, and mutations of a saved JSON result."""
from __future__ import annotations

from pathlib import Path

from hypothesis import strategies as st

from calcsheet import builtins as B

REPO = Path(__file__).parents[2]
DEMOS = [p.read_bytes() for p in sorted((REPO / "sheets").glob("*.calc"))]

NAMES = ["a", "b", "x", "L", "w", "M", "f_y", "sec", "E", "undefined_name", "φ", "b2"]
UNITS = ["m", "mm", "kN", "kN/m", "kN*m", "MPa", "N/mm^2", "deg", "s", "kPa", "mm^4", "mm²", "%", "degC",
         "kNm", "furlong", "ksi", "lbf", "ft"]
NUMBERS = ["0", "1", "2.5", "0.001", "1e3", "3.", ".5", "1e308", "1e999", "1e-999", "5e-324", "1e-300",
           "123456789012345678901234567890", "9" * 45, "0e5", "2E-3"]
PLUGIN_CALLS = ["section.rectangle(b=100 mm, h=200 mm)", "section.rectangle(b=0 mm, h=1e300 mm)",
                "material.steel(grade=\"S355\")", "material.steel(grade=\"nope\")",
                "beam.point(P=1 kN, x=1 m)", "section.box(b=100 mm)", "nosuch.thing(a=1)",
                "section.rectangle(100 mm, 200 mm)"]
COMPARE = ["<=", ">=", "<", ">", "≤", "≥"]
FUNCS = sorted(B.FUNCTIONS)


def _number():
    return st.builds(lambda n, u: f"{n} {u}".strip(), st.sampled_from(NUMBERS),
                     st.one_of(st.just(""), st.sampled_from(UNITS)))


def _atom():
    return st.one_of(_number(), st.sampled_from(NAMES), st.sampled_from(PLUGIN_CALLS),
                     st.sampled_from(['"text"', '""', '"S355"']))


def expressions(max_leaves: int = 12):
    def extend(inner):
        return st.one_of(
            st.builds(lambda a, op, b: f"{a} {op} {b}", inner, st.sampled_from(["+", "-", "*", "/", "^", "·"]),
                      inner),
            st.builds(lambda a: f"-{a}", inner),
            st.builds(lambda a: f"({a})", inner),
            st.builds(lambda f, args: f"{f}({', '.join(args)})", st.sampled_from(FUNCS),
                      st.lists(inner, max_size=4)),
            st.builds(lambda c, l, op, r, a, b: f"{c}({l} {op} {r}, {a}, {b})", st.just("if"), inner,
                      st.sampled_from(COMPARE), inner, inner, inner),
            st.builds(lambda a, f: f"{a}.{f}", st.sampled_from(NAMES + PLUGIN_CALLS), st.sampled_from(
                ["A", "I_x", "Z", "f_y", "nope"])),
            st.builds(lambda xs: "[" + ", ".join(xs) + "]", st.lists(inner, max_size=3)),
        )
    return st.recursive(_atom(), extend, max_leaves=max_leaves)


def statements():
    expr = expressions()
    definition = st.builds(lambda n, u, e: f"{n}{u} = {e}", st.sampled_from(NAMES),
                           st.one_of(st.just(""), st.sampled_from(UNITS).map(lambda u: f" [{u}]"),
                                     st.just(" []"), st.just(" [2]")), expr)
    check = st.builds(lambda a, op, b: f"check {a} {op} {b}", expr, st.sampled_from(COMPARE), expr)
    decorated = st.builds(lambda s, tail: s + tail, st.one_of(definition, check), st.sampled_from(
        ["", "  -- a description", "  // a comment", "  // allow implausible-value: because",
         "  // allow nonsense", "  -- desc // comment \"quoted\""]))
    return st.one_of(decorated, st.sampled_from([
        "# Heading", "## Sub heading", "#No space", "> prose line", "", "// comment", "include \"x.calc\"",
        "include \"../outside.calc\"", "include \"/etc/passwd\"", "include \"a\x00.calc\"", "---", "title: x",
        "check", "=", "a = ", "a = (1 + ", ")", "a = [1, 2", "   continued)", "\t", "check a <= b <= c",
    ]))


def sheets():
    """A sheet's text: optional front matter, then statements drawn from the grammar."""
    front = st.sampled_from(["", "---\ntitle: Fuzz\nunits: US\nsigfigs: 4\n---\n", "---\nunits: XX\nsigfigs: 99\n",
                             "---\nrevisions:\n  - A | x\n---\n", "\ufeff"])
    return st.builds(lambda f, lines, nl: f + nl.join(lines) + "\n", front, st.lists(statements(), max_size=14),
                     st.sampled_from(["\n", "\r\n", "\r"]))


# ---------------------------------------------------------------- mutation of real inputs

JUNK = [b"(", b")", b"[", b"]", b'"', b"-", b"--", b"//", b"#", b">", b"^", b"=", b"check ", b"1e999",
        b"1e-999", b"\xff", b"\xe6", b"\x00", b"\t", b"\n", b"\r", b"\xc3", b"\xe2\x89\xa4", b" mm", b"/0",
        b"sqrt(-1)", b"9" * 50, b"(" * 300, b".", b",", b"include \"", b"---\n", b"\xef\xbb\xbf"]


@st.composite
def mutated(draw, originals: list[bytes]):
    data = bytearray(draw(st.sampled_from(originals)))
    for _ in range(draw(st.integers(1, 6))):
        if not data:
            data.extend(draw(st.sampled_from(JUNK)))
            continue
        at = draw(st.integers(0, len(data)))
        op = draw(st.sampled_from(["insert", "delete", "replace", "duplicate", "truncate", "swap"]))
        if op == "insert":
            data[at:at] = draw(st.one_of(st.sampled_from(JUNK), st.binary(min_size=1, max_size=4)))
        elif op == "delete":
            del data[at:at + draw(st.integers(1, 40))]
        elif op == "replace":
            data[at:at + 1] = draw(st.sampled_from(JUNK))
        elif op == "duplicate":
            end = min(len(data), at + draw(st.integers(1, 200)))
            data[at:at] = data[at:end]
        elif op == "truncate":
            del data[at:]
        else:
            lines = bytes(data).split(b"\n")
            i, j = draw(st.integers(0, len(lines) - 1)), draw(st.integers(0, len(lines) - 1))
            lines[i], lines[j] = lines[j], lines[i]
            data = bytearray(b"\n".join(lines))
    return bytes(data)


def demo_mutations():
    return mutated(DEMOS)
