"""The import rules of docs/architecture.md: stages import one way, only ifc/ touches
ifcopenshell, and the exported API stays what the documentation says."""

from __future__ import annotations

import ast
from pathlib import Path

import pytest

PACKAGE = Path(__file__).parents[1] / "ifccheck"

# each part of the package may import only the parts of lower layers (and itself)
LAYERS: list[set[str]] = [
    {"errors", "reasons", "perf", "atomic"},
    {"units", "model", "results"},
    {"sections"},
    {"config"},
    {"ifc", "framing", "design"},
    {"floors"},
    {"loads"},
    {"segments", "adequacy"},
    {"explain"},
    {"check", "diff"},
    {"report", "samples"},
    {"service"},
    {"cli"},
]
LAYER_OF = {part: i for i, layer in enumerate(LAYERS) for part in layer}


def _part(path: Path) -> str:
    rel = path.relative_to(PACKAGE).parts
    return rel[0].removesuffix(".py")


def _imports(path: Path) -> set[str]:
    out: set[str] = set()
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        names: list[str] = []
        if isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            names = [node.module]
        elif isinstance(node, ast.Import):
            names = [a.name for a in node.names]
        out.update(names)
    return out


def _modules() -> list[Path]:
    return sorted(PACKAGE.rglob("*.py"))


@pytest.mark.parametrize("path", _modules(), ids=lambda p: str(p.relative_to(PACKAGE)))
def test_imports_go_one_way(path: Path):
    # entry points (__main__) may start the CLI; the package root holds version and caution
    if path.name == "__main__.py" or path == PACKAGE / "__init__.py":
        return
    own = _part(path)
    assert own in LAYER_OF, f"{own} has no layer in the architecture"
    for name in _imports(path):
        if not name.startswith("ifccheck."):
            continue
        other = name.split(".")[1]
        if other == own:
            continue
        assert LAYER_OF[other] < LAYER_OF[own], f"{path.name}: {own} imports {name}"


@pytest.mark.parametrize("path", _modules(), ids=lambda p: str(p.relative_to(PACKAGE)))
def test_only_ifc_touches_ifcopenshell(path: Path):
    if _part(path) == "ifc":
        return
    touched = {n for n in _imports(path) if n.split(".")[0] == "ifcopenshell"}
    assert not touched, f"{path.relative_to(PACKAGE)} imports {sorted(touched)}"


def test_the_exported_api():
    import ifccheck.check as check
    import ifccheck.errors as errors
    import ifccheck.reasons as reasons

    for name in ("run_check", "check_beams"):
        assert callable(getattr(check, name))
    for name in ("IfccheckError", "InputError", "OutOfScope"):
        assert isinstance(getattr(errors, name), type)
    assert hasattr(reasons, "NotChecked") and hasattr(reasons, "Reason")
