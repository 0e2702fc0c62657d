"""lark's parse errors -> our located SheetSyntaxError, worded for an engineer."""
from __future__ import annotations

from lark.exceptions import UnexpectedCharacters, UnexpectedEOF, UnexpectedInput

from ..errors import SheetSyntaxError, Span

_TOKEN_WORDS = {
    "NAME": "a name", "NUMBER": "a number", "UNIT": "a unit", "STRING": "a text in quotes",
    "LPAR": "'('", "RPAR": "')'", "LSQB": "'['", "RSQB": "']'", "COMMA": "','", "EQUAL": "'='",
    "PLUS": "'+'", "MINUS": "'-'", "SLASH": "'/'", "CIRCUMFLEX": "'^'", "MULOP": "'*'", "COMPARE": "a comparison",
    "DOT": "'.'", "$END": "the end of the line",
}


def friendly(exc: UnexpectedInput, text: str, line_offset: int) -> SheetSyntaxError:
    """``text`` is the statement; its first line is line ``line_offset + 1`` of the file (as in ``exc``)."""
    line = exc.line if exc.line and exc.line > line_offset else line_offset + 1
    col = exc.column if exc.column and exc.column > 0 else 1
    stripped = text.strip()
    hint = None
    if isinstance(exc, UnexpectedCharacters):
        ch = text[exc.pos_in_stream] if exc.pos_in_stream < len(text) else ""
        msg = f"unexpected character {ch!r}"
        if ch == "=" and stripped.startswith("check"):
            msg, hint = "a check compares with <=, <, >= or >", "write check a <= b"
        elif ch == "=":
            msg = "unexpected '='"
            hint = "a definition is name = expression; a check is check a <= b"
        return SheetSyntaxError(msg, Span(line, col, line, col + 1), hint=hint)
    if isinstance(exc, UnexpectedEOF):
        end = text.rstrip("\n ").splitlines() or [""]
        lines = text.rstrip("\n ").count("\n")
        return SheetSyntaxError("the statement ends too early", Span(line_offset + lines + 1, len(end[-1]) + 1,
                                                                     line_offset + lines + 1, len(end[-1]) + 2),
                                hint="is an operand or a closing bracket missing?")
    tok = exc.token
    expected = getattr(exc, "expected", set()) or set()
    width = max(1, len(str(tok))) if tok.type != "$END" else 1
    span = Span(line, col, line, col + width)
    if tok.type == "$END":
        if "RPAR" in expected or "RSQB" in expected:
            return SheetSyntaxError("a bracket is not closed", span, hint="close every '(' and '['")
        return SheetSyntaxError("the statement ends too early", span, hint="is an operand missing?")
    if "EQUAL" in expected and tok.type in ("NAME", "UNIT", "NUMBER", "STRING", "LPAR"):
        hint = "start prose lines with '>' and headings with '#'; a calculation line is name = expression"
        return SheetSyntaxError(f"this line is not a calculation: unexpected {str(tok)!r}", span, hint=hint)
    if tok.type == "EQUAL" and text.lstrip().startswith("check"):
        return SheetSyntaxError("a check compares with <=, <, >= or >", span, hint="write check a <= b")
    if tok.type in ("NAME", "UNIT", "NUMBER", "LPAR", "STRING"):
        if tok.type in ("NAME", "UNIT") and any(e in expected for e in ("PLUS", "MULOP", "$END")):
            hint = "put an operator between values (a unit follows a number directly: 5 kN/m)"
        return SheetSyntaxError(f"unexpected {str(tok)!r}: an operator is missing", span, hint=hint)
    words = sorted({_TOKEN_WORDS.get(e, e) for e in expected if not e.startswith("__")})
    wanted = ", ".join(words[:6])
    return SheetSyntaxError(f"unexpected {str(tok)!r}" + (f"; expected {wanted}" if wanted else ""), span, hint=hint)
