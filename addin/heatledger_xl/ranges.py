"""Layer-table ranges of the spreadsheet functions turned into engine inputs (the single
cell values are read by :mod:`heatledger_xl.cells`).

Everything here is plain Python: no spreadsheet library is imported, so the parser serves
desktop Excel (classic xlwings), Excel on the web and macOS (the in-browser runtime) and
plain tests alike. Every rejected value raises :class:`heatledger.errors.HeatLedgerError`
with a one-line message naming the argument (and the row of a layer table) and the rule;
the function layer (:mod:`heatledger_xl.udfs`) turns it into the text shown in the cell.

Layer-table conventions
-----------------------
A layer table is a range of 2 to 6 columns, one row per layer, **inside to outside**.
Columns are read by position; a narrower range simply leaves the later columns blank.

==== ======================= ======================= ============================================
col  heading (suggested)     unit                    rule
==== ======================= ======================= ============================================
1    name or material        text                    Library material name (case-insensitive),
                                                     or any label when column 3 or 4 is given.
                                                     ``air`` = unventilated air layer (ISO 6946
                                                     Annex D); ``air:well`` = well ventilated;
                                                     ``air:slightly:<Av mm2>`` = slightly
                                                     ventilated. Blank: layer is called
                                                     ``layer <n>``.
2    thickness               mm                      Required, 0.001 <= d <= 10000 mm (air
                                                     layers at most 300 mm).
3    conductivity            W/(m K)                 Optional. Blank: taken from the library
                                                     material named in column 1.
4    declared resistance     m2 K/W                  Optional, instead of a conductivity (give
                                                     one or the other, never both).
5    bridging fraction       -                       Optional, 0 < f < 1: the area fraction of
                                                     studs/joists/battens in this layer; the
                                                     rest is the main material (col. 3 or 1).
6    bridging conductivity   W/(m K) or text         Required with column 5: a number or a
                                                     library material name; blank otherwise.
==== ======================= ======================= ============================================

Further rules:

- **No gaps.** A row whose cells are all blank (empty, or text of spaces only) ends the
  table, and every row below it in the range must be blank too, so a range may reach into
  empty cells below the table. A blank row with a filled row below it is an error naming
  both rows (never silently a shorter table: the layers below the gap would vanish from
  the U-value).
- **Bridged layers.** At most :data:`MAX_BRIDGED_LAYERS` bridged layers per table (the
  upper limit combines every section through all of them: 2 to the power of their number).
- **Header row.** The first row is a header, and skipped, when every filled cell in it is
  text and its thickness cell (column 2) mentions ``mm`` or ``thick``.
- **Blank optional cells take defaults**: blank conductivity -> library value; blank
  resistance -> not declared; blank bridging fraction -> homogeneous layer.
- **Numbers written as text** (``"12.5"``) are read as numbers; other text, TRUE/FALSE,
  dates and spreadsheet errors (``#N/A``) in a number column are rejected with the row.
- At most :data:`MAX_LAYERS` layers; a range of 1 column, or of more than 6, is rejected.
- **Spilled results** (temperatures, layer tables, material list) are 2-D arrays; their
  optional last argument ``header`` (TRUE) adds one row of column titles with units.
"""

from __future__ import annotations

from functools import lru_cache

from heatledger._validate import LIMITS
from heatledger.airlayers import MAX_AIR_LAYER_THICKNESS
from heatledger.construction_family.schema import FUNCTION_LAYER_TABLE
from heatledger.constructions import AirLayer, BridgedLayer, Construction, Layer
from heatledger.errors import HeatLedgerError
from heatledger.materials import Material, default_library

from .cells import ERROR_VALUES, REQUIRED, describe, is_blank, number, row_is_blank, text
from .cells import unwrap_single as _unwrap_single

__all__ = [
    "LAYER_COLUMNS",
    "MAX_LAYERS",
    "LIBRARY",
    "layer_rows",
    "build_construction",
    "check_blank_below",
    "MAX_BRIDGED_LAYERS",
]

