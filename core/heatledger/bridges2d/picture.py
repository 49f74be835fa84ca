"""The picture of a solved 2-D section: the temperature field in colour with isotherms, the
outline of every region, the surfaces drawn by side and the lowest inside surface
temperature marked, as a PNG a reviewer reads at a glance.

matplotlib is imported when a picture is drawn (never by ``import heatledger``), with its
non-interactive Agg canvas, so no display is needed.

Sources: [source: iso10211-method, 11 (temperature field, minimum surface temperature)].
"""

from __future__ import annotations

import io

import numpy as np

__all__ = ["temperature_picture", "ISOTHERM_STEP"]

#: Temperature step between drawn isotherms. [K]
ISOTHERM_STEP = 1.0


def _field(result) -> np.ndarray:
    """Cell temperatures on the grid, NaN where there is no material. [degC]"""
    g = result.grid
    field = np.full(g.active.shape, np.nan)
    field[g.active] = result.cell_temperatures[g.index[g.active]]
    return field


def temperature_picture(result, *, title: str = "", inside=(), lowest=None,
                        width_cm: float = 16.0, height_cm: float = 11.0, dpi: int = 150
                        ) -> bytes:
    """A PNG of the temperature field of a solved section.

    Parameters
    ----------
    result : Section2DResult
        The solved section. [-]
    title : str
        Title above the picture. [-]
    inside : sequence of str
        Inside surfaces, drawn in red (the others in blue). [-]
    lowest : SurfaceMinimum, optional
        The lowest inside surface temperature, marked with its value. [-]
    width_cm, height_cm : float
        Size of the picture. [cm]
    dpi : int
        Resolution. [1/inch]

    Returns
    -------
    bytes
        The PNG file.

    References
    ----------
    [source: iso10211-method, 11].
    """
    import matplotlib

    matplotlib.use("Agg", force=False)
    from matplotlib.figure import Figure

    g = result.grid
    field = _field(result)
    fig = Figure(figsize=(width_cm / 2.54, height_cm / 2.54), dpi=dpi, layout="constrained")
    ax = fig.add_subplot()
    mm = 1000.0
    mesh = ax.pcolormesh(g.xe * mm, g.ye * mm, np.ma.masked_invalid(field), cmap="coolwarm",
                         shading="flat")
    fig.colorbar(mesh, ax=ax, label="temperature [degC]", shrink=0.9)
    xc, yc = (g.xe[:-1] + g.xe[1:]) / 2 * mm, (g.ye[:-1] + g.ye[1:]) / 2 * mm
    lo, hi = np.nanmin(field), np.nanmax(field)
    levels = np.arange(np.ceil(lo / ISOTHERM_STEP), np.floor(hi / ISOTHERM_STEP) + 1) \
        * ISOTHERM_STEP
    if levels.size:
        lines = ax.contour(xc, yc, np.ma.masked_invalid(field), levels=levels, colors="k",
                           linewidths=0.4)
        ax.clabel(lines, lines.levels[::max(1, len(lines.levels) // 8)], fontsize=6,
                  fmt="%g")
    for r in g.blocks.regions:
        ax.add_patch(_rectangle(r, mm))
    for s in g.blocks.surfaces:
        ax.plot([s.x0 * mm, s.x1 * mm], [s.y0 * mm, s.y1 * mm], lw=2.5,
                color="#C0392B" if s.name in inside else "#2E5A9B", solid_capstyle="butt")
    if lowest is not None:
        ax.plot([lowest.x * mm], [lowest.y * mm], marker="o", ms=6, mfc="yellow", mec="k")
        ax.annotate(f"{lowest.temperature:.2f} degC", (lowest.x * mm, lowest.y * mm),
                    textcoords="offset points", xytext=(6, 6), fontsize=7,
                    bbox={"boxstyle": "round", "fc": "white", "alpha": 0.8})
    ax.set_aspect("equal")
    ax.set_xlabel("x [mm]")
    ax.set_ylabel("y [mm]")
    ax.set_title(title or "temperature field", fontsize=9)
    buf = io.BytesIO()
    fig.savefig(buf, format="png", dpi=dpi, metadata={"Software": None})
    return buf.getvalue()


def _rectangle(region, mm):
    from matplotlib.patches import Rectangle

    return Rectangle((region.x0 * mm, region.y0 * mm), (region.x1 - region.x0) * mm,
                     (region.y1 - region.y0) * mm, fill=False, lw=0.5, ec="0.25")
