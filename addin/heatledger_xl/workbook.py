"""The ready workbook that uses the spreadsheet functions on an invented demo construction.

``python -m heatledger_xl.workbook [FOLDER] [--force]`` writes
``FOLDER/heatledger_functions_demo.xlsx`` (default folder ``workbooks``). The file holds:

- ``Functions demo``: an invented cavity wall as a layer table (with a header row, as the
  range conventions allow), the design data, one cell per function (``=HL_UVALUE(...)``
  and friends), beside each the value the engine gave when the file was generated and a
  check cell, and the spilled tables (interfaces, nodes, layers, bridging limits) as
  dynamic-array formulas (:mod:`heatledger_xl.workbook_writer`): in Excel 365 they grow and
  shrink with their input; Excel before 365 shows each as a legacy array formula over the
  range it had when the file was written (to resize one there, select the new range and
  enter the formula with Ctrl+Shift+Enter);
- ``xlwings.conf``: the workbook settings sheet classic xlwings reads, with
  ``UDF Modules`` = ``heatledger_xl.udfs`` starting in cell A1;
- ``Read me``: the steps to import the functions on first use.

The workbook is generated, never edited by hand, and deterministic (fixed timestamps).
The formulas show ``#NAME?`` until the functions are imported (see ``Read me``).
"""

from __future__ import annotations

import sys
from pathlib import Path

from heatledger.sheet.files import normalise_zip, write_bytes_atomic
from heatledger.sheet.plan import WorkbookPlan, col_index, col_letter, sheet_ref

from . import udfs
from .workbook_writer import plan_to_xlsx

__all__ = ["FILE_NAME", "DEMO_LAYERS", "SHEET", "workbook_bytes", "write", "main"]

FILE_NAME = "heatledger_functions_demo.xlsx"
SHEET = "Functions demo"
#: Invented demo construction (not a real product build-up), inside to outside.
DEMO_NAME = "EW-demo cavity wall (invented)"
DEMO_LAYERS = [
    ["material", "thickness [mm]", "conductivity [W/(m K)]", "resistance [m2 K/W]",
     "bridging fraction [-]", "bridging conductivity"],
    ["gypsum plasterboard 900", 12.5, None, None, None, None],
    ["insulation between battens", 50.0, 0.035, None, 0.1, "softwood 500"],
    ["concrete medium density 1800", 100.0, None, None, None, None],
    ["mineral wool 035", 100.0, None, None, None, None],
    ["air", 50.0, None, None, None, None],
    ["clay brick outer leaf", 102.5, None, None, None, None],
]
TABLE = "$B$6:$G$12"  # the layer table with its header row
#: Invented Annex F corrections of the demo wall (layer 4 = the mineral wool).
DEMO_CORRECTIONS = [
    ["kind", "layer", "level / conductivity", "cross section [mm2]", "count [1/m2]"],
    ["air_gaps", 4, 1, None, None],
    ["fasteners", 4, "stainless steel", 12.6, 4],
]
CORR = "$I$6:$M$8"
T_IN, T_OUT, HEAT_FLOW, TARGET_U, SIZE_LAYER = 20.0, -5.0, "horizontal", 0.18, 4
_CAUTION = ("Results support, and do not replace, design by a competent person under the "
            "local building regulations; check material values against the declared values "
            "of the products used.")
