"""Every public name of heatledger a user meets: parameters of public engine functions,
methods and classes, fields of result dataclasses, spreadsheet-function arguments, with the
unit each docstring states. Used by the glossary test."""

from __future__ import annotations

import dataclasses
import importlib
import inspect
import re
from collections import defaultdict

#: Engine modules and subpackages whose ``__all__`` is public.
ENGINE_MODULES = ("heatledger.constructions", "heatledger.surfaces", "heatledger.airlayers",
                  "heatledger.materials", "heatledger.fv1d", "heatledger.windows",
                  "heatledger.ground", "heatledger.heatloss", "heatledger.fins",
                  "heatledger.bridges2d",
                  "heatledger.errors")
#: Words that are not quantities (self, names, switches of the code).
NOT_QUANTITIES = {"self", "cls", "args", "kwargs"}

_PARAM = re.compile(r"^ {0,8}(\w+(?:, \w+)*) : [^\n]*\n((?: {4,}[^\n]*\n?)*)", re.M)
_UNIT = re.compile(r"\[([^\[\]]+)\]\s*$")


def _doc_units(obj) -> dict:
    """name -> unit as the numpydoc sections of ``obj`` state it (Parameters, Attributes)."""
    doc = inspect.getdoc(obj) or ""
    out = {}
    for m in _PARAM.finditer(doc):
        desc = " ".join(line.strip() for line in m.group(2).splitlines()).strip()
        unit = _UNIT.search(desc)
        for name in m.group(1).split(", "):
            out[name] = unit.group(1) if unit else None
    return out


def _members(obj):
    for name, member in inspect.getmembers(obj):
        if (name == "__init__" or not name.startswith("_")) and inspect.isfunction(member):
            yield f"{obj.__name__}.{name}", member


def engine_names() -> dict:
    """name -> set of (where, unit or None) over the public engine."""
    found: dict = defaultdict(set)
    for mod_name in ENGINE_MODULES:
        mod = importlib.import_module(mod_name)
        for public in getattr(mod, "__all__", ()):
            obj = getattr(mod, public, None)
            if inspect.isclass(obj):
                units = _doc_units(obj)
                if dataclasses.is_dataclass(obj):
                    for f in dataclasses.fields(obj):
                        found[f.name].add((public, units.get(f.name)))
                for where, meth in _members(obj):
                    mu = _doc_units(meth)
                    for p in list(inspect.signature(meth).parameters)[1:]:
                        found[p].add((where, mu.get(p, units.get(p))))
            elif callable(obj):
                units = _doc_units(obj)
                for p in inspect.signature(obj).parameters:
                    found[p].add((public, units.get(p)))
    return {k: v for k, v in found.items() if k not in NOT_QUANTITIES}


def function_arguments() -> dict:
    """Argument name -> set of spreadsheet functions that take it."""
    import heatledger_xl.udfs  # noqa: F401  registers every family's functions
    from heatledger_xl.registry import REGISTRY

    found: dict = defaultdict(set)
    for name, entry in REGISTRY.items():
        for p in inspect.signature(entry.function).parameters:
            found[p].add(name)
    return dict(found)
