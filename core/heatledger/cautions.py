"""The cautions heatledger shows with its results (CLI output, cover sheet, README).

Other method families add their own lines (plant sizing, hot surfaces) to ``CAUTIONS`` by
name so that every output shows the same wording.
"""

from __future__ import annotations

__all__ = ["CAUTIONS", "ON_REQUEST", "caution_lines"]

CAUTIONS: dict[str, str] = {
    "general": (
        "heatledger results support, and do not replace, design by a competent person under "
        "the local building regulations and codes."
    ),
    "materials": (
        "Material values in the generic library are design values from standards or typical "
        "values; check them against the declared values of the products actually used."
    ),
    "condensation": (
        "Surface and interface temperatures inform condensation and mould-risk checks; they "
        "are not by themselves a condensation or mould assessment (see EN ISO 13788)."
    ),
    "hot_surfaces": (
        "Fins and finned surfaces (heat sinks, finned tubes, heater fins) can be hot to the "
        "touch: a fin shedding heat is hottest at its base (unless its tip is held hotter). "
        "Check accessible surface temperatures against the touch limits that apply (for example "
        "EN ISO 13732-1, hot surfaces and contact burns; standard number from memory) and "
        "guard or insulate where they are exceeded."
    ),
    "plant_sizing": (
        "The design heat load supports, and does not replace, the sizing of heating plant "
        "and emitters under the local code by a competent person: check design temperatures, "
        "air flows, adjustment factors and allowances against the rules that apply."
    ),
    "moisture": (
        "Moisture results (EN ISO 13788) are a steady monthly diffusion check: they ignore air "
        "leakage, rain, built-in and rising moisture, moisture storage and workmanship, which "
        "often matter more. A pass is not proof that a construction is free of moisture "
        "damage, nor a failure proof that it will be damaged; follow the local codes, "
        "product guidance and licensed practice, and use a transient hygrothermal assessment "
        "(EN 15026) where the risk warrants it."
    ),
}

#: Topics shown only where they apply (named explicitly), not in the default list:
#: ``hot_surfaces`` when a project has fins, ``plant_sizing`` when it has rooms,
#: ``moisture`` when it has moisture checks.
ON_REQUEST = ("hot_surfaces", "plant_sizing", "moisture")


def caution_lines(*topics: str) -> list[str]:
    """The caution texts for ``topics`` (when none are named, all except those in
    :data:`ON_REQUEST`), in a stable order.

    Parameters
    ----------
    *topics : str
        Keys of :data:`CAUTIONS`. [-]

    Returns
    -------
    list of str
    """
    keys = topics or tuple(k for k in CAUTIONS if k not in ON_REQUEST)
    return [CAUTIONS[k] for k in keys if k in CAUTIONS]