_STEPS = [
    "Classic xlwings, desktop Excel for Windows:",
    "heatledger is not on the package index yet: install it from a clone (pip install .) "
    "or from a wheel built there (python -m build --wheel, then pip install "
    "dist/heatledger-0.1.0-py3-none-any.whl).",
    "1. Install heatledger as above into the Python Excel should use (brings xlwings, "
    "numpy, scipy).",
    "2. xlwings addin install    (the xlwings tab appears in Excel)",
    "3. Open this file, File > Save As > Excel Macro-Enabled Workbook (.xlsm).",
    "4. File > Options > Trust Center > Trust Center Settings > Macro Settings: tick "
    "'Trust access to the VBA project object model'.",
    "5. VBA editor (Alt+F11) > Tools > References: tick xlwings.",
    "6. xlwings tab: set Interpreter (or Conda Path/Env) to the Python with heatledger, "
    "then click 'Import Functions'. The sheet xlwings.conf already names the module "
    "(UDF Modules = heatledger_xl.udfs).",
    "7. Recalculate (Ctrl+Alt+F9): every check cell in column E should say OK.",
    "",
    "xlwings Lite (Excel on the web, macOS, Windows; Python in the browser):",
    "1. Home > Add-ins: add 'xlwings Lite'.",
    "2. requirements.txt: add the HTTPS address where you put the heatledger wheel (not on "
    "the package index yet).",
    "3. main.py: from heatledger_xl.udfs import *   and   from heatledger_xl.macros import "
    "HL_CALC_SHEET",
    "4. Restart xlwings Lite; the HL_ functions are then available in every cell.",
    "",
    "The tables from row 36 are dynamic arrays: in Excel 365 they grow and shrink with the "
    "layer table. Excel before 365 shows them over the range they had when the file was "
    "written: to resize one, select the new range, edit the formula and press "
    "Ctrl+Shift+Enter.",
    "",
    "Calculation sheet of the demo wall: select the layer table (B6:G12) and run the macro "
    "HL_CALC_SHEET (xlwings Lite: script list; classic: a VBA button macro calling "
    "RunPython \"import heatledger_xl.macros as m; m.calc_sheet_from_excel()\").",
]


def workbook_bytes() -> bytes:
    """The demo workbook as deterministic .xlsx bytes."""
    dynamic = [(ref, formula) for _, ref, formula in _spills()]
    return normalise_zip(plan_to_xlsx(_plan(), dynamic))


def write(folder="workbooks", *, force: bool = False) -> Path:
    """Write the demo workbook into ``folder``.

    Parameters
    ----------
    folder : str or path-like
        Target folder (must exist). [-]
    force : bool
        Replace an existing file. [-]

    Returns
    -------
    pathlib.Path
    """
    return write_bytes_atomic(Path(folder) / FILE_NAME, workbook_bytes(), force=force)


def main(argv=None) -> int:
    """Command line: ``python -m heatledger_xl.workbook [FOLDER] [--force]``.

    Parameters
    ----------
    argv : list of str, optional
        Command-line arguments; default sys.argv. [-]
    """
    args = list(sys.argv[1:] if argv is None else argv)
    force = "--force" in args
    rest = [a for a in args if a != "--force"]
    try:
        path = write(rest[0] if rest else "workbooks", force=force)
    except Exception as exc:  # noqa: BLE001 - a one-line message, not a traceback
        print(f"heatledger_xl.workbook: {exc}", file=sys.stderr)
        return 1
    print(path)
    return 0


# --------------------------------------------------------------------------- content
def _single_results():
    """(label, formula, engine value now, number format) of every one-cell function."""
    t, ti, te, hf, tu, k = TABLE, "$C$15", "$C$16", "$C$17", "$C$18", "$C$19"
    layers = DEMO_LAYERS
    return [
        ("U-value, unrounded [W/(m2 K)]", f"=HL_UVALUE({t},{hf})",
         udfs.HL_UVALUE(layers, HEAT_FLOW), "0.0000"),
        ("U-value, 2 significant figures [W/(m2 K)]", f"=HL_UVALUE_REPORTED({t},{hf})",
         udfs.HL_UVALUE_REPORTED(layers, HEAT_FLOW), "0.00"),
        ("Total resistance R_T [m2 K/W]", f"=HL_RTOTAL({t},{hf})",
         udfs.HL_RTOTAL(layers, HEAT_FLOW), "0.0000"),
        ("Heat flux q [W/m2]", f"=HL_HEATFLUX({t},{ti},{te},{hf})",
         udfs.HL_HEATFLUX(layers, T_IN, T_OUT, HEAT_FLOW), "0.000"),
        ("Thickness of layer (row C19) for the target U [mm]",
         f"=HL_THICKNESS({t},{k},{tu},{hf})",
         udfs.HL_THICKNESS(layers, SIZE_LAYER, TARGET_U, HEAT_FLOW), "0.0"),
        ("Rsi, ISO 6946 Table 7 [m2 K/W]", f'=HL_RSURFACE("inside",{hf})',
         udfs.HL_RSURFACE("inside", HEAT_FLOW), "0.00"),
        ("Rse, ISO 6946 Table 7 [m2 K/W]", f'=HL_RSURFACE("outside",{hf})',
         udfs.HL_RSURFACE("outside", HEAT_FLOW), "0.00"),
        ("Rs inside, emissivity 0.1, Annex C [m2 K/W]",
         f'=HL_RSURFACE_CALC("inside",{hf},0.1)',
         udfs.HL_RSURFACE_CALC("inside", HEAT_FLOW, 0.1), "0.000"),
        ("R of the 50 mm air layer, Annex D [m2 K/W]", f"=HL_RAIR(50,{hf})",
         udfs.HL_RAIR(50, HEAT_FLOW), "0.000"),
        ("λ of mineral wool 035 from the library [W/(m K)]",
         '=HL_MATERIAL("mineral wool 035")', udfs.HL_MATERIAL("mineral wool 035"), "0.000"),
        ("Source of that value", '=HL_MATERIAL("mineral wool 035","source")',
         udfs.HL_MATERIAL("mineral wool 035", "source"), "General"),
        ("U-value with the Annex F corrections (table I6:M8) [W/(m2 K)]",
         f"=HL_UVALUE_CORRECTED({t},{CORR},{hf})",
         udfs.HL_UVALUE_CORRECTED(layers, DEMO_CORRECTIONS, HEAT_FLOW), "0.0000"),
    ]


