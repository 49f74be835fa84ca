"""The fin calculation sheets, judged by LibreOffice Calc.

After LibreOffice has recalculated every formula (each with a planted stale cached value, see
conftest.py), every fin check cell must say OK, and the heat rates, efficiencies,
effectiveness, resistances, tip temperatures, temperature profiles, array results and
finite-volume temperatures the spreadsheet computed must equal the engine's to 1e-9
relative. Some recomputed values are also held against sources outside the project:
textbook closed forms written out here and scipy's special functions.

All fins here are invented test scenarios of our own.
"""

from __future__ import annotations

import copy
import io
import math
import re
import zipfile

import numpy as np
import openpyxl
import pytest
from openpyxl.utils.formulas import FORMULAE
from scipy.special import iv, kv

from heatledger.project import project_from_dict
from heatledger.sheet import audit
from heatledger.sheet.plan import split_ref
from heatledger.sheet.render_openpyxl import workbook_bytes, write_workbook
from tests.tolerances import RTOL_LAST_BITS, RTOL_ROUND_OFF, RTOL_SHEET

#: Functions the fin sheets may use: each is known to Excel and to LibreOffice Calc by this
#: name, and openpyxl writes it without an _xlfn. prefix (openpyxl's FORMULAE list).
FIN_FUNCTIONS = {"IF", "ABS", "MAX", "SUM", "COUNTIF", "AND", "OR", "ROUND", "SQRT", "EXP",
                 "COSH", "SINH", "TANH", "BESSELI", "BESSELK", "PI", "LN", "ASINH",
                 "SUMPRODUCT"}

_COMMON = {"h": 25.0, "temp_base": 80.0, "temp_fluid": 20.0}


def _fin(name, **kw):
    row = dict(_COMMON)
    row.update(kw)
    row["name"] = name
    return row


def fins_data() -> dict:
    """An invented project with one fin of every kind, tip and option the sheet handles."""
    fins = [
        _fin("plate, convective tip, array", kind="straight", material="aluminium alloy",
             length_mm=40, thickness_mm=2, width_mm=120,
             array={"count": 14, "base_area": 0.0216, "target_heat_rate": 120.0}),
        _fin("plate, adiabatic tip", kind="straight", conductivity=200, length_mm=50,
             thickness_mm=2, tip="adiabatic", fv={"cells": 25}),
        _fin("pin, corrected length", kind="straight", conductivity=380, length_mm=30,
             diameter_mm=5, corrected_length=True),
        _fin("pin, prescribed tip", kind="straight", conductivity=50, length_mm=100,
             diameter_mm=10, tip="temperature", temp_tip=30.0),
        _fin("pin, infinite", kind="straight", conductivity=16, length_mm=300, diameter_mm=5,
             tip="infinite"),
        _fin("triangular plate", kind="straight", conductivity=180, length_mm=30,
             thickness_mm=3, profile="triangular"),
        _fin("parabolic plate", kind="straight", conductivity=180, length_mm=30,
             thickness_mm=3, profile="parabolic", tip="adiabatic"),
        _fin("conical pin", kind="straight", conductivity=180, length_mm=30, diameter_mm=4,
             profile="triangular"),
        _fin("parabolic pin", kind="straight", conductivity=180, length_mm=30, diameter_mm=4,
             profile="parabolic"),
        _fin("annular, adiabatic rim, array", kind="annular", conductivity=200, h=58.0,
             tube_diameter_mm=25.4, fin_diameter_mm=57.15, thickness_mm=0.38,
             array={"count": 100, "base_area": 0.08, "contact_resistance": 1e-4}),
        _fin("annular, convective rim", kind="annular", conductivity=50,
             tube_diameter_mm=20, fin_diameter_mm=60, thickness_mm=1.0, tip="convective"),
        _fin("annular, corrected radius", kind="annular", conductivity=50,
             tube_diameter_mm=20, fin_diameter_mm=60, thickness_mm=1.0, tip="convective",
             corrected_length=True),
        _fin("=1+1 poor fin", kind="straight", conductivity=0.2, h=200.0, length_mm=20,
             thickness_mm=10, width_mm=100),
        _fin("natural convection and radiation", kind="straight", material="aluminium alloy",
             length_mm=60, thickness_mm=2, width_mm=100, tip="adiabatic",
             fv={"cells": 30, "emissivity": 0.8, "h_coefficient": 1.4, "h_exponent": 0.25}),
        _fin("radiation, convective tip", kind="straight", material="aluminium alloy",
             length_mm=60, thickness_mm=2, width_mm=100, fv={"cells": 20, "emissivity": 0.8}),
    ]
    return {"project": {"name": "Fin sheets (invented test scenario)"}, "fins": fins}


