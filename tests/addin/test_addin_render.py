"""One plan through both renderers: openpyxl (file read back with openpyxl) and xlwings
(onto :class:`RecordingBook`, a small recording stand-in for the few xlwings objects the
renderer uses). Both must give the same cells, formulas, number formats, fonts, fills,
merges, column widths, frozen panes and chart ranges.

RecordingBook mimics Excel where the renderer relies on it: a value written with a
leading apostrophe is stored as text without it; a string starting with ``=`` written
through ``value`` or ``formula`` becomes a formula.
"""

from __future__ import annotations

import io
import re

import openpyxl
import pytest

from heatledger.sheet import render_openpyxl
from heatledger.sheet.plan import STYLES, WorkbookPlan, col_index, col_letter, sheet_ref
from heatledger_xl import macros, render_xlwings

# Invented demo wall, inside to outside.
WALL = [["material", "thickness [mm]", "conductivity [W/(m K)]"],
        ["gypsum plasterboard 900", 12.5, None],
        ["mineral wool 035", 100, None],
        ["block", 150, 1.35],
        ["air", 25, None],
        ["brick", 102, 0.77]]


# --------------------------------------------------------------------------- the stand-in
def _bounds(address: str) -> tuple[int, int, int, int]:
    address = address.replace("$", "")
    if re.fullmatch(r"[A-Z]+:[A-Z]+", address):
        a, b = address.split(":")
        return 1, col_index(a), 1_048_576, col_index(b)
    if re.fullmatch(r"\d+:\d+", address):
        a, b = address.split(":")
        return int(a), 1, int(b), 16_384
    parts = address.split(":")
    cells = []
    for p in parts:
        m = re.fullmatch(r"([A-Z]+)(\d+)", p)
        assert m, f"RecordingBook cannot parse {address!r}"
        cells.append((int(m.group(2)), col_index(m.group(1))))
    (r1, c1), (r2, c2) = cells[0], cells[-1]
    return r1, c1, r2, c2


class RecordingFont:
    def __init__(self, rng):
        object.__setattr__(self, "_rng", rng)

    def __setattr__(self, key, value):
        self._rng._set(f"font.{key}", value)


class RecordingBorder:
    def __init__(self, rng, side):
        object.__setattr__(self, "_rng", rng)
        object.__setattr__(self, "_side", side)

    def __setattr__(self, key, value):
        self._rng._set(f"border.{self._side}.{key}", value)


class RecordingBorders(RecordingBorder):
    def __getitem__(self, side):
        return RecordingBorder(self._rng, side)


class RecordingValidation:
    def __init__(self, rng):
        self.rng = rng

    def set_list(self, source):
        self.rng.sheet.validations.append((self.rng.address, source))


