"""Project input: a TOML project file (or the same data from a filled-in template) turned
into domain objects, with every problem reported at once.

The project-wide tables (``[project]``, ``[design]``, ``[[materials]]``) are read here; every
other section belongs to a method family of :data:`heatledger.families.FAMILIES`, whose
parser is called in registry order. The keys are documented in the README ("Project file"),
derived from the families' input schemas. Every problem names its key path, for example
``constructions[2].layers[3].thickness_mm`` (numbering from 1, as a consultant counts rows).
"""

from __future__ import annotations

import copy
import hashlib
import tomllib
from dataclasses import dataclass, field
from pathlib import Path

from ._projectio import error_text, number, table, table_list, text, unknown
from .construction_family.project_io import ConstructionEntry, build_construction
from .construction_family.schema import DESIGN_TABLE, MATERIAL_TABLE, PROJECT_TABLE
from .errors import HeatLedgerError, ProjectError
from .families import FAMILIES, ParseContext
from .fileio import read_bytes_limited
from .materials import Material, MaterialLibrary, default_library
from .schema import read_value

__all__ = ["Project", "ConstructionEntry", "build_construction", "load_project",
           "project_from_dict", "MAX_INPUT_BYTES", "TOP_KEYS"]

#: Largest project file accepted. [bytes]
MAX_INPUT_BYTES = 20 * 1024 * 1024

PROJECT_KEYS = PROJECT_TABLE.keys()
DESIGN_KEYS = DESIGN_TABLE.keys()
MATERIAL_KEYS = MATERIAL_TABLE.keys()
#: Top-level sections: the project-wide ones and every family's.
TOP_KEYS = ("project", "design", "materials") + tuple(
    key for fam in FAMILIES for key in fam.sections)


@dataclass
class Project:
    """A parsed project: information, design temperatures, materials and constructions.

    Attributes
    ----------
    info : dict
        [project] texts: name, client, site, author, checker, revision, date, notes. [-]
    temp_inside, temp_outside : float
        Design temperatures of [design]. [degC]
    materials : MaterialLibrary
        The library with the project's own materials. [-]
    user_materials : list of Material
        The project's own materials. [-]
    entries : dict
        Family name -> the family's entries (see :data:`heatledger.families.FAMILIES`); each
        is also an attribute named as the family declares: ``constructions`` (list of
        ConstructionEntry), ``fins`` (list of FinEntry), ``building`` (BuildingInput or
        None). [-]
    raw : dict
        The project data as read. [-]
    source_bytes : bytes
        The input file's bytes (for its SHA-256). [-]
    source_name : str
        The input file's name. [-]
    warnings : list of tuple
        Input that is probably a slip, as (key path, message). [-]
    """

    info: dict
    temp_inside: float
    temp_outside: float
    materials: MaterialLibrary
    user_materials: list = field(default_factory=list)
    entries: dict = field(default_factory=dict)
    raw: dict = field(default_factory=dict)
    source_bytes: bytes = b""
    source_name: str = ""
    #: Input that is probably a slip, as ``(key path, message)``: shown beside the results.
    warnings: list = field(default_factory=list)

    def __getattr__(self, name: str):
        """A family's entries by the attribute name it declares (``project.fins``). [-]"""
        for fam in FAMILIES:
            if fam.attribute == name:
                return self.__dict__.get("entries", {}).get(fam.name, fam.empty)
        raise AttributeError(f"{type(self).__name__!r} object has no attribute {name!r}")

    @property
    def sha256(self) -> str:
        """SHA-256 of the input file (hex), for the audit trail."""
        return hashlib.sha256(self.source_bytes).hexdigest()

    def materials_used(self) -> list:
        """Materials referred to by the project's layers, corrections and fins, in order of
        first use."""
        seen: dict[str, Material] = {}
        for entry in self.constructions:
            for row in entry.layer_inputs:
                for key in ("material", "bridging_material"):
                    name = row.get(key)
                    if isinstance(name, str) and name in self.materials:
                        mat = self.materials.get(name)
                        seen.setdefault(mat.name, mat)
        for fin in self.fins:
            mat = getattr(fin, "material", None)
            if mat is not None:
                seen.setdefault(mat.name, mat)
        return list(seen.values())


