"""The fill-in template: a workbook a consultant fills in, and its reader.

``template_plan`` lays out the sheets (Instructions, Project, Materials, Constructions,
Layers, Corrections and the drop-down Lists) with input styles and data-validation lists;
example rows come from a project's data (the invented demo by default). ``read_template``
takes a filled-in file back: it refuses over-large or malformed files, parses with
defusedxml active (openpyxl uses it when installed), skips blank rows, and reports every
problem at once, each naming its sheet and cell. It returns the same project data as the
TOML route, so ``project_from_template`` ends in :func:`heatledger.project.project_from_dict`.
"""

from __future__ import annotations

import io
import math
import zipfile
from dataclasses import replace
from pathlib import Path

from .._validate import quote
from ..construction_family.schema import DESIGN_TABLE, MATERIAL_TABLE, PROJECT_TABLE
from ..errors import HeatLedgerError, ProjectError
from ..families import FAMILIES
from ..fileio import read_bytes_limited
from ..materials import default_library
from ..project import Project, project_from_dict
from .plan import (
    DataValidation,
    PrintSetup,
    WorkbookPlan,
    col_letter,
    fit_text_columns,
    fit_wrapped_rows,
    sheet_ref,
)
from .template_tables import note_cells
from .xlsx_rows import SheetReader, reason

__all__ = [
    "template_plan",
    "read_template",
    "project_from_template",
    "MAX_TEMPLATE_BYTES",
    "MAX_UNCOMPRESSED_BYTES",
    "MAX_ROWS",
    "MAX_SHEET_ROWS",
    "MAX_PARTS",
    "MAX_XML_ELEMENTS",
    "TEMPLATE_SHEETS",
]

#: Largest template file accepted. [bytes]
MAX_TEMPLATE_BYTES = 10 * 1024 * 1024
#: Largest total uncompressed size of the file's parts (guards against zip bombs). [bytes]
MAX_UNCOMPRESSED_BYTES = 200 * 1024 * 1024
#: Largest number of data rows read from one sheet. [-]
MAX_ROWS = 5000
#: Largest number of parts (zip members) of a template: a template has about twenty, a
#: workbook with many drawings and images a few hundred. [-]
MAX_PARTS = 2000
#: Largest number of rows stored in one sheet, blank (formatted) rows included. [-]
MAX_SHEET_ROWS = 10_000
#: Largest number of XML elements (rows, cells, shared texts, styles and their parts, blank
#: ones included) read from a template: fifteen times those of the template as written
#: (about 33,000), and a bound on the work spent on content that carries only formatting. [-]
MAX_XML_ELEMENTS = 500_000
#: Row of the column headers on every data sheet; data start on the next row.
HEADER_ROW = 3
#: Input rows prepared (styled, with drop-downs) on each data sheet.
INPUT_ROWS = 200

#: (key, label, type) of the Project sheet's rows: ``[project]`` and ``[design]``.
PROJECT_FIELDS = tuple((c.key, c.header, c.template_type)
                       for c in PROJECT_TABLE.columns + DESIGN_TABLE.columns)
#: The tables of the template, in sheet order: the project's materials, then every
#: family's tables (from the family registry).
TABLES = (MATERIAL_TABLE,) + tuple(t for fam in FAMILIES for t in fam.tables if t.sheet)
#: (key, header, type) per sheet; type "text", "number", "int" or "ref" (a layer named by
#: its name, or by its number 1, 2, ... from the inside)
COLUMNS = {t.sheet: t.template_columns() for t in TABLES}
TEMPLATE_SHEETS = ("Instructions", "Project") + tuple(COLUMNS) + ("Lists",)
#: Sheets a template must have (the first family's tables and the materials).
REQUIRED_SHEETS = ("Project", "Materials") + tuple(t.sheet for t in FAMILIES[0].tables)
_WIDTHS = {"text": 26, "number": 14, "int": 12, "ref": 22}
#: Number formats of the template's U and R columns (two decimals at least, five at most)
#: and of its λ and ψ columns (three at least).
INPUT_FORMAT_THERMAL = "0.00###"
INPUT_FORMAT_CONDUCTIVITY = "0.000##"
#: Column width printed across one A4 landscape page: about 147 characters fit at 100 %
#: with 0.5 inch margins, so this keeps the print at 65 % or more. [characters]
PAGE_WIDTH_CHARS = 230.0


