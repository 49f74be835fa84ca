"""Small input checks shared by every engine module, and the one table of physical limits.

Each check returns the cleaned value or raises :class:`~heatledger.errors.HeatLedgerError`
whose message names the input (``name``), the value received and the rule, in the words of a
project file or a sheet (:func:`show`), never in Python syntax.

Two kinds of bound live here, each with its justification beside it:

- :data:`LIMITS`: input beyond them cannot be right and is refused (a temperature at or below
  absolute zero, a 1e308 mm layer, a resistance so small the solve loses its precision).
- the *slip* thresholds (:data:`THIN_LAYER`, :data:`CONDUCTIVITY_CLASSES`,
  :data:`OPENING_U_HIGH`, :data:`ROOM_HEIGHT_RANGE`): input beyond them is probably a slip
  (metres in a millimetre field, mW for W) and is flagged as a warning beside the results.
"""

from __future__ import annotations

import datetime as _dt
import functools
import math
import re
from collections.abc import Iterable
from dataclasses import dataclass

import numpy as np

from ._constants import ZERO_CELSIUS
from .errors import HeatLedgerError

__all__ = ["finite", "positive", "non_negative", "fraction", "choice", "array_positive",
           "show", "quote", "choices_text", "Limit", "LIMITS", "within", "limit_rule",
           "positive_within",
           "ABSOLUTE_ZERO", "MAX_CELLS_PER_LAYER", "MAX_CELLS", "MAX_PROJECT_CELLS_PER_LAYER",
           "THIN_LAYER", "OPENING_U_HIGH", "ROOM_HEIGHT_RANGE", "CONDUCTIVITY_CLASSES",
           "conductivity_class", "thin_layer_warning", "conductivity_warning",
           "opening_u_warning", "frame_glazing_warning", "room_height_warning"]

#: Absolute zero on the Celsius scale, 0 K = -273.15 degC. [degC]
#: source: definition of the Celsius scale (0 degC = 273.15 K)
ABSOLUTE_ZERO = -ZERO_CELSIUS


# ------------------------------------------------------------------------------ wording
def show(value) -> str:
    """``value`` as a user wrote it in a project file or a sheet, for a message.

    Parameters
    ----------
    value : object
        The value received. [-]

    Returns
    -------
    str
        Text as written in TOML or a cell: ``nothing`` for a missing value, ``true`` /
        ``false``, text in double quotes, numbers as ``%g``, lists in brackets, ``a table``.
    """
    if value is None:
        return "nothing"
    if isinstance(value, (bool, np.bool_)):
        return "true" if value else "false"
    if isinstance(value, str):
        return quote(value)
    if isinstance(value, (int, np.integer)):
        return str(int(value))
    if isinstance(value, (float, np.floating)):
        return f"{float(value):g}"
    if isinstance(value, (_dt.date, _dt.time)):
        return value.isoformat()
    if isinstance(value, dict):
        return "a table"
    if isinstance(value, (list, tuple)):
        return "[" + ", ".join(show(v) for v in value) + "]"
    if isinstance(value, np.ndarray):
        return show(value.tolist())
    return f"a {type(value).__name__} object"


def quote(text) -> str:
    """``text`` in double quotes, as a name or choice is written in a project file. [-]"""
    return f'"{text}"'


def choices_text(options: Iterable) -> str:
    """``"a", "b" or "c"``: the valid choices for a message. [-]"""
    items = [quote(o) for o in options]
    if len(items) <= 1:
        return "".join(items)
    return ", ".join(items[:-1]) + " or " + items[-1]


# ------------------------------------------------------------------------------ checks
def _as_float(name: str, value: object) -> float:
    if type(value) is float and value - value == 0.0:  # fast path: a finite float
        return value
    if isinstance(value, (bool, np.bool_)):
        raise HeatLedgerError(f"{name} must be a number; got {show(value)}")
    try:
        out = float(value)  # type: ignore[arg-type]
    except (TypeError, ValueError):
        raise HeatLedgerError(f"{name} must be a number; got {show(value)}") from None
    if math.isnan(out) or math.isinf(out):
        raise HeatLedgerError(f"{name} must be a finite number; got {show(out)}")
    return out


