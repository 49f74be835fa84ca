"""Docstrings (DEVELOPERS.md, "Conventions"): every public function, class, method and property
has one; every parameter is documented, with its unit in brackets at the end of its description
(``Layer thickness. [m]``, ``[-]`` when dimensionless); every public engine function, and every
engine class with methods of its own, has a References section naming a row of the sources
table (``[source: key, clause]``, checked against the table by tests/test_sources.py)."""

import importlib
import inspect
import pkgutil
import re

import pytest

import heatledger

PACKAGES = ["heatledger", "heatledger_xl", "heatledger_calc"]
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


def _unwrap_cached(obj):
    """The function inside a ``functools.cache`` / ``lru_cache`` wrapper, so a cached public
    function is checked like any other."""
    return obj.__wrapped__ if callable(getattr(obj, "cache_info", None)) else obj


def _public_objects():
    seen = set()
    for mod in _modules():
        names = getattr(mod, "__all__", None) or [n for n in vars(mod) if not n.startswith("_")]
        for name in names:
            obj = _unwrap_cached(getattr(mod, name, None))
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
                    if isinstance(member, property):
                        member = member.fget
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
    assert "heatledger.constructions.construction.Construction" in names
    assert "heatledger.surfaces.surface_resistance" in names
    assert heatledger.__version__


def _documented(doc: str) -> set:
    """Names documented in the Parameters and Attributes sections of ``doc``."""
    names = set()
    lines = inspect.cleandoc(doc).splitlines()
    for i, line in enumerate(lines[:-1]):
        if line.strip() in ("Parameters", "Attributes") and set(lines[i + 1].strip()) == {"-"}:
            for entry in lines[i + 2:]:
                if entry.strip() and not entry.startswith(" "):
                    match = PARAM_LINE.match(entry.strip())
                    if match is None or entry.strip() in ("Returns", "Raises", "Notes",
                                                          "References", "Examples", "Yields"):
                        break
                    names |= {n.strip().lstrip("*") for n in match.group(1).split(",")}
    return names


def _is_generated(obj) -> bool:
    """A dataclass's generated docstring (its signature) is no documentation."""
    return inspect.isclass(obj) and (obj.__doc__ or "").startswith(f"{obj.__name__}(")


def _in_scope(name: str, obj) -> bool:
    """Public modules only (no part starting with ``_``); spreadsheet functions document
    their arguments in the function registry instead (``@udf(args=...)``, tested there)."""
    module = getattr(obj, "__module__", "")
    return (not any(p.startswith("_") for p in module.split(".")[1:])
            and not hasattr(obj, "__xlfunc__") and not getattr(obj, "__wrapped__", None))


ALL = [(n, o) for n, o in _public_objects() if _in_scope(n, o)]
#: Engine modules: everything of heatledger outside the sheet layer, the command line, file
#: handling and private modules.
NOT_ENGINE = ("heatledger.sheet", "heatledger.cli", "heatledger.fileio", "heatledger.demo",
              "heatledger.families", "heatledger.schema", "heatledger.sources",
              "heatledger.errors", "heatledger.project", "heatledger.cautions")
#: Input-side modules of a family (readers of the project file and registry hooks).
INPUT_SIDE = (".project_io", ".element_io", ".family", ".schema")


@pytest.mark.parametrize(("name", "obj"), ALL, ids=[c[0] for c in ALL])
def test_every_public_object_has_a_docstring(name, obj):
    assert obj.__doc__ and obj.__doc__.strip() and not _is_generated(obj), f"{name}: no docstring"


def _parameters(obj) -> list:
    target = obj.__init__ if inspect.isclass(obj) else obj
    try:
        params = inspect.signature(target).parameters
    except (TypeError, ValueError):
        return []
    return [p for p in params if p not in ("self", "cls")
            and params[p].kind not in (inspect.Parameter.VAR_POSITIONAL,
                                       inspect.Parameter.VAR_KEYWORD)]


@pytest.mark.parametrize(("name", "obj"), ALL, ids=[c[0] for c in ALL])
def test_every_parameter_is_documented(name, obj):
    if inspect.isclass(obj) and obj.__init__ is object.__init__:
        return
    missing = [p for p in _parameters(obj) if p not in _documented(obj.__doc__ or "")]
    assert not missing, f"{name}: parameters without a description: {missing}"