class RecordingRange:
    """Stand-in for ``xlwings.Range``: records what the renderer sets."""

    def __init__(self, sheet, address: str):
        self.sheet = sheet
        self.address = address
        self.bounds = _bounds(address)

    def _cells(self):
        r1, c1, r2, c2 = self.bounds
        return [(r, c) for r in range(r1, r2 + 1) for c in range(c1, c2 + 1)]

    def _set(self, key, value):
        self.sheet.calls += 1
        r1, c1, r2, c2 = self.bounds
        if r2 - r1 > 10_000 or c2 - c1 > 1000:  # whole column/row settings
            self.sheet.settings[(self.address, key)] = value
            return
        for rc in self._cells():
            self.sheet.format.setdefault(rc, {})[key] = value

    def _write(self, grid, *, as_formula: bool):
        self.sheet.calls += 1
        r1, c1, r2, c2 = self.bounds
        assert len(grid) == r2 - r1 + 1 and all(len(row) == c2 - c1 + 1 for row in grid)
        for i, row in enumerate(grid):
            for j, v in enumerate(row):
                rc = (r1 + i, c1 + j)
                self.sheet.values.pop(rc, None)
                self.sheet.formulas.pop(rc, None)
                if isinstance(v, str) and v.startswith("'"):
                    self.sheet.values[rc] = v[1:]  # apostrophe: text as it stands
                elif isinstance(v, str) and v.startswith("="):
                    self.sheet.formulas[rc] = v
                elif v is not None and v != "":
                    assert not as_formula or isinstance(v, str)
                    self.sheet.values[rc] = v

    def _read(self, ndim=None):
        r1, c1, r2, c2 = self.bounds
        grid = [[self.sheet.values.get((r, c), self.sheet.formulas.get((r, c)))
                 for c in range(c1, c2 + 1)] for r in range(r1, r2 + 1)]
        if ndim == 2 or (len(grid) > 1 and len(grid[0]) > 1):
            return grid
        flat = [v for row in grid for v in row]
        return flat[0] if len(flat) == 1 else flat

    def options(self, ndim=None):
        return InputRange(self._read(ndim))

    value = property(_read, lambda self, grid: self._write(grid, as_formula=False))
    formula = property(None, lambda self, grid: self._write(grid, as_formula=True))
    number_format = property(None, lambda self, v: self._set("number_format", v))
    color = property(None, lambda self, v: self._set("fill", v))
    wrap_text = property(None, lambda self, v: self._set("wrap", v))
    horizontal_alignment = property(None, lambda self, v: self._set("halign", v))
    vertical_alignment = property(None, lambda self, v: self._set("valign", v))
    column_width = property(None, lambda self, v: self._set("column_width", v))
    row_height = property(None, lambda self, v: self._set("row_height", v))

    @property
    def font(self):
        return RecordingFont(self)

    @property
    def borders(self):
        return RecordingBorders(self, "all")

    @property
    def data_validation(self):
        return RecordingValidation(self)

    def merge(self):
        self.sheet.merges.append(self.address)


class RecordingSeries:
    def __init__(self, values, x_values=None):
        self.values = values
        self.x_values = x_values
        self.look = {}

    def set(self, **kwargs):
        self.look.update(kwargs)


class RecordingChart:
    def __init__(self, **kwargs):
        self.kwargs = kwargs
        self.title = None
        self.series = [RecordingSeries(kwargs["source"])]

    def set_x_axis_values(self, rng):
        for s in self.series:
            s.x_values = rng

    def add_series(self, values, x_values=None):
        self.series.append(RecordingSeries(values, x_values))


class RecordingCharts(list):
    def add(self, **kwargs):
        chart = RecordingChart(**kwargs)
        self.append(chart)
        return chart


class RecordingFreeze:
    def __init__(self, sheet):
        self.sheet = sheet

    def freeze_at(self, ref):
        self.sheet.frozen = ref


class RecordingSheet:
    """Stand-in for ``xlwings.Sheet``."""

    def __init__(self, name: str, book):
        self.name = name
        self.book = book
        self.values, self.formulas, self.format, self.settings = {}, {}, {}, {}
        self.merges, self.validations = [], []
        self.charts = RecordingCharts()
        self.freeze_panes = RecordingFreeze(self)
        self.frozen = None
        self.calls = 0

    def range(self, address: str) -> RecordingRange:
        return RecordingRange(self, address)

    def clear(self):
        self.__init__(self.name, self.book)


class RecordingSheets:
    def __init__(self, book):
        self.book = book
        self.items: list[RecordingSheet] = []

    def __iter__(self):
        return iter(self.items)

    def __len__(self):
        return len(self.items)

    def __getitem__(self, key):
        if isinstance(key, int):
            return self.items[key]
        for s in self.items:
            if s.name.lower() == key.lower():
                return s
        raise KeyError(key)

    def add(self, name, after=None):
        assert after is None or after is self.items[-1]
        sheet = RecordingSheet(name, self.book)
        self.items.append(sheet)
        return sheet


class RecordingName:
    def __init__(self, name, refers_to, book):
        self.name = name
        self.refers_to = refers_to
        self.book = book

    @property
    def refers_to_range(self):
        m = re.fullmatch(r"='?((?:[^']|'')+?)'?!(.+)", self.refers_to)
        return self.book.sheets[m.group(1)].range(m.group(2))