def finite(name: str, value: object) -> float:
    """Return ``value`` as a finite float."""
    return _as_float(name, value)


def positive(name: str, value: object, unit: str = "") -> float:
    """Return ``value`` as a float that is finite and > 0."""
    out = _as_float(name, value)
    if out <= 0.0:
        raise HeatLedgerError(f"{name} must be greater than zero; got {out:g}{_u(unit)}")
    return out


def non_negative(name: str, value: object, unit: str = "") -> float:
    """Return ``value`` as a float that is finite and >= 0."""
    out = _as_float(name, value)
    if out < 0.0:
        raise HeatLedgerError(f"{name} must not be negative; got {out:g}{_u(unit)}")
    return out


def fraction(name: str, value: object, *, allow_zero: bool = True) -> float:
    """Return ``value`` as a float in [0, 1] (or (0, 1] when ``allow_zero`` is false)."""
    out = _as_float(name, value)
    low_ok = out >= 0.0 if allow_zero else out > 0.0
    if not (low_ok and out <= 1.0):
        bound = "0" if allow_zero else "above 0"
        raise HeatLedgerError(f"{name} must be between {bound} and 1; got {out:g}")
    return out


def choice(name: str, value: object, choices: Iterable[str]) -> str:
    """Return ``value`` if it is one of ``choices`` (case-insensitive, spaces trimmed)."""
    options = tuple(choices)
    text = str(value).strip().lower() if isinstance(value, str) else value
    if text not in options:
        raise HeatLedgerError(f"{name} must be one of {choices_text(options)}; "
                              f"got {show(value)}")
    return text  # type: ignore[return-value]


def array_positive(name: str, value: object) -> np.ndarray:
    """Return ``value`` as a float array whose every element is finite and > 0."""
    arr = np.asarray(value, dtype=float)
    bad = ~np.isfinite(arr) | (arr <= 0.0)
    if bad.any():
        first = arr.ravel()[np.argmax(bad.ravel())]
        raise HeatLedgerError(f"{name} must be finite and greater than zero; got "
                              f"{show(first)}")
    return arr


def _u(unit: str) -> str:
    return f" {unit}" if unit else ""


# ------------------------------------------------------------------------------ limits
@dataclass(frozen=True)
class Limit:
    """Bounds of one kind of input beyond which it cannot be right.

    Parameters
    ----------
    low : float or None
        Smallest value accepted (None: no bound here; signs are checked separately). [SI]
    high : float or None
        Largest value accepted. [SI]
    unit : str
        SI unit of ``low`` and ``high``. [-]
    low_why, high_why : str
        The justification of each bound: a source, or "common practice, no published
        source". [-]
    low_open : bool
        The low bound itself is refused too (absolute zero). [-]
    """

    low: float | None
    high: float | None
    unit: str
    low_why: str = ""
    high_why: str = ""
    low_open: bool = False

    def broken(self, value: float) -> str | None:
        """``"low"`` or ``"high"`` when ``value`` [SI] is beyond a bound, else None. [-]"""
        if self.low is not None and (value < self.low or (self.low_open and value == self.low)):
            return "low"
        if self.high is not None and value > self.high:
            return "high"
        return None

    def rule(self, side: str, scale: float = 1.0, unit: str | None = None) -> str:
        """The rule of bound ``side`` in the input's unit (``scale`` = SI per input unit).
        [-]"""
        unit = unit or self.unit
        bound = self.low if side == "low" else self.high
        why = self.low_why if side == "low" else self.high_why
        si = "" if unit == self.unit else f"{bound:g} {self.unit}; "
        if side == "low":
            word = "above" if self.low_open else "at least"
        else:
            word = "at most"
        return f"{word} {bound / scale:g} {unit} ({si}{why})"


