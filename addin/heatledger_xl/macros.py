"""Macros: write the full calculation sheet of a construction into the open workbook.

The sheet is the one the headless audit writes for a construction
(:func:`heatledger.sheet.construction_sheet.add_construction_sheet`), rendered through
xlwings (:mod:`heatledger_xl.render_xlwings`), so the live formulas, the engine's values and
the check cells are the same.

Input, read from the calling workbook:

- the layer table: the current selection when it spans at least two columns, otherwise the
  range named ``hl_layers``; same conventions as the spreadsheet functions
  (:mod:`heatledger_xl.ranges`);
- the design temperatures: the cells named ``hl_temp_inside`` and ``hl_temp_outside``
  [degC]; optional ``hl_heat_flow`` (``up``, ``horizontal``, ``down``) and
  ``hl_construction`` (the construction's name, also the sheet name).

Entry points:

- :func:`write_construction_sheet` - a plain function taking the book (and the inputs);
- :func:`HL_CALC_SHEET` - an xlwings ``script`` for xlwings Lite and xlwings Server (the
  runtime passes the book; a sheet button can run it);
- :func:`calc_sheet_from_excel` - for classic xlwings on Windows, called from a VBA button
  macro: ``RunPython "import heatledger_xl.macros as m; m.calc_sheet_from_excel()"``.

A problem with the input is shown in a message box, never written into the sheet.
"""

from __future__ import annotations

import xlwings as xw
from xlwings import script

from heatledger.errors import HeatLedgerError
from heatledger.sheet.construction_sheet import add_construction_sheet
from heatledger.sheet.plan import WorkbookPlan, safe_sheet_name

from .cells import heat_flow_value, number, text
from .ranges import LIBRARY, build_construction, layer_rows
from .render_xlwings import RenderReport, render_plan

__all__ = ["construction_plan", "write_construction_sheet", "HL_CALC_SHEET",
           "calc_sheet_from_excel", "NAMES"]

#: Workbook names the macro reads.
NAMES = {"layers": "hl_layers", "temp_inside": "hl_temp_inside",
         "temp_outside": "hl_temp_outside", "heat_flow": "hl_heat_flow",
         "name": "hl_construction"}


def construction_plan(layers, temp_inside, temp_outside, heat_flow=None, *,
                      name: str = "construction", nodes_per_layer=None) -> WorkbookPlan:
    """The calculation-sheet plan of one construction given as a layer-table range.

    Parameters
    ----------
    layers : list of list
        Layer table, inside to outside, as the spreadsheet functions take it. [mm, W/(m K)]
    temp_inside, temp_outside : float
        Design air temperatures. [degC]
    heat_flow : str, optional
        ``"up"``, ``"horizontal"`` (default) or ``"down"``. [-]
    name : str
        Construction name; also the sheet name (shortened to 31 characters). [-]
    nodes_per_layer : int, optional
        Finite-volume cells per layer (engine default when None). [-]

    Returns
    -------
    WorkbookPlan

    Raises
    ------
    HeatLedgerError
        For a bad layer table or temperature (the message names the row and the rule).
    """
    rows = layer_rows("layers", layers)
    construction = build_construction(rows, heat_flow_value(heat_flow), None, None,
                                      label=str(name))
    t_i = number("temp_inside", temp_inside, low=-273.15, high=2000.0, unit="degC")
    t_e = number("temp_outside", temp_outside, low=-273.15, high=2000.0, unit="degC")
    materials = [_library_name(cells[0]) for _, cells in rows]
    bridging = [_library_name(cells[5]) for _, cells in rows]
    plan = WorkbookPlan(title=f"heatledger calculation sheet: {name}")
    sheet_name = safe_sheet_name(str(name) or "construction", set())
    add_construction_sheet(plan, sheet_name, construction, temp_inside=t_i, temp_outside=t_e,
                           nodes_per_layer=nodes_per_layer, materials=materials,
                           bridging_materials=bridging)
    return plan


