"""The registry of spreadsheet functions survives reloads and refuses non-finite numbers.

Classic xlwings (desktop Excel for Windows) reloads the module named under "UDF Modules"
with :func:`importlib.reload` when its file changed while Excel's Python process runs (as
after an upgrade); before, every HL_ function then failed with "registered twice" until
the process restarted.
"""

from __future__ import annotations

import csv
import importlib
import math
import re
from pathlib import Path

import pytest

from heatledger.errors import HeatLedgerError
from heatledger_xl import registry, udfs, udfs_fins, udfs_heatloss
from heatledger_xl.registry import REGISTRY, udf

WALL = [["gypsum plasterboard 900", 12.5], ["mineral wool 035", 100], ["block", 150, 1.35]]


def _consistent() -> None:
    assert set(udfs.__all__) == set(REGISTRY)
    for name, spec in REGISTRY.items():
        assert getattr(udfs, name) is spec.function, name


@pytest.mark.parametrize("module", [udfs, udfs_fins, udfs_heatloss])
def test_reloading_a_function_module_replaces_its_functions(module):
    names = list(REGISTRY)
    u = udfs.HL_UVALUE(WALL)
    old = {n: s.function for n, s in REGISTRY.items() if s.function.__module__ ==
           module.__name__}
    importlib.reload(module)
    if module is not udfs:
        importlib.reload(udfs)  # what xlwings reloads; keeps udfs' members current
    assert list(REGISTRY) == names  # same functions, same order
    for name, fn in old.items():
        assert REGISTRY[name].function is not fn, f"{name} kept its old function"
    _consistent()
    assert udfs.HL_UVALUE(WALL) == u
    assert isinstance(udfs.HL_FIN_EFFICIENCY(50, 2, 200, 25, 80, 20), float)
    assert isinstance(udfs.HL_VENTILATION_HV(100), float)


def test_reloading_udfs_reloads_the_modules_it_is_built_on():
    fins_before = udfs_fins.HL_FIN_HEATRATE
    heat_before = udfs_heatloss.HL_ROOM_HT
    importlib.reload(udfs)
    assert udfs_fins.HL_FIN_HEATRATE is not fins_before
    assert udfs_heatloss.HL_ROOM_HT is not heat_before
    _consistent()


def test_helpers_imported_before_a_reload_still_refuse_a_blank_required_value():
    # macros imported ``number`` before the reload; its "no default" marker must still be
    # recognised by the reloaded module (or a blank required cell would pass as a value)
    from heatledger_xl import macros

    importlib.reload(udfs)  # reloads ranges too
    with pytest.raises(HeatLedgerError, match="x is blank"):
        macros.number("x", None)
    with pytest.raises(HeatLedgerError, match="x is blank"):
        macros.text("x", "  ")


def test_the_same_name_from_another_module_is_still_refused():
    def HL_UVALUE(layers):  # noqa: N802 - a spreadsheet name
        """A second function of the same name. [-]"""
        return 0.0

    before = REGISTRY["HL_UVALUE"]
    with pytest.raises(HeatLedgerError, match="declared in heatledger_xl.udfs and again"):
        udf("test", returns="x [-]", args={"layers": "Layer table. [-]"})(HL_UVALUE)
    assert REGISTRY["HL_UVALUE"] is before


@pytest.mark.parametrize("value", [math.nan, math.inf, [[1.0, math.nan]], [["a", -math.inf]]])
def test_a_non_finite_number_never_reaches_a_cell(value):
    def HL_TEST_NONFINITE(x=None):  # noqa: N802 - a spreadsheet name
        """Returns what the test gives it, for the wrapper's check. [-]"""
        return value

    try:
        fn = udf("test", returns="x [-]", args={"x": "Anything. [-]"}, spills=True)(
            HL_TEST_NONFINITE)
        out = fn()
    finally:
        REGISTRY.pop("HL_TEST_NONFINITE", None)
    assert out == ("HL_TEST_NONFINITE: no finite result for these arguments (x); please "
                   "report it with the arguments used")
    assert registry.error_text("HL_X", HeatLedgerError("a")) == "HL_X: a"


# --------------------------------------------------------------------------- one vocabulary
#: The naming scheme of the functions (DEVELOPERS.md, "Function names"): a result that is a
#: U-value ends in UVALUE, temperatures in TEMP (one) or TEMPS (a table), each word of the
#: name separated by an underscore.
SUFFIX_RULES = (
    (lambda n: not n.endswith("_U"), "a U-value result ends in _UVALUE, not _U"),
    (lambda n: "TEMP" not in n or any(w in ("TEMP", "TEMPS") for w in n.split("_")),
     "temperatures are the word TEMP or TEMPS"),
    (lambda n: not (n.startswith("HL_T") and n.split("_")[1] not in
                    ("THICKNESS", "TEMP", "TEMPS")),
     "no T prefix glued to a word (HL_NODE_TEMPS, not HL_TNODES)"),
)
#: Layout options stand last, in this order, in every function that has them.
LAYOUT_OPTIONS = ("points", "nodes", "nodes_per_layer", "header")


@pytest.mark.parametrize("name", sorted(REGISTRY))
def test_function_names_follow_one_scheme(name):
    for rule, text in SUFFIX_RULES:
        assert rule(name), f"{name}: {text}"


