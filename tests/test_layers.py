"""Layers that only look down: the import graph of heatledger and its add-in.

The flow is input -> validation -> domain objects -> engine -> results -> sheet plan ->
renderer. These tests read every module's imports with ``ast`` (module-level and inside
functions alike: a lazy import is still a dependency) and check that:

- no module depends on itself through others (no import cycle);
- the engine (everything outside ``heatledger.sheet``, the command line and the add-in) never
  imports the sheet layer, the command line or the add-in;
- the sheet layer never imports scipy: the engine computes every number a sheet shows.
"""

from __future__ import annotations

import ast
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
PACKAGES = {"heatledger": ROOT / "core" / "heatledger",
            "heatledger_xl": ROOT / "addin" / "heatledger_xl"}


def _module_name(package: str, folder: Path, path: Path) -> str:
    parts = list(path.relative_to(folder).with_suffix("").parts)
    if parts[-1] == "__init__":
        parts = parts[:-1]
    return ".".join([package, *parts])


def _resolve(module: str, is_package: bool, node: ast.ImportFrom) -> list[str]:
    if node.level == 0:
        base = node.module or ""
    else:
        parts = module.split(".")
        keep = len(parts) - node.level + (1 if is_package else 0)
        base = ".".join(parts[:keep] + ([node.module] if node.module else []))
    # "from . import x" names submodules; "from .m import f" names module m
    return [f"{base}.{a.name}" for a in node.names] + [base]


def import_graph() -> dict[str, set[str]]:
    """Module -> the heatledger modules it imports (anywhere in its code)."""
    modules = {}
    for package, folder in PACKAGES.items():
        for path in folder.rglob("*.py"):
            modules[_module_name(package, folder, path)] = path
    graph: dict[str, set[str]] = {}
    for name, path in modules.items():
        deps: set[str] = set()
        is_package = path.name == "__init__.py"
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            targets = []
            if isinstance(node, ast.Import):
                targets = [a.name for a in node.names]
            elif isinstance(node, ast.ImportFrom):
                targets = _resolve(name, is_package, node)
            deps |= {t for t in targets if t in modules and t != name}
        graph[name] = deps
    return graph


GRAPH = import_graph()


def _cycles(graph: dict[str, set[str]]) -> list[list[str]]:
    """Strongly connected components with more than one module (Tarjan)."""
    index, low, stack, on, out = {}, {}, [], set(), []
    counter = [0]

    def visit(v):
        index[v] = low[v] = counter[0]
        counter[0] += 1
        stack.append(v)
        on.add(v)
        for w in graph[v]:
            if w not in index:
                visit(w)
                low[v] = min(low[v], low[w])
            elif w in on:
                low[v] = min(low[v], index[w])
        if low[v] == index[v]:
            comp = []
            while True:
                w = stack.pop()
                on.discard(w)
                comp.append(w)
                if w == v:
                    break
            if len(comp) > 1:
                out.append(sorted(comp))

    for v in sorted(graph):
        if v not in index:
            visit(v)
    return out


def _is_package_init(name: str, other: str) -> bool:
    """A package's ``__init__`` re-exporting its own submodules is not a cycle of layers."""
    return other.startswith(name + ".") or name.startswith(other + ".")


def test_there_is_no_import_cycle():
    graph = {m: {d for d in deps if not _is_package_init(m, d)} for m, deps in GRAPH.items()}
    assert _cycles(graph) == []


def test_the_cycle_finder_finds_a_planted_cycle():
    planted = {"a": {"b"}, "b": {"c"}, "c": {"a"}, "d": {"a"}}
    assert _cycles(planted) == [["a", "b", "c"]]


def _is_engine(module: str) -> bool:
    return (module.startswith("heatledger.") and not module.startswith("heatledger.sheet")
            and module not in ("heatledger.cli", "heatledger.__main__"))


def test_the_engine_never_imports_the_sheet_layer_the_command_or_the_add_in():
    wrong = {m: sorted(d for d in deps if d.startswith(("heatledger.sheet", "heatledger_xl"))
                       or d == "heatledger.cli")
             for m, deps in GRAPH.items() if _is_engine(m)}
    assert not {m: d for m, d in wrong.items() if d}, wrong


def test_the_sheet_layer_never_imports_scipy():
    folder = PACKAGES["heatledger"] / "sheet"
    users = []
    for path in folder.rglob("*.py"):
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            names = ([a.name for a in node.names] if isinstance(node, ast.Import) else
                     [node.module or ""] if isinstance(node, ast.ImportFrom) else [])
            if any(n == "scipy" or n.startswith("scipy.") for n in names):
                users.append(path.name)
    assert not users, f"the engine computes what these sheets take from scipy: {users}"
