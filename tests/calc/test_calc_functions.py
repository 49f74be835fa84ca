"""The functions in a real LibreOffice Calc: documents that call them, recalculated headless.

The extension is built from this checkout's registry and installed into a throw-away profile
(``tests/calc/conftest.py``); each test fills a new document over UNO, recalculates it, reads
every cell back and compares it with the same function called in Python with the values Calc
passes (a range as rows of cells with ``None`` for empty cells, a number as a float), and,
for the construction functions, with the engine itself (:class:`Construction`). Numbers pass
through UNO as IEEE doubles and the component runs the same code, so Calc and Python must
agree to the last bits (``RTOL_ULP``); the engine comparison allows round-off
(``RTOL_ROUND_OFF``), as the xlwings server tests do.

LibreOffice 7.4 has no dynamic arrays: a table result is entered as an array formula over a
range; cells of the range beyond the result show #N/A, and a one-cell answer (a problem
text) fills the whole range.
"""

from __future__ import annotations

import pytest

import heatledger_xl.udfs  # noqa: F401 - declares every family's functions
from heatledger import __version__
from heatledger.constructions import AirLayer, Construction, Layer
from heatledger.materials import default_library
from heatledger_xl.registry import REGISTRY
from tests.addin.test_addin_xlwings_server import call as server_call
from tests.addin.test_addin_xlwings_server import xl  # noqa: F401 - fixture
from tests.tolerances import ATOL_ROUND_OFF, RTOL_ROUND_OFF, RTOL_ULP

pytestmark = pytest.mark.calc_functions

#: Function-wizard category number of add-in functions (Calc's ID_FUNCTION_GRP_ADDINS).
ADDIN_CATEGORY = 11
#: The invented demo wall of the xlwings server tests, as cells (None = empty cell).
WALL = [["material", "thickness [mm]", "conductivity [W/(m K)]"],
        ["gypsum plasterboard 900", 12.5, None],
        ["mineral wool 035", 100, None],
        ["block", 150, 1.35],
        ["air", 25, None],
        ["brick", 102, 0.77]]
WALL_RANGE = "A1:C6"
U_FUNCTION, TABLE_FUNCTION = "HL_UVALUE", "HL_INTERFACE_TEMPS"


def _col(index: int) -> str:
    name = ""
    index += 1
    while index:
        index, rem = divmod(index - 1, 26)
        name = chr(65 + rem) + name
    return name


def cells_of(rows: list, col: int = 0, row: int = 1) -> dict:
    """``{"A1": value}`` for the non-empty cells of ``rows`` placed at (col, row)."""
    return {f"{_col(col + j)}{row + i}": v for i, r in enumerate(rows)
            for j, v in enumerate(r) if v is not None}


def as_passed(rows: list) -> list:
    """The rows as Calc passes a range to the component: numbers as floats."""
    return [[float(v) if isinstance(v, int) else v for v in r] for r in rows]


def engine_wall() -> Construction:
    lib = default_library()
    return Construction([
        Layer(0.0125, material=lib.get("gypsum plasterboard 900")),
        Layer(0.100, material=lib.get("mineral wool 035")),
        Layer(0.150, 1.35), AirLayer(0.025), Layer(0.102, 0.77)], "horizontal")


def shown(cell: list) -> object:
    """A cell read back from Calc as a Python value (an error as ``("error", text)``)."""
    kind = cell[0]
    if kind == "number":
        return cell[1]
    if kind == "text":
        return cell[1]
    if kind == "empty":
        return None
    return ("error", cell[2])


def expected(value: object) -> object:
    """What Calc shows for a cell of a Python result: blank text for None, 1/0 for
    TRUE/FALSE, every number a float."""
    if value is None:
        return ""
    if isinstance(value, bool):
        return float(value)
    if isinstance(value, int):
        return float(value)
    return value


def assert_same(got: object, want: object, rel: float = RTOL_ULP) -> None:
    want = expected(want)
    if isinstance(want, float):
        assert isinstance(got, float), (got, want)
        assert got == pytest.approx(want, rel=rel), (got, want)
    else:
        assert got == want


def evaluate(calc, cells: dict, read: list, **extra) -> dict:
    answer = calc.request({"op": "evaluate", "cells": cells, "read": read, **extra})
    return {name: [[shown(c) for c in row] for row in rows]
            for name, rows in answer["read"].items()}