def _spill_specs():
    t, ti, te, hf = TABLE, "$C$15", "$C$16", "$C$17"
    return [
        ("Interface temperatures", "B", f"=HL_INTERFACE_TEMPS({t},{ti},{te},{hf},,,TRUE)",
         udfs.HL_INTERFACE_TEMPS(DEMO_LAYERS, T_IN, T_OUT, HEAT_FLOW, None, None, True)),
        ("Nodal temperatures, 2 cells per layer", "F",
         f"=HL_NODE_TEMPS({t},{ti},{te},{hf},,,2,TRUE)",
         udfs.HL_NODE_TEMPS(DEMO_LAYERS, T_IN, T_OUT, HEAT_FLOW, None, None, 2, True)),
        ("Layer table as used", "K", f"=HL_LAYERS({t},{hf},,,TRUE)",
         udfs.HL_LAYERS(DEMO_LAYERS, HEAT_FLOW, None, None, True)),
        ("Bridged layer: upper and lower limits", "S", f"=HL_RLIMITS({t},{hf},,,TRUE)",
         udfs.HL_RLIMITS(DEMO_LAYERS, HEAT_FLOW, None, None, True)),
        ("Annex F corrections", "V", f"=HL_CORRECTIONS({t},{CORR},{hf},,,TRUE)",
         udfs.HL_CORRECTIONS(DEMO_LAYERS, DEMO_CORRECTIONS, HEAT_FLOW, None, None, True)),
        ("Finite-volume checks, 2 cells per layer", "Z",
         f"=HL_FVCHECK({t},{ti},{te},{hf},,,2,TRUE)",
         udfs.HL_FVCHECK(DEMO_LAYERS, T_IN, T_OUT, HEAT_FLOW, None, None, 2, True)),
    ]


SPILL_ROW = 36


def _spills():
    out = []
    for _, col, formula, value in _spill_specs():
        assert isinstance(value, list), value
        last_col = col_letter(col_index(col) + len(value[0]) - 1)
        top = f"{col}{SPILL_ROW}"
        out.append((top, f"{top}:{last_col}{SPILL_ROW + len(value) - 1}", formula))
    return out