# --------------------------------------------------------------------------- writing
def template_plan(data: dict | None = None) -> WorkbookPlan:
    """The fill-in template, with example rows from ``data`` (project-file schema).

    Every sheet after Project is one input table of :data:`TABLES` (the project's materials
    and every registered family's tables); its columns, headers, notes and drop-down lists
    come from the table's schema.

    Parameters
    ----------
    data : dict, optional
        Project data whose rows are filled in (the demo project for the CLI's template);
        None for an empty template. [-]

    Returns
    -------
    WorkbookPlan
    """
    data = data or {}
    plan = WorkbookPlan(title="heatledger project template")
    _instructions(plan, bool(data))
    _project_sheet(plan, data)
    rows = {"Materials": list(data.get("materials", []))}
    for fam in FAMILIES:
        rows.update(fam.load("template").template_rows(data))
    lists = _lists_sheet_columns()
    for table in TABLES:
        _table_sheet(plan, table, rows.get(table.sheet, []), lists)
    _lists_sheet(plan, lists)
    for sh in plan.sheets:
        fit_text_columns(sh)
        fit_wrapped_rows(sh)
        if sh.name in COLUMNS or sh.name == "Lists":  # wide tables print across pages
            across = math.ceil(sum(sh.column_widths.values()) / PAGE_WIDTH_CHARS)
            sh.print_setup = replace(sh.print_setup, fit_width=max(1, across))
    return plan


def _project_sheet(plan: WorkbookPlan, data: dict) -> None:
    sh = plan.add_sheet("Project", column_widths={"A": 16, "B": 40, "C": 50},
                        freeze=f"A{HEADER_ROW + 1}", print_setup=_print("Project"))
    b = sh.block("project")
    b.put("A1", "Project information and design temperatures", style="hl title")
    b.put("A2", "Fill in column C. Column A holds the key the reader looks for; keep it.",
          role="note")
    for j, head in enumerate(("Key", "Field", "Value"), 1):
        b.put(f"{col_letter(j)}{HEADER_ROW}", head, role="header")
    info = dict(data.get("project", {}))
    info.update(data.get("design", {}))
    for i, (key, label, kind) in enumerate(PROJECT_FIELDS, HEADER_ROW + 1):
        b.put(f"A{i}", key, role="label")
        b.put(f"B{i}", label)
        value = info.get(key)
        if kind == "number" and value is not None:
            value = float(value)
        elif value is not None:
            value = str(value)
        b.put(f"C{i}", value, role="input", number_format="0.0" if kind == "number" else None)


def _lists_sheet_columns() -> dict:
    """Drop-down lists of the template: ``choices -> (Lists column, header, values)``; the
    library's materials first, then every distinct set of choices of the tables."""
    out = {"material": ("A", "Library materials", tuple(default_library().names()))}
    for table in TABLES:
        for col in table.columns:
            if col.choices and col.choices not in out:
                out[col.choices] = (col_letter(len(out) + 1), col.label.split(" (")[0],
                                    col.choices)
    return out


