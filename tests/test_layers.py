"""The package's layers: each folder imports only the folders below it, and no module imports itself back.

The order is the one DEVELOPERS.md draws (its layer map); a change there and here go together.
Internal checks of the package's shape: no published source is involved.
"""

import ast
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1] / "lampcalc"

#: Bottom to top. A module may import its own layer and the layers before it.
LAYERS = ("errors", "physics", "spectra", "io", "colorimetry", "rendering", "standards", "rating", "verdicts",
          "plots", "report", "cli")


def _modules():
    mods = {}
    for path in ROOT.rglob("*.py"):
        parts = ["lampcalc", *path.relative_to(ROOT).with_suffix("").parts]
        if parts[-1] == "__init__":
            parts = parts[:-1]
        mods[".".join(parts)] = path
    return mods


def _imports(name, path, known):
    """Every lampcalc module ``name`` imports, at the top or inside functions."""
    is_package = path.name == "__init__.py"
    found = set()
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.Import):
            candidates = [alias.name for alias in node.names]
        elif isinstance(node, ast.ImportFrom):
            if node.level:
                base = name.split(".") if is_package else name.split(".")[:-1]
                base = base[: len(base) - (node.level - 1)]
                module = ".".join(base + ([node.module] if node.module else []))
            else:
                module = node.module or ""
            candidates = [module] + [f"{module}.{alias.name}" for alias in node.names]
        else:
            continue
        found |= {c for c in candidates if c in known and c != name and not name.startswith(c + ".")}
    return found


def _layer(module):
    parts = module.split(".")
    return parts[1] if len(parts) > 1 else None


GRAPH = {name: _imports(name, path, set(_modules())) for name, path in _modules().items()}


def test_every_folder_has_a_place_in_the_map():
    folders = {p.name for p in ROOT.iterdir() if (p / "__init__.py").exists()} - {"spectra_demo"}
    assert folders <= set(LAYERS)


def test_no_layer_imports_a_higher_one():
    rank = {layer: k for k, layer in enumerate(LAYERS)}
    upward = [
        f"{m} imports {d}"
        for m, deps in GRAPH.items()
        for d in deps
        if _layer(m) in rank and _layer(d) in rank and rank[_layer(d)] > rank[_layer(m)]
    ]
    assert upward == []


def test_no_import_cycle():
    state, cycles = {}, []

    def visit(node, stack):
        state[node] = "open"
        for dep in sorted(GRAPH[node]):
            if state.get(dep) == "open":
                cycles.append(stack[stack.index(dep):] + [dep])
            elif dep not in state:
                visit(dep, stack + [dep])
        state[node] = "done"

    for node in sorted(GRAPH):
        if node not in state:
            visit(node, [node])
    assert cycles == []


def test_no_module_over_450_lines():
    long = {str(p.relative_to(ROOT)): n for p in ROOT.rglob("*.py") if (n := len(p.read_text().splitlines())) > 450}
    assert long == {}