def _engine_module(module: str) -> bool:
    return (module.startswith("heatledger.") and not module.startswith(NOT_ENGINE)
            and not module.endswith(INPUT_SIDE)
            and not any(part.startswith("_") for part in module.split(".")[1:]))


def _engine_function(name: str, obj) -> bool:
    """A public function of an engine module (not a method)."""
    return (inspect.isfunction(obj) and _engine_module(obj.__module__)
            and name.count(".") == obj.__module__.count(".") + 1)


def _engine_class(name: str, obj) -> bool:
    """A public class of an engine module with behaviour of its own (a public method or
    property): its methods compute by a published method, so the class names its source.
    Plain records of inputs or results are not counted."""
    return (inspect.isclass(obj) and _engine_module(obj.__module__)
            and name.count(".") == obj.__module__.count(".") + 1
            and any(not n.startswith("_") and (inspect.isfunction(m) or isinstance(m, property))
                    for n, m in vars(obj).items()))


#: A pointer to a row of the sources table (written so that this file holds no pointer).
SOURCE_POINTER = re.compile(r"\[" + r"source:\s*[a-z0-9]")


def _section(doc: str, title: str) -> str:
    """The text of the numpydoc section ``title`` of ``doc`` ('' when it has none)."""
    lines = inspect.cleandoc(doc or "").splitlines()
    titles = [i for i in range(len(lines) - 1)
              if lines[i].strip() and not lines[i].startswith(" ")
              and set(lines[i + 1].strip()) == {"-"}]
    for k, i in enumerate(titles):
        if lines[i].strip() == title:
            end = titles[k + 1] if k + 1 < len(titles) else len(lines)
            return "\n".join(lines[i + 2:end])
    return ""


def _source_problem(name: str, obj) -> str:
    """Why ``obj`` does not name its source ('' when it does): a References section that
    holds a pointer to a row of the sources table."""
    refs = _section(obj.__doc__, "References")
    if not refs.strip():
        return f"{name}: no References section"
    if not SOURCE_POINTER.search(refs):
        return f"{name}: its References name no row of the sources table ([source: key, clause])"
    return ""


ENGINE = [(n, o) for n, o in ALL if _engine_function(n, o) or _engine_class(n, o)]


@pytest.mark.parametrize(("name", "obj"), ENGINE, ids=[c[0] for c in ENGINE])
def test_every_public_engine_function_names_its_source(name, obj):
    problem = _source_problem(name, obj)
    assert not problem, problem


def test_the_checks_catch_planted_gaps():
    def half_documented(thickness, conductivity):
        """Resistance.

        Parameters
        ----------
        thickness : float
            Layer thickness. [m]

        Notes
        -----
        R = d/lambda [source: iso6946-layers, 6.7] (a pointer outside References).

        References
        ----------
        EN ISO 6946:2017, 6.7.
        """

    def bare(thickness):
        return thickness

    assert _documented(half_documented.__doc__) == {"thickness"}
    with pytest.raises(AssertionError, match=r"without a description: \['conductivity'\]"):
        test_every_parameter_is_documented("x.half_documented", half_documented)
    with pytest.raises(AssertionError, match="no docstring"):
        test_every_public_object_has_a_docstring("x.bare", bare)
    with pytest.raises(AssertionError, match="no References section"):
        test_every_public_engine_function_names_its_source("x.bare", bare)
    with pytest.raises(AssertionError, match="name no row of the sources table"):
        test_every_public_engine_function_names_its_source("x.half", half_documented)
    half_documented.__doc__ += "    [source: iso6946-layers, 6.7].\n"
    assert _source_problem("x.half", half_documented) == ""
    assert not _engine_function("x.y", half_documented)  # defined in a test, not the engine


def test_the_walker_sees_cached_functions_properties_and_methods_of_engine_classes():
    import functools

    def f(x):
        """F. [-]"""

    assert _unwrap_cached(functools.cache(f)) is f
    names = {n for n, _ in ALL}
    assert "heatledger.sheet.addresses.col_letter" in names  # an lru_cache'd function
    assert "heatledger.constructions.corrections.AirGapCorrection.label" in names  # property
    engine = {n for n, _ in ENGINE}
    assert "heatledger.constructions.construction.Construction" in engine
    assert "heatledger.ground.slab.slab_on_ground" in engine
    assert "heatledger.windows.WindowResult" not in engine  # a plain result record
