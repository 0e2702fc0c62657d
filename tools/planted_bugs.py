"""Plant each bug of issue 19 by hand in a scratch copy, run the test meant to catch it, expect red, revert.

A record of how the new tests were checked (python tools/planted_bugs.py); a pattern that no longer matches
the source prints "??" instead of a verdict.
"""
import shutil, subprocess, sys, os, tempfile
from pathlib import Path
ROOT = Path(__file__).resolve().parents[1]
work = Path(tempfile.mkdtemp(prefix="plant-"))
for part in ("calcsheet", "plugins", "tests", "sheets", "docs"):
    shutil.copytree(ROOT / part, work / part, ignore=shutil.ignore_patterns("__pycache__", ".hypothesis", "*.egg-info"))
shutil.copy2(ROOT / "pyproject.toml", work / "pyproject.toml")
env = dict(os.environ, PYTHONPATH=f"{work}:{work}/plugins", PYTHONDONTWRITEBYTECODE="1")
P = "plugins/calcsheet_plugins"
BUGS = [
    ("transition slenderness wrong (traced fields)", f"{P}/column/buckling.py", 'work.calc("C_c", "sqrt(2*pi^2*E/F_y)"', 'work.calc("C_c", "sqrt(2.2*pi^2*E/F_y)"', "tests/plugins/test_traced_fields.py"),
    ("check <= evaluated as <", "calcsheet/builtins.py", '"<=": lambda a, b: a <= b', '"<=": lambda a, b: a < b', "tests/test_evaluator_rules.py"),
    ("check >= evaluated as >", "calcsheet/builtins.py", '">=": lambda a, b: a >= b', '">=": lambda a, b: a > b', "tests/test_evaluator_rules.py"),
    ("evaluator drops the dimension check of +", "calcsheet/builtins.py", "    if a.dim != b.dim:\n        word", "    if False:\n        word", "tests/test_evaluator_rules.py"),
    ("evaluator drops the exponent rule", "calcsheet/builtins.py", "if b is not None and b.dim != U.DIMENSIONLESS:", "if False:", "tests/test_evaluator_rules.py"),
    ("summary table: check description unescaped", "calcsheet/render/page.py", 'c.anchor, c.number, c.description or "", sym', 'c.anchor, c.number, Html(c.description or ""), sym', "tests/test_package_escaping.py"),
    ("inputs table: description unescaped", "calcsheet/render/page.py", 'self.printer.m_name(name), step.description or "",', 'self.printer.m_name(name), Html(step.description or ""),', "tests/test_package_escaping.py"),
    ("plugin table cells unescaped", "calcsheet/render/page.py", "            return esc(v)\n", "            return Html(str(v))\n", "tests/test_package_escaping.py"),
    ("revisions table unescaped", "calcsheet/render/page.py", 'Html("<td>{}</td>").format(c) for c in cells[:4]', 'Html("<td>{}</td>").format(Html(c)) for c in cells[:4]', "tests/test_package_escaping.py"),
    ("atomic write done in place", "calcsheet/atomic.py", '    path = Path(path)\n    folder = path.parent\n', '    path = Path(path)\n    path.write_bytes(data[: len(data) // 2]); os.fsync(-1) if len(data) > 10**9 else None\n    with open(path, "wb") as fh:\n        fh.write(data); fh.flush(); os.fsync(fh.fileno())\n    return\n    folder = path.parent\n', "tests/test_atomic.py"),
    ("atomic write leaves its temporary on failure", "calcsheet/atomic.py", "            os.unlink(tmp)\n", "            pass\n", "tests/test_atomic.py"),
    ("dead copy of r_x from the wrong second moment", f"{P}/section/properties.py", "r_x=math.sqrt(b.I_x / b.A)", "r_x=math.sqrt(b.I_y / b.A)", "tests/plugins/test_traced_fields.py"),
    ("record field differs from its traced step", f"{P}/section/report.py", 'out = {name: work[name].to(unit(UNITS[name]))', 'out = {name: (work[name] * (1.001 if name == "r_y" else 1)).to(unit(UNITS[name]))', "tests/plugins/test_traced_fields.py"),
    ("dead euler_load helper drifts", f"{P}/column/buckling.py", "return math.pi**2 * E * I / (K * L) ** 2", "return math.pi**2 * E * I / (K * L)", "tests/plugins/test_traced_fields.py"),
    ("column default ends changed", f"{P}/column/buckling.py", '"ends_y is given)", default="pinned-pinned")', '"ends_y is given)", default="fixed-pinned")', "tests/plugins/test_defaults.py"),
    ("column f_pl default F_y/3", f"{P}/column/buckling.py", 'work.calc("f_pl", "F_y/2"', 'work.calc("f_pl", "F_y/3"', "tests/plugins/test_defaults.py"),
    ("custom material nu default 0.25", f"{P}/material/functions.py", "work.q(0.3, \"\")", "work.q(0.25, \"\")", "tests/plugins/test_defaults.py"),
    ("section detail default brief", f"{P}/section/functions.py", 'default="full", choices=("full", "brief")),\n]', 'default="brief", choices=("full", "brief")),\n]', "tests/plugins/test_defaults.py"),
    ("custom f_u default 0.9 f_y (Param and code)", f"{P}/material/functions.py", '"f_u": f_u if f_u is not None else f_y', '"f_u": f_u if f_u is not None else 0.9 * f_y', "tests/plugins/test_defaults.py"),
    ("transition slenderness with a wrong factor", f"{P}/column/buckling.py", 'work.calc("C_c", "sqrt(2*pi^2*E/F_y)"', 'work.calc("C_c", "sqrt(2.2*pi^2*E/F_y)"', "tests/test_golden_values.py"),
    ("Johnson parabola with a wrong factor", f"{P}/column/buckling.py", 'f"F_y - F_y^2*KL_r_{axis}^2/(4*pi^2*E)"', 'f"F_y - F_y^2*KL_r_{axis}^2/(4.4*pi^2*E)"', "tests/test_golden_values.py"),
    ("plastic neutral... Q_x off by 1%", f"{P}/section/report.py", 'rec.let("Q_x", _q(vals["Q_x"], "mm^3")', 'rec.let("Q_x", _q(1.01 * vals["Q_x"], "mm^3")', "tests/test_golden_values.py"),
]
only = sys.argv[1:]  # optional words: run only the bugs whose description contains one of them
BUGS = [b for b in BUGS if not only or any(w in b[0] for w in only)]
red = 0
for what, rel, old, new, test in BUGS:
    path = work / rel
    orig = path.read_text()
    if orig.count(old) != 1:
        print(f"?? {what}: pattern found {orig.count(old)} times"); continue
    path.write_text(orig.replace(old, new))
    try:
        p = subprocess.run([sys.executable, "-m", "pytest", "-x", "-q", "-p", "no:cacheprovider", test], cwd=work, env=env, capture_output=True, text=True, timeout=600)
    finally:
        path.write_text(orig)
    failed = [l for l in p.stdout.splitlines() if l.startswith(("FAILED", "ERROR"))]
    status = "RED  " if p.returncode != 0 else "GREEN"
    red += p.returncode != 0
    print(f"{status} {what:50s} -> {failed[0][:110] if failed else p.stdout.strip().splitlines()[-1]}", flush=True)
print(f"{red}/{len(BUGS)} planted bugs caught")
shutil.rmtree(work)