def write_construction_sheet(book, layers, temp_inside, temp_outside, heat_flow=None, *,
                             name: str = "construction", replace: bool = False,
                             nodes_per_layer=None) -> RenderReport:
    """Write the calculation sheet of a construction and its finite-volume appendix sheet
    into ``book``.

    Parameters
    ----------
    book : xlwings.Book
        The open workbook (the one the macro was called from). [-]
    layers : list of list
        Layer table, inside to outside. [mm, W/(m K)]
    temp_inside, temp_outside : float
        Design air temperatures. [degC]
    heat_flow : str, optional
        ``"up"``, ``"horizontal"`` (default) or ``"down"``. [-]
    name : str
        Construction and sheet name. [-]
    replace : bool
        Reuse a sheet of the same name instead of adding ``"name (2)"``. [-]
    nodes_per_layer : int, optional
        Finite-volume cells per layer. [-]

    Returns
    -------
    RenderReport
    """
    plan = construction_plan(layers, temp_inside, temp_outside, heat_flow, name=name,
                             nodes_per_layer=nodes_per_layer)
    return render_plan(plan, book, replace=replace)


@script
def HL_CALC_SHEET(book: xw.Book):
    """Write the heatledger calculation sheet of the selected layer table (or of the range
    named hl_layers) into this workbook.

    Parameters
    ----------
    book : xlwings.Book, optional
        The workbook; default the caller's. [-]
    """
    _run(book)


def calc_sheet_from_excel():
    """Classic xlwings entry point (RunPython from a VBA button macro)."""
    _run(xw.Book.caller())


# --------------------------------------------------------------------------- helpers
def _run(book) -> RenderReport | None:
    try:
        inputs = read_inputs(book)
        report = write_construction_sheet(book, **inputs)
    except HeatLedgerError as exc:
        _tell(book, f"heatledger: {exc}")
        return None
    main, *appendix = report.sheets.values()
    also = f" and its finite-volume appendix {appendix[0]}" if appendix else ""
    _tell(book, f"heatledger wrote the calculation sheet {main}{also}: {report.cells} cells, "
                f"{report.formulas} formulas. Check that every check cell says OK.")
    return report


def read_inputs(book) -> dict:
    """The macro's inputs from the workbook (selection or names, see the module docstring).

    Parameters
    ----------
    book : xlwings.Book
        The calling workbook. [-]

    Returns
    -------
    dict
        Keyword arguments of :func:`write_construction_sheet`.
    """
    layers = None
    selection = getattr(book, "selection", None)
    if selection is not None:
        values = selection.options(ndim=2).value
        if values and max(len(r) for r in values) >= 2:
            layers = values
    if layers is None:
        layers = _named_value(book, NAMES["layers"], ndim=2)
    if layers is None:
        raise HeatLedgerError("select the layer table (2 to 6 columns) or name it hl_layers")
    out = {"layers": layers}
    for key in ("temp_inside", "temp_outside"):
        value = _named_value(book, NAMES[key])
        if value is None:
            raise HeatLedgerError(f"{key}: name the cell holding it {NAMES[key]} "
                                  "(Formulas > Define Name)")
        out[key] = value
    out["heat_flow"] = _named_value(book, NAMES["heat_flow"])
    out["name"] = text("hl_construction", _named_value(book, NAMES["name"]), "construction")
    return out


def _named_value(book, name: str, ndim: int | None = None):
    for item in book.names:
        if item.name.lower() == name.lower():
            rng = item.refers_to_range
            return rng.options(ndim=ndim).value if ndim else rng.value
    return None


def _library_name(value) -> str:
    if isinstance(value, str) and value.strip() in LIBRARY:
        return LIBRARY.get(value.strip()).name
    return ""


def _tell(book, message: str) -> None:
    app = getattr(book, "app", None)
    alert = getattr(app, "alert", None)
    if callable(alert):
        alert(message, title="heatledger")
