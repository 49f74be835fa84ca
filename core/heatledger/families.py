"""The family registry: every method family of heatledger, declared once.

A method family (constructions, heat loss of rooms, fins...) is one folder plus one entry
here. The entry names, as ``"module:attribute"`` strings loaded only when used (so that
``import heatledger`` stays light and the engine never imports the sheet layer):

========== ===========================================================================
hook        what it is
========== ===========================================================================
schema      the family's input tables (:class:`heatledger.schema.Table`), template order
parse       ``parse(data, context, problems) -> entries``: the project-file section(s)
            read into domain objects, every problem appended as ``(key path, message)``
results     ``results(project) -> dict``: the ``calc --json`` data of the family
report      ``report(results, write)``: the ``calc`` text of the family
sheets      ``add_sheets(plan, project, audit)``: the family's audit sheets
topics      ``topics(project) -> (methods, cautions)``: what the cover lists
template    module with ``template_rows(data)`` and ``read_rows(tables, data, problems,
            cells)`` for the fill-in template
functions   the add-in module of the family's spreadsheet functions
========== ===========================================================================

:func:`heatledger.project.project_from_dict`, :func:`heatledger.sheet.audit.audit_plan`,
the ``heatledger`` command, :func:`heatledger.sheet.template.template_plan` and the add-in
loop over :data:`FAMILIES`; none of them names a family. DEVELOPERS.md ("How to add a method
family") lists the steps.
"""

from __future__ import annotations

import importlib
from dataclasses import dataclass, field

__all__ = ["Family", "FAMILIES", "family", "ParseContext", "project_file_reference"]


@dataclass(frozen=True)
class Family:
    """One method family and where its parts live.

    Parameters
    ----------
    name : str
        Short name (``"fins"``). [-]
    title : str
        What the family computes, for documents. [-]
    sections : tuple of str
        Top-level project-file keys the family reads (``("rooms", "building")``). [-]
    attribute : str
        Attribute of :class:`heatledger.project.Project` holding the family's entries. [-]
    empty : object
        The entries of a project without the family's sections (``[]`` or None). [-]
    result_key : str
        Key of the family's data in the ``calc --json`` results. [-]
    cautions : tuple of str
        Keys of :mod:`heatledger.cautions` the outputs add when the project uses the
        family. [-]
    hooks : dict
        Hook name -> ``"module:attribute"`` (see the module docstring). [-]
    """

    name: str
    title: str
    sections: tuple
    attribute: str
    empty: object
    result_key: str
    cautions: tuple = ()
    hooks: dict = field(default_factory=dict)

    def load(self, hook: str):
        """The object a hook names, imported on first use (None for a hook not declared).

        Parameters
        ----------
        hook : str
            Hook name (``"parse"``, ``"sheets"``...). [-]

        Returns
        -------
        object or None
        """
        target = self.hooks.get(hook)
        if target is None:
            return None
        module, _, attr = target.partition(":")
        mod = importlib.import_module(module)
        return getattr(mod, attr, None) if attr else mod

    def entries(self, project):
        """The family's entries in ``project`` (its ``empty`` value when it has none). [-]

        Parameters
        ----------
        project : heatledger.project.Project
            A parsed project. [-]
        """
        return getattr(project, self.attribute, self.empty)

    def present(self, project) -> bool:
        """True when ``project`` has entries of this family. [-]

        Parameters
        ----------
        project : heatledger.project.Project
            A parsed project. [-]
        """
        entries = self.entries(project)
        return bool(getattr(entries, "rooms", entries))

    @property
    def tables(self) -> tuple:
        """The family's input tables (:class:`heatledger.schema.Table`), template order."""
        return self.load("schema") or ()


@dataclass
class ParseContext:
    """What a family's parser may read of the project parsed before it.

    Attributes
    ----------
    library : heatledger.materials.MaterialLibrary
        The library with the project's own materials. [-]
    temp_inside, temp_outside : float
        Design temperatures of ``[design]``. [degC]
    entries : dict
        Family name -> entries of the families parsed earlier (in registry order). [-]
    broken : set of str
        Names of entries with a problem of their own: known, so that references to them
        are not reported again as unknown. [-]
    """

    library: object
    temp_inside: float | None
    temp_outside: float | None
    entries: dict = field(default_factory=dict)
    broken: set = field(default_factory=set)


def _hooks(folder: str, sheet: str, template: str, functions: str) -> dict:
    return {"schema": f"heatledger.{folder}.schema:TABLES",
            "parse": f"heatledger.{folder}.family:parse",
            "warnings": f"heatledger.{folder}.family:warnings",
            "results": f"heatledger.{folder}.family:results",
            "report": f"heatledger.{folder}.family:report",
            "topics": f"heatledger.sheet.{sheet}:topics",
            "sheets": f"heatledger.sheet.{sheet}:add_sheets",
            "template": f"heatledger.sheet.{template}",
            "functions": f"heatledger_xl.{functions}"}


#: The method families, in the order they are parsed, computed and printed.
FAMILIES = (
    Family("constructions", "U-values and temperatures through constructions (EN ISO 6946)",
           ("constructions",), "constructions", [], "constructions", (),
           _hooks("construction_family", "audit_constructions", "template_constructions",
                  "udfs")),
    Family("fins", "Fins and finned surfaces (Incropera & DeWitt ch. 3)", ("fins",), "fins",
           [], "fins", ("hot_surfaces",),
           _hooks("fins", "blocks_fins", "template_fins", "udfs_fins")),
    Family("junctions", "2-D thermal bridges: psi and f_Rsi of junctions (EN ISO 10211)",
           ("junctions",), "junctions", [], "junctions", ("condensation",),
           _hooks("bridges2d", "blocks_junctions", "template_junctions", "udfs_junctions")),
    Family("heatloss", "Heat loss of rooms and buildings (EN 12831-1, EN ISO 13370)",
           ("rooms", "building"), "building", None, "building", ("plant_sizing",),
           _hooks("heatloss", "blocks_heatloss", "template_rooms", "udfs_heatloss")),
    Family("moisture", "Surface humidity and interstitial condensation (EN ISO 13788)",
           ("climates", "moisture"), "moisture", [], "moisture", ("moisture",),
           _hooks("moisture", "blocks_moisture", "template_moisture", "udfs_moisture")),
)


def family(name: str) -> Family:
    """The registered family called ``name``.

    Parameters
    ----------
    name : str
        Short name of the family. [-]

    Returns
    -------
    Family
    """
    for fam in FAMILIES:
        if fam.name == name:
            return fam
    raise KeyError(name)


def project_file_reference() -> str:
    """Every key of the project file as Markdown tables: the project-wide tables, then each
    registered family's (the README's "Keys of the project file" section). [-]

    Returns
    -------
    str
        Markdown, one table per project-file table.
    """
    from .construction_family.schema import DESIGN_TABLE, MATERIAL_TABLE, PROJECT_TABLE
    from .schema import markdown

    tables = (PROJECT_TABLE, DESIGN_TABLE, MATERIAL_TABLE) + tuple(
        t for fam in FAMILIES for t in fam.tables)
    return "\n".join(markdown(t) for t in tables)


if __name__ == "__main__":  # python -m heatledger.families: the README's key tables
    print(project_file_reference(), end="")