def python(name: str, *args):
    return REGISTRY[name].function(*args)


# --------------------------------------------------------------------------- wizard
def test_function_wizard_shows_every_function_with_the_registry_texts(calc):
    listed = {f["name"]: f for f in calc.request({"op": "functions", "prefix": "HL_"})
              ["functions"]}
    assert set(listed) == set(REGISTRY)
    for name, spec in REGISTRY.items():
        entry = listed[name]
        assert entry["description"] == spec.description
        assert entry["category"] == ADDIN_CATEGORY
        assert entry["arguments"] == [[a.name, a.doc, a.optional] for a in spec.args]


# --------------------------------------------------------------------------- single values
def test_single_values_match_python_and_the_engine(calc):
    wall, c = as_passed(WALL), engine_wall()
    cases = {  # cell: (formula, function, Python arguments, engine value or None)
        "E1": (f"={U_FUNCTION}({WALL_RANGE})", U_FUNCTION, (wall,), c.u_value),
        "E2": (f"=HL_RTOTAL({WALL_RANGE})", "HL_RTOTAL", (wall,), c.total_resistance),
        "E3": (f"=HL_UVALUE_REPORTED({WALL_RANGE})", "HL_UVALUE_REPORTED", (wall,),
               c.u_value_reported),
        "E4": (f"=HL_HEATFLUX({WALL_RANGE};20;-5)", "HL_HEATFLUX", (wall, 20.0, -5.0),
               25.0 / c.total_resistance),
        "E5": (f'={U_FUNCTION}({WALL_RANGE};"up")', U_FUNCTION, (wall, "up"), None),
        # source: EN ISO 6946:2017 Table 7, Rsi upwards 0.10 m2 K/W
        "E6": ('=HL_RSURFACE("inside";"up")', "HL_RSURFACE", ("inside", "up"), 0.10),
        # source: ISO 10456:2007 Table 3, steel 50 W/(m K) (the library row)
        "E7": ('=HL_MATERIAL("steel")', "HL_MATERIAL", ("steel",), 50.0),
        "E8": ("=HL_RAIR(25)", "HL_RAIR", (25.0,), None),
        "E9": ("=HL_VERSION()", "HL_VERSION", (), f"heatledger {__version__}"),
    }
    cells = cells_of(WALL)
    cells.update({ref: case[0] for ref, case in cases.items()})
    got = evaluate(calc, cells, ["E1:E9"])["E1:E9"]
    for (ref, (_, name, args, engine)), (value,) in zip(cases.items(), got, strict=True):
        want = python(name, *args)
        assert_same(value, want)
        if engine is not None:
            assert_same(value, engine, rel=RTOL_ROUND_OFF)
        assert not (isinstance(value, str) and value.startswith(f"{name}:")), (ref, value)


def _probe_args(spec) -> tuple[list, list]:
    """Formula arguments and Python values for a call of ``spec`` with every required
    argument: the wall for a range, 10, 20, 30... for the others."""
    texts, values = [], []
    for i, a in enumerate(spec.args):
        if a.optional:
            break
        if a.is_range:
            texts.append(WALL_RANGE)
            values.append(as_passed(WALL))
        else:
            texts.append(str(10 * (i + 1)))
            values.append(10.0 * (i + 1))
    return texts, values


def test_every_function_answers_in_calc_as_in_python(calc):
    cells, arrays, reads, want, top = cells_of(WALL), {}, [], {}, 10
    for name, spec in REGISTRY.items():
        texts, args = _probe_args(spec)
        out = spec.function(*args)
        rows = out if isinstance(out, list) else [[out]]
        ref = f"E{top}:{_col(4 + len(rows[0]) - 1)}{top + len(rows) - 1}"
        formula = f"={name}({';'.join(texts)})"
        if spec.spills:
            arrays[ref] = formula
        else:
            cells[f"E{top}"] = formula
        reads.append(ref)
        want[ref] = (name, rows)
        top += len(rows) + 1
    got = evaluate(calc, cells, reads, arrays=arrays)
    for ref, (_name, rows) in want.items():
        for got_row, want_row in zip(got[ref], rows, strict=True):
            for value, cell in zip(got_row, want_row, strict=True):
                assert_same(value, cell)


