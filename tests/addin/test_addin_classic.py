"""The functions as classic xlwings (desktop Excel for Windows) declares them.

Classic xlwings writes one VBA function per Python function when the user clicks
**Import Functions**; its decorators live in ``xlwings.udfs``, which needs the Windows COM
modules. In a fresh interpreter the three COM modules are replaced by empty stand-ins (no
COM call is made), xlwings' classic decorators are put where ``from xlwings import func``
finds them on Windows, and xlwings' own ``generate_vba_wrapper`` writes the VBA module.
The test checks every function is there with its arguments, optional ones marked
``Optional``, and no argument or function named like a VBA keyword (which would not
compile).
"""

from __future__ import annotations

import json
import re
import subprocess
import sys

from heatledger_xl import udfs
from heatledger_xl.registry import REGISTRY

assert udfs.__all__  # importing udfs registers every family
PROBE = r"""
import io, json, sys, types
for name in ("pythoncom", "pywintypes", "win32com", "win32com.client"):
    sys.modules[name] = types.ModuleType(name)
sys.modules["win32com.client"].Dispatch = lambda *a, **k: None
sys.modules["pywintypes"].com_error = Exception
sys.modules["pythoncom"].CoInitialize = lambda: None
import xlwings
import xlwings.udfs as classic
xlwings.func, xlwings.arg, xlwings.ret = classic.xlfunc, classic.xlarg, classic.xlret
import heatledger_xl.udfs as udfs

class Workbook:  # generate_vba_wrapper only reads the name
    Name = "heatledger_functions_demo.xlsm"

out = io.StringIO()
classic.generate_vba_wrapper("heatledger_xl.udfs", udfs, out, Workbook())
meta = {n: {"doc": f.__xlfunc__["ret"]["doc"],
            "args": [(a["name"], a["doc"], a["options"]) for a in f.__xlfunc__["args"]],
            "category": f.__xlfunc__.get("category")}
        for n in udfs.__all__ for f in [getattr(udfs, n)]}
print(json.dumps({"vba": out.getvalue(), "meta": meta}))
"""

# Visual Basic for Applications keywords and statements that cannot name a variable.
VBA_KEYWORDS = {
    "and", "as", "boolean", "byref", "byte", "byval", "call", "case", "close", "const",
    "currency", "date", "declare", "dim", "do", "double", "each", "else", "elseif", "end",
    "enum", "erase", "error", "event", "exit", "false", "for", "friend", "function", "get",
    "global", "gosub", "goto", "if", "implements", "in", "input", "integer", "is", "let",
    "like", "line", "load", "lock", "long", "loop", "lset", "me", "mod", "name", "new",
    "next", "not", "nothing", "null", "on", "open", "option", "optional", "or", "paramarray",
    "preserve", "print", "private", "property", "public", "put", "raiseevent", "redim", "rem",
    "resume", "return", "rset", "seek", "select", "set", "single", "static", "step", "stop",
    "string", "sub", "then", "time", "to", "true", "type", "typeof", "unload", "unlock",
    "until", "variant", "wend", "while", "width", "with", "withevents", "write", "xor",
}


def run_probe() -> dict:
    proc = subprocess.run([sys.executable, "-c", PROBE], capture_output=True, text=True,
                          timeout=120, check=False)
    assert proc.returncode == 0, proc.stderr[-2000:]
    return json.loads(proc.stdout.strip().splitlines()[-1])


def test_classic_xlwings_writes_a_vba_function_for_every_function():
    probe = run_probe()
    vba = probe["vba"]
    declared = dict(re.findall(r"^Function (HL_[A-Z0-9_]+)\((.*)\)\r?$", vba, re.MULTILINE))
    assert set(declared) == set(REGISTRY)
    for name, spec in REGISTRY.items():
        params = [p.strip() for p in declared[name].split(",")] if declared[name] else []
        want = [("Optional " if a.optional else "") + a.name for a in spec.args]
        assert params == want, name
        assert f'XLPy.CallUDF("heatledger_xl.udfs", "{name}"' in vba
        meta = probe["meta"][name]
        assert meta["doc"] == spec.description and len(meta["doc"]) <= 255
        assert meta["category"] == "heatledger"
        for (arg, doc, options), a in zip(meta["args"], spec.args, strict=True):
            assert (arg, doc) == (a.name, a.doc) and len(doc) <= 255
            assert options.get("err_to_str") is True
            assert options.get("ndim") == (2 if a.is_range else None)


def test_no_argument_or_function_is_named_like_a_vba_keyword():
    for name, spec in REGISTRY.items():
        assert name.lower() not in VBA_KEYWORDS
        for a in spec.args:
            assert a.name.lower() not in VBA_KEYWORDS, (name, a.name)
            assert re.fullmatch(r"[a-z][a-z0-9_]*", a.name), (name, a.name)
            assert len(a.name) <= 255
