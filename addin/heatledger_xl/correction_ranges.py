"""Correction tables: U-value corrections of EN ISO 6946:2017 Annex F given as a range.

A correction table is a range of 2 to 6 columns, one row per correction. Column 1 names
the kind, column 2 the layer it concerns (its row number in the layer table, 1 = first
layer, or its name), the others depend on the kind:

================= ======================= ===================== =====================
kind (col. 1)     col. 3                  col. 4                col. 5 / col. 6
================= ======================= ===================== =====================
``air_gaps``      level 0, 1 or 2 (F.2)   -                     -
``fasteners``     conductivity [W/(m K)]  cross section [mm2]   count per m2 [1/m2] /
                  or material name                              penetration [mm],
                                                                blank = through (F.3,
                                                                2017 form)
``inverted_roof`` precipitation [mm/day]  drainage factor [-]   factor x, blank = 0.04
                                                                [W day/(m2 K mm)] (F.4)
================= ======================= ===================== =====================

As for layer tables: a blank row ends the table and every row below it must be blank
too; a first row whose cells are all text and
whose kind cell is not a kind (``kind``, ``correction``...) is a header; blank optional
cells take the defaults shown. The engine applies the corrections only when they total at
least 3 % of U (Annex F); :func:`heatledger_xl.udfs.HL_CORRECTIONS` shows what it did.
"""

from __future__ import annotations

from heatledger.construction_family.schema import CORRECTION_KINDS, CORRECTION_TABLE
from heatledger.constructions import (
    AirGapCorrection,
    FastenerCorrection,
    InvertedRoofCorrection,
)
from heatledger.errors import HeatLedgerError
from heatledger.schema import check_value

from .cells import ERROR_VALUES, REQUIRED, number, text
from .cells import is_blank as _is_blank
from .cells import unwrap_single as _unwrap_single
from .ranges import LIBRARY, _no_booleans, check_blank_below

__all__ = ["CORRECTION_KINDS", "MAX_CORRECTIONS", "correction_rows", "build_corrections"]


MAX_CORRECTIONS = 50
_WIDTH = 6


def correction_rows(name: str, cells: object) -> tuple:
    """The filled rows of a correction-table range, up to the first blank row.

    Parameters
    ----------
    name : str
        Argument name used in messages (``"corrections"``). [-]
    cells : object
        The range as a 2-D list; a 1-D list is one row; blank means no corrections. [-]

    Returns
    -------
    tuple of (int, tuple)
        ``(row number in the range, the six cells)`` per correction (header dropped).
    """
    if cells is None or (isinstance(cells, str) and not cells.strip()):
        return ()
    if not isinstance(cells, (list, tuple)):
        value = _unwrap_single(name, cells)
        if _is_blank(value):
            return ()
        raise HeatLedgerError(f"{name} must be a range of 2 to 6 columns (kind, layer, ...); "
                              f"got {value!r}")
    if cells and not any(isinstance(r, (list, tuple)) for r in cells):
        cells = [cells]
    out = []
    for i, row in enumerate(cells, start=1):
        if not isinstance(row, (list, tuple)):
            row = (row,)
        if all(_is_blank(c) for c in row):
            check_blank_below(name, cells, i)
            break
        if len(row) > _WIDTH and any(not _is_blank(c) for c in row[_WIDTH:]):
            raise HeatLedgerError(f"{name} has {len(row)} columns; a correction table has 2 "
                                  "to 6 (kind, layer, then the values of that kind)")
        padded = tuple(row[:_WIDTH]) + (None,) * (_WIDTH - min(len(row), _WIDTH))
        if i == 1 and _is_header(padded):
            continue
        _no_booleans(f"{name} row {i}", padded, ("kind", "layer", "column 3", "column 4",
                                                 "column 5", "column 6"))
        if len(out) >= MAX_CORRECTIONS:
            raise HeatLedgerError(f"{name} holds more than {MAX_CORRECTIONS} corrections; end "
                                  "the table with a blank row")
        out.append((i, padded))
    return tuple(out)


