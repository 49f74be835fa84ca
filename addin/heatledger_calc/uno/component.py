"""heatledger functions in LibreOffice Calc: the UNO component of the extension.

This file runs inside LibreOffice's own Python (its Python loader executes it), not in the
environment heatledger is installed in. It stays thin: it reads the function table the
extension was built with (``heatledger_functions.json`` beside it: names, arguments and
descriptions from the registry, and the folders of the Python environment that built it),
answers Calc's questions about the functions (XAddIn: names, descriptions, category), and
passes every call to :func:`heatledger_calc.values.call`, imported from that environment on
the first call. A function never raises into the sheet: when heatledger cannot be imported,
every function answers a one-line text saying why and what to do.
"""

import json
import os
import site
import sys

import unohelper
from com.sun.star.lang import Locale, XServiceInfo, XServiceName
from com.sun.star.sheet import XAddIn

with open(os.path.join(os.path.dirname(os.path.abspath(__file__)), "heatledger_functions.json"),
          encoding="utf-8") as _file:
    TABLE = json.load(_file)
FUNCTIONS = {f["name"]: f for f in TABLE["functions"]}
IMPLEMENTATION = TABLE["implementation"]
SERVICES = (IMPLEMENTATION, "com.sun.star.sheet.AddIn")
CATEGORY = "Add-In"
_ENGINE = {}


def _interface():
    module, _, name = TABLE["interface"].rpartition(".")
    return getattr(__import__(module, fromlist=[name]), name)


def _engine():
    """heatledger_calc.values from the environment that built the extension, or the reason
    it cannot be imported (a text)."""
    if "values" not in _ENGINE:
        before = list(sys.path)
        for folder in TABLE.get("site_dirs", []):
            if os.path.isdir(folder):
                site.addsitedir(folder)
        added = [p for p in sys.path if p not in before]
        sys.path[:] = [p for p in TABLE.get("site_dirs", []) if p in added] + [
            p for p in added if p not in TABLE.get("site_dirs", [])] + before
        try:
            from heatledger_calc import values
            _ENGINE["values"] = values
        except Exception as exc:  # noqa: BLE001 - reported in every cell instead
            built = ".".join(map(str, TABLE.get("python", [])))
            running = f"{sys.version_info[0]}.{sys.version_info[1]}"
            versions = (f" (the extension was built with Python {built}; LibreOffice runs "
                        f"Python {running}: they must match)" if built != running else "")
            _ENGINE["values"] = (
                f"heatledger cannot be imported in LibreOffice's Python ({type(exc).__name__}: "
                f"{exc}){versions}; rebuild and reinstall the extension from the Python "
                "environment heatledger is installed in: heatledger calc-addin install")
    return _ENGINE["values"]


def _method(name):
    spills = FUNCTIONS[name]["spills"]

    def method(self, *args):
        values = _engine()
        if isinstance(values, str):
            text = " ".join(f"{name}: {values}".split())[:250]
            return ((text,),) if spills else text
        return values.call(name, args, spills)

    method.__name__ = name
    return method


class HeatLedgerFunctions(unohelper.Base, _interface(), XAddIn, XServiceName, XServiceInfo):
    """The add-in object: one method per function (added below), and its descriptions."""

    def __init__(self, ctx):
        self.ctx = ctx
        self.locale = Locale("en", "US", "")

    # XAddIn: everything from the generated table
    def getProgrammaticFuntionName(self, display_name):  # (sic: the UNO method's name)
        return display_name if display_name in FUNCTIONS else ""

    def getDisplayFunctionName(self, name):
        return name if name in FUNCTIONS else ""

    def getFunctionDescription(self, name):
        return FUNCTIONS[name]["description"] if name in FUNCTIONS else ""

    def getDisplayArgumentName(self, name, index):
        args = FUNCTIONS[name]["args"] if name in FUNCTIONS else []
        return args[index]["name"] if 0 <= index < len(args) else ""

    def getArgumentDescription(self, name, index):
        args = FUNCTIONS[name]["args"] if name in FUNCTIONS else []
        return args[index]["doc"] if 0 <= index < len(args) else ""

    def getProgrammaticCategoryName(self, name):
        return CATEGORY

    def getDisplayCategoryName(self, name):
        return CATEGORY

    def setLocale(self, locale):
        self.locale = locale

    def getLocale(self):
        return self.locale

    # XServiceName, XServiceInfo
    def getServiceName(self):
        return IMPLEMENTATION

    def getImplementationName(self):
        return IMPLEMENTATION

    def supportsService(self, name):
        return name in SERVICES

    def getSupportedServiceNames(self):
        return SERVICES


for _name in FUNCTIONS:
    setattr(HeatLedgerFunctions, _name, _method(_name))

g_ImplementationHelper = unohelper.ImplementationHelper()
g_ImplementationHelper.addImplementation(HeatLedgerFunctions, IMPLEMENTATION, SERVICES)