#: Column names of a layer table, in order, as used in messages (from the schema).
LAYER_COLUMNS = tuple(c.key for c in FUNCTION_LAYER_TABLE.columns)
#: Most layers a table may hold (a real build-up has well under 30).
MAX_LAYERS = 100
#: Most bridged layers a table may hold: the upper limit of EN ISO 6946 6.7.2 sums over
#: every combination of their parts (2**n sections for n two-part layers), so the work
#: doubles with each one; real build-ups have one to three (studs, battens, counter-battens).
MAX_BRIDGED_LAYERS = 8


def _bounds(key: str) -> tuple:
    """Low and high bound of a layer column in its own unit (the schema's physical limit)."""
    col = FUNCTION_LAYER_TABLE.column(key)
    lim = LIMITS[col.limit]
    return lim.low / col.scale, lim.high / col.scale


#: Smallest and largest layer thickness accepted. [mm]
MIN_THICKNESS_MM, MAX_THICKNESS_MM = _bounds("thickness_mm")
#: Smallest and largest conductivity accepted. [W/(m K)]
MIN_CONDUCTIVITY, MAX_CONDUCTIVITY = _bounds("conductivity")
#: Largest resistance of one layer, declared or thickness/conductivity. [m2 K/W]
MAX_LAYER_RESISTANCE = _bounds("resistance")[1]
#: The generic material library, read once when the add-in loads (package data through
#: importlib.resources, so it also loads in an in-browser Python).
LIBRARY = default_library()

_PADDING = tuple((None,) * (len(LAYER_COLUMNS) - n) for n in range(len(LAYER_COLUMNS)))
_ZERO_ONE = frozenset((0, 1))


# --------------------------------------------------------------------------- layer tables
def layer_rows(name: str, cells: object) -> tuple[tuple[int, tuple], ...]:
    """The filled rows of a layer-table range, which end at the first blank row.

    Parameters
    ----------
    name : str
        Argument name used in messages (``"layers"``). [-]
    cells : object
        The range as a 2-D list (rows of cells); a 1-D list is one row. [-]

    Returns
    -------
    tuple of (int, tuple)
        ``(row number in the range, 1-based; the six cells)`` for every layer row, with the
        header row (if any) dropped. Hashable, so it can key a cache.

    Raises
    ------
    HeatLedgerError
        If the range is a single cell, has 1 or more than 6 columns, holds no layer, more
        than :data:`MAX_LAYERS` layers, or a filled row below a blank row.
    """
    if not isinstance(cells, (list, tuple)):
        raise HeatLedgerError(f"{name} must be a range of 2 to 6 columns (material, "
                              f"thickness_mm, ...); got {describe(cells)}")
    if cells and not isinstance(cells[0], (list, tuple)) and not any(
            isinstance(r, (list, tuple)) for r in cells):
        cells = [cells]  # a single row given as a 1-D list
    out = []
    width = 0
    n_cols = len(LAYER_COLUMNS)
    i = 0
    for row in cells:
        i += 1
        if not isinstance(row, (list, tuple)):
            row = (row,)
        n = len(row)
        first = row[0] if n else None
        # a row whose first cell holds a name is filled (the common case, checked first)
        if not (type(first) is str and first and not first.isspace()) and row_is_blank(row):
            check_blank_below(name, cells, i)
            break
        if n > width:
            width = n
        if n >= n_cols:
            if n > n_cols and any(not is_blank(c) for c in row[n_cols:]):
                raise HeatLedgerError(
                    f"{name} has {n} columns; a layer table has 2 to 6 (material, "
                    "thickness_mm, conductivity, resistance, bridging_fraction, "
                    "bridging_conductivity)")
            padded = tuple(row) if n == n_cols else tuple(row[:n_cols])
        else:
            padded = tuple(row) + _PADDING[n]
        if i == 1 and type(padded[1]) is str and _is_header(padded):
            continue
        try:  # no cell equal to 0 or 1: none can be TRUE or FALSE (a quick look)
            maybe_bool = not _ZERO_ONE.isdisjoint(padded)
        except TypeError:  # an unhashable cell (a nested list)
            maybe_bool = True
        if maybe_bool:
            _no_booleans(f"{name} row {i}", padded, LAYER_COLUMNS)
        if len(out) == MAX_LAYERS:
            raise HeatLedgerError(f"{name} holds more than {MAX_LAYERS} layers; end the "
                                  "table with a blank row")
        out.append((i, padded))
    if width == 1:
        raise HeatLedgerError(f"{name} has 1 column; a layer table needs at least material "
                              "and thickness_mm")
    if not out:
        raise HeatLedgerError(f"{name} holds no layer: the range is empty or blank")
    return tuple(out)


