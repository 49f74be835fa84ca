"""Cell addresses of the sheet plan: column letters, A1 references, sheet references, safe
sheet names and formula-like text.
"""

from __future__ import annotations

import functools
import re
from collections.abc import Iterable

from ..errors import HeatLedgerError

__all__ = ["col_letter", "safe_sheet_name", "col_index", "ref", "split_ref", "absolute",
           "sheet_ref", "is_formula_like"]


_REF_RE = re.compile(r"^\$?([A-Z]{1,3})\$?([1-9][0-9]*)$")


_FORMULA_LIKE = ("=", "+", "-", "@")


# --------------------------------------------------------------------------- addresses
@functools.lru_cache(maxsize=4096)
def col_letter(index: int) -> str:
    """Column letters of a 1-based column index (1 -> ``A``, 27 -> ``AA``).

    Parameters
    ----------
    index : int
        Column number, 1 for the first column. [-]

    Returns
    -------
    str

    Examples
    --------
    >>> col_letter(1), col_letter(26), col_letter(28)
    ('A', 'Z', 'AB')
    """
    if index < 1:
        raise HeatLedgerError(f"column index must be 1 or more; got {index}")
    out = ""
    while index:
        index, rem = divmod(index - 1, 26)
        out = chr(65 + rem) + out
    return out


#: Characters no sheet name may hold: Excel's forbidden []:*?/\\ and control characters.
_SHEET_NAME_BAD = re.compile(r"[\[\]:*?/\\\x00-\x1f\x7f]")


def safe_sheet_name(text: str, used: set[str], *, reserved: Iterable[str] = ()) -> str:
    """A valid, unique sheet name made from ``text``; the name is added to ``used``.

    Forbidden characters (``[]:*?/\\`` and control characters) become spaces, runs of
    spaces one space; the name is cut to 31 characters and then loses leading and trailing
    apostrophes (a name ending in ``'`` makes a workbook that LibreOffice cannot open). A
    name already in ``used`` or ``reserved``, or Excel's own "History" (compared without
    case), gets ``~2``, ``~3``...

    Parameters
    ----------
    text : str
        The wanted name (a construction, room or fin name with its number). [-]
    used : set of str
        Lower-case names already taken; updated. [-]
    reserved : iterable of str
        Names kept for fixed sheets (``Cover``, ``Summary``...). [-]

    Examples
    --------
    >>> safe_sheet_name("07 Ground floor: slab/edge", set())
    '07 Ground floor slab edge'
    >>> safe_sheet_name("03 Roof over the old Gardeners' shed", set())  # cut at the '
    '03 Roof over the old Gardeners'
    >>> safe_sheet_name("'" * 40, set())
    'Sheet'
    """
    taken = used | {r.lower() for r in reserved} | {"history"}  # Excel keeps "History"

    def tidy(name: str) -> str:
        return name.rstrip().strip("'").rstrip()

    base = tidy(re.sub(r"\s+", " ", _SHEET_NAME_BAD.sub(" ", str(text))).strip()[:31]) \
        or "Sheet"
    name, k = base, 2
    while name.lower() in taken:
        suffix = f"~{k}"
        name = tidy(base[:31 - len(suffix)]) + suffix
        k += 1
    used.add(name.lower())
    return name


def col_index(letters: str) -> int:
    """1-based column index of column letters (``A`` -> 1).

    Parameters
    ----------
    letters : str
        Column letters, upper case. [-]

    Examples
    --------
    >>> col_index("AB")
    28
    """
    out = 0
    for ch in letters:
        out = out * 26 + (ord(ch) - 64)
    return out


def ref(row: int, col: int, *, absolute_ref: bool = False) -> str:
    """A1 reference of a 1-based row and column.

    Parameters
    ----------
    row : int
        Row number, 1 for the first row. [-]
    col : int
        Column number, 1 for column A. [-]
    absolute_ref : bool
        Write ``$B$7`` instead of ``B7``. [-]

    Examples
    --------
    >>> ref(7, 2), ref(7, 2, absolute_ref=True)
    ('B7', '$B$7')
    """
    if row < 1:
        raise HeatLedgerError(f"row must be 1 or more; got {row}")
    if absolute_ref:
        return f"${col_letter(col)}${row}"
    return f"{col_letter(col)}{row}"


@functools.lru_cache(maxsize=65536)
@functools.lru_cache(maxsize=65536)
def split_ref(a1: str) -> tuple[int, int]:
    """Row and column (1-based) of an A1 reference such as ``"B7"`` or ``"$B$7"``.

    Parameters
    ----------
    a1 : str
        The reference. [-]

    Examples
    --------
    >>> split_ref("$C$12")
    (12, 3)
    """
    m = _REF_RE.match(a1)
    if not m:
        raise HeatLedgerError(f"cell reference must look like 'B7'; got {a1!r}")
    return int(m.group(2)), col_index(m.group(1))


def absolute(a1: str) -> str:
    """``B7`` -> ``$B$7``.

    Parameters
    ----------
    a1 : str
        The reference. [-]
    """
    row, col = split_ref(a1)
    return ref(row, col, absolute_ref=True)


def sheet_ref(sheet: str, a1: str) -> str:
    """Reference to a cell or range on a named sheet, quoted: ``'EW1 wall'!$B$7``.

    Parameters
    ----------
    sheet : str
        Sheet name. [-]
    a1 : str
        Cell or range reference (``B7`` or ``B7:B9``); made absolute. [-]

    Examples
    --------
    >>> sheet_ref("Cover", "B3:B4")
    "'Cover'!$B$3:$B$4"
    """
    parts = a1.split(":")
    body = ":".join(absolute(p) for p in parts)
    quoted = sheet.replace("'", "''")
    return f"'{quoted}'!{body}"


def is_formula_like(text: object) -> bool:
    """True when ``text`` is a string a spreadsheet could take for a formula.

    Parameters
    ----------
    text : object
        A cell value. [-]

    Examples
    --------
    >>> is_formula_like("=1+1"), is_formula_like("-5 mm"), is_formula_like("wall")
    (True, True, False)
    """
    return isinstance(text, str) and text.startswith(_FORMULA_LIKE)