_CP = "common practice, no published source"

#: The physical limits of inputs, in SI, each bound with its justification. Input beyond
#: them is refused with a message naming the input, the value and this rule.
LIMITS = {
    "temperature": Limit(
        ABSOLUTE_ZERO, 5000.0, "degC",
        low_why="absolute zero, by the definition of the Celsius scale",
        high_why="no solid survives higher; tungsten melts at 3422 degC, from memory; " + _CP,
        low_open=True),
    "thickness": Limit(
        1e-6, 10.0, "m",
        low_why="thinner than any layer a construction lists, a foil is about 6 micrometres "
                "(from memory); " + _CP,
        high_why="no building layer is thicker; " + _CP),
    "conductivity": Limit(
        1e-3, 5000.0, "W/(m K)",
        low_why="no material conducts less; a vacuum insulation panel is about 0.004, from "
                "memory; " + _CP,
        high_why="no material conducts more; diamond is about 2000, from memory; " + _CP),
    "layer_resistance": Limit(
        1e-9, 1e4, "m2 K/W",
        low_why="thinner than 1 micrometre of copper; below it the temperature solve loses "
                "its precision against the other layers (tested: at 1e-9 it still agrees "
                "with 1/R_T to 1e-9); " + _CP,
        high_why="more than 10 m of the best insulation; " + _CP),
    "surface_resistance": Limit(
        None, 10.0, "m2 K/W",
        high_why="EN ISO 6946 Annex C gives at most 1/0.7 = 1.4 (still air, heat flow down, "
                 "zero emissivity); 10 leaves room for an unheated space taken as a "
                 "resistance; " + _CP),
    "area": Limit(
        None, 1e7, "m2",
        high_why="10 km2, more than the roof of the largest building, about 0.4 km2, from "
                 "memory; " + _CP),
    "volume": Limit(
        None, 1e8, "m3",
        high_why="more than the largest building, about 1.3e7 m3, from memory; " + _CP),
    "wall_thickness": Limit(
        None, 10.0, "m", high_why="no building wall is thicker; " + _CP),
    "perimeter": Limit(
        1e-3, 1e5, "m", low_why="shorter than 1 mm is no building's perimeter; " + _CP,
        high_why="100 km, more than any building's perimeter; " + _CP),
    "length": Limit(
        None, 1e5, "m", high_why="100 km, more than any building's perimeter or junction; "
        + _CP),
    "u_value": Limit(
        None, 100.0, "W/(m2 K)",
        high_why="1/Rsi alone is at most about 11 W/(m2 K), EN ISO 6946 Annex C with heat "
                 "flowing up and emissivity 1; 100 leaves a wide margin; " + _CP),
    "psi": Limit(
        -10.0, 10.0, "W/(m K)",
        low_why="building junctions lie within about 1.5 W/(m K) either way; " + _CP,
        high_why="building junctions lie within about 1.5 W/(m K) either way; " + _CP),
    "chi": Limit(
        -100.0, 100.0, "W/K",
        low_why="a point bridge through a building element is far below 10 W/K; " + _CP,
        high_why="a point bridge through a building element is far below 10 W/K; " + _CP),
    "h": Limit(
        1e-3, 1e6, "W/(m2 K)",
        low_why="far below free convection in still air, about 2 to 5 W/(m2 K); " + _CP,
        high_why="condensing steam reaches about 1e5 W/(m2 K), from memory; " + _CP),
    "air_change": Limit(
        None, 1000.0, "1/h",
        high_why="clean rooms reach about 600 air changes per hour, from memory; " + _CP),
    "air_flow": Limit(
        None, 1e7, "m3/h", high_why="more than any room's ventilation; " + _CP),
    "degree_days": Limit(
        None, 36500.0, "K day", high_why="a whole year 100 K below the base temperature; "
        + _CP),
    "area_load": Limit(
        None, 1000.0, "W/m2", high_why="reheat allowances are tabulated up to a few tens "
        "of W/m2 (EN 12831-1, from memory); " + _CP),
    "precipitation": Limit(
        None, 2000.0, "mm/day", high_why="the wettest day on record brought about 1.8 m of "
        "rain, from memory; " + _CP),
    "factor_x": Limit(
        None, 1.0, "W day/(m2 K mm)", high_why="25 times the 0.04 of EN ISO 6946 Annex F.4, "
        "recalled; " + _CP),
    "resistance": Limit(
        None, 1e4, "m2 K/W", high_why="more than 10 m of the best insulation; " + _CP),
    "wind_speed": Limit(
        None, 120.0, "m/s", high_why="above the strongest gust on record, about 113 m/s, "
        "from memory; " + _CP),
    "count_per_m2": Limit(
        None, 1e4, "1/m2", high_why="one fastener per square centimetre; " + _CP),
    "vapour_resistance_factor": Limit(
        0.1, 1e7, "-", low_why="still air has 1 and no porous material resists vapour much "
        "less; " + _CP, high_why="metal foils and glass are vapour-tight: give inf; " + _CP),
    "sd": Limit(
        1e-6, 1e6, "m", low_why="a micrometre of still air; " + _CP,
        high_why="far beyond the 1500 m commonly taken as vapour-tight (give inf for a "
        "vapour-tight layer); " + _CP),
}