def _table_sheet(plan: WorkbookPlan, table, table_rows: list, lists: dict) -> None:
    cols = table.template_columns()
    name = table.sheet
    widths = {col_letter(j): (13 if kind == "text" and col.choices else
                              max(_WIDTHS[kind], min(len(head) + 2, 30)))
              for j, ((_key, head, kind), col) in enumerate(zip(cols, _sheet_columns(table),
                                                                strict=True), 1)}
    sh = plan.add_sheet(name, column_widths=widths, freeze=f"B{HEADER_ROW + 1}",
                        print_setup=_print(name, "landscape"))
    b = sh.block("data")
    b.put("A1", f"{name}", style="hl title")
    b.put("A2", table.note, role="note")
    for j, (_key, head, _kind) in enumerate(cols, 1):
        b.put(f"{col_letter(j)}{HEADER_ROW}", head, role="header")
    sh.row_heights[HEADER_ROW] = 30.0
    formats = {j: _input_format(head, kind) for j, (_k, head, kind) in enumerate(cols, 1)}
    n_rows = max(INPUT_ROWS, len(table_rows) + 50)
    for i in range(n_rows):
        src = table_rows[i] if i < len(table_rows) else {}
        for j, (key, _head, kind) in enumerate(cols, 1):
            b.put(f"{col_letter(j)}{HEADER_ROW + 1 + i}", _cell_value(src.get(key), kind),
                  role="input", number_format=formats[j])
    last = HEADER_ROW + n_rows
    for j, col in enumerate(_sheet_columns(table), 1):
        unit = f" [{col.unit}]" if col.unit and col.unit != "-" else ""
        sh.validations.append(DataValidation(  # the header says what the column is
            f"{col_letter(j)}{HEADER_ROW}", "", f"{col.description}{unit}"[:250], kind="any"))
        sh.validations += _drop_down(col, f"{col_letter(j)}{HEADER_ROW + 1}:"
                                          f"{col_letter(j)}{last}", lists, name)


def _sheet_columns(table) -> tuple:
    return tuple(c for c in table.columns if c.place != "file")


def _cell_value(value, kind: str):
    if value is not None and kind == "number":
        return float(value)
    if value is not None and kind == "int" and not isinstance(value, bool):
        return int(value) if isinstance(value, (int, float)) else str(value)
    if value is not None and not isinstance(value, (int, float)):
        return str(value)
    return value


#: Columns naming a row of another sheet, and that sheet (its first column holds the names).
#: Each family's template module declares its own (``REF_SHEETS``).
_REF_SHEETS = {k: v for fam in FAMILIES
               for k, v in getattr(fam.load("template"), "REF_SHEETS", {}).items()}


def _drop_down(col, cells: str, lists: dict, sheet: str = "") -> list:
    """The data-validation list of a column with choices, naming a material or naming a row
    of another sheet."""
    target = _REF_SHEETS.get((sheet, col.key))
    if target is not None:
        first, last = HEADER_ROW + 1, HEADER_ROW + INPUT_ROWS
        return [DataValidation(cells, sheet_ref(target, f"$A${first}:$A${last}"),
                               f"a name from the {target} sheet",
                               f"not on the {target} sheet: add it there first",
                               error_style="warning")]
    if col.type == "material":
        column, _head, values = lists["material"]
        return [DataValidation(cells, sheet_ref("Lists", f"{column}2:{column}"
                                                         f"{len(values) + 1}"),
                               "a library material or one of your Materials rows",
                               "not in the library: add it on the Materials sheet",
                               error_style="warning")]
    if not col.choices:
        return []
    column, _head, values = lists[col.choices]
    return [DataValidation(cells, sheet_ref("Lists", f"{column}2:{column}{len(values) + 1}"),
                           ", ".join(values), "choose from the list")]


def _lists_sheet(plan: WorkbookPlan, lists: dict) -> None:
    sh = plan.add_sheet("Lists", column_widths={c: (34 if c == "A" else 16)
                                                for c, _h, _v in lists.values()},
                        print_setup=_print("Lists"))
    b = sh.block("lists")
    for column, head, values in lists.values():
        b.put(f"{column}1", head, role="header")
        for i, v in enumerate(values, 2):
            b.put(f"{column}{i}", v)


def _input_format(head: str, kind: str) -> str | None:
    """Number format of a template column: U and R show at least two decimals (a target of
    0.20 reads 0.20, not 0.2), λ and ψ three (0.040), up to five as typed; others as typed."""
    if kind != "number" or "contact" in head:
        return None
    if "[W/(m K)]" in head:
        return INPUT_FORMAT_CONDUCTIVITY
    if "[W/(m2 K)]" in head or "[m2 K/W]" in head:
        return INPUT_FORMAT_THERMAL
    return None


