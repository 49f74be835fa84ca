"""The function module loads in the in-browser runtime of Excel on the web and macOS.

xlwings Lite runs Python compiled to WebAssembly (Pyodide) with numpy and scipy from its
own package set; only pure-Python wheels install besides. There are no subprocesses and no
file system holding the package, so package data must come through importlib.resources.
Checked here in a fresh interpreter: after numpy and scipy (which that runtime provides)
and a stand-in for xlwings (which it provides too), importing ``heatledger_xl.udfs`` adds
only standard-library modules, heatledger and heatledger_xl: no subprocess, sockets or
ctypes, no compiled module beyond numpy and scipy, no spreadsheet-file library.
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import heatledger
import heatledger_xl

PROBE = r"""
import json, sys, types

def _decorator_factory(*args, **kwargs):
    if args and callable(args[0]) and not kwargs:
        return args[0]
    return lambda f: f

stub = types.ModuleType("xlwings")  # the runtime brings its own xlwings
stub.func = stub.arg = stub.ret = stub.script = _decorator_factory
sys.modules["xlwings"] = stub

import numpy, scipy, scipy.constants, scipy.linalg, scipy.optimize  # provided by the runtime
before = set(sys.modules)
import heatledger_xl.udfs as udfs
after = set(sys.modules)
new = sorted(after - before)
files = {m: getattr(sys.modules[m], "__file__", None) or "" for m in new}
print(json.dumps({"new": new, "files": files, "stdlib": sorted(sys.stdlib_module_names),
                  "materials": len(udfs.LIBRARY), "u": udfs.HL_UVALUE([["block", 100, 1.0]])}))
"""

BANNED = {"subprocess", "_posixsubprocess", "multiprocessing", "socket", "_socket", "ssl",
          "_ssl", "ctypes", "_ctypes", "sqlite3", "tkinter", "select", "selectors",
          "concurrent", "openpyxl", "defusedxml", "xlwings"}
ALLOWED_THIRD_PARTY = {"numpy", "scipy"}
OURS = {"heatledger", "heatledger_xl"}


def run_probe() -> dict:
    proc = subprocess.run([sys.executable, "-c", PROBE], capture_output=True, text=True,
                          timeout=120, check=False)
    assert proc.returncode == 0, proc.stderr
    return json.loads(proc.stdout.strip().splitlines()[-1])


def test_importing_the_functions_needs_nothing_the_browser_runtime_lacks():
    probe = run_probe()
    stdlib = set(probe["stdlib"])
    roots = {m.split(".")[0] for m in probe["new"]}
    assert not roots & BANNED, sorted(roots & BANNED)
    assert OURS <= roots
    strangers = roots - stdlib - OURS - ALLOWED_THIRD_PARTY
    assert not strangers, f"third-party modules imported: {sorted(strangers)}"
    compiled = [m for m, f in probe["files"].items()
                if f.endswith((".so", ".pyd")) and m.split(".")[0] not in stdlib
                and m.split(".")[0] not in ALLOWED_THIRD_PARTY]
    assert not compiled, compiled
    assert probe["materials"] > 20  # the library came through importlib.resources
    assert isinstance(probe["u"], float)


def test_engine_and_add_in_read_package_data_only_through_importlib_resources():
    roots = [Path(heatledger.__file__).parent, Path(heatledger_xl.__file__).parent]
    used = ["airlayers", "errors", "fv1d", "materials", "surfaces", "_validate", "project",
            "__init__"]
    sources = ([roots[0] / f"{m}.py" for m in used] + sorted(roots[1].glob("*.py"))
               + sorted((roots[0] / "constructions").glob("*.py")))
    for path in sources:
        text = path.read_text(encoding="utf-8")
        assert "__file__" not in text, f"{path.name} locates files through __file__"
        assert "import subprocess" not in text and "from subprocess" not in text, path.name
    materials = (roots[0] / "materials.py").read_text(encoding="utf-8")
    assert "resources.files(" in materials