#: Most finite-volume cells per layer the engine accepts. [-]
#: A cell costs about 250 bytes with the refinement and the mesh estimate (measured with
#: tracemalloc), so a million cells take about 250 MB: far finer than any layer needs (the
#: scheme is exact for plain layers and converges as 1/n^2 otherwise), and the size of the
#: solver benchmark. Common practice, no published source.
MAX_CELLS_PER_LAYER = 1_000_000
#: Most finite-volume cells in one construction (about 250 MB of memory, see above). [-]
MAX_CELLS = 1_000_000
#: Most cells per layer a project file or template may ask for: each cell is a row of the
#: audit sheet (as for fins, ``[fins.fv] cells``). [-]
MAX_PROJECT_CELLS_PER_LAYER = 500


def limit_rule(kind: str, value: float, *, scale: float = 1.0, unit: str | None = None):
    """The rule ``value`` breaks among :data:`LIMITS` ``[kind]``, or None.

    Parameters
    ----------
    kind : str
        Key of :data:`LIMITS`. [-]
    value : float
        The value, in the input's unit. [input unit]
    scale : float
        SI units per input unit (0.001 for mm). [-]
    unit : str, optional
        The input's unit for the message; default the SI unit. [-]

    Returns
    -------
    str or None
        ``"at most 10000 mm (10 m; ...)"`` when a bound is broken, else None.
    """
    lim = LIMITS[kind]
    side = lim.broken(value * scale)
    return None if side is None else lim.rule(side, scale, unit)


def positive_within(name: str, value, kind: str, unit: str = "") -> float:
    """Return ``value`` [SI] as a float greater than zero and within :data:`LIMITS`
    ``[kind]`` (the message says "greater than zero" for zero or less). [SI]"""
    return within(name, positive(name, value, unit), kind)


def within(name: str, value, kind: str, *, scale: float = 1.0, unit: str | None = None):
    """Return ``value`` as a finite float within :data:`LIMITS` ``[kind]``.

    Parameters
    ----------
    name : str
        The input, for the message. [-]
    value : float
        The value, in the input's unit. [input unit]
    kind : str
        Key of :data:`LIMITS`. [-]
    scale : float
        SI units per input unit (0.001 for mm). [-]
    unit : str, optional
        The input's unit; default the SI unit of the limit. [-]

    Returns
    -------
    float
        The value. [input unit]
    """
    out = _as_float(name, value)
    lim = LIMITS[kind]
    v = out * scale
    if ((lim.low is None or v > lim.low) and (lim.high is None or v <= lim.high)):
        return out  # fast path: strictly inside (the bounds themselves go the long way)
    rule = limit_rule(kind, out, scale=scale, unit=unit)
    if rule is not None:
        raise HeatLedgerError(f"{name} must be {rule}; got {out:g} "
                              f"{unit or LIMITS[kind].unit}")
    return out


