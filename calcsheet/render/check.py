"""How ``calcsheet check`` prints its findings: for people, for editors, for programs.

human: ``path:line:col: severity: message [code]``, the source line, a caret
under the exact span, and the hint. line: ``path:line:col: severity code:
message`` (one line each, for editors and CI annotations). json: the DESIGN.md
diagnostics shape plus code, hint and end position; suppressed findings are
listed apart with their reasons.
"""
from __future__ import annotations

from ..errors import Diagnostic

def human(d: Diagnostic, source: str | None) -> str:
    return d.format(source, with_code=True)


def summary(path: str, active: list[Diagnostic], suppressed: list[Diagnostic]) -> str:
    counts = {s: sum(1 for d in active if d.severity == s) for s in ("error", "warning", "info")}
    if not active:
        text = f"{path}: no problems found"
    else:
        parts = [f"{n} {s}{'s' if n != 1 else ''}" for s, n in counts.items() if n]
        text = f"{path}: " + ", ".join(parts)
    if suppressed:
        text += f" ({len(suppressed)} allowed with a reason)"
    return text


def to_json(path: str, active: list[Diagnostic], suppressed: list[Diagnostic]) -> dict:
    out = {"path": path, "diagnostics": [d.to_json() for d in active]}
    if suppressed:
        out["suppressed"] = [{**d.to_json(), "reason": d.suppressed} for d in suppressed]
    return out


def split(diagnostics: list[Diagnostic]) -> tuple[list[Diagnostic], list[Diagnostic]]:
    active = [d for d in diagnostics if not d.suppressed]
    return active, [d for d in diagnostics if d.suppressed]


def exit_status(active: list[Diagnostic], strict: bool) -> int:
    """0 clean; 1 errors; 3 warnings under --strict (infos never fail)."""
    if any(d.severity == "error" for d in active):
        return 1
    if strict and any(d.severity == "warning" for d in active):
        return 3
    return 0
