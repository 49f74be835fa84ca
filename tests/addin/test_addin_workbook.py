"""The ready demo workbook (workbooks/heatledger_functions_demo.xlsx).

- it is exactly what ``python -m heatledger_xl.workbook`` generates (no drift);
- its ``xlwings.conf`` sheet has the sheet name and key spelling classic xlwings reads
  (the VBA of the xlwings add-in reads sheet ``xlwings.conf`` from A1 down, keys
  upper-cased, and asks for ``UDF MODULES``);
- every formula calls registered functions with a valid number of arguments, and,
  evaluated here by calling the Python functions on the referenced cells, gives the value
  written beside it (so the check cells will say OK once the functions are imported).
"""

from __future__ import annotations

import html
import io
import re
import zipfile
from pathlib import Path

import openpyxl
import pytest
from openpyxl.worksheet.formula import ArrayFormula

from heatledger_xl import udfs, workbook
from heatledger_xl.registry import REGISTRY
from tests._workbook_compare import differences
from tests.tolerances import RTOL_ULP

COMMITTED = Path(__file__).resolve().parents[2] / "workbooks" / workbook.FILE_NAME
CALL = re.compile(r"^=(HL_[A-Z_]+)\((.*)\)$")
rtol_written = RTOL_ULP  # tests/tolerances.py


def load():
    return openpyxl.load_workbook(io.BytesIO(workbook.workbook_bytes()))


def test_committed_workbook_has_not_drifted():
    assert COMMITTED.exists(), "run `python -m heatledger_xl.workbook workbooks --force`"
    # by content (numbers to a stated tolerance): another numpy/scipy may move last bits
    found = differences(COMMITTED, workbook.workbook_bytes())
    assert not found, (f"workbooks/ is out of date ({found}): run "
                       "`python -m heatledger_xl.workbook workbooks --force`")
    # byte for byte only between two generations in the same environment
    assert workbook.workbook_bytes() == workbook.workbook_bytes()


def test_xlwings_conf_sheet_names_the_function_module():
    wb = load()
    conf = wb["xlwings.conf"]
    assert conf["A1"].value.upper() == "UDF MODULES"  # what the add-in's VBA asks for
    assert conf["B1"].value == "heatledger_xl.udfs"
    assert conf["A2"].value is None  # settings end at the first blank row


def _split_args(text: str) -> list[str]:
    out, depth, cur, quoted = [], 0, "", False
    for ch in text:
        if ch == '"':
            quoted = not quoted
        if ch == "," and depth == 0 and not quoted:
            out.append(cur)
            cur = ""
            continue
        depth += ch == "("
        depth -= ch == ")"
        cur += ch
    out.append(cur)
    return out


def _argument(ws, text: str):
    text = text.strip()
    if text == "":
        return None
    if text.startswith('"'):
        return text.strip('"')
    if text.upper() in ("TRUE", "FALSE"):
        return text.upper() == "TRUE"
    if re.fullmatch(r"[-+0-9.E]+", text):
        return float(text)
    ref = text.replace("$", "")
    if ":" in ref:
        return [[c.value for c in row] for row in ws[ref]]
    return ws[ref].value


def evaluate(ws, formula: str):
    m = CALL.match(formula)
    assert m, formula
    name, body = m.groups()
    spec = REGISTRY[name]
    args = [_argument(ws, a) for a in _split_args(body)] if body else []
    assert sum(not a.optional for a in spec.args) <= len(args) <= len(spec.args), formula
    return getattr(udfs, name)(*args)


def test_every_function_cell_gives_the_value_written_beside_it():
    ws = load()[workbook.SHEET]
    checked = 0
    for row in range(23, 23 + len(workbook._single_results())):
        formula = ws[f"C{row}"].value
        got = evaluate(ws, formula)
        want = ws[f"D{row}"].value
        assert not (isinstance(got, str) and got.startswith("HL_")), got
        if isinstance(want, float):
            assert got == pytest.approx(want, rel=rtol_written), formula
        else:
            assert got == want, formula
        assert ws[f"E{row}"].value.startswith("=IF(")
        checked += 1
    assert checked >= 10


def test_spilled_tables_are_array_formulas_of_the_right_size():
    ws = load()[workbook.SHEET]
    names = set()
    for top, ref, formula in workbook._spills():
        cell = ws[top].value
        assert isinstance(cell, ArrayFormula) and cell.ref == ref and cell.text == formula
        value = evaluate(ws, formula)
        (r1, c1), (r2, c2) = [openpyxl.utils.cell.coordinate_to_tuple(p) for p in
                              ref.split(":")]
        assert (len(value), len(value[0])) == (r2 - r1 + 1, c2 - c1 + 1)
        names.add(CALL.match(formula).group(1))
    assert names == {"HL_INTERFACE_TEMPS", "HL_NODE_TEMPS", "HL_LAYERS", "HL_RLIMITS",
                     "HL_CORRECTIONS", "HL_FVCHECK"}


def test_macro_names_point_at_the_demo_inputs():
    wb = load()
    names = {n: wb.defined_names[n].attr_text for n in wb.defined_names}
    assert names["hl_layers"] == f"'{workbook.SHEET}'!$B$6:$G$12"
    assert names["hl_temp_inside"].endswith("$C$15")
    assert names["hl_temp_outside"].endswith("$C$16")


def test_spilled_tables_are_dynamic_arrays_in_excel_365():
    """Each spilling formula carries the dynamic-array cell metadata Excel 365 reads (ECMA-376
    cell attribute cm pointing at xl/metadata.xml's XLDAPR "fDynamic" property, as Excel
    writes it), so that it grows and shrinks with its input; older Excel sees a legacy array
    formula over the range the file names."""
    with zipfile.ZipFile(io.BytesIO(workbook.workbook_bytes())) as z:
        sheet = z.read("xl/worksheets/sheet1.xml").decode("utf-8")
        metadata = z.read("xl/metadata.xml").decode("utf-8")
        types = z.read("[Content_Types].xml").decode("utf-8")
    assert 'name="XLDAPR"' in metadata and 'fDynamic="1"' in metadata
    assert "/xl/metadata.xml" in types
    for top, ref, formula in workbook._spills():
        m = re.search(rf'<c r="{top}" cm="(\d+)"><f t="array" ref="{ref}">([^<]*)</f>', sheet)
        assert m, top
        assert "=" + html.unescape(m.group(2)) == formula
