"""The functions run through xlwings' own calling machinery (``xlwings.server``).

xlwings picks its decorators when it is imported: with ``XLWINGS_ON_SERVER=true`` they are
the ones of xlwings Server / xlwings Lite (the runtime of Excel on the web and macOS), which
record the metadata and conversion options. The fixture sets the environment for these
tests only (monkeypatch), imports fresh copies of xlwings and of the add-in, and puts the
original modules back afterwards. ``XLWINGS_LICENSE_KEY=noncommercial`` is the key value
xlwings documents for noncommercial use of its PRO part (xlwings README, "License key for
noncommercial purpose"); it is used here only to run the tests.

Payloads are shaped as the spreadsheet sends them: every argument a 2-D matrix
(``[[value]]`` for one cell), ``None`` for an omitted optional argument, error cells as
``{"type": "Error", "basicValue": "#N/A"}``.
"""

from __future__ import annotations

import asyncio
import importlib
import sys
from types import SimpleNamespace

import pytest

from heatledger.constructions import AirLayer, Construction, Layer
from heatledger.materials import default_library
from tests.tolerances import ATOL_ROUND_OFF, RTOL_ROUND_OFF

PACKAGES = ("xlwings", "heatledger_xl")
WALL = [["material", "thickness [mm]", "conductivity [W/(m K)]"],
        ["gypsum plasterboard 900", 12.5, None],
        ["mineral wool 035", 100, None],
        ["block", 150, 1.35],
        ["air", 25, None],
        ["brick", 102, 0.77]]  # invented demo wall
rtol_engine = RTOL_ROUND_OFF  # tests/tolerances.py


def _ours(name: str) -> bool:
    return name.split(".")[0] in PACKAGES


@pytest.fixture
def xl(monkeypatch):
    monkeypatch.setenv("XLWINGS_ON_SERVER", "true")
    monkeypatch.setenv("XLWINGS_LICENSE_KEY", "noncommercial")
    saved = {k: v for k, v in sys.modules.items() if _ours(k)}
    for k in saved:
        del sys.modules[k]
    try:
        xlwings = importlib.import_module("xlwings")
        server = importlib.import_module("xlwings.server")
        udfs = importlib.import_module("heatledger_xl.udfs")
        registry = importlib.import_module("heatledger_xl.registry")
        yield SimpleNamespace(xlwings=xlwings, server=server, udfs=udfs,
                              registry=registry.REGISTRY)
    finally:
        for k in [k for k in sys.modules if _ours(k)]:
            del sys.modules[k]
        sys.modules.update(saved)


def call(xl, func_name, *args):
    payload = {
        "func_name": func_name,
        "args": list(args),
        "caller_address": "Sheet1!B2",
        "version": xl.xlwings.__version__,
        "client": "Office.js",
        "runtime": "1.4",
        "culture_info_name": "en-GB",
        "date_format": "dd/mm/yyyy",
    }
    return asyncio.run(xl.server.custom_functions_call(payload, xl.udfs))


def engine_wall() -> Construction:
    lib = default_library()
    return Construction([
        Layer(0.0125, material=lib.get("gypsum plasterboard 900")),
        Layer(0.100, material=lib.get("mineral wool 035")),
        Layer(0.150, 1.35), AirLayer(0.025), Layer(0.102, 0.77)], "horizontal")


def test_decorators_are_the_server_ones(xl):
    assert xl.xlwings.on_server
    assert all(hasattr(spec.function, "__xlfunc__") for spec in xl.registry.values())


def test_metadata_lists_every_function_with_its_descriptions(xl):
    meta = xl.server.custom_functions_meta(xl.udfs)
    listed = {f["name"]: f for f in meta["functions"]}
    assert set(listed) == set(xl.registry)
    for name, spec in xl.registry.items():
        f = listed[name]
        assert f["id"] == name
        assert f["description"] == spec.description
        assert len(f["description"]) <= 255
        assert [p["name"] for p in f["parameters"]] == [a.name for a in spec.args]
        for p, a in zip(f["parameters"], spec.args, strict=True):
            assert p["description"] == a.doc and len(p["description"]) <= 255
            assert p.get("optional", False) == a.optional
            assert p["dimensionality"] == "matrix"


