"""The Calc extension's texts are generated from the function registry, and the component's
value conversion gives the spreadsheet functions what xlwings gives them in Excel.

These checks need no LibreOffice: the IDL and CalcAddIns.xcu are parsed and compared with
:data:`heatledger_xl.registry.REGISTRY` field by field; :mod:`heatledger_calc.values` is
called with values shaped as Calc passes them through UNO (rows of cells as tuples, ``None``
for empty cells of a range and for arguments left out).
"""

from __future__ import annotations

import json
import re
import sys
import zipfile

import defusedxml.ElementTree as ET
import pytest

import heatledger_xl.udfs  # noqa: F401 - declares every family's functions
from heatledger.cli import main
from heatledger_calc import extension as ext
from heatledger_calc import values
from heatledger_xl.registry import REGISTRY
from tests.tolerances import RTOL_ULP

OOR = "{http://openoffice.org/2001/registry}"
LANG = "{http://www.w3.org/XML/1998/namespace}lang"
TABLE = ext.function_table()
# invented demo wall, as Calc passes a range: rows of cells, None for empty cells
WALL = (("material", "thickness [mm]", "conductivity [W/(m K)]"),
        ("gypsum plasterboard 900", 12.5, None), ("mineral wool 035", 100.0, None),
        ("block", 150.0, 1.35), ("air", 25.0, None), ("brick", 102.0, 0.77))


def _rows(cells):
    return [list(r) for r in cells]


def test_table_lists_every_registered_function_in_order():
    assert [f["name"] for f in TABLE["functions"]] == list(REGISTRY)
    for f in TABLE["functions"]:
        spec = REGISTRY[f["name"]]
        assert f["description"] == spec.description and f["spills"] == spec.spills
        assert [(a["name"], a["doc"], a["optional"], a["is_range"]) for a in f["args"]] == [
            (a.name, a.doc, a.optional, a.is_range) for a in spec.args]


def test_idl_declares_one_method_per_function_with_calc_argument_types():
    idl = ext.idl_text(TABLE)
    methods = dict(re.findall(r"^\s+(?:any|sequence< sequence< any > >) (HL_\w+)\((.*)\);$",
                              idl, re.M))
    assert list(methods) == list(REGISTRY)
    for name, spec in REGISTRY.items():
        params = [p for p in methods[name].split(", ") if p]
        assert len(params) == len(spec.args)
        for p, a in zip(params, spec.args, strict=True):
            # Calc treats only `any` arguments as optional (sc addincol.cxx, ReadFromAddIn)
            kind = "any" if a.optional else "sequence< sequence< any > >"
            assert p == f"[in] {kind} {ext.idl_name(a.name)}"
        result = "sequence< sequence< any > >" if spec.spills else "any"
        assert re.search(rf"^\s+{re.escape(result)} {name}\(", idl, re.M)


def test_idl_names_are_unoidl_identifiers():
    # unoidl-write refuses an identifier with "_" unless it is all capitals
    for f in TABLE["functions"]:
        for a in f["args"]:
            assert re.fullmatch(r"[a-z][A-Za-z0-9]*", a["idl"]), a


def test_xcu_holds_every_wizard_text_of_the_registry():
    root = ET.fromstring(ext.xcu_text(TABLE))
    info = root.find(f"node[@{OOR}name='AddInInfo']")
    service = info.find(f"node[@{OOR}name='{ext.IMPLEMENTATION}']")
    functions = service.find(f"node[@{OOR}name='AddInFunctions']")
    nodes = functions.findall("node")
    assert [n.get(f"{OOR}name") for n in nodes] == list(REGISTRY)
    for node in nodes:
        spec = REGISTRY[node.get(f"{OOR}name")]
        props = {p.get(f"{OOR}name"): p.find("value") for p in node.findall("prop")}
        assert props["DisplayName"].text == spec.name
        assert props["DisplayName"].get(LANG) == "en-US"
        assert props["Description"].text == spec.description
        assert props["Category"].text == "Add-In"
        params = node.find(f"node[@{OOR}name='Parameters']").findall("node")
        assert [p.get(f"{OOR}name") for p in params] == [ext.idl_name(a.name)
                                                          for a in spec.args]
        for p, a in zip(params, spec.args, strict=True):
            texts = {q.get(f"{OOR}name"): q.find("value").text for q in p.findall("prop")}
            assert texts == {"DisplayName": a.name, "Description": a.doc}


def test_manifest_and_components_name_the_extension_files():
    manifest = ET.fromstring(ext.manifest_text())
    paths = {e.get("{http://openoffice.org/2001/manifest}full-path") for e in manifest}
    assert paths == {ext.TYPES_FILE, ext.COMPONENTS_FILE, ext.XCU_FILE}
    comps = ET.fromstring(ext.components_text())
    ns = "{http://openoffice.org/2010/uno-components}"
    component = comps.find(f"{ns}component")
    assert component.get("uri") == ext.COMPONENT_FILE
    assert component.get("loader") == "com.sun.star.loader.Python"
    services = {s.get("name") for s in component.iter(f"{ns}service")}
    assert services == {ext.IMPLEMENTATION, "com.sun.star.sheet.AddIn"}
    desc = ET.fromstring(ext.description_text("0.1.0"))
    ns = "{http://openoffice.org/extensions/description/2006}"
    assert desc.find(f"{ns}identifier").get("value") == ext.EXTENSION_ID