class RecordingNames(list):
    def __init__(self, book):
        super().__init__()
        self.book = book

    def add(self, name, refers_to):
        self.append(RecordingName(name, refers_to, self.book))

    def __getitem__(self, key):
        if isinstance(key, str):
            return next(n for n in self if n.name == key)
        return super().__getitem__(key)


class RecordingApp:
    def __init__(self):
        self.screen_updating = True
        self.alerts = []

    def alert(self, prompt, title=None):
        self.alerts.append(prompt)


class RecordingBook:
    """Stand-in for ``xlwings.Book``: ``sheets``, ``names``, ``app`` and ``selection``."""

    def __init__(self, *sheet_names):
        self.app = RecordingApp()
        self.sheets = RecordingSheets(self)
        self.names = RecordingNames(self)
        self.selection = None
        for n in sheet_names:
            self.sheets.add(n)


class InputRange:
    """A selection or named input range whose value the macro reads."""

    def __init__(self, value):
        self._value = value

    def options(self, ndim=None):
        return self

    @property
    def value(self):
        return self._value


# --------------------------------------------------------------------------- helpers
def openpyxl_cells(plan: WorkbookPlan):
    data = render_openpyxl.workbook_bytes(plan)
    return openpyxl.load_workbook(io.BytesIO(data))


def plan_of_wall() -> WorkbookPlan:
    return macros.construction_plan(WALL, 20.0, -5.0, "horizontal", name="EW1 demo wall")


def hex_of(color) -> str:
    return str(color.rgb)[-6:].upper() if color is not None and color.rgb else ""


def _same_cells(ws, rec) -> int:
    """Assert one sheet's values and formulas agree in both renderers; return its formula
    count."""
    xl_values, xl_formulas = {}, {}
    for row in ws.iter_rows():
        for c in row:
            if c.value is None:
                continue
            if c.data_type == "f":
                xl_formulas[(c.row, c.column)] = c.value
            else:
                xl_values[(c.row, c.column)] = c.value
    assert rec.formulas == xl_formulas
    assert rec.values.keys() == xl_values.keys()
    rtol_file = 1e-15  # openpyxl writes numbers to the file with 16 significant digits
    for rc, v in xl_values.items():
        if isinstance(v, float):
            assert rec.values[rc] == pytest.approx(v, rel=rtol_file), rc
        else:
            assert rec.values[rc] == v, rc
    return len(xl_formulas)


# --------------------------------------------------------------------------- tests
def test_both_renderers_give_the_same_cells_formulas_and_formats():
    plan = plan_of_wall()
    wb = openpyxl_cells(plan)
    book = RecordingBook("Sheet1")
    report = render_xlwings.render_plan(plan, book)
    # the calculation sheet and its finite-volume appendix
    assert report.sheets == {"EW1 demo wall": "EW1 demo wall",
                             "FV EW1 demo wall": "FV EW1 demo wall"}
    total = 0
    for sheet in plan.sheets:
        total += _same_cells(wb[sheet.name], book.sheets[sheet.name])
    assert total > 200 and report.formulas == total
    ws = wb["EW1 demo wall"]
    rec = book.sheets["EW1 demo wall"]
    for cell in plan.sheets[0].cells():
        oc = ws[cell.ref]
        fmt = rec.format[(oc.row, oc.column)]
        assert fmt["number_format"] == oc.number_format, cell.ref
        assert fmt["font.bold"] == bool(oc.font.b), cell.ref
        assert fmt["font.italic"] == bool(oc.font.i), cell.ref
        assert fmt["font.color"][1:] == hex_of(oc.font.color), cell.ref
        style = STYLES[cell.style]
        if style.fill:
            assert fmt["fill"][1:] == hex_of(oc.fill.fgColor) == style.fill, cell.ref
        else:
            assert "fill" not in fmt
    assert sorted(rec.merges) == sorted(str(r) for r in ws.merged_cells.ranges)
    widths = {a: w for (a, k), w in rec.settings.items() if k == "column_width"}
    for letters, dim in ws.column_dimensions.items():
        if dim.width and f"{letters}:{letters}" in widths:
            assert widths[f"{letters}:{letters}"] == pytest.approx(dim.width)
    assert len(widths) == len(plan.sheets[0].column_widths)
    assert rec.frozen == ws.freeze_panes == "A4"