def check_blank_below(name: str, cells, blank_row: int) -> None:
    """Check that every row below a blank row of a table range is blank too.

    A table ends at its first blank row; a filled row further down means a gap inside the
    table (a deleted layer, a row left for later), and reading only the rows above it
    would silently drop the rows below.

    Parameters
    ----------
    name : str
        Argument name used in messages (``"layers"``). [-]
    cells : sequence
        The rows of the range. [-]
    blank_row : int
        Number of the blank row in the range, 1-based. [-]

    Raises
    ------
    HeatLedgerError
        Naming the blank row and the first filled row below it.
    """
    for j in range(blank_row, len(cells)):
        row = cells[j]
        if not isinstance(row, (list, tuple)):
            row = (row,)
        if not row_is_blank(row):
            raise HeatLedgerError(
                f"{name} row {blank_row} is blank but row {j + 1} below it is filled; a table "
                f"has no blank rows inside it: delete row {blank_row}, or end the range above "
                "it")


def build_construction(rows: tuple, heat_flow: str, rsi: float | None,
                       rse: float | None, *, name: str = "layers",
                       label: str = "", corrections: tuple = ()) -> Construction:
    """A :class:`heatledger.Construction` from parsed layer rows.

    Parameters
    ----------
    rows : tuple
        Output of :func:`layer_rows`. [-]
    heat_flow : str
        ``"up"``, ``"horizontal"`` or ``"down"``. [-]
    rsi, rse : float or None
        Surface resistances; None for the ISO 6946 Table 7 values. [m2 K/W]
    name : str
        Argument name used in messages. [-]
    label : str
        Name of the construction. [-]
    corrections : tuple
        U-value corrections (EN ISO 6946 Annex F objects), see
        :mod:`heatledger_xl.correction_ranges`. [-]

    Returns
    -------
    Construction
    """
    try:
        layers = [_cached_layer(name, i, cells) for i, cells in rows]
    except TypeError:  # a cell value that cannot key a cache (a nested list)
        layers = [_layer(name, i, cells) for i, cells in rows]
    if [lay.kind for lay in layers].count("bridged") > MAX_BRIDGED_LAYERS:
        bridged = [i for (i, _), lay in zip(rows, layers, strict=True) if lay.kind == "bridged"]
        raise HeatLedgerError(
            f"{name} row {bridged[MAX_BRIDGED_LAYERS]}: at most {MAX_BRIDGED_LAYERS} bridged "
            f"layers per table (this one has {len(bridged)}); combine battens and studs that "
            "share a layer, or model the element by a numerical method (ISO 10211)")
    try:
        return Construction(layers, heat_flow, rsi=rsi, rse=rse, name=label,
                            corrections=corrections)
    except HeatLedgerError as exc:
        msg = str(exc)
        for head in ("construction: ", "construction "):
            if msg.startswith(head):
                msg = msg[len(head):]
                break
        raise HeatLedgerError(f"{name}: {msg}") from None
    except ArithmeticError as exc:  # out-of-scale values the engine could not combine
        raise HeatLedgerError(f"{name}: these layers cannot be combined "
                              f"({type(exc).__name__}); check the conductivities and "
                              "resistances") from None


# --------------------------------------------------------------------------- internals
#: Layer objects kept by (argument, row number, cells): a table that differs from one
#: already seen in a few rows rebuilds only those rows (about 0.5 kB an entry, the cells
#: being shared with the table caches of :mod:`heatledger_xl.udfs`).
ROW_CACHE_SIZE = 4096


@lru_cache(maxsize=ROW_CACHE_SIZE)
def _cached_layer(name: str, row: int, cells: tuple):
    return _layer(name, row, cells)


def _no_booleans(where: str, cells: tuple, columns: tuple) -> None:
    """TRUE/FALSE is never a valid table cell. Rejected here, before the row keys a cache,
    because TRUE == 1 and FALSE == 0 in Python and would share a cache entry."""
    if bool not in map(type, cells):
        return
    for column, cell in zip(columns, cells, strict=False):
        if type(cell) is bool:
            raise HeatLedgerError(f"{where} {column} must be a number or a text; got "
                                  f"{describe(cell)}")


