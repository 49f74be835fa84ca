"""Every public parameter is documented with its unit in brackets at the end of its
description (DEVELOPERS.md, "Conventions"): ``Layer thickness. [m]``, ``[-]`` when dimensionless."""

import importlib
import inspect
import pkgutil
import re

import pytest

import heatledger

PACKAGES = ["heatledger", "heatledger_xl"]
UNIT_AT_END = re.compile(r"\[[^\[\]]+\]\s*$")
PARAM_LINE = re.compile(r"^(\*{0,2}[A-Za-z_][\w]*(?:\s*,\s*\*{0,2}[A-Za-z_][\w]*)*)(\s*:.*)?$")


def _modules():
    for pkg_name in PACKAGES:
        try:
            pkg = importlib.import_module(pkg_name)
        except ImportError:  # pragma: no cover - add-in not installed
            continue
        yield pkg
        for info in pkgutil.walk_packages(pkg.__path__, prefix=pkg_name + "."):
            yield importlib.import_module(info.name)


def _public_objects():
    seen = set()
    for mod in _modules():
        names = getattr(mod, "__all__", None) or [n for n in vars(mod) if not n.startswith("_")]
        for name in names:
            obj = getattr(mod, name, None)
            if not (inspect.isfunction(obj) or inspect.isclass(obj)):
                continue
            if getattr(obj, "__module__", "").split(".")[0] not in PACKAGES:
                continue
            key = (obj.__module__, obj.__qualname__)
            if key in seen:
                continue
            seen.add(key)
            yield f"{obj.__module__}.{obj.__qualname__}", obj
            if inspect.isclass(obj):
                for mname, member in vars(obj).items():
                    if not mname.startswith("_") and inspect.isfunction(member):
                        yield f"{obj.__module__}.{obj.__qualname__}.{mname}", member


def _parameter_entries(doc: str):
    lines = inspect.cleandoc(doc).splitlines()
    try:
        start = next(i for i, ln in enumerate(lines[:-1])
                     if ln.strip() == "Parameters" and set(lines[i + 1].strip()) == {"-"})
    except StopIteration:
        return []
    entries = []
    current = None
    for ln in lines[start + 2:]:
        if ln.strip() and not ln.startswith(" "):
            if set(ln.strip()) == {"-"}:  # next section underline: previous line was a title
                if current and current[1] and current[1][-1] == "__title__":
                    pass
                break
            match = PARAM_LINE.match(ln.strip())
            if match is None:
                break
            current = [ln.strip(), []]
            entries.append(current)
        elif current is not None and ln.strip():
            current[1].append(ln.strip())
    # a following section title (e.g. "Returns") is captured as an entry without text
    return [(head, " ".join(body)) for head, body in entries if body]


CASES = [(name, obj) for name, obj in _public_objects() if obj.__doc__]


@pytest.mark.parametrize(("name", "obj"), CASES, ids=[c[0] for c in CASES])
def test_parameters_carry_units(name, obj):
    missing = [head for head, text in _parameter_entries(obj.__doc__)
               if not UNIT_AT_END.search(text)]
    assert not missing, f"{name}: parameters without a [unit] at the end: {missing}"


def test_walker_finds_the_front_door():
    names = {n for n, _ in CASES}
    assert "heatledger.constructions.Construction" in names
    assert "heatledger.surfaces.surface_resistance" in names
    assert heatledger.__version__