def test_charts_have_the_same_ranges_in_both_renderers():
    plan = plan_of_wall()
    spec = plan.sheets[0].charts[0]
    wb = openpyxl_cells(plan)
    xl_chart = wb["EW1 demo wall"]._charts[0]
    book = RecordingBook()
    render_xlwings.render_plan(plan, book)
    rec = book.sheets[0].charts[0]
    assert rec.title == spec.title and rec.kwargs["chart_type"] == "xy_scatter_lines"
    assert rec.kwargs["anchor"].address == spec.anchor
    assert len(rec.series) == len(spec.series) == len(xl_chart.series)
    for got, ser, want in zip(rec.series, xl_chart.series, spec.series, strict=True):
        y_ref = ser.yVal.numRef.f
        x_ref = ser.xVal.numRef.f
        assert f"'{got.values.sheet.name}'!{got.values.address}" == y_ref.replace("$", "")
        assert f"'{got.x_values.sheet.name}'!{got.x_values.address}" == x_ref.replace("$", "")
        assert want.values.replace("$", "") == y_ref.replace("$", "")
        assert got.look["name"] == want.title


def test_text_is_always_text_in_the_live_workbook():
    plan = WorkbookPlan(title="text check")
    sheet = plan.add_sheet("T")
    block = sheet.block("t")
    hostile = ["=1+1", "+2", "-3 mm render", "@SUM(A1)", "12", "2026-12-02", "TRUE", "#N/A"]
    for i, text in enumerate(hostile, start=1):
        block.put(f"A{i}", text, role="input")
    block.put("B1", formula="=LEN(A1)")
    book = RecordingBook()
    render_xlwings.render_plan(plan, book)
    rec = book.sheets["T"]
    assert [rec.values[(i, 1)] for i in range(1, len(hostile) + 1)] == hostile
    assert rec.formulas == {(1, 2): "=LEN(A1)"}


def test_existing_sheet_is_kept_and_references_follow_the_new_name():
    plan = WorkbookPlan(title="rename")
    s = plan.add_sheet("Wall")
    blk = s.block("b")
    blk.put("A1", 1.5, role="input")
    blk.put("A2", formula=f"={sheet_ref('Wall', 'A1')}*2")
    plan.defined_names["hl_wall_value"] = sheet_ref("Wall", "A2")
    book = RecordingBook("Wall")
    book.sheets["Wall"].values[(1, 1)] = "user data"
    report = render_xlwings.render_plan(plan, book)
    assert report.sheets == {"Wall": "Wall (2)"}
    assert book.sheets["Wall"].values == {(1, 1): "user data"}  # untouched
    new = book.sheets["Wall (2)"]
    assert new.formulas == {(2, 1): "='Wall (2)'!$A$1*2"}
    assert book.names["hl_wall_value"].refers_to == "='Wall (2)'!$A$2"
    again = render_xlwings.render_plan(plan, book, replace=True)
    assert again.sheets == {"Wall": "Wall"}
    assert book.sheets["Wall"].values == {(1, 1): 1.5}
    assert any("already in the workbook" in s for s in again.skipped)