def _is_header(cells: tuple) -> bool:
    filled = [c for c in cells if not is_blank(c)]
    if not filled or not all(isinstance(c, str) for c in filled):
        return False
    thick = cells[1]
    if not isinstance(thick, str):
        return False
    low = thick.lower()
    return "mm" in low or "thick" in low


def _material(where: str, value: object) -> Material:
    label = text(where, value)
    try:
        return LIBRARY.get(label)
    except HeatLedgerError as exc:
        raise HeatLedgerError(f"{where}: {exc}") from None


def _cell(name: str, row: int, column: str, value: object, default: object, low: float,
          high: float, low_inclusive: bool, unit: str) -> float:
    """:func:`number` for a table cell; a plain number within bounds or a blank optional cell
    is answered without building the message text (the common case of every row)."""
    kind = type(value)
    if kind is float or kind is int:
        if (value > low or (low_inclusive and value == low)) and value <= high:
            return float(value)
    elif value is None and default is not REQUIRED:
        return default  # type: ignore[return-value]
    return number(f"{name} row {row} {column}", value, default, low=low, high=high,
                  low_inclusive=low_inclusive, unit=unit)


def _layer(name: str, row: int, cells: tuple):
    # ``where`` (for messages) is written out only on the paths that may need it
    c_name, c_thick, c_cond, c_res, c_frac, c_bcond = cells
    if not (type(c_name) is str and (label := c_name.strip()) and label[0] != "#"):
        label = text(f"{name} row {row} material", c_name, "")  # a name is the common case
    thickness = _cell(name, row, "thickness_mm", c_thick, REQUIRED, MIN_THICKNESS_MM,
                      MAX_THICKNESS_MM, True, "mm") / 1000.0
    # blank optional cells (None) are the common case: answered without a call
    cond = None if c_cond is None else _cell(name, row, "conductivity", c_cond, None,
                                             MIN_CONDUCTIVITY, MAX_CONDUCTIVITY, True, "W/(m K)")
    if cond is not None and thickness > MAX_LAYER_RESISTANCE * cond:
        _layer_resistance(f"{name} row {row}", "conductivity", thickness, cond)  # raises
    res = None if c_res is None else _cell(name, row, "resistance", c_res, None, 0.0,
                                           MAX_LAYER_RESISTANCE, False, "m2 K/W")
    frac = None if c_frac is None else _cell(name, row, "bridging_fraction", c_frac, None, 0.0,
                                             1.0, False, "")
    where = f"{name} row {row}" if frac is not None or c_bcond is not None else ""
    if frac is not None and frac >= 1.0:
        raise HeatLedgerError(f"{where} bridging_fraction must be below 1; got {frac:g} "
                              "(give the fraction of studs or battens, e.g. 0.12)")
    has_bcond = c_bcond is not None and not is_blank(
        _unwrap_single(f"{where} bridging_conductivity", c_bcond))
    try:
        low = label.lower()
        if low == "air" or low.startswith("air:"):
            where = f"{name} row {row}"
            if cond is not None or res is not None or frac is not None or has_bcond:
                raise HeatLedgerError(
                    f"{where}: an air layer takes its resistance from ISO 6946 Annex D; "
                    "leave conductivity, resistance and bridging blank (or give the layer "
                    "another name and a declared resistance)")
            return _air_layer(where, label, thickness)
        if frac is None and has_bcond:
            raise HeatLedgerError(f"{name} row {row}: bridging_conductivity is given but "
                                  "bridging_fraction is blank; give both or neither")
        if frac is not None:
            if res is not None:
                raise HeatLedgerError(f"{where}: a bridged layer needs a conductivity, not a "
                                      "declared resistance")
            if not has_bcond:
                raise HeatLedgerError(f"{where}: bridging_fraction is given but "
                                      "bridging_conductivity is blank; give both or neither")
            main = cond if cond is not None else _main_conductivity(where, label)
            bcond = _bridging_conductivity(where, c_bcond)
            _layer_resistance(where, "bridging_conductivity", thickness, bcond)
            return BridgedLayer(thickness, [(main, 1.0 - frac), (bcond, frac)],
                                name=label or f"layer {row}")
        if res is not None:
            if cond is not None:
                raise HeatLedgerError(f"{name} row {row}: give conductivity or a declared "
                                      "resistance, not both")
            return Layer(thickness, resistance=res, name=label or f"layer {row}")
        if cond is not None:
            return Layer(thickness, cond, name=label or f"layer {row}")
        if not label:
            raise HeatLedgerError(f"{name} row {row}: give a material name, a conductivity or "
                                  "a declared resistance")
        material = _library_material(label)  # a library name (cached); otherwise the message
        return Layer(thickness, material=material if material is not None else
                     _material(f"{name} row {row} material", label))
    except HeatLedgerError as exc:
        msg = str(exc)
        where = f"{name} row {row}"
        if msg.startswith(where):
            raise
        raise HeatLedgerError(f"{where}: {msg}") from None