def load_project(path) -> Project:
    """Read a TOML project file.

    Parameters
    ----------
    path : str or Path
        The ``.toml`` file. [-]

    Returns
    -------
    Project

    Raises
    ------
    ProjectError
        Listing every problem found, each with its key path.
    """
    p = Path(path)
    data_bytes = read_bytes_limited(p, MAX_INPUT_BYTES, "project file")
    try:  # utf-8-sig: a byte-order mark (some Windows editors write one) is not text
        data = tomllib.loads(data_bytes.decode("utf-8-sig"))
    except UnicodeDecodeError:
        raise _file_error(p, "not UTF-8 text; save the project file as UTF-8") from None
    except tomllib.TOMLDecodeError as exc:
        raise _file_error(p, f"not valid TOML: {exc}") from None
    except RecursionError:
        raise _file_error(p, "not a project file: arrays or tables are nested too deeply "
                             "to read") from None
    return project_from_dict(data, source_bytes=data_bytes, source_name=p.name)


def _file_error(p: Path, message: str) -> ProjectError:
    """A project file that cannot be parsed at all: one problem, told on one line."""
    err = ProjectError([("file", message)], source=p.name)
    err.args = (f"{p.name}: {message}",)
    return err


def project_from_dict(data: dict, *, source_bytes: bytes = b"", source_name: str = "") -> Project:
    """Build a :class:`Project` from parsed TOML data, collecting every problem.

    Parameters
    ----------
    data : dict
        The project data (project-file schema). [-]
    source_bytes : bytes
        The input file's bytes (for the SHA-256 on the cover sheet). [-]
    source_name : str
        The input file's name, for messages. [-]

    Returns
    -------
    Project

    Raises
    ------
    ProjectError
        Listing every problem found, each with its key path.
    """
    problems: list[tuple[str, str]] = []
    if not isinstance(data, dict):
        raise ProjectError([("file", "the project must be a table of sections")],
                           source=source_name)
    unknown(data, TOP_KEYS, "", problems)
    info_in = table(data, "project", problems)
    unknown(info_in, PROJECT_KEYS, "project", problems)
    info = {k: "" if info_in.get(k) is None else str(info_in.get(k)) for k in PROJECT_KEYS}
    t_i, t_e = _design(data, problems)
    library = default_library()
    user_materials = _materials(data, library, problems)
    context = ParseContext(library, t_i, t_e)
    for fam in FAMILIES:
        if any(key in data for key in fam.sections):
            context.entries[fam.name] = fam.load("parse")(data, context, problems)
        else:
            context.entries[fam.name] = copy.copy(fam.empty)
    if problems:
        raise ProjectError(problems, source=source_name)
    warnings = [w for fam in FAMILIES
                for w in _family_warnings(fam, context.entries[fam.name])]
    return Project(info=info, temp_inside=t_i, temp_outside=t_e, materials=library,
                   user_materials=user_materials, raw=data, source_bytes=source_bytes,
                   source_name=source_name, warnings=warnings,
                   entries=dict(context.entries))


def _family_warnings(fam, entries) -> list:
    hook = fam.load("warnings")
    return list(hook(entries)) if hook is not None and entries else []


def _design(data, problems) -> tuple:
    design = table(data, "design", problems)
    unknown(design, DESIGN_KEYS, "design", problems)
    t_i = number(design, "temp_inside", "design", problems,
                 default=DESIGN_TABLE.column("temp_inside").default, limit="temperature")
    t_e = number(design, "temp_outside", "design", problems,
                 default=DESIGN_TABLE.column("temp_outside").default, limit="temperature")
    if t_i is not None and t_e is not None and not t_i > t_e:
        problems.append(("design.temp_outside", f"must be below temp_inside ({t_i:g} degC) for "
                         f"a heating case; got {t_e:g} degC"))
    return t_i, t_e


def _materials(data, library, problems) -> list:
    """The project's own materials, added to ``library`` (a material with a problem is
    withheld, so that layers naming it are not reported again)."""
    user_materials = []
    for i, row in enumerate(table_list(data, "materials", problems), 1):
        where = f"materials[{i}]"
        if not isinstance(row, dict):
            problems.append((where, "must be a table with name and conductivity"))
            continue
        unknown(row, MATERIAL_KEYS, where, problems)
        mat_start = len(problems)
        mat_name = text(row, "name", where, problems)
        values = {c.key: read_value(c, row, where, problems) for c in MATERIAL_TABLE.columns
                  if c.type == "number"}
        if mat_name is not None and len(problems) == mat_start:
            try:
                mat = Material(name=mat_name, source=str(row.get("source") or "") or
                               "user input", confidence="user", **values)
                library.add(mat, override=True)
                user_materials.append(mat)
            except HeatLedgerError as exc:
                problems.append((exc.where or where, error_text(exc)))
        if len(problems) > mat_start and mat_name:  # references must not add "unknown"
            library.withhold(mat_name)
    return user_materials