def _print(name: str, orientation: str = "portrait") -> PrintSetup:
    return PrintSetup(orientation=orientation, header=f"heatledger project template | {name}",
                      footer_right="page {page} of {pages}", title_rows=f"1:{HEADER_ROW}")


def _instructions(plan: WorkbookPlan, with_examples: bool) -> None:
    sh = plan.add_sheet("Instructions", column_widths={"A": 4, "B": 100},
                        print_setup=_print("Instructions"))
    b = sh.block("text")
    b.put("B1", "heatledger project template", style="hl title")
    lines = ["1. Project: fill in the project information and the design temperatures "
             "(column C)."]
    lines += [f"{i}. {table.sheet}: {table.note[0].lower()}{table.note[1:]}"
              for i, table in enumerate(TABLES, 2)]
    lines += [
        f"{len(TABLES) + 2}. Run: heatledger audit this-file.xlsx -o audit.xlsx, open audit.xlsx, "
        "let the spreadsheet program recalculate, and check that the cover says ALL CHECKS OK.",
        "Sand cells are inputs. Blank rows are skipped; sheets you do not need stay empty. Do "
        "not rename the sheets or move the header rows: the reader checks them and names "
        "every problem by sheet and cell.",
        "Units are in the column headers: thickness and fin lengths mm; λ W/(m K); R m2 K/W; "
        "U W/(m2 K); temperatures degC; areas m2; volumes m3.",
    ]
    if with_examples:
        lines.append("The rows already filled in are the invented heatledger demo project; "
                     "overwrite or delete them.")
    lines.append("Results support, and do not replace, design by a competent person under the "
                 "local building regulations and codes; check material values against the "
                 "declared values of the products actually used.")
    for i, text in enumerate(lines, 3):
        b.put(f"B{i}", text, style="hl paragraph")
        sh.row_heights[i] = 30.0


# --------------------------------------------------------------------------- reading
def read_template(path) -> tuple[dict, bytes]:
    """Read a filled-in template into project data (the project-file schema).

    Parameters
    ----------
    path : str or path-like
        The .xlsx file. [-]

    Returns
    -------
    (dict, bytes)
        The project data and the file's bytes (for the SHA-256 on the cover).

    Raises
    ------
    ProjectError
        Listing every problem, each naming its sheet and cell (``Layers!E7``).
    HeatLedgerError
        If the file is missing, too large or not an .xlsx workbook.
    """
    p = Path(path)
    data, raw, _cells, early = _read(p)
    if early:
        raise ProjectError(early, source=p.name)
    return data, raw


def project_from_template(path) -> Project:
    """Read a filled-in template and build the :class:`~heatledger.project.Project`.

    Parameters
    ----------
    path : str or path-like
        The .xlsx file. [-]

    Returns
    -------
    Project

    Raises
    ------
    ProjectError
        Every problem found, in the template or in the project data, naming sheet and cell.
    """
    p = Path(path)
    data, raw, cells, early = _read(p)
    try:
        project = project_from_dict(data, source_bytes=raw, source_name=p.name)
    except ProjectError as exc:
        # every sheet's problems in one run: the cells that could not be read first, then
        # what the project data says, less what follows from a cell already named
        named = {where for where, _m in early}
        later = [(_locate(where, cells), msg) for where, msg in exc.problems]
        raise ProjectError(early + [(w, m) for w, m in later if w not in named],
                           source=p.name) from None
    if early:
        raise ProjectError(early, source=p.name)
    project.warnings = [(_locate(where, cells), msg) for where, msg in project.warnings]
    return project