def build_corrections(rows: tuple, layer_names: list[str], *,
                      name: str = "corrections") -> tuple:
    """Engine correction objects from parsed correction rows.

    Parameters
    ----------
    rows : tuple
        Output of :func:`correction_rows`. [-]
    layer_names : list of str
        Names of the layers of the construction, inside to outside. [-]
    name : str
        Argument name used in messages. [-]

    Returns
    -------
    tuple
        :class:`~heatledger.constructions.AirGapCorrection`,
        :class:`~heatledger.constructions.FastenerCorrection` or
        :class:`~heatledger.constructions.InvertedRoofCorrection` items.
    """
    return tuple(_correction(f"{name} row {i}", cells, layer_names) for i, cells in rows)


def _is_header(cells: tuple) -> bool:
    filled = [c for c in cells if not _is_blank(c)]
    return bool(filled) and all(isinstance(c, str) for c in filled) and (
        str(cells[0]).strip().lower() not in CORRECTION_KINDS)


def _layer_index(where: str, value: object, layer_names: list[str]) -> int:
    n = len(layer_names)
    value = _unwrap_single(f"{where} layer", value)
    if isinstance(value, str) and value.strip().upper() not in ERROR_VALUES:
        try:
            value = float(value)
        except ValueError:
            key = " ".join(value.lower().split())
            names = [" ".join(x.lower().split()) for x in layer_names]
            if key in names:
                return names.index(key)
            raise HeatLedgerError(f"{where} layer must be a layer number 1 to {n} or a layer "
                                  f"name; got {value!r}") from None
    k = number(f"{where} layer", value, low=1, low_inclusive=True, high=n)
    if k != int(k):
        raise HeatLedgerError(f"{where} layer must be a whole number 1 to {n}; got {k:g}")
    return int(k) - 1


def _correction(where: str, cells: tuple, layer_names: list[str]):
    c_kind, c_layer, c3, c4, c5, c6 = cells
    kind = text(f"{where} kind", c_kind).lower()
    if kind not in CORRECTION_KINDS:
        raise HeatLedgerError(f"{where} kind must be one of "
                              + ", ".join(map(repr, CORRECTION_KINDS)) + f"; got {kind!r}")
    idx = _layer_index(where, c_layer, layer_names)
    if kind == "air_gaps":
        level = _value(where, "level", c3)
        _blank_rest(where, kind, (c4, c5, c6), 4)
        return AirGapCorrection(idx, level)
    if kind == "fasteners":
        lam = _conductivity(f"{where} conductivity", c3)
        area_mm2 = _value(where, "cross_section_mm2", c4)
        count = _value(where, "count_per_m2", c5)
        pen = _value(where, "penetration_mm", c6, None)
        return FastenerCorrection(idx, lam, area_mm2 * 1e-6, count,
                                  penetration=None if pen is None else pen / 1000.0)
    p = _value(where, "precipitation_mm_per_day", c3)
    f = _value(where, "drainage_factor", c4)
    x = _value(where, "factor_x", c5, 0.04)
    _blank_rest(where, kind, (c6,), 6)
    return InvertedRoofCorrection(idx, p, f, x)


def _value(where: str, key: str, value: object, default: object = REQUIRED):
    """A number of a correction row, checked by the rule of its project-file key (the
    schema's :data:`~heatledger.construction_family.schema.CORRECTION_TABLE`)."""
    out = number(f"{where} {key}", value, default)
    if out is None:
        return None
    return check_value(CORRECTION_TABLE.column(key), int(out) if out == int(out) and
                       CORRECTION_TABLE.column(key).type == "int" else out, f"{where} {key}")


def _conductivity(where: str, value: object) -> float:
    value = _unwrap_single(where, value)
    if isinstance(value, str) and value.strip().upper() not in ERROR_VALUES:
        try:
            float(value)
        except ValueError:
            try:
                return LIBRARY.get(value.strip()).conductivity
            except HeatLedgerError as exc:
                raise HeatLedgerError(f"{where}: {exc}") from None
    return number(where, value, low=0.0, high=1.0e4, unit="W/(m K)")


def _blank_rest(where: str, kind: str, cells, first_col: int) -> None:
    for k, c in enumerate(cells, start=first_col):
        if not _is_blank(_unwrap_single(where, c)):
            raise HeatLedgerError(f"{where}: column {k} must be blank for {kind}")