@pytest.mark.parametrize("name", sorted(REGISTRY))
def test_layout_options_stand_last_in_every_function(name):
    args = [a.name for a in REGISTRY[name].args]
    layout = [a for a in args if a in LAYOUT_OPTIONS]
    assert args[len(args) - len(layout):] == layout, args
    assert layout == sorted(layout, key=LAYOUT_OPTIONS.index), args
    if "header" in args:
        assert args[-1] == "header" and REGISTRY[name].args[-1].optional


#: Pairs of arguments that stand together, in this order, wherever a function takes both
#: (a function that took the outside temperature first would swap them without a warning).
ARGUMENT_PAIRS = (("temp_inside", "temp_outside"), ("rsi", "rse"),
                  ("emissivity_1", "emissivity_2"), ("temp_base", "temp_fluid"))


def _swapped_pairs(args: list[str]) -> list[tuple[str, str]]:
    """The pairs of ARGUMENT_PAIRS that a function takes but not side by side in order."""
    return [(a, b) for a, b in ARGUMENT_PAIRS
            if a in args and b in args and args.index(b) != args.index(a) + 1]


@pytest.mark.parametrize("name", sorted(REGISTRY))
def test_paired_arguments_stand_in_one_order_in_every_function(name):
    args = [a.name for a in REGISTRY[name].args]
    assert not _swapped_pairs(args), (name, args)


def test_the_pair_rule_catches_a_swapped_or_separated_pair():
    assert _swapped_pairs(["temp_outside", "temp_inside", "rh_inside"]) == \
        [("temp_inside", "temp_outside")]
    assert _swapped_pairs(["layers", "rsi", "heat_flow", "rse"]) == [("rsi", "rse")]


def _glossary_units() -> dict[str, str]:
    path = (Path(__file__).resolve().parents[2] / "core" / "heatledger" / "data"
            / "glossary.csv")
    rows = [line for line in path.read_text().splitlines() if not line.startswith("#")]
    return {row["name"]: row["unit"] for row in csv.DictReader(rows)}


def _misnamed_temperatures(args: list[str], units: dict[str, str]) -> list[str]:
    """Arguments in degC whose name does not say temperature the one way (temp_*)."""
    return [a for a in args if units.get(a) == "degC"
            and not (a == "temp" or a.startswith("temp_") or a == "temperature")]


@pytest.mark.parametrize("name", sorted(REGISTRY))
def test_every_temperature_argument_is_named_temp(name):
    args = [a.name for a in REGISTRY[name].args]
    assert not _misnamed_temperatures(args, _glossary_units()), (name, args)


@pytest.mark.parametrize("name", sorted(REGISTRY))
def test_every_argument_description_states_its_unit(name):
    # every family, including those whose own test file does not check it
    for a in REGISTRY[name].args:
        assert re.search(r"\[[^\]]+\]$", a.doc), f"{name}({a.name}) states no unit"


def test_the_temperature_rule_catches_an_old_name():
    units = {"tip_temperature": "degC", "temp_tip": "degC", "h": "W/(m2 K)"}
    assert _misnamed_temperatures(["h", "tip_temperature", "temp_tip"], units) == \
        ["tip_temperature"]


def test_hl_message_explains_a_problem_and_says_when_there_is_none():
    assert udfs.HL_MESSAGE("HL_UVALUE", [["brick", -5, 0.77]]) == \
        udfs.HL_UVALUE([["brick", -5, 0.77]])  # the same text the classic cell shows
    assert udfs.HL_MESSAGE("hl_uvalue", WALL) == "HL_UVALUE: no problem with these arguments"
    assert "takes 1 argument; got 2" in udfs.HL_MESSAGE("HL_MATERIALS", [[True]], [[1]])
    assert "no function" in udfs.HL_MESSAGE("HL_NOTHING")
    assert "no function" in udfs.HL_MESSAGE("HL_MESSAGE")
    # a one-cell argument reaches a scalar argument as its value
    assert udfs.HL_MESSAGE("HL_RSURFACE", [["sideways"]]) == udfs.HL_RSURFACE("sideways")


def test_the_readme_names_every_function_and_argument_the_wizard_shows():
    """The README's function tables and the function dialog (the registry) agree: every
    function and every argument name is in the README's section, and it names no function
    the registry lacks (``value_1`` ... ``value_14`` of HL_MESSAGE are written as a range)."""
    import re
    from pathlib import Path

    text = (Path(__file__).resolve().parents[2] / "README.md").read_text(encoding="utf-8")
    section = text[text.index("## Spreadsheet functions (xlwings)"):
                   text.index("## Spreadsheet functions in LibreOffice Calc")]
    named = set(re.findall(r"`(HL_[A-Z0-9_]+)`", section))
    assert named == set(REGISTRY), (sorted(named ^ set(REGISTRY)))
    words = set(re.findall(r"[A-Za-z_][A-Za-z0-9_]*", section))
    missing = {(name, a.name) for name, spec in REGISTRY.items() for a in spec.args
               if a.name not in words and not re.fullmatch(r"value_([2-9]|1[0-3])", a.name)}
    assert not missing, sorted(missing)
