"""Input slips of a construction's layers: a thickness that looks like metres written in a
millimetre field, a conductivity far outside the class its name gives (the thresholds and
their justification are in :mod:`heatledger._validate`).
"""

from __future__ import annotations

import functools

from .._validate import (
    THIN_LAYER,
    conductivity_class,
    conductivity_warning,
    quote,
    thin_layer_warning,
)


def _input_slips(layers) -> list:
    """Warnings for layer input that is probably a slip (see heatledger._validate)."""
    out = []
    for i, lay in enumerate(layers, 1):
        mat = getattr(lay, "material", None)
        lam = getattr(lay, "conductivity", None)
        names = (lay.name, mat.name if mat is not None else "")
        # most layers are thick enough and of a plausible conductivity for their class:
        # decided here without building a message (the class lookup is cached by name)
        if lay.thickness >= THIN_LAYER and (lam is None or _plausible(lam, names)):
            continue
        found = _layer_slips(*names, lay.thickness, lam)
        if found:
            label = f"layer {i} {quote(lay.name)}" if lay.name else f"layer {i}"
            out += [f"{label}: {text}" for text in found]
    return out


def _plausible(conductivity: float, names: tuple) -> bool:
    """True when the conductivity lies in the range of the material class the names give
    (or the names give none). [-]"""
    found = conductivity_class(*names)
    return found is None or found[1] <= conductivity <= found[2]


@functools.lru_cache(maxsize=4096)
def _layer_slips(name: str, material: str, thickness: float, conductivity) -> tuple:
    """The slip warnings of one layer, without its position (cached: a spreadsheet's tables
    repeat their layers). [-]"""
    found = [thin_layer_warning("", thickness, name, material,
                                metal=conductivity is not None and conductivity >= 10.0)]
    if conductivity is not None:
        found.append(conductivity_warning("", conductivity, name, material))
    return tuple(w for w in found if w)
