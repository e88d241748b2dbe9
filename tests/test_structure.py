"""The package's shape: every module imports on its own, no import cycle, no
module reaches into another's private names, and the wheel lists every package.

These are checks of the code's structure, read from the source with ``ast``
(common practice for layered packages: a cycle or a private import is a fact of
the source, not a judgement).
"""

import ast
import subprocess
import sys
import tomllib
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
PACKAGE = ROOT / "estimator"


def _module_name(path: Path) -> str:
    parts = list(path.relative_to(ROOT).with_suffix("").parts)
    if parts[-1] == "__init__":
        parts = parts[:-1]
    return ".".join(parts)


def _sources() -> dict[str, Path]:
    return {_module_name(p): p for p in sorted(PACKAGE.rglob("*.py"))
            if p.name != "__main__.py"}


def _is_module(name: str) -> bool:
    path = ROOT.joinpath(*name.split("."))
    return path.with_suffix(".py").exists() or (path / "__init__.py").exists()


def _imports(name: str, path: Path):
    """(module imported, names taken from it) for every import in the file,
    at the top and inside functions alike."""
    package = name.split(".") if path.name == "__init__.py" else name.split(".")[:-1]
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.ImportFrom):
            if node.level:
                base = package[:len(package) - (node.level - 1)]
                target = ".".join(base + ([node.module] if node.module else []))
            else:
                target = node.module or ""
            for alias in node.names:
                sub = f"{target}.{alias.name}"
                if _is_module(sub):
                    yield sub, None
                else:
                    yield target, alias.name
        elif isinstance(node, ast.Import):
            for alias in node.names:
                yield alias.name, None


def _graph() -> dict[str, set[str]]:
    sources = _sources()
    return {name: {target for target, _ in _imports(name, path)
                   if target in sources and target != name}
            for name, path in sources.items()}


@pytest.mark.parametrize("module", sorted(_sources()))
def test_each_module_imports_in_a_fresh_interpreter(module):
    """A module imported first, alone, loads (no order-dependent cycle)."""
    run = subprocess.run([sys.executable, "-c", f"import {module}"], capture_output=True,
                         text=True, timeout=300, cwd=ROOT)
    assert run.returncode == 0, run.stderr[-2000:]


def test_no_import_cycle():
    """No chain of imports, top-level or inside functions, leads back to its start."""
    graph = _graph()
    state: dict[str, int] = {}
    cycles = []

    def visit(node, trail):
        state[node] = 1
        for nxt in sorted(graph[node]):
            if state.get(nxt) == 1:
                cycles.append(trail[trail.index(nxt):] + [nxt])
            elif nxt not in state:
                visit(nxt, trail + [nxt])
        state[node] = 2

    for start in sorted(graph):
        if start not in state:
            visit(start, [start])
    assert not cycles, "\n".join(" -> ".join(c) for c in cycles)


def test_no_module_imports_another_modules_private_names():
    """``from .x import _name`` across modules is refused: what is shared is public."""
    sources = _sources()
    found = []
    for name, path in sources.items():
        for target, taken in _imports(name, path):
            if target in sources and taken and taken.startswith("_") \
                    and not taken.startswith("__"):
                found.append(f"{name} takes {target}.{taken}")
    assert not found, found


def test_the_wheel_lists_every_package_and_the_version_has_one_home():
    """pyproject lists each folder of modules; the version comes from estimator._meta."""
    config = tomllib.loads((ROOT / "pyproject.toml").read_text(encoding="utf-8"))
    listed = set(config["tool"]["setuptools"]["packages"])
    folders = {_module_name(p) for p in PACKAGE.rglob("__init__.py")}
    assert folders <= listed, sorted(folders - listed)
    assert config["tool"]["setuptools"]["dynamic"]["version"] == {
        "attr": "estimator._meta.__version__"}
    import estimator
    from estimator import _meta

    assert estimator.__version__ == _meta.__version__
    assert estimator.CAUTIONS is _meta.CAUTIONS


#: The longest function body (docstring not counted) in the package and the front
#: end: past it, a named step is to be pulled out.
LONGEST_BODY = 80


def _body_lines(node) -> int:
    body = node.body
    first = body[0]
    if (isinstance(first, ast.Expr) and isinstance(first.value, ast.Constant)
            and isinstance(first.value.value, str)):
        start = body[1].lineno if len(body) > 1 else first.end_lineno
    else:
        start = first.lineno
    return node.end_lineno - start + 1


def test_no_function_runs_past_the_longest_body():
    """Every function of estimator/ and ui/ reads as named steps: no body over
    LONGEST_BODY lines."""
    long = []
    for path in sorted([*PACKAGE.rglob("*.py"), *(ROOT / "ui").rglob("*.py")]):
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            if isinstance(node, (ast.FunctionDef, ast.AsyncFunctionDef)):
                lines = _body_lines(node)
                if lines > LONGEST_BODY:
                    long.append(f"{path.relative_to(ROOT)}:{node.lineno} {node.name} ({lines})")
    assert not long, "functions to split into named steps: " + "; ".join(long)


def _private_uses(path: Path, package: str) -> list[str]:
    """`from <package>... import _x` and `<module>._x` on a module of `package` (the
    import's own name bound in the file)."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    modules, found = set(), []
    for node in ast.walk(tree):
        if isinstance(node, ast.ImportFrom) and (node.level or (node.module or "").split(
                ".")[0] == package):
            for alias in node.names:
                # a module of the package kept out of its public face (`_meta`) may be
                # imported; a private name of another module may not
                is_module = node.level == 1 and not node.module and (
                    path.parent / f"{alias.name}.py").exists()
                if alias.name.startswith("_") and not alias.name.startswith("__") \
                        and not is_module:
                    found.append(f"imports {alias.name}")
                modules.add(alias.asname or alias.name)
        elif isinstance(node, ast.Import):
            for alias in node.names:
                if alias.name.split(".")[0] == package:
                    modules.add(alias.asname or alias.name.split(".")[0])
    for node in ast.walk(tree):
        if (isinstance(node, ast.Attribute) and isinstance(node.value, ast.Name)
                and node.value.id in modules and node.attr.startswith("_")
                and not node.attr.startswith("__")):
            found.append(f"uses {node.value.id}.{node.attr}")
    return found


@pytest.mark.parametrize("folder, package", [("estimator", "estimator"), ("ui", "ullage_ui")])
def test_no_private_name_of_another_module_by_attribute(folder, package):
    """Neither `from ullage_ui.case import _x` nor `case._x` in another module of the
    package or the front end: what is shared is public where it belongs."""
    found = []
    for path in sorted((ROOT / folder).rglob("*.py")):
        found += [f"{path.relative_to(ROOT)} {use}" for use in _private_uses(path, package)]
    assert not found, found