def test_macro_reads_selection_and_names_and_writes_the_sheet():
    book = RecordingBook("Inputs")
    inputs = book.sheets["Inputs"]
    book.selection = InputRange(WALL)
    for name, ref, value in (("hl_temp_inside", "B1", 20.0), ("hl_temp_outside", "B2", -5.0),
                             ("hl_construction", "B3", "EW1 demo wall")):
        book.names.add(name, f"='Inputs'!{ref}")
        inputs.values[(int(ref[1]), 2)] = value
    report = macros._run(book)
    assert report is not None and report.sheets == {"EW1 demo wall": "EW1 demo wall",
                                                    "FV EW1 demo wall": "FV EW1 demo wall"}
    assert "wrote the calculation sheet EW1 demo wall" in book.app.alerts[-1]
    direct = RecordingBook()
    render_xlwings.render_plan(plan_of_wall(), direct)
    assert book.sheets["EW1 demo wall"].formulas == direct.sheets[0].formulas
    assert book.sheets["EW1 demo wall"].values == direct.sheets[0].values
    assert book.app.screen_updating is True


def test_macro_reports_missing_input_in_a_message_and_writes_nothing():
    book = RecordingBook("Inputs")
    book.selection = InputRange(WALL)
    assert macros._run(book) is None
    assert book.app.alerts == ["heatledger: temp_inside: name the cell holding it "
                               "hl_temp_inside (Formulas > Define Name)"]
    assert [s.name for s in book.sheets] == ["Inputs"]
    book.selection = InputRange([["brick", -3, 0.77]])
    for name, ref in (("hl_temp_inside", "B1"), ("hl_temp_outside", "B2")):
        book.names.add(name, f"='Inputs'!{ref}")
        book.sheets["Inputs"].values[(int(ref[1]), 2)] = 0.0
    assert macros._run(book) is None
    assert book.app.alerts[-1].startswith("heatledger: layers row 1 thickness_mm must be")
    assert [s.name for s in book.sheets] == ["Inputs"]


def test_report_lists_what_xlwings_cannot_write():
    report = render_xlwings.render_plan(plan_of_wall(), RecordingBook())
    assert any("print setup" in s for s in report.skipped)
    assert col_letter(1) == "A"  # plan helpers shared by both renderers


@pytest.mark.parametrize("which", ["audit", "template"])
def test_whole_workbooks_render_the_same_through_both_renderers(which):
    """The demo project's audit (cover, materials, every construction, fins and rooms,
    summary; cross-sheet formulas and defined names) and the fill-in template (drop-down
    lists) through both renderers."""
    from heatledger.demo import demo_project
    from heatledger.sheet.audit import audit_plan
    from heatledger.sheet.template import template_plan

    plan = audit_plan(demo_project()) if which == "audit" else template_plan()
    wb = openpyxl_cells(plan)
    book = RecordingBook()
    report = render_xlwings.render_plan(plan, book)
    assert list(report.sheets) == [s.name for s in plan.sheets] == wb.sheetnames
    rtol_file = 1e-15  # openpyxl writes numbers with 16 significant digits
    for ps in plan.sheets:
        ws, rec = wb[ps.name], book.sheets[ps.name]
        formulas = {(c.row, c.column): c.value for row in ws.iter_rows() for c in row
                    if c.data_type == "f"}
        values = {(c.row, c.column): c.value for row in ws.iter_rows() for c in row
                  if c.value is not None and c.data_type != "f"}
        assert rec.formulas == formulas, ps.name
        assert rec.values.keys() == values.keys(), ps.name
        for rc, v in values.items():
            got = rec.values[rc]
            if isinstance(v, (int, float)) and not isinstance(v, bool):
                assert got == pytest.approx(v, rel=rtol_file), (ps.name, rc)
            elif hasattr(v, "date") and not isinstance(got, type(v)):
                assert got == v.date(), (ps.name, rc)  # a date cell reads back as datetime
            else:
                assert got == v, (ps.name, rc)
        assert sorted(rec.merges) == sorted(str(r) for r in ws.merged_cells.ranges)
        assert len(rec.charts) == len(ps.charts)
        lists = [v for v in ps.validations if v.kind == "list"]  # messages: openpyxl only
        assert len(rec.validations) == len(lists)
    names = {n.name: n.refers_to for n in book.names}
    assert names == {k: "=" + v for k, v in plan.defined_names.items()}