# ------------------------------------------------------------------------------ slips
#: A layer thinner than this is flagged unless it is a membrane, foil, film or metal sheet:
#: a thickness in metres written in a millimetre field. [m]
#: common practice, no published source
THIN_LAYER = 1e-3
#: Words of a layer or material name that make a thin layer expected. [-]
THIN_WORDS = ("membrane", "foil", "film", "sheet", "barrier", "vcl", "paint", "coating",
              "tape", "liner", "wrap", "underlay")
#: Window or door U-values above this are flagged. 1/(Rsi + Rse) = 1/(0.10 + 0.04) = 7.1
#: W/(m2 K) is the U of a pane of no resistance at all with heat flowing up (EN ISO
#: 6946:2017 Table 7); rounded down to 7: common practice, no published source. [W/(m2 K)]
OPENING_U_HIGH = 7.0
#: Mean room height volume / floor area outside this range is flagged (a volume written as an
#: area, or in litres). Most codes ask 2.1 to 2.5 m for a habitable room (from memory); 1.8 m
#: leaves room for sloping ceilings, 30 m for halls and atria: common practice, no published
#: source. [m]
ROOM_HEIGHT_RANGE = (1.8, 30.0)
#: Conductivity range of material classes, recognised by a word at the start of a word of
#: the layer's or material's name (first class that matches wins), as (class, words, low,
#: high) [W/(m K)]. Ranges are generous spans of EN ISO 10456:2007 Table 3 and product
#: declarations, from memory; a value outside is probably a slip (mW/(m K) for W/(m K)):
#: common practice, no published source.
CONDUCTIVITY_CLASSES = (
    ("vacuum insulation", ("vacuum", "vip"), 0.002, 0.02),
    ("fibre cement or concrete", ("fibre cement", "fiber cement", "concrete", "cement",
                                  "screed", "mortar"), 0.1, 5.0),
    ("insulation", ("insulation", "mineral wool", "glass wool", "rock wool", "stone wool",
                    "wool", "eps", "xps", "pir", "pur", "polyiso", "polystyrene",
                    "polyurethane", "phenolic", "cellulose", "fibre", "fiber", "cork",
                    "cellular glass", "foam glass", "aerogel", "foam"), 0.01, 0.1),
    ("timber", ("timber", "wood", "softwood", "hardwood", "plywood", "osb", "chipboard",
                "particleboard", "mdf", "clt", "glulam", "lvl"), 0.06, 0.3),
    ("gypsum and plaster", ("plasterboard", "gypsum", "plaster", "render"), 0.1, 1.5),
    ("masonry and stone", ("brick", "block", "masonry", "stone", "granite", "sandstone",
                           "limestone", "marble", "slate", "tile", "clay"), 0.1, 5.0),
    ("metal", ("steel", "aluminium", "aluminum", "copper", "brass", "bronze", "zinc", "lead",
               "iron", "titanium", "metal"), 10.0, 450.0),
    ("glass", ("glass",), 0.5, 1.5),
    ("plastics and bitumen", ("pvc", "polyethylene", "polypropylene", "polycarbonate",
                              "acrylic", "rubber", "epdm", "bitumen", "asphalt", "membrane",
                              "plastic"), 0.1, 1.0),
)


def _lead(label: str) -> str:
    return f"{label}: " if label else ""


@functools.lru_cache(maxsize=64)
def _word_pattern(words: tuple) -> re.Pattern:
    """One pattern matching any of ``words`` at the start of a word."""
    return re.compile(r"(?<![a-z])(?:" + "|".join(map(re.escape, words)) + ")")