def test_u_value_call_returns_the_engine_value(xl):
    want = engine_wall().u_value
    out = call(xl, "HL_UVALUE", WALL, None, None, None)
    assert out == [[pytest.approx(want, rel=rtol_engine)]]
    # blank cells in optional arguments, and optional arguments left out
    assert call(xl, "HL_UVALUE", WALL, [[None]], [[None]], [[None]]) == out
    assert call(xl, "HL_UVALUE", WALL) == out
    assert call(xl, "HL_RTOTAL", WALL, [["horizontal"]]) == [[pytest.approx(
        engine_wall().total_resistance, rel=rtol_engine)]]


def test_spilled_nodal_table_matches_the_engine(xl):
    res = engine_wall().temperatures(20.0, -5.0, nodes_per_layer=3)
    out = call(xl, "HL_NODE_TEMPS", WALL, [[20]], [[-5]], None, None, None, [[3]], [[True]])
    assert out[0] == ["node", "layer", "x [mm]", "temperature [degC]"]
    body = out[1:]
    assert len(body) == len(res.x) == 15
    atol_K = 1e-12  # same solve, no conversion of the numbers
    for row, x, t, layer in zip(body, res.x, res.temperature, res.layer_of_node, strict=True):
        assert row[1] == int(layer) + 1
        assert row[2] == pytest.approx(x * 1000.0, abs=ATOL_ROUND_OFF)
        assert row[3] == pytest.approx(t, abs=atol_K)


def test_spilled_interfaces_and_other_functions(xl):
    ladder = engine_wall().ladder_temperatures(20.0, -5.0)
    out = call(xl, "HL_INTERFACE_TEMPS", WALL, [[20]], [[-5]])
    assert [r[2] for r in out] == pytest.approx(list(ladder), abs=ATOL_ROUND_OFF)
    assert call(xl, "HL_RSURFACE", [["inside"]], [["up"]]) == [[0.10]]  # ISO 6946 Table 7
    assert call(xl, "HL_MATERIAL", [["steel"]]) == [[50.0]]
    listing = call(xl, "HL_MATERIALS", [[True]])
    assert listing[0][0] == "material" and len(listing) == len(default_library()) + 1


def test_a_problem_is_an_error_value_and_hl_message_gives_its_text(xl):
    # Office.js (xlwings Server and Lite): a problem is Excel's #VALUE!, which IFERROR
    # catches (Office.js custom functions, error type "Value"); HL_MESSAGE with the same
    # arguments gives the one-line text
    value_error = [[{"type": "Error", "errorType": "Value"}]]
    na = {"type": "Error", "basicValue": "#N/A", "errorType": "NotAvailable"}
    assert call(xl, "HL_UVALUE", WALL, [[na]]) == value_error
    assert call(xl, "HL_MESSAGE", [["HL_UVALUE"]], WALL, [[na]]) == \
        [["HL_UVALUE: heat_flow holds the error #N/A; give a text"]]
    bad_table = [["block", na, 1.0]]
    assert call(xl, "HL_UVALUE", bad_table) == value_error
    text = call(xl, "HL_MESSAGE", [["HL_UVALUE"]], bad_table)[0][0]
    assert text.startswith("HL_UVALUE: layers row 1 thickness_mm holds the error #N/A")
    assert call(xl, "HL_INTERFACE_TEMPS", WALL, [["warm"]], [[-5]]) == value_error
    text = call(xl, "HL_MESSAGE", [["hl_interface_temps"]], WALL, [["warm"]], [[-5]])[0][0]
    assert text.startswith("HL_INTERFACE_TEMPS: temp_inside must be a number")
    good = call(xl, "HL_MESSAGE", [["HL_UVALUE"]], WALL)
    assert good == [["HL_UVALUE: no problem with these arguments"]]