def _layer_resistance(where: str, column: str, thickness: float, conductivity: float) -> None:
    """Reject a thickness/conductivity whose resistance exceeds MAX_LAYER_RESISTANCE."""
    if thickness > MAX_LAYER_RESISTANCE * conductivity:
        raise HeatLedgerError(
            f"{where} {column} {conductivity:.3g} W/(m K) gives R = thickness/conductivity "
            f"= {thickness / conductivity:.3g} m2 K/W, above {MAX_LAYER_RESISTANCE:g} m2 K/W; "
            "check the conductivity")


def _main_conductivity(where: str, label: str) -> float:
    if not label:
        raise HeatLedgerError(f"{where}: a bridged layer needs the main material's "
                              "conductivity (column 3) or a library material name")
    return _material(f"{where} material", label).conductivity


@lru_cache(maxsize=ROW_CACHE_SIZE)
def _library_material(label: str) -> Material | None:
    """The library material a text names, or None (then the caller's path gives the
    message): the lookup of the names a workbook repeats in every table, cached."""
    return LIBRARY.get(label) if label in LIBRARY else None


@lru_cache(maxsize=ROW_CACHE_SIZE)
def _named_conductivity(value: str) -> float | None:
    """Conductivity of the library material a bridging_conductivity text names, or None for
    a number written as text, an error value or an unknown name (read the long way)."""
    stripped = value.strip()
    try:
        float(stripped)
    except ValueError:
        if stripped.upper() not in ERROR_VALUES and stripped and stripped[0] != "#":
            material = _library_material(stripped)
            return None if material is None else material.conductivity
    return None


def _bridging_conductivity(where: str, value: object) -> float:
    if type(value) is str and (lam := _named_conductivity(value)) is not None:
        return lam  # a library name, the common case
    value = _unwrap_single(f"{where} bridging_conductivity", value)
    if isinstance(value, str):
        try:
            float(value.strip())
        except ValueError:
            if value.strip().upper() not in ERROR_VALUES:
                return _material(f"{where} bridging_conductivity", value).conductivity
    return number(f"{where} bridging_conductivity", value, low=MIN_CONDUCTIVITY,
                  high=MAX_CONDUCTIVITY, low_inclusive=True, unit="W/(m K)")


def _air_layer(where: str, label: str, thickness: float) -> AirLayer:
    if thickness > MAX_AIR_LAYER_THICKNESS + 1e-12:
        raise HeatLedgerError(f"{where}: air layer thickness must be at most "
                              f"{MAX_AIR_LAYER_THICKNESS * 1000:g} mm for ISO 6946 Annex D; got "
                              f"{thickness * 1000:g} mm")
    parts = [p.strip().lower() for p in label.split(":")]
    kind = parts[1] if len(parts) > 1 else "unventilated"
    if kind in ("unventilated", "") and len(parts) <= 2:
        return AirLayer(thickness, name="air layer")
    if kind == "well" and len(parts) == 2:
        return AirLayer(thickness, ventilation="well", name="air layer, well ventilated")
    if kind == "slightly" and len(parts) == 3:
        area = number(f"{where} material (vent area of air:slightly:<mm2>)", parts[2],
                      low=0.0, unit="mm2")
        return AirLayer(thickness, ventilation="slightly", vent_area=area,
                        name="air layer, slightly ventilated")
    raise HeatLedgerError(f"{where} material {label!r}: write 'air', 'air:unventilated', "
                          "'air:well' or 'air:slightly:<vent area mm2>'")


