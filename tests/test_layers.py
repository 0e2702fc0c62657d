"""The architecture stays as drawn: each stage imports only the stages before it, no import cycles, lark only
in the parser, each output format on its own.

The contracts live in pyproject.toml ([tool.importlinter]); import-linter checks them on the real import
graph (every ``import`` in every module, including those inside functions). The planted-import tests run the
same contracts on a copy of the package with one bad import added, so they show the check can fail.
"""
import shutil
import subprocess
import sys
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
PACKAGE = ROOT / "calcsheet"
CONFIG = ROOT / "pyproject.toml"

LINT = ("import sys; from importlinter.cli import lint_imports; "
        "sys.exit(lint_imports(config_filename='pyproject.toml', no_cache=True, no_logo=True))")


def lint(folder: Path) -> subprocess.CompletedProcess:
    """Run the contracts on the calcsheet package found in ``folder`` (nothing else on the path first)."""
    return subprocess.run([sys.executable, "-c", LINT], cwd=folder, capture_output=True, text=True, timeout=300,
                          env={"PATH": "/usr/bin:/bin", "PYTHONPATH": str(folder), "PYTHONIOENCODING": "utf-8"})


def test_the_package_keeps_its_architecture(tmp_path):
    shutil.copy(CONFIG, tmp_path / "pyproject.toml")
    (tmp_path / "calcsheet").symlink_to(PACKAGE, target_is_directory=True)
    proc = lint(tmp_path)
    assert proc.returncode == 0, proc.stdout + proc.stderr
    assert "4 kept, 0 broken" in proc.stdout


@pytest.fixture
def copy(tmp_path):
    """A copy of the package and its contracts, to plant one import in."""
    shutil.copytree(PACKAGE, tmp_path / "calcsheet", ignore=shutil.ignore_patterns("__pycache__"))
    shutil.copy(CONFIG, tmp_path / "pyproject.toml")

    def plant(module: str, line: str) -> subprocess.CompletedProcess:
        path = tmp_path / "calcsheet" / module
        path.write_text(path.read_text(encoding="utf-8") + f"\n{line}  # planted\n", encoding="utf-8")
        return lint(tmp_path)

    return plant


@pytest.mark.parametrize("module, line, broken, shown", [
    # an earlier stage reaching into a later one
    ("parser/lines.py", "from .. import cli", "A stage imports only the stages before it BROKEN",
     "calcsheet.parser.lines -> calcsheet.cli"),
    ("evaluator.py", "from .render import html", "A stage imports only the stages before it BROKEN",
     "calcsheet.evaluator -> calcsheet.render.html"),
    # a cycle inside one layer (the layers contract allows siblings to import each other; this one does not)
    ("slips.py", "from . import suppress", None, None),
    # lark outside the parser
    ("resolver.py", "import lark", "Only the parser knows lark exists BROKEN", "calcsheet.resolver -> lark"),
    # one output format leaning on another
    ("render/json.py", "from . import text", "Each output format stands alone BROKEN",
     "calcsheet.render.json -> calcsheet.render.text"),
])
def test_a_planted_bad_import_breaks_a_contract(copy, module, line, broken, shown):
    if broken is None:  # make the cycle: suppress already sits in slips' layer; have it import slips back too
        copy("suppress.py", "from . import slips")
        proc = copy(module, line)
        broken, shown = "No import cycles between modules or subpackages BROKEN", ".slips"
    else:
        proc = copy(module, line)
    assert proc.returncode == 1, proc.stdout + proc.stderr
    assert broken in proc.stdout
    assert shown in proc.stdout