def _read(p: Path):
    import openpyxl
    from openpyxl.xml import DEFUSEDXML

    if not DEFUSEDXML:
        raise HeatLedgerError("reading a workbook needs defusedxml (protection against "
                              "malicious XML); install it with: pip install defusedxml")

    raw = read_bytes_limited(p, MAX_TEMPLATE_BYTES, "template")
    try:
        with zipfile.ZipFile(io.BytesIO(raw)) as zf:
            total = sum(i.file_size for i in zf.infolist())
            names = set(zf.namelist())
            parts = len(zf.infolist())
    except (zipfile.BadZipFile, ValueError, EOFError):
        raise HeatLedgerError(f"{p.name!r} is not an .xlsx workbook (not a zip archive); save "
                              "the template as Excel Workbook (.xlsx)") from None
    if parts > MAX_PARTS:
        raise HeatLedgerError(f"template {p.name!r} has {parts} parts; the limit is "
                              f"{MAX_PARTS}: save it again from a spreadsheet program")
    if total > MAX_UNCOMPRESSED_BYTES:
        raise HeatLedgerError(f"template {p.name!r} unpacks to {total} bytes; the limit is "
                              f"{MAX_UNCOMPRESSED_BYTES} bytes")
    if "xl/workbook.xml" not in names:
        raise HeatLedgerError(f"{p.name!r} is not an .xlsx workbook (no xl/workbook.xml)")
    reader = SheetReader(p.name, MAX_SHEET_ROWS, MAX_XML_ELEMENTS)
    try:  # every part whole: each checksum, also of parts read only in part or not at all
        with zipfile.ZipFile(io.BytesIO(raw)) as zf:
            bad = zf.testzip()
            if bad is not None:
                raise zipfile.BadZipFile(f"bad CRC-32 for {bad}")
            reader.count_parts(zf)  # shared texts and styles are loaded whole: bound them
        wb = openpyxl.load_workbook(io.BytesIO(raw), read_only=True, data_only=True)
    except HeatLedgerError:
        raise
    except Exception as exc:  # noqa: BLE001 - malformed XML surfaces as many exception types
        raise HeatLedgerError(f"{quote(p.name)} cannot be read as a workbook "
                              f"({reason(exc)}); save the template again from a spreadsheet "
                              "program") from None
    try:  # the sheets' XML is read by SheetReader, which reports damage on one line
        return _parse(wb, reader, raw)
    finally:
        wb.close()


def _parse(wb, reader: SheetReader, raw: bytes):
    source = reader.source
    problems: list[tuple[str, str]] = []
    cells: dict[str, str] = {}
    missing = [s for s in REQUIRED_SHEETS if s not in wb.sheetnames]
    for s in missing:
        problems.append((f"{s}!", f"sheet {s!r} is missing; the template needs the sheets "
                         f"{', '.join(REQUIRED_SHEETS)}"))
    data: dict = {"project": {}, "design": {}}
    if "Project" in wb.sheetnames:
        _read_project(reader.rows(wb["Project"], HEADER_ROW, 3), data, problems, cells)
    tables = {}
    for name, cols in COLUMNS.items():
        if name in wb.sheetnames:
            tables[name] = _read_table(reader.rows(wb[name], HEADER_ROW, len(cols)), name,
                                       cols, problems)
    if missing:
        raise ProjectError(problems, source=source)
    early, problems = problems, []  # cells that could not be read: reported with the rest
    materials = []
    for i, (row, where) in enumerate(tables.get("Materials", []), 1):
        materials.append(row)
        note_cells(cells, f"materials[{i}]", where)
    if materials:
        data["materials"] = materials
    for fam in FAMILIES:
        fam.load("template").read_rows(tables, data, problems, cells)
    return data, raw, cells, early + problems


def _read_project(rows, data, problems, cells) -> None:
    heads = [_text(v) for v in _header(rows, 3)]
    if [h.lower() for h in heads] != ["key", "field", "value"]:
        problems.append((f"Project!A{HEADER_ROW}", f"header row must read Key, Field, Value in "
                         f"A{HEADER_ROW}:C{HEADER_ROW}; found {', '.join(map(repr, heads))} "
                         "(rows or columns were inserted or deleted?)"))
        return
    fields = {k: (label, kind) for k, label, kind in PROJECT_FIELDS}
    seen = set()
    for r, (key, _label, value), unsaved in rows:
        if unsaved:
            _not_saved("Project", r, unsaved, problems)
            continue
        if key in (None, "") and value in (None, ""):
            continue
        key = _text(key).strip()
        where = f"Project!C{r}"
        if key not in fields:
            problems.append((f"Project!A{r}", f"unknown key {key!r}; keys are "
                             f"{', '.join(fields)}"))
            continue
        seen.add(key)
        section = "design" if key.startswith("temp_") else "project"
        cells[f"{section}.{key}"] = where
        if value in (None, ""):
            continue
        if fields[key][1] == "number":
            num = _number(value, where, problems)
            if num is not None:
                data[section][key] = num
        else:
            data[section][key] = _text(value)