@pytest.fixture(scope="module")
def project():
    return project_from_dict(fins_data(), source_bytes=b"fins", source_name="fins")


def _value(wb, reference):
    sheet, a1 = re.match(r"^'((?:[^']|'')+)'!(.+)$", reference).groups()
    return wb[sheet.replace("''", "'")][a1.replace("$", "")].value


def _fin_sheets(plan):
    return [s for s in plan.sheets if s.name == "Fins" or s.name.startswith("Fin ")]


@pytest.mark.calc
def test_every_fin_check_ok_and_values_equal_engine(project, tmp_path, recalc, stale_value):
    plan = audit.audit_plan(project)
    wb = openpyxl.load_workbook(recalc(write_workbook(plan, tmp_path / "fins.xlsx")),
                                data_only=True)
    names = {s.name for s in _fin_sheets(plan)}
    checks = [(s, c) for s, c in plan.cells_with_role("check") if s in names]
    assert len(checks) > 1000
    bad = [(s, c.ref, wb[s][c.ref].value) for s, c in checks if wb[s][c.ref].value != "OK"]
    assert not bad, bad[:10]
    cover = {r[0]: r[1] for r in wb["Cover"].iter_rows(min_col=2, max_col=3, values_only=True)}
    assert cover["State"] == "ALL CHECKS OK"
    assert cover["Check cells in the workbook"] == len(list(plan.cells_with_role("check")))
    # no formula anywhere on the fin sheets gives an error or kept its planted stale value
    broken = [(s.name, c.ref, wb[s.name][c.ref].value) for s in _fin_sheets(plan)
              for c in s.cells() if c.formula
              and (wb[s.name][c.ref].value == stale_value
                   or str(wb[s.name][c.ref].value).startswith(("#", "Err:")))]
    assert not broken, broken[:10]

    for entry in project.fins:
        refs = plan.index[("fins", entry.name)]
        res = entry.evaluate()
        for attr in ("heat_rate", "efficiency", "effectiveness", "fin_resistance",
                     "temp_tip"):
            assert _value(wb, getattr(refs, attr)) == pytest.approx(getattr(res, attr),
                                                                    rel=RTOL_SHEET), attr
        ws = wb[refs.sheet]
        p0, p1 = refs.extras["profile"]
        profile = np.array([ws[f"E{r}"].value for r in range(p0, p1 + 1)], dtype=float)
        engine = entry.fin.temperatures(entry.temp_base, entry.temp_fluid,
                                        points=p1 - p0 + 1).temperature
        np.testing.assert_allclose(profile, engine, rtol=RTOL_SHEET, atol=0)
        n0, n1 = refs.extras["fv"]
        nodal = np.array([ws[f"N{r}"].value for r in range(n0, n1 + 1)], dtype=float)
        np.testing.assert_allclose(nodal, entry.finite_volume().solution.temperature,
                                   rtol=RTOL_SHEET, atol=0)
        if entry.array is not None:
            arr = entry.evaluate_array()
            for key, value in (("heat_rate", arr.heat_rate),
                               ("overall_efficiency", arr.overall_efficiency),
                               ("fin_resistance", arr.fin_resistance)):
                assert _value(wb, refs.array[key]) == pytest.approx(value, rel=RTOL_SHEET), key

    # against sources outside the project ------------------------------------------------
    # source: Incropera & DeWitt 6th ed., Table 3.4 case B: q = sqrt(h P k A_c) theta_b tanh mL
    refs = plan.index[("fins", "plate, adiabatic tip")]
    h, k, t, w, big_l = 25.0, 200.0, 0.002, 1.0, 0.050
    p, a_c = 2 * (w + t), w * t
    m = math.sqrt(h * p / (k * a_c))
    q_book = math.sqrt(h * p * k * a_c) * 60.0 * math.tanh(m * big_l)
    assert _value(wb, refs.heat_rate) == pytest.approx(q_book, rel=RTOL_ROUND_OFF)
    # source: Incropera & DeWitt 6th ed., Table 3.4 case D: q = M theta_b, eta = 1/(mL)
    refs = plan.index[("fins", "pin, infinite")]
    h, k, d, big_l = 25.0, 16.0, 0.005, 0.300
    m = math.sqrt(4 * h / (k * d))
    assert _value(wb, refs.heat_rate) == pytest.approx(
        math.sqrt(h * math.pi * d * k * math.pi * d * d / 4) * 60.0, rel=RTOL_ROUND_OFF)
    # efficiency over the stated length: (1 - exp(-mL))/(mL), case D integrated on 0..L
    assert _value(wb, refs.efficiency) == pytest.approx(-math.expm1(-m * big_l) / (m * big_l),
                                                        rel=RTOL_ROUND_OFF)
    # source: scipy.special.iv and kv (Cephes / AMOS): the sheet's I_n by BESSELI and K_n
    # by the trapezoidal integral, recomputed by LibreOffice
    refs = plan.index[("fins", "annular, adiabatic rim, array")]
    ws = wb[refs.sheet]
    rows = {row[1]: row[6] for row in ws.iter_rows(min_row=11, max_row=80, max_col=7,
                                                   values_only=True) if row[1]}
    x1 = rows["x_1 = m r_1 [-]"]
    x2 = rows["x_2 = m r_2c [-]"]
    for n in (0, 1):
        for x, lab in ((x1, "x_1"), (x2, "x_2")):
            assert rows[f"I{n}({lab}) = BESSELI [-]"] == pytest.approx(iv(n, x), rel=RTOL_LAST_BITS)
            assert rows[f"K{n}({lab}) by the integral (A&S 9.6.24) [-]"] == pytest.approx(
                kv(n, x), rel=RTOL_LAST_BITS)
    # source: ht.fin_efficiency_Kern_Kraus docstring example (Do 25.4 mm, D_fin 57.15 mm,
    # t 0.38 mm, k 200, h 58): 0.8412588620231153
    assert _value(wb, refs.efficiency) == pytest.approx(0.8412588620231153, rel=RTOL_ROUND_OFF)
    # the fin that does not help is flagged in the recalculated sheet
    refs = plan.index[("fins", "=1+1 poor fin")]
    texts = [c.value for row in wb[refs.sheet].iter_rows() for c in row
             if isinstance(c.value, str)]
    assert any(t.startswith("WARNING: fin effectiveness") and "below 1" in t for t in texts)
    assert "=1+1 poor fin" in [r[0] for r in wb["Fins"].iter_rows(min_col=2, max_col=2,
                                                                  values_only=True)]


