"""Named cell styles of the sheet plan (fonts, fills, borders, wrap), shared by both renderers.
"""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["Style", "STYLES"]


# --------------------------------------------------------------------------- styles
@dataclass(frozen=True)
class Style:
    """A named cell style of our own palette.

    Attributes
    ----------
    name : str
        Style name as stored in the file (``"hl input"`` ...).
    bold, italic : bool
        Font weight and slant.
    size : float
        Font size in points.
    color : str
        Font colour, ``RRGGBB``.
    fill : str or None
        Background colour, ``RRGGBB``; None for no fill.
    border : str or None
        ``"thin"`` for a thin grey box, ``"bottom"`` for a rule under the cell, None.
    align : str or None
        ``"left"``, ``"center"``, ``"right"`` or None.
    wrap : bool
        Wrap text in the cell.
    number_format : str
        Default number format of the style.
    """

    name: str
    bold: bool = False
    italic: bool = False
    size: float = 10.0
    color: str = "1F2A33"
    fill: str | None = None
    border: str | None = None
    align: str | None = None
    wrap: bool = False
    number_format: str = "General"


# Our own palette: slate text, pale sand for what the user types, pale teal for formulas,
# light grey for the engine's constants, and a pale green band for checks.
STYLES: dict[str, Style] = {
    s.name: s
    for s in (
        Style("hl title", bold=True, size=14, color="12303F"),
        Style("hl subtitle", bold=True, size=11, color="12303F", border="bottom"),
        Style("hl header", bold=True, color="FFFFFF", fill="2E5A6B", border="thin",
              align="center", wrap=True),
        Style("hl label", color="1F2A33"),
        Style("hl note", italic=True, size=9, color="5A6770", wrap=False),
        Style("hl note wrap", italic=True, size=9, color="5A6770", wrap=True),
        Style("hl input", color="3A2A00", fill="FBEFD0", border="thin"),
        Style("hl formula", color="0B3340", fill="DDEFF2", border="thin"),
        Style("hl engine", color="4A4A4A", fill="EEEEEE", border="thin"),
        Style("hl check", bold=True, color="1E5130", fill="DCEFD9", border="thin",
              align="center"),
        Style("hl text", color="1F2A33", border="thin"),
        Style("hl text wrap", color="1F2A33", border="thin", wrap=True),
        Style("hl paragraph", color="1F2A33", wrap=True),
        Style("hl warning", bold=True, color="7A1F12", wrap=True),
    )
}