def _read_table(rows, name, cols, problems):
    expected = [h for _k, h, _t in cols]
    found = [_text(v) for v in _header(rows, len(cols))]
    if [f.strip().lower() for f in found] != [e.lower() for e in expected]:
        bad = next(j for j, (f, e) in enumerate(zip(found, expected, strict=True))
                   if f.strip().lower() != e.lower())
        problems.append((f"{name}!{col_letter(bad + 1)}{HEADER_ROW}",
                         f"header must be {expected[bad]!r}; found {found[bad]!r} (the header "
                         f"row is row {HEADER_ROW} from column A; were rows or columns "
                         "inserted or deleted?)"))
        return []
    out = []
    for r, values, uncached in rows:
        if uncached:
            _not_saved(name, r, uncached, problems)
            continue
        if all(v is None or (isinstance(v, str) and not v.strip()) for v in values):
            continue
        if r > HEADER_ROW + MAX_ROWS:
            problems.append((f"{name}!A{r}", f"more than {MAX_ROWS} rows; split the project"))
            break
        rec: dict = {}
        where: dict = {}
        for j, ((key, _head, kind), value) in enumerate(zip(cols, values, strict=True), 1):
            ref = f"{name}!{col_letter(j)}{r}"
            where[key] = ref
            if value is None or (isinstance(value, str) and not value.strip()):
                continue
            if kind == "number":
                num = _number(value, ref, problems)
                if num is not None:
                    rec[key] = num
            elif kind == "int":
                num = _number(value, ref, problems)
                if num is not None:
                    if num != int(num):
                        problems.append((ref, f"must be a whole number; got {value!r}"))
                    else:
                        rec[key] = int(num)
            elif kind == "ref" and isinstance(value, (int, float)) and not isinstance(
                    value, bool) and float(value).is_integer():
                rec[key] = int(value)
            else:
                rec[key] = _text(value).strip()
        where["_row"] = f"{name}!A{r}"
        out.append((rec, where))
    return out


def _header(rows, ncols):
    """Values of the header row: the first row of ``rows`` (which start at the header row)
    when the file stores the header row; blank when it does not."""
    for r, values, _unsaved in rows:
        return values if r == HEADER_ROW else [None] * ncols
    return [None] * ncols


def _not_saved(sheet, r, columns, problems) -> None:
    """Name the formula cells of a row whose result the file does not carry (read as blank,
    the row would silently vanish)."""
    refs = ", ".join(f"{sheet}!{col_letter(j)}{r}" for j in columns)
    problems.append((f"{sheet}!{col_letter(columns[0])}{r}",
                     f"formula cells {refs} have no calculated value (the file was written by "
                     "a program that does not calculate); open the template in a spreadsheet "
                     "program, let it recalculate and save, or type the values"))


def _number(value, where, problems):
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        problems.append((where, f"must be a number; got {value!r} (text in a number cell)"))
        return None
    value = float(value)
    if value != value or value in (float("inf"), float("-inf")):
        problems.append((where, f"must be a finite number; got {value!r}"))
        return None
    return value


def _text(value) -> str:
    if value is None:
        return ""
    if isinstance(value, float) and value.is_integer():
        return str(int(value))
    return str(value)


def _locate(where: str, cells: dict) -> str:
    """Translate a project key path (``constructions[2].layers[3].thickness_mm``) into the
    template cell it came from (``Layers!E9``); unknown paths are kept."""
    key = where
    while key:
        if key in cells:
            return cells[key]
        if "." not in key:
            break
        key = key.rsplit(".", 1)[0]
    return where