def test_idl_names_of_reserved_words_and_underscores():
    assert ext.idl_name("temp_inside") == "tempInside"
    assert ext.idl_name("sequence") == "sequenceX"
    with pytest.raises(ValueError):
        ext.idl_name("bad name")


# --------------------------------------------------------------------------- values
def test_range_and_scalar_arguments_arrive_as_xlwings_gives_them():
    spec = REGISTRY["HL_UVALUE"]
    want = spec.function(_rows(WALL), None, None, None)
    assert isinstance(want, float)
    out = values.call("HL_UVALUE", (WALL, None, None, None), False)
    assert out == pytest.approx(want, rel=RTOL_ULP)
    # a one-cell range for a scalar argument is its cell, as in Excel
    assert values.call("HL_UVALUE", (WALL, (("up",),), None, None), False) == pytest.approx(
        spec.function(_rows(WALL), "up", None, None), rel=RTOL_ULP)


def test_table_results_are_rectangular_rows_with_blank_texts():
    spec = REGISTRY["HL_LAYERS"]
    want = spec.function(_rows(WALL), None, None, None, True)
    out = values.call("HL_LAYERS", (WALL, None, None, None, 1.0), True)
    assert len(out) == len(want) and {len(r) for r in out} == {len(want[0])}
    for got_row, want_row in zip(out, want, strict=True):
        for got, cell in zip(got_row, want_row, strict=True):
            assert got == ("" if cell is None else cell)


def test_problems_are_texts_never_exceptions():
    out = values.call("HL_INTERFACE_TEMPS", (WALL, (("warm",),), ((-5.0,),), None, None, None,
                                         None), True)
    assert out == ((REGISTRY["HL_INTERFACE_TEMPS"].function(_rows(WALL), "warm", -5.0),),)
    assert out[0][0].startswith("HL_INTERFACE_TEMPS: temp_inside")
    wrong_count = values.call("HL_UVALUE", (WALL,), False)
    assert wrong_count.startswith("HL_UVALUE: unexpected problem")
    unknown = values.call("HL_NO_SUCH_FUNCTION", (), True)
    assert unknown[0][0].startswith("HL_NO_SUCH_FUNCTION: unexpected problem")


def test_results_are_plain_uno_values():
    assert values.to_calc(3, False) == 3.0 and type(values.to_calc(3, False)) is float
    assert values.to_calc([[1, None], [2]], True) == ((1.0, ""), (2.0, ""))
    assert values.to_calc([], True) == (("",),)


# --------------------------------------------------------------------------- command line
def test_command_help_lists_the_calc_addin_actions(capsys):
    with pytest.raises(SystemExit):
        main(["calc-addin", "--help"])
    out = capsys.readouterr().out
    assert "build" in out and "install" in out and "remove" in out


def test_build_refuses_a_name_unopkg_cannot_install(tmp_path, capsys):
    assert main(["calc-addin", "build", "-o", str(tmp_path / "functions.zip")]) == 1
    assert ".oxt" in capsys.readouterr().err


def test_install_as_root_asks_for_shared_before_doing_anything(monkeypatch, tmp_path, capsys):
    from heatledger_calc import install

    monkeypatch.setattr(install.os, "geteuid", lambda: 0)
    monkeypatch.setattr(install, "unopkg_path", lambda: pytest.fail("unopkg must not run"))
    assert main(["calc-addin", "install", "--oxt", str(tmp_path / "none.oxt")]) == 1
    assert "--shared" in capsys.readouterr().err
    assert main(["calc-addin", "remove"]) == 1
    assert "--shared" in capsys.readouterr().err


def test_install_names_a_missing_extension_file(tmp_path, capsys):
    assert main(["calc-addin", "install", "--shared", "--oxt", str(tmp_path / "none.oxt")]) == 1
    assert "calc-addin build" in capsys.readouterr().err


def test_location_arguments_point_libreoffice_at_other_folders(tmp_path):
    from heatledger_calc.install import location_args

    args = location_args(tmp_path / "p", tmp_path / "s")
    assert args == [f"-env:UserInstallation={(tmp_path / 'p').resolve().as_uri()}",
                    f"-env:UNO_SHARED_PACKAGES_CACHE={(tmp_path / 's').resolve().as_uri()}"]


@pytest.mark.calc_functions
def test_built_extension_holds_the_generated_files(calc_oxt):
    with zipfile.ZipFile(calc_oxt) as zf:
        names = set(zf.namelist())
        assert {"META-INF/manifest.xml", "description.xml", ext.TYPES_FILE, ext.XCU_FILE,
                ext.COMPONENT_FILE, ext.TABLE_FILE, ext.COMPONENTS_FILE} <= names
        stored = json.loads(zf.read(ext.TABLE_FILE))
        assert stored["functions"] == TABLE["functions"]
        assert stored["site_dirs"] and stored["python"] == list(sys.version_info[:2])
        assert zf.read(ext.XCU_FILE).decode("utf-8") == ext.xcu_text(TABLE)


def test_libreoffice_runs_without_the_active_virtual_environment(monkeypatch):
    """LibreOffice's own Python must not see a virtual environment of another Python."""
    from heatledger_calc.build import office_env

    monkeypatch.setenv("VIRTUAL_ENV", "/somewhere/.venv")
    monkeypatch.setenv("PATH", "/somewhere/.venv/bin:/usr/bin:/bin")
    monkeypatch.setenv("PYTHONPATH", "/somewhere/lib")
    env = office_env()
    assert "VIRTUAL_ENV" not in env and "PYTHONPATH" not in env
    assert env["PATH"] == "/usr/bin:/bin"
