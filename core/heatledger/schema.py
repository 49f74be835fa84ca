"""Input schema: every table of project input declared once, and the checks that read it.

A method family declares its tables here-style in its own folder (``fins/schema.py``...):
for each table its columns with key, unit, type, choices, default and a one-line
description. Everything else is derived from that declaration:

- the project-file parser's allowed keys (:meth:`Table.keys`) and value checks
  (:func:`read_value`, which collects problems);
- the fill-in template's columns, headers, drop-down lists and instructions
  (:meth:`Table.template_columns`, :meth:`Table.subtables`, :attr:`Column.choices`);
- the spreadsheet functions' argument checks (:func:`check_value`, which raises);
- the key tables of the README (:func:`markdown`; ``python -m heatledger.families``).

One validation core, two faces: :func:`value_problem` says what is wrong with one value (or
None); :func:`check_value` raises it as a :class:`~heatledger.errors.HeatLedgerError` (engine
and spreadsheet functions), :func:`read_value` appends it to a problem list (project files
and templates, which report every problem at once).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from ._validate import LIMITS, choices_text, limit_rule, show
from .errors import HeatLedgerError

__all__ = ["Column", "Table", "value_problem", "check_value", "read_value", "markdown",
           "TYPES"]

#: Column types: text, a number (float), a whole number, true/false, a reference to a row
#: of another table (by name), a material name, a nested table, a list of tables.
TYPES = ("text", "number", "int", "bool", "ref", "material", "table", "list")


@dataclass(frozen=True)
class Column:
    """One key of a project-input table.

    Parameters
    ----------
    key : str
        Key in the project file (``thickness_mm``). [-]
    label : str
        Short header in sheets, without the unit (``"d"``, ``"Layer name"``). [-]
    unit : str
        Unit of the value as entered (``"mm"``, ``"W/(m K)"``, ``"-"``); empty for text. [-]
    type : str
        One of :data:`TYPES`. [-]
    description : str
        One line: what the value is and when it is needed. [-]
    choices : tuple of str
        The values allowed (empty = any). [-]
    default : object
        Value used when the key is blank (None = no default). [-]
    required : bool
        The key must be given. [-]
    limit : str, optional
        Key of :data:`heatledger._validate.LIMITS` the value must lie within. [-]
    scale : float
        SI units per unit entered (0.001 for a ``_mm`` key). [-]
    sign : str
        ``"positive"``, ``"non_negative"`` or empty: a sign rule checked before the limit. [-]
    variants : tuple of str
        Kinds or methods of the table that read this key (empty = all). [-]
    sub : str
        Key of the nested table that holds this key (``"array"`` for ``[fins.array]``);
        empty for a key of the table itself. [-]
    column : str
        Column key in the fill-in template (sub-table keys are prefixed, ``array_count``);
        empty = the key. [-]
    place : str
        ``"both"``: a project-file key and a template column; ``"file"``: project file only;
        ``"sheet"``: template only (a row's link to its parent, ``construction``). [-]
    """

    key: str
    label: str
    unit: str
    type: str
    description: str
    choices: tuple = ()
    default: object = None
    required: bool = False
    limit: str | None = None
    scale: float = 1.0
    sign: str = ""
    variants: tuple = ()
    sub: str = ""
    column: str = ""
    place: str = "both"

    @property
    def header(self) -> str:
        """Header of the template column: label and unit (``"d [mm]"``). [-]"""
        return f"{self.label} [{self.unit}]" if self.unit else self.label

    @property
    def template_key(self) -> str:
        """Key of the template column (prefixed for a sub-table key). [-]"""
        if self.column:
            return self.column
        return f"{self.sub}_{self.key}" if self.sub else self.key

    @property
    def template_type(self) -> str:
        """Cell type of the template column: ``text``, ``number``, ``int`` or ``ref``. [-]"""
        return {"bool": "text", "material": "text"}.get(self.type, self.type)


@dataclass(frozen=True)
class Table:
    """One table of project input (a TOML table or list of tables, a template sheet).

    Parameters
    ----------
    key : str
        Key path of the table in the project file (``"fins"``, ``"rooms.elements"``). [-]
    title : str
        What one row is, for documents (``"one fin or finned surface"``). [-]
    columns : tuple of Column
        The keys, in template order. [-]
    sheet : str
        Name of the template sheet; empty when the table has none. [-]
    note : str
        The template sheet's one-line instruction. [-]
    variant_key : str
        Key whose value selects the variant (``"kind"``, ``"method"``); empty = none. [-]
    extra : tuple of str
        Keys of child tables read elsewhere (``"layers"``), allowed but not columns. [-]
    many : bool
        A list of tables (``[[fins]]``) rather than one table (``[building]``). [-]
    """

    key: str
    title: str
    columns: tuple
    sheet: str = ""
    note: str = ""
    variant_key: str = ""
    extra: tuple = ()
    many: bool = True

    def column(self, key: str, sub: str = "") -> Column:
        """The column of ``key`` (in sub-table ``sub``). [-]

        Parameters
        ----------
        key : str
            Key of the column. [-]
        sub : str
            Sub-table holding the key (empty for the table's own). [-]
        """
        for c in self.columns:
            if c.key == key and c.sub == sub:
                return c
        raise KeyError(f"{self.key}: no column {key!r}")

    @property
    def variants(self) -> tuple:
        """The variants of the table, from its variant key's choices. [-]"""
        if not self.variant_key:
            return ()
        return self.column(self.variant_key).choices

    def keys(self, variant: str | None = None, sub: str = "") -> tuple:
        """Keys allowed in the table (or its sub-table ``sub``) for ``variant``. [-]

        Parameters
        ----------
        variant : str, optional
            Kind or method of the table; None = every key. [-]
        sub : str
            Sub-table whose keys are wanted (empty for the table's own). [-]
        """
        out = []
        for c in self.columns:
            key = c.key if c.sub == sub else (c.sub if not sub and c.sub else None)
            if key is None or key in out or c.place == "sheet":
                continue
            if variant is None or not c.variants or variant in c.variants:
                out.append(key)
        return tuple(out) + (self.extra if not sub else ())

    def template_columns(self) -> tuple:
        """``(column key, header, type)`` of every template column, in order. [-]"""
        return tuple((c.template_key, c.header, c.template_type) for c in self.columns
                     if c.place != "file")

    def subtables(self) -> dict:
        """Template column key -> ``(sub-table, key inside it)`` for sub-table keys. [-]"""
        return {c.template_key: (c.sub, c.key) for c in self.columns
                if c.sub and c.place != "file"}


# ------------------------------------------------------------------ validation core
def value_problem(col: Column, value) -> str | None:
    """What is wrong with ``value`` for column ``col``, or None when it is acceptable.

    Parameters
    ----------
    col : Column
        The column. [-]
    value : object
        The value as given (a blank is ``None`` or ``""``). [-]

    Returns
    -------
    str or None
        The rule broken, in project-file words (``"must be greater than zero; got 0"``).
    """
    if value is None or value == "":
        return "is required" if col.required else None
    if col.type in ("number", "int"):
        return _number_problem(col, value)
    if col.type == "bool":
        return None if isinstance(value, bool) else f"must be true or false; got {show(value)}"
    if col.type in ("text", "ref", "material"):
        if isinstance(value, bool) or not isinstance(value, (str, int)):
            return f"must be text (a name); got {show(value)}"
        if col.choices and str(value).strip().lower() not in col.choices:
            return f"must be one of {choices_text(col.choices)}; got {show(value)}"
    return None


def _number_problem(col: Column, value) -> str | None:
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        kind = " (text)" if isinstance(value, str) else ""
        return f"must be a number; got {show(value)}{kind}"
    if not math.isfinite(float(value)):
        return f"must be a finite number; got {show(value)}"
    if col.type == "int" and float(value) != int(value):
        return f"must be a whole number; got {show(value)}"
    v = float(value)
    if col.choices and f"{v:g}" not in col.choices:
        return f"must be one of {choices_text(col.choices)}; got {v:g}"
    if col.sign == "positive" and v <= 0.0:
        return f"must be greater than zero; got {v:g}"
    if col.sign == "non_negative" and v < 0.0:
        return f"must not be negative; got {v:g}"
    if col.limit is not None:
        rule = limit_rule(col.limit, v, scale=col.scale, unit=col.unit or None)
        if rule is not None:
            return f"must be {rule}; got {v:g} {col.unit or LIMITS[col.limit].unit}"
    return None


def _clean(col: Column, value):
    """The value in its column's type (default for a blank; choices lower-cased)."""
    if value is None or value == "":
        return col.default
    if col.type == "number":
        return float(value)
    if col.type == "int":
        return int(value)
    if col.type in ("text", "ref", "material"):
        text = str(value).strip()
        return text.lower() if col.choices else text
    return value


def check_value(col: Column, value, name: str = ""):
    """Return ``value`` in its column's type, or raise naming the input and the rule.

    Parameters
    ----------
    col : Column
        The column. [-]
    value : object
        The value as given. [-]
    name : str
        The input as the caller knows it (an argument, a cell); default the key. [-]

    Returns
    -------
    object
        The value (float, int, stripped text, bool) or the column's default for a blank.
    """
    problem = value_problem(col, value)
    if problem is not None:
        raise HeatLedgerError(f"{name or col.key} {problem}")
    return _clean(col, value)


def read_value(col: Column, row, where: str, problems: list):
    """Read ``col`` from table ``row``; a problem is appended instead of raised.

    Parameters
    ----------
    col : Column
        The column. [-]
    row : dict
        The table (its sub-table when ``col.sub`` is set); anything else reads as empty. [-]
    where : str
        Key path of the table (``fins[2]``, ``fins[2].array``). [-]
    problems : list
        ``(key path, message)`` is appended for a problem. [-]

    Returns
    -------
    object
        The value in its type, the default when blank, None when it has a problem.
    """
    value = row.get(col.key) if isinstance(row, dict) else None
    problem = value_problem(col, value)
    if problem is not None:
        problems.append((f"{where}.{col.key}" if where else col.key, problem))
        return None
    return _clean(col, value)


# ------------------------------------------------------------------------ documents
def markdown(table: Table) -> str:
    """The table's keys as a Markdown table (key, unit, type, allowed values, meaning). [-]

    Parameters
    ----------
    table : Table
        The table. [-]

    Returns
    -------
    str
        Markdown lines, ending with a newline.
    """
    head = f"`[[{table.key}]]`" if table.many else f"`[{table.key}]`"
    lines = [f"{head}: {table.title}.", "",
             "| key | unit | type | allowed / default | meaning |", "|---|---|---|---|---|"]
    for c in table.columns:
        key = f"{c.sub}.{c.key}" if c.sub else c.key
        allowed = " / ".join(c.choices)
        if c.default is not None and c.default != "":
            allowed += ("; " if allowed else "") + f"default {_md_value(c.default)}"
        if c.required:
            allowed += ("; " if allowed else "") + "required"
        used = f" ({', '.join(c.variants)} only)" if c.variants else ""
        lines.append(f"| `{key}` | {c.unit} | {c.type} | {allowed} | {c.description}{used} |")
    return "\n".join(lines) + "\n"


def _md_value(value) -> str:
    if isinstance(value, bool):
        return "true" if value else "false"
    return f'"{value}"' if isinstance(value, str) else f"{value:g}"