@pytest.mark.calc
def test_a_wrong_engine_value_is_reported_as_mismatch(project, tmp_path, recalc):
    plan = audit.audit_plan(project)
    refs = plan.index[("fins", "annular, convective rim")]
    row, _ = split_ref(refs.heat_rate.split("!")[1].replace("$", ""))
    sheet = plan.sheet(refs.sheet)
    engine = next(c for c in sheet.cells() if c.ref == f"K{row}")
    engine.value *= 1.0 + 1e-6
    wb = openpyxl.load_workbook(recalc(write_workbook(plan, tmp_path / "bad.xlsx")),
                                data_only=True)
    assert str(wb[refs.sheet][f"L{row}"].value).startswith("MISMATCH")
    states = [r[0] for r in wb["Fins"].iter_rows(min_col=14, max_col=14, values_only=True)]
    assert "NOT ALL OK" in states
    cover = {r[0]: r[1] for r in wb["Cover"].iter_rows(min_col=2, max_col=3, values_only=True)}
    assert str(cover["State"]).startswith("NOT ALL OK")


def test_fin_formulas_use_functions_both_programs_know(project):
    plan = audit.audit_plan(project)
    used = set()
    for sheet in _fin_sheets(plan):
        for cell in sheet.cells():
            if cell.formula:
                used |= set(re.findall(r"([A-Z][A-Z0-9.]*)\(", re.sub(r'"[^"]*"', "",
                                                                   cell.formula)))
    assert used <= FIN_FUNCTIONS, used - FIN_FUNCTIONS
    assert FIN_FUNCTIONS <= FORMULAE  # openpyxl needs no _xlfn. prefix for any of them
    with zipfile.ZipFile(io.BytesIO(workbook_bytes(plan))) as zf:
        xml = "".join(zf.read(n).decode("utf-8") for n in zf.namelist()
                      if n.startswith("xl/worksheets/"))
    assert "_xlfn" not in xml
    assert "BESSELI(" in xml and "COSH(" in xml and "SUMPRODUCT(" in xml


