"""The cautions heatledger shows with its results (CLI output, cover sheet, README).

Other method families add their own lines (plant sizing, hot surfaces) to ``CAUTIONS`` by
name so that every output shows the same wording.
"""

from __future__ import annotations

__all__ = ["CAUTIONS", "caution_lines"]

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
}


def caution_lines(*topics: str) -> list[str]:
    """The caution texts for ``topics`` (all when none are named), in a stable order.

    Parameters
    ----------
    *topics : str
        Keys of :data:`CAUTIONS`. [-]

    Returns
    -------
    list of str
    """
    keys = topics or tuple(CAUTIONS)
    return [CAUTIONS[k] for k in keys if k in CAUTIONS]