# --------------------------------------------------------------------------- tables
def test_array_formula_tables_match_python_and_the_engine(calc):
    wall, c = as_passed(WALL), engine_wall()
    interfaces = python(TABLE_FUNCTION, wall, 20.0, -5.0, None, None, None, True)
    nodes = python("HL_NODE_TEMPS", wall, 20.0, -5.0, None, None, None, 3.0)
    layers = python("HL_LAYERS", wall, None, None, None, True)
    n_i, n_n, n_l = len(interfaces), len(nodes), len(layers)
    arrays = {f"E1:G{n_i + 1}": f"={TABLE_FUNCTION}({WALL_RANGE};20;-5;;;;1)",
              f"I1:L{n_n}": f"=HL_NODE_TEMPS({WALL_RANGE};20;-5;;;;3)",
              f"N1:T{n_l}": f"=HL_LAYERS({WALL_RANGE};;;;1)"}
    got = evaluate(calc, cells_of(WALL), list(arrays), arrays=arrays)
    table = got[f"E1:G{n_i + 1}"]
    for got_row, want_row in zip(table, interfaces, strict=False):
        for value, cell in zip(got_row, want_row, strict=True):
            assert_same(value, cell)
    assert table[-1] == [("error", "#N/A")] * 3  # beyond the result: no dynamic arrays
    ladder = c.ladder_temperatures(20.0, -5.0)
    assert [r[2] for r in table[1:-1]] == pytest.approx(list(ladder), abs=ATOL_ROUND_OFF)
    res = c.temperatures(20.0, -5.0, nodes_per_layer=3)
    for got_row, want_row, t in zip(got[f"I1:L{n_n}"], nodes, res.temperature, strict=True):
        for value, cell in zip(got_row, want_row, strict=True):
            assert_same(value, cell)
        assert got_row[3] == pytest.approx(t, abs=ATOL_ROUND_OFF)
    for got_row, want_row in zip(got[f"N1:T{n_l}"], layers, strict=True):
        for value, cell in zip(got_row, want_row, strict=True):
            assert_same(value, cell)  # the empty cells of the surfaces' rows show blank


# --------------------------------------------------------------------------- errors
def test_errors_show_as_documented(calc):
    wall = as_passed(WALL)
    cells = cells_of(WALL)
    cells.update({"Z1": "=1/0", "X10": "block", "Y10": "=NA()", "Z10": 1.35,
                  "E1": f"={U_FUNCTION}({WALL_RANGE};Z1)",
                  "E2": f"={U_FUNCTION}(X10:Z10)",
                  "E3": f'={U_FUNCTION}({WALL_RANGE};"sideways")',
                  "E4": f"={U_FUNCTION}({WALL_RANGE};;;;;;)"})
    arrays = {"G1:I2": f'={TABLE_FUNCTION}({WALL_RANGE};"warm";-5)'}
    got = evaluate(calc, cells, ["E1:E4", "G1:I2"], arrays=arrays)
    e = [row[0] for row in got["E1:E4"]]
    assert e[0] == ("error", "#DIV/0!")  # an error cell argument: the formula shows it
    assert e[1] == ("error", "Err:504")  # a range holding an error: Calc's parameter error
    text = python(U_FUNCTION, wall, "sideways")
    assert e[2] == text and text.startswith(f"{U_FUNCTION}: heat_flow")
    assert e[3] == ("error", "Err:504")  # too many arguments
    problem = python(TABLE_FUNCTION, wall, "warm", -5.0)
    assert problem.startswith(f"{TABLE_FUNCTION}: temp_inside")
    assert got["G1:I2"] == [[problem] * 3] * 2  # a one-cell answer fills the array range


# --------------------------------------------------------------------------- blanks
def test_blank_cells_and_left_out_arguments(calc):
    wall = as_passed(WALL)
    gap = WALL[:3] + [[None, None, None]] + WALL[3:]  # a blank row ends the table
    cells = cells_of(WALL)
    cells.update(cells_of(gap, col=23, row=20))  # X20:Z26
    cells.update({"E1": f"={U_FUNCTION}({WALL_RANGE})",
                  "E2": f"={U_FUNCTION}({WALL_RANGE};;;0.13)",
                  "E3": f'={U_FUNCTION}({WALL_RANGE};"")',
                  "E4": f"={U_FUNCTION}({WALL_RANGE};;Z99)",
                  "E5": f"={U_FUNCTION}(X20:Z26)"})
    got = [row[0] for row in evaluate(calc, cells, ["E1:E5"])["E1:E5"]]
    default = python(U_FUNCTION, wall)
    assert_same(got[0], default)  # blank cells inside the range: None, as in Excel
    assert_same(got[1], python(U_FUNCTION, wall, None, None, 0.13))
    assert got[1] != default
    assert_same(got[2], default)  # "" takes the default
    # an empty single cell arrives as 0 (Calc passes 0 to every add-in for it)
    assert_same(got[3], python(U_FUNCTION, wall, None, 0.0))
    assert got[3] != default
    assert_same(got[4], python(U_FUNCTION, as_passed(gap)))


