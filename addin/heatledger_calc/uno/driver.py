"""Drive a running headless Calc over UNO: fill a new sheet, recalculate, read it back.

Run with LibreOffice's Python (the one that can ``import uno``): ``python3 driver.py
PIPE_NAME``. It connects to the soffice listening on that pipe, then answers one JSON
request per input line with one JSON line:

- ``{"op": "evaluate", "cells": {"A1": 1.5, "B1": "text", "C1": "=HL_VERSION()"},
  "data": {"A2:B3": [[1.0, "x"], ...]}, "arrays": {"E1:G4": "=..."}, "blocks": {"A1:A3":
  [["=..."], ...]}, "read": ["C1"], "bulk": ["A1:A3"]}`` - a new hidden document, automatic
  calculation off, the cells set (a text starting with ``=`` is a formula; ``data`` sets
  numbers and texts a range at a time, ``arrays`` are array formulas over a range, ``blocks``
  formulas a range at a time), one full recalculation, a copy saved to ``save_as`` (an
  .ods or .xlsx, by its extension) if given, then each ``read``
  range cell by cell (``["number", x]``, ``["text", s]``, ``["empty"]``, ``["error", code,
  shown]``) and each ``bulk`` range as its data array with the addresses of error cells;
- ``{"op": "load", "path": "/abs/book.xlsx", "read": [...], "bulk": [...]}`` - the same on
  the first sheet of a file (an .xlsx or .ods);
- ``{"op": "functions", "prefix": "HL_"}`` - the function-wizard entries (name,
  description, category, arguments) of the functions whose names start with ``prefix``;
- ``{"op": "quit"}`` - closes LibreOffice.

Imports of ``uno`` happen in :func:`main`, so that the file can be imported (by linters and
test collectors) where LibreOffice's Python is not.
"""

import json
import sys
import time

_FORMULA_VALUE, _FORMULA_TEXT = 1, 2
_FILTERS = {"ods": "calc8", "xlsx": "Calc MS Excel 2007 XML"}


def _connect(uno, pipe, wait_s=120.0):
    from com.sun.star.connection import NoConnectException

    local = uno.getComponentContext()
    resolver = local.ServiceManager.createInstanceWithContext(
        "com.sun.star.bridge.UnoUrlResolver", local)
    deadline = time.monotonic() + wait_s
    while True:
        try:
            return resolver.resolve(f"uno:pipe,name={pipe};urp;StarOffice.ComponentContext")
        except NoConnectException:
            if time.monotonic() > deadline:
                raise
            time.sleep(0.25)


def _cell_value(cell):
    kind = cell.getType().value
    if kind == "EMPTY":
        return ["empty"]
    if kind == "FORMULA":
        if cell.getError():
            return ["error", cell.getError(), cell.getString()]
        if cell.FormulaResultType2 == _FORMULA_VALUE:
            return ["number", cell.getValue()]
        return ["text", cell.getString()]
    if kind == "VALUE":
        return ["number", cell.getValue()]
    return ["text", cell.getString()]


def _read(sheet, name):
    rng = sheet.getCellRangeByName(name)
    addr = rng.getRangeAddress()
    return [[_cell_value(rng.getCellByPosition(c, r))
             for c in range(addr.EndColumn - addr.StartColumn + 1)]
            for r in range(addr.EndRow - addr.StartRow + 1)]


def _set(sheet, name, value):
    cell = sheet.getCellRangeByName(name)
    if value is None:
        return
    if isinstance(value, str):
        if value.startswith("="):
            cell.setFormula(value)
        else:
            cell.setString(value)
    else:
        cell.setValue(float(value))


def _open(uno, desktop, url):
    hidden = uno.createUnoStruct("com.sun.star.beans.PropertyValue")
    hidden.Name, hidden.Value = "Hidden", True
    return desktop.loadComponentFromURL(url, "_blank", 0, (hidden,))


def _fill(sheet, req):
    for name, value in req.get("cells", {}).items():
        _set(sheet, name, value)
    for name, rows in req.get("data", {}).items():
        sheet.getCellRangeByName(name).setDataArray(tuple(tuple(r) for r in rows))
    for name, formula in req.get("arrays", {}).items():
        sheet.getCellRangeByName(name).setArrayFormula(formula)
    for name, rows in req.get("blocks", {}).items():
        sheet.getCellRangeByName(name).setFormulaArray(tuple(tuple(r) for r in rows))


def _evaluate(uno, desktop, req):
    from com.sun.star.sheet.FormulaResult import ERROR

    if req["op"] == "load":
        doc = _open(uno, desktop, uno.systemPathToFileUrl(req["path"]))
    else:
        doc = _open(uno, desktop, "private:factory/scalc")
    try:
        doc.enableAutomaticCalculation(False)
        sheet = doc.Sheets.getByIndex(0)
        _fill(sheet, req)
        started = time.perf_counter()
        doc.calculateAll()
        seconds = time.perf_counter() - started
        out = {"read": {n: _read(sheet, n) for n in req.get("read", [])}, "bulk": {},
               "seconds": seconds}
        if req.get("save_as"):
            kind = uno.createUnoStruct("com.sun.star.beans.PropertyValue")
            kind.Name = "FilterName"
            kind.Value = _FILTERS[req["save_as"].rpartition(".")[2].lower()]
            doc.storeToURL(uno.systemPathToFileUrl(req["save_as"]), (kind,))
        for name in req.get("bulk", []):
            rng = sheet.getCellRangeByName(name)
            errors = rng.queryFormulaCells(ERROR).getRangeAddressesAsString()
            out["bulk"][name] = {"data": [list(r) for r in rng.getDataArray()],
                                 "errors": errors}
        return out
    finally:
        doc.close(True)


def _functions(smgr, ctx, prefix):
    descriptions = smgr.createInstanceWithContext("com.sun.star.sheet.FunctionDescriptions",
                                                  ctx)
    found = []
    for i in range(descriptions.getCount()):
        entry = {p.Name: p.Value for p in descriptions.getByIndex(i)}
        if entry["Name"].startswith(prefix):
            found.append({"name": entry["Name"], "description": entry["Description"],
                          "category": entry["Category"],
                          "arguments": [[a.Name, a.Description, bool(a.IsOptional)]
                                        for a in entry.get("Arguments") or ()]})
    return found


def main(pipe):
    """Serve requests from stdin until ``quit`` or end of input.

    Parameters
    ----------
    pipe : str
        Name of the pipe soffice accepts connections on. [-]
    """
    import uno

    ctx = _connect(uno, pipe)
    smgr = ctx.ServiceManager
    desktop = smgr.createInstanceWithContext("com.sun.star.frame.Desktop", ctx)
    print(json.dumps({"ready": True}), flush=True)
    for line in sys.stdin:
        req = json.loads(line)
        try:
            if req["op"] == "quit":
                try:
                    desktop.terminate()
                except Exception:  # noqa: BLE001 - the bridge closes as soffice exits
                    pass
                print(json.dumps({"ok": True}), flush=True)
                return
            if req["op"] == "functions":
                result = {"functions": _functions(smgr, ctx, req.get("prefix", ""))}
            else:
                result = _evaluate(uno, desktop, req)
        except Exception as exc:  # noqa: BLE001 - reported to the caller
            result = {"failure": f"{type(exc).__name__}: {exc}"}
        print(json.dumps(result), flush=True)


if __name__ == "__main__":
    main(sys.argv[1])