def test_calculation_sheet_renders_through_the_real_xlwings_object_model(xl):
    """The renderer driving xlwings' own remote Book (the object model of xlwings Server and
    xlwings Lite), which records every change as an action for the spreadsheet."""
    from heatledger.sheet.plan import split_ref

    macros = importlib.import_module("heatledger_xl.macros")
    render = importlib.import_module("heatledger_xl.render_xlwings")
    data = {"client": "Office.js", "version": xl.xlwings.__version__,
            "book": {"name": "demo.xlsx", "active_sheet_index": 0, "selection": "A1"},
            "names": [], "sheets": [{"name": "Sheet1", "values": [[""]], "pictures": [],
                                     "tables": []}]}
    book = xl.xlwings.Book(json=data)
    plan = macros.construction_plan(WALL, 20.0, -5.0, name="EW1 demo wall")
    report = render.render_plan(plan, book)
    actions = book.json()["actions"]
    values, formulas = {}, {}
    for a in actions:
        if a["func"] not in ("setValues", "setFormula"):
            continue
        if a["sheet_position"] == 2:  # the finite-volume appendix, after the sheet
            continue
        assert a["sheet_position"] == 1  # the new sheet, after Sheet1: nothing else touched
        for i, row in enumerate(a["values"]):
            for j, v in enumerate(row):
                key = (a["start_row"] + i + 1, a["start_column"] + j + 1)
                if a["func"] == "setFormula":
                    formulas[key] = v
                elif v not in (None, ""):
                    values[key] = v
    assert any(a["func"] == "addSheet" and a["args"][1] == "EW1 demo wall" for a in actions)
    n_formulas = 0
    for cell in plan.sheets[0].cells():
        key = split_ref(cell.ref)
        if cell.formula is not None:
            assert formulas[key] == cell.formula
            n_formulas += 1
        elif isinstance(cell.value, str) and cell.value:
            assert values[key] == "'" + cell.value  # written as text
        elif cell.value not in (None, ""):
            assert values[key] == cell.value
    assert n_formulas > 50
    assert report.formulas == n_formulas + sum(c.formula is not None
                                               for c in plan.sheets[1].cells()) > 200
    funcs = {a["func"] for a in actions}
    assert {"addChart", "setChartTitle", "rangeMerge", "freezePaneAtRange", "setNumberFormat",
            "setFontProperty", "setRangeColor", "setColumnWidth"} <= funcs
    assert any("series names" in s for s in report.skipped)  # stated, not silently dropped


def test_calculation_sheet_script_runs_through_custom_scripts_call(xl):
    """The button script as xlwings Server / Lite runs it: the runtime injects the book, the
    script reads the selected layer table and the named design temperatures."""
    macros = importlib.import_module("heatledger_xl.macros")
    values = [row + [None, None, None] for row in WALL]
    for i, (label, value) in enumerate([("inside", 20.0), ("outside", -5.0),
                                        ("name", "EW1 demo wall")]):
        values[i][4], values[i][5] = label, value
    values = [["" if v is None else v for v in row] for row in values]
    names = [{"name": n, "sheet_index": 0, "address": a, "book_scope": True,
              "scope_sheet_name": None, "scope_sheet_index": None, "refers_to": f"=Inputs!{a}"}
             for n, a in (("hl_temp_inside", "$F$1"), ("hl_temp_outside", "$F$2"),
                          ("hl_construction", "$F$3"))]
    data = {"client": "Office.js", "version": xl.xlwings.__version__,
            "book": {"name": "demo.xlsx", "active_sheet_index": 0, "selection": "A1:C6"},
            "names": names, "sheets": [{"name": "Inputs", "values": values, "pictures": [],
                                        "tables": []}]}
    book = xl.xlwings.Book(json=data)
    asyncio.run(xl.server.custom_scripts_call(macros, "HL_CALC_SHEET",
                                              typehint_to_value={xl.xlwings.Book: book}))
    actions = book.json()["actions"]
    added = [a["args"] for a in actions if a["func"] == "addSheet"]
    assert added == [[1, "EW1 demo wall"], [2, "FV EW1 demo wall"]]  # with its appendix
    formulas = [a for a in actions if a["func"] == "setFormula"]
    assert len(formulas) > 50
    meta = xl.server.custom_scripts_meta(macros)
    assert [m["function_name"] for m in meta] == ["HL_CALC_SHEET"]