def test_fins_sheets_only_with_fins_and_hot_surface_caution(project):
    no_fins = project_from_dict({"project": {"name": "walls only"}, "constructions": [
        {"name": "slab", "heat_flow": "down",
         "layers": [{"name": "slab", "conductivity": 1.6, "thickness_mm": 200}]}]})
    plain = audit.audit_plan(no_fins)
    assert not _fin_sheets(plain)
    texts = [c.value for c in plain.sheet("Cover").cells() if isinstance(c.value, str)]
    assert not any("hot to the touch" in t for t in texts)
    plan = audit.audit_plan(project)
    assert len(_fin_sheets(plan)) == len(project.fins) + 1
    cover = [c.value for c in plan.sheet("Cover").cells() if isinstance(c.value, str)]
    assert any("hot to the touch" in t for t in cover)
    assert any("Table 3.4" in t for t in cover)
    for sheet in _fin_sheets(plan):
        assert any(isinstance(c.value, str) and "hot to the touch" in c.value
                   for c in sheet.cells()), sheet.name
        assert sheet.name == "Fins" or sheet.charts


def test_fin_sheets_are_deterministic(project):
    assert audit.audit_bytes(project) == audit.audit_bytes(copy.deepcopy(project))


@pytest.mark.calc
def test_formulas_are_live_a_changed_input_recomputes(project, tmp_path, recalc):
    """Change h of one fin in the sheet: the spreadsheet's q_f follows the engine's q_f for
    the new h (formulas, not pasted values), while the checks against the old engine
    constants now fail."""
    plan = audit.audit_plan(project)
    entry = next(e for e in project.fins if e.name == "plate, adiabatic tip")
    refs = plan.index[("fins", entry.name)]
    sheet = plan.sheet(refs.sheet)
    h_cell = next(c for c in sheet.cells() if c.role == "input" and c.value == entry.fin.h
                  and any(o.ref == f"B{split_ref(c.ref)[0]}" and str(o.value).startswith("h,")
                          for o in sheet.cells()))
    h_cell.value = 40.0
    wb = openpyxl.load_workbook(recalc(write_workbook(plan, tmp_path / "live.xlsx")),
                                data_only=True)
    changed = type(entry.fin)(entry.fin.length, entry.fin.conductivity, 40.0,
                              thickness=entry.fin.thickness, tip=entry.fin.tip)
    assert _value(wb, refs.heat_rate) == pytest.approx(changed.heat_rate(80.0, 20.0),
                                                       rel=RTOL_SHEET)
    row, _ = split_ref(refs.heat_rate.split("!")[1].replace("$", ""))
    assert str(wb[refs.sheet][f"L{row}"].value).startswith("MISMATCH")
