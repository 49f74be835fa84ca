"""Material library: design thermal values of building materials, each with its source.

The generic library ships as ``heatledger/data/materials.csv`` (read through
``importlib.resources`` so it also loads where there is no file system, such as an in-browser
Python). Users add their own products or override a generic row with the declared value of
the product they actually use.

References
----------
EN ISO 10456:2007, *Building materials and products - Hygrothermal properties - Tabulated
design values*, Table 3 (rows marked "read" or "recalled" in the data file).

Sources: [source: iso10456, Table 3]; [source: cibse-guide-a, Table 3.36].
"""

from __future__ import annotations

import csv
import difflib
import io
import math
from collections.abc import Iterable, Iterator
from dataclasses import dataclass
from functools import lru_cache
from importlib import resources

from ._validate import positive, quote, within
from .errors import HeatLedgerError

__all__ = ["Material", "MaterialLibrary", "MaterialWithheld", "default_library"]


class MaterialWithheld(HeatLedgerError):
    """A material whose own entry in the project has a problem, reported there already.

    :meth:`MaterialLibrary.get` raises it for a withheld name, so that references to the
    material do not add "unknown material" lines that hide the real cause.

    Parameters
    ----------
    message : str
        Why the material is withheld. [-]
    where : str
        Key path of the material's own entry. [-]
    """


@dataclass(frozen=True)
class Material:
    """A material with its design values.

    Parameters
    ----------
    name : str
        Name used to refer to the material (matched case-insensitively). [-]
    conductivity : float
        Design thermal conductivity lambda. [W/(m K)]
    density : float, optional
        Density rho. [kg/m3]
    specific_heat : float, optional
        Specific heat capacity c_p. [J/(kg K)]
    vapour_resistance_factor : float, optional
        Water-vapour resistance factor mu (dry cup); ``inf`` for vapour-tight. [-]
    vapour_resistance_factor_wet : float, optional
        Water-vapour resistance factor mu (wet cup). [-]
    source : str
        Where the values come from (standard and table, or product declaration). [-]
    confidence : str
        ``"read"``, ``"recalled"``, ``"typical"`` or ``"user"``. [-]
    """

    name: str
    conductivity: float
    density: float | None = None
    specific_heat: float | None = None
    vapour_resistance_factor: float | None = None
    vapour_resistance_factor_wet: float | None = None
    source: str = ""
    confidence: str = "user"

    def __post_init__(self) -> None:
        if not str(self.name).strip():
            raise HeatLedgerError("material name must not be empty")
        label = f"conductivity of material {quote(self.name)}"
        within(label, positive(label, self.conductivity, "W/(m K)"), "conductivity")
        for label in ("density", "specific_heat"):
            value = getattr(self, label)
            if value is not None:
                positive(f"{label} of material {quote(self.name)}", value)


class MaterialLibrary:
    """An ordered, case-insensitive collection of :class:`Material`.

    Parameters
    ----------
    materials : iterable of Material
        Initial rows; a repeated name is rejected. [-]

    References
    ----------
    [source: iso10456, Table 3]; each row of the library names its own source.
    """

    def __init__(self, materials: Iterable[Material] = ()) -> None:
        self._rows: dict[str, Material] = {}
        self._withheld: set[str] = set()
        for m in materials:
            self.add(m)

    def add(self, material: Material, *, override: bool = False) -> None:
        """Add ``material``; with ``override`` replace a row of the same name.

        Parameters
        ----------
        material : Material
            The material to add. [-]
        override : bool
            Replace a material of the same name. [-]

        Raises
        ------
        HeatLedgerError
            If the name exists and ``override`` is false.
        """
        key = _key(material.name)
        if key in self._rows and not override:
            raise HeatLedgerError(
                f"material {quote(material.name)} is already in the library; give it another name "
                "or ask to override the library row"
            )
        self._rows[key] = material

    def get(self, name: str) -> Material:
        """Return the material called ``name``.

        Parameters
        ----------
        name : str
            Material name (case-insensitive). [-]

        Raises
        ------
        HeatLedgerError
            If no material has that name; the message lists the closest names.
        """
        if self._withheld and _key(str(name)) in self._withheld:
            raise MaterialWithheld(f"material {quote(name)} has a problem in its own entry")
        try:
            return self._rows[_key(name)]
        except (KeyError, AttributeError):
            pass
        close = difflib.get_close_matches(_key(str(name)), list(self._rows), n=3, cutoff=0.4)
        hint = (
            "; closest known: " + ", ".join(quote(self._rows[c].name) for c in close)
            if close
            else '; run "heatledger materials" to list the library'
        )
        raise HeatLedgerError(f"unknown material {quote(name)}{hint}")

    def withhold(self, name: str) -> None:
        """Mark ``name`` as a material whose own entry has a problem (already reported):
        :meth:`get` then raises :class:`MaterialWithheld` for it, not "unknown material".

        Parameters
        ----------
        name : str
            The material's name. [-]
        """
        key = _key(str(name))
        if key:
            self._withheld.add(key)

    def __contains__(self, name: object) -> bool:
        return isinstance(name, str) and _key(name) in self._rows and (
            _key(name) not in self._withheld)

    def __iter__(self) -> Iterator[Material]:
        return iter(self._rows.values())

    def __len__(self) -> int:
        return len(self._rows)

    def names(self) -> list[str]:
        """Names of all materials, in library order."""
        return [m.name for m in self._rows.values()]

    def copy(self) -> MaterialLibrary:
        """A copy that can be extended without changing this library."""
        return MaterialLibrary(self._rows.values())


def default_library() -> MaterialLibrary:
    """The generic library shipped with heatledger (a fresh copy each call).

    Examples
    --------
    >>> default_library().get("steel").conductivity
    50.0

    References
    ----------
    [source: iso10456, Table 3]; each row names its own source.
    """
    return _load_default().copy()


@lru_cache(maxsize=1)
def _load_default() -> MaterialLibrary:
    text = resources.files("heatledger").joinpath("data/materials.csv").read_text("utf-8")
    return MaterialLibrary(_parse_rows(text))


def _parse_rows(text: str) -> Iterator[Material]:
    lines = [ln for ln in text.splitlines() if ln and not ln.startswith("#")]
    for row in csv.DictReader(io.StringIO("\n".join(lines))):
        yield Material(
            name=row["name"].strip(),
            conductivity=float(row["conductivity_W_mK"]),
            density=_opt(row["density_kg_m3"]),
            specific_heat=_opt(row["specific_heat_J_kgK"]),
            vapour_resistance_factor=_opt(row["mu_dry"]),
            vapour_resistance_factor_wet=_opt(row["mu_wet"]),
            source=row["source"].strip(),
            confidence=row["confidence"].strip(),
        )


def _opt(text: str) -> float | None:
    text = text.strip()
    if not text:
        return None
    return math.inf if text.lower() == "inf" else float(text)


def _key(name: str) -> str:
    return " ".join(name.lower().split())