@functools.lru_cache(maxsize=8192)
def _has_word(names: tuple, words: tuple) -> str | None:
    pattern = _word_pattern(words)
    for name in names:
        found = pattern.search(str(name or "").lower())
        if found:
            return found.group(0)
    return None


@functools.lru_cache(maxsize=8192)
def conductivity_class(*names) -> tuple | None:
    """The material class of a layer from its names, as ``(class, low, high)``, or None
    (cached: a workbook's tables repeat their layer names).

    Parameters
    ----------
    *names : str
        The layer's name and its material's name. [-]

    Returns
    -------
    tuple or None
        Class name, lowest and highest conductivity of the class. [-, W/(m K), W/(m K)]
    """
    for cls, words, low, high in CONDUCTIVITY_CLASSES:
        if _has_word(names, words):
            return cls, low, high
    return None


def conductivity_warning(label: str, conductivity: float, *names) -> str | None:
    """A warning when ``conductivity`` [W/(m K)] is outside the range of the class named by
    ``names``, else None. [-]"""
    found = conductivity_class(*names)
    if found is None:
        return None
    cls, low, high = found
    if low <= conductivity <= high:
        return None
    hint = (" (was it given in mW/(m K)?)" if conductivity > high and
            low <= conductivity / 1000.0 <= high else "")
    return (f"{_lead(label)}conductivity {conductivity:g} W/(m K) is far outside the range of "
            f"{cls}, {low:g} to {high:g} W/(m K){hint}; check the value (range: common "
            "practice, no published source)")


def thin_layer_warning(label: str, thickness: float, *names, metal: bool = False):
    """A warning when a layer of ``thickness`` [m] is thinner than :data:`THIN_LAYER` and
    not a membrane, foil, film or metal sheet, else None. [-]"""
    if thickness >= THIN_LAYER or metal or _has_word(names, THIN_WORDS):
        return None
    d_mm = thickness * 1000.0
    return (f"{_lead(label)}thickness {d_mm:g} mm is below 1 mm; only membranes, foils and metal "
            f"sheets are this thin: if {d_mm:g} was meant in metres, write "
            f"{d_mm * 1000.0:g} mm (common practice, no published source)")


def opening_u_warning(label: str, u_value: float) -> str | None:
    """A warning when a window or door U-value [W/(m2 K)] is above :data:`OPENING_U_HIGH`,
    else None. [-]"""
    if not u_value > OPENING_U_HIGH:
        return None
    return (f"{_lead(label)}U-value {u_value:.3g} W/(m2 K) is above {OPENING_U_HIGH:g}, more than "
            "a pane of no resistance at all between the surface resistances (1/(0.10 + 0.04) "
            "= 7.1 W/(m2 K), EN ISO 6946 Table 7); check the value")


def frame_glazing_warning(label: str, frame_area: float, glazing_area: float) -> str | None:
    """A warning when the frame area [m2] is larger than the glazing area [m2], else
    None. [-]"""
    if not frame_area > glazing_area:
        return None
    return (f"{_lead(label)}frame_area {frame_area:g} m2 is larger than glazing_area "
            f"{glazing_area:g} m2; usual windows have more glass than frame: check that the "
            "two are not swapped (common practice, no published source)")


def room_height_warning(label: str, volume: float, floor_area: float) -> str | None:
    """A warning when ``volume`` [m3] over ``floor_area`` [m2] gives a mean room height
    outside :data:`ROOM_HEIGHT_RANGE`, else None. [-]"""
    if not floor_area > 0.0:
        return None
    height = volume / floor_area
    low, high = ROOM_HEIGHT_RANGE
    if low <= height <= high:
        return None
    return (f"{_lead(label)}volume {volume:g} m3 over floor_area {floor_area:g} m2 gives a mean "
            f"height of {height:.3g} m, outside {low:g} to {high:g} m; check the volume "
            "(range: common practice, no published source)")