# --------------------------------------------------------------------------- 5,000 cells
def test_five_thousand_cells_recalculate_to_the_python_values(calc):
    n = 5000
    temps = [[15.0 + (i % 101) * 0.1, -15.0 + (i % 37) * 0.5] for i in range(n)]
    formulas = [[f"=HL_HEATFLUX($X$1:$Z$6;A{i + 1};B{i + 1})"] for i in range(n)]
    answer = calc.request({"op": "evaluate", "cells": cells_of(WALL, col=23),
                           "data": {f"A1:B{n}": temps}, "blocks": {f"C1:C{n}": formulas},
                           "bulk": [f"C1:C{n}"]})
    block = answer["bulk"][f"C1:C{n}"]
    assert block["errors"] == ""
    wall, r_total = as_passed(WALL), engine_wall().total_resistance
    assert len(block["data"]) == n
    for (t_i, t_e), (value,) in zip(temps, block["data"], strict=True):
        assert value == pytest.approx(python("HL_HEATFLUX", wall, t_i, t_e), rel=RTOL_ULP)
        assert value == pytest.approx((t_i - t_e) / r_total, rel=RTOL_ROUND_OFF)


# --------------------------------------------------------------------------- three hosts
def test_same_inputs_same_results_in_python_xlwings_server_and_calc(calc, xl):  # noqa: F811
    wall = as_passed(WALL)
    u_python = python(U_FUNCTION, wall)
    u_server = server_call(xl, U_FUNCTION, WALL)[0][0]
    t_python = python(TABLE_FUNCTION, wall, 20.0, -5.0)
    t_server = server_call(xl, TABLE_FUNCTION, WALL, [[20]], [[-5]])
    n = len(t_python)
    cells = cells_of(WALL)
    cells["E1"] = f"={U_FUNCTION}({WALL_RANGE})"
    arrays = {f"G1:I{n}": f"={TABLE_FUNCTION}({WALL_RANGE};20;-5)"}
    got = evaluate(calc, cells, ["E1", f"G1:I{n}"], arrays=arrays)
    assert_same(got["E1"][0][0], u_python)
    assert_same(u_server, u_python)
    for calc_row, py_row, server_row in zip(got[f"G1:I{n}"], t_python, t_server, strict=True):
        for value, cell, server in zip(calc_row, py_row, server_row, strict=True):
            assert_same(value, cell)
            assert_same(server, cell)


@pytest.mark.parametrize("suffix", ["ods", "xlsx"])
def test_a_saved_document_reopens_and_recalculates(calc, tmp_path, suffix):
    path = tmp_path / f"wall.{suffix}"
    cells = cells_of(WALL)
    cells["E1"] = f"={U_FUNCTION}({WALL_RANGE})"
    first = evaluate(calc, cells, ["E1"], save_as=str(path))
    assert path.is_file()
    answer = calc.request({"op": "load", "path": str(path), "read": ["E1"]})
    again = shown(answer["read"]["E1"][0][0])
    assert again == first["E1"][0][0] == pytest.approx(python(U_FUNCTION, as_passed(WALL)),
                                                       rel=RTOL_ULP)


def test_an_excel_workbook_calling_the_functions_shows_name_errors_in_calc(calc, tmp_path):
    # README: Calc 7.4's Excel import does not hand unknown function names to add-ins
    import openpyxl

    book = openpyxl.Workbook()
    sheet = book.active
    for row in WALL:
        sheet.append(row)
    sheet["E1"] = f"={U_FUNCTION}({WALL_RANGE.replace(';', ',')})"
    path = tmp_path / "from_excel.xlsx"
    book.save(path)
    answer = calc.request({"op": "load", "path": str(path), "read": ["E1"]})
    assert shown(answer["read"]["E1"][0][0]) == ("error", "#NAME?")