def _plan() -> WorkbookPlan:
    plan = WorkbookPlan(title="heatledger spreadsheet functions: demo")
    widths = {"A": 3, "B": 44, "C": 16, "D": 16, "E": 10, "F": 8, "G": 8, "H": 10, "I": 14}
    sh = plan.add_sheet(SHEET, column_widths=widths, tab_color="2E5A6B")
    b = sh.block("head")
    b.put("B1", "heatledger spreadsheet functions on an invented demo wall", style="hl title")
    b.put("B2", "Demo data are invented. " + _CAUTION, role="note")
    b.put("B3", "Cells show #NAME? until the HL_ functions are imported: see the sheet "
                "'Read me'.", role="note")
    b.put("B5", "Layer table, inside to outside (range B6:G12, header row included)",
          style="hl subtitle")
    t = sh.block("layers")
    for i, row in enumerate(DEMO_LAYERS):
        for j, value in enumerate(row):
            a1 = f"{'BCDEFG'[j]}{6 + i}"
            if i == 0:
                t.put(a1, value, role="header")
            elif value is not None:
                t.put(a1, value, role="input",
                      number_format="0.0" if j == 1 else ("0.000" if j != 0 else None))
    b.put("I5", "Corrections, EN ISO 6946 Annex F (range I6:M8, header row included)",
          style="hl subtitle")
    cb = sh.block("corrections")
    for i, row in enumerate(DEMO_CORRECTIONS):
        for j, value in enumerate(row):
            if value is not None:
                cb.put(f"{'IJKLM'[j]}{6 + i}", value, role="header" if i == 0 else "input")
    d = sh.block("design")
    d.put("B14", "Construction name")
    d.put("C14", DEMO_NAME, role="input")
    for r, (label, value, fmt) in enumerate(
            [("Inside air temperature [degC]", T_IN, "0.0"),
             ("Outside air temperature [degC]", T_OUT, "0.0"),
             ("Heat-flow direction (up, horizontal, down)", HEAT_FLOW, None),
             ("Target U-value [W/(m2 K)]", TARGET_U, "0.00"),
             ("Layer to size (row of the table, 1 = first layer)", SIZE_LAYER, "0")],
            start=15):
        d.put(f"B{r}", label)
        d.put(f"C{r}", value, role="input", number_format=fmt)
    res = sh.block("results")
    res.put("B21", "Results", style="hl subtitle")
    for j, title in enumerate(["function in the cell", "value at generation", "check"]):
        res.put(f"{'CDE'[j]}22", title, role="header")
    for r, (label, formula, value, fmt) in enumerate(_single_results(), start=23):
        res.put(f"B{r}", label)
        res.put(f"C{r}", formula=formula, number_format=fmt)
        if isinstance(value, str):
            res.put(f"D{r}", value, role="engine")
            res.put(f"E{r}", formula=f'=IF(C{r}=D{r},"OK","MISMATCH")', role="check")
        else:
            res.put(f"D{r}", float(value), role="engine", number_format=fmt)
            res.put(f"E{r}", formula=f'=IF(ABS(C{r}-D{r})<=1E-9*MAX(1,ABS(D{r})),"OK",'
                                     f'"MISMATCH")', role="check")
    sp = sh.block("spill titles")
    for title, col, formula, _ in _spill_specs():
        sp.put(f"{col}{SPILL_ROW - 1}", f"{title}: {formula[1:]}", style="hl subtitle")
    plan.defined_names.update({
        "hl_layers": sheet_ref(SHEET, TABLE.replace("$", "")),
        "hl_construction": sheet_ref(SHEET, "C14"),
        "hl_temp_inside": sheet_ref(SHEET, "C15"),
        "hl_temp_outside": sheet_ref(SHEET, "C16"),
        "hl_heat_flow": sheet_ref(SHEET, "C17"),
    })
    conf = plan.add_sheet("xlwings.conf", column_widths={"A": 22, "B": 40})
    c = conf.block("settings")
    c.put("A1", "UDF Modules")
    c.put("B1", "heatledger_xl.udfs")
    c.put("A3", "Classic xlwings reads its workbook settings from this sheet, from A1 down "
                "to the first blank row. Keep the sheet name and the key spelling.",
          role="note")
    readme = plan.add_sheet("Read me", column_widths={"A": 120})
    rb = readme.block("steps")
    rb.put("A1", "Import the heatledger functions on first use", style="hl title")
    for i, line in enumerate(_STEPS, start=3):
        if line:
            rb.put(f"A{i}", line)
    rb.put(f"A{len(_STEPS) + 4}", _CAUTION, role="note")
    return plan


if __name__ == "__main__":  # pragma: no cover
    raise SystemExit(main())
