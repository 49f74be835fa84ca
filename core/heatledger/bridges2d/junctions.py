"""Junctions built from the project's constructions: the common 2-D thermal bridges of a
building envelope drawn as regions and surfaces from a construction's layers and a few
dimensions, with the flanking elements EN ISO 10211 subtracts to give psi.

Every layer becomes a band of its equivalent conductivity ``lambda_j = d_j / R_j`` with the
resistance the construction's ladder uses (air layers by EN ISO 6946 Annex D, bridged layers
by their share of the upper/lower-limit mean), so that the flanking part of a section far
from the junction carries the construction's own ``U = 1/R_T``; layers outside a well
ventilated air layer are left out, as the U-value leaves them out. Flanking elements extend
``max(1 m, 3 d)`` beyond the junction (EN ISO 10211, 5.2), ``d`` the thickness of the
flanking element, unless a longer flank is given.

Sources: [source: iso10211-method, 5.2 (cut-off planes), 10.3 (psi)];
[source: iso6946-surfaces, Table 7 (surface resistances)].
"""

from __future__ import annotations

from dataclasses import dataclass, field

from .._validate import non_negative, positive, quote
from ..errors import HeatLedgerError
from ..surfaces import surface_resistance
from .geometry import Region, Surface
from .section import Section2D

__all__ = ["Junction", "JunctionResult", "external_corner", "wall_floor", "stud_wall",
           "general_junction", "layer_bands", "JUNCTION_KINDS", "RESISTANCE_INSIDE_FRSI",
           "MIN_FLANK"]

#: The builders by name (project files and sheets). [-]
JUNCTION_KINDS = ("corner", "floor", "balcony", "stud", "rectangles")
#: Inside surface resistance of the surface-temperature solve (EN ISO 10211, 6.2 and
#: EN ISO 13788: 0.25 m2 K/W for opaque elements). [m2 K/W]
RESISTANCE_INSIDE_FRSI = 0.25
#: Shortest flank from the junction, and the multiple of the flanking thickness. [m], [-]
MIN_FLANK, FLANK_THICKNESSES = 1.0, 3.0


def layer_bands(construction) -> tuple:
    """The counted layers as ``(name, thickness [m], equivalent conductivity [W/(m K)])``,
    inside to outside, with the U-value of the bands ``1/(Rsi + sum d/lambda + Rse)``.

    Parameters
    ----------
    construction : heatledger.Construction
        The flanking construction. [-]

    Returns
    -------
    tuple
        ``(bands, u_value [W/(m2 K)])``.

    References
    ----------
    [source: iso6946-layers, 6.7 (R_T, U)].
    """
    bands = []
    for row, lay in zip(construction.layer_table, construction.layers, strict=True):
        if row.counted:
            bands.append((lay.name or f"layer {row.index + 1}", lay.thickness,
                          lay.thickness / row.resistance))
    r_t = construction.rsi + sum(d / lam for _, d, lam in bands) + construction.rse_used
    return tuple(bands), 1.0 / r_t


def _flank(given, start: float, thickness: float, label: str) -> float:
    """Where a flank ends: ``start`` plus at least ``max(1 m, 3 d)`` (EN ISO 10211, 5.2)."""
    need = start + max(MIN_FLANK, FLANK_THICKNESSES * thickness)
    if given is None:
        return need
    value = positive(label, given, "m")
    if value < need - 1e-9:
        raise HeatLedgerError(f"{label} = {value:g} m is shorter than EN ISO 10211 5.2 asks: "
                              f"the cut must lie max(1 m, 3 x {thickness:g} m) beyond the "
                              f"junction, so {label} must be at least {need:g} m")
    return value


@dataclass(frozen=True)
class Junction:
    """A junction ready to solve: the section twice (design inside surface resistances for
    the heat flow, 0.25 m2 K/W for the surface temperature) and its flanking elements.

    Attributes
    ----------
    kind, name : str
        Builder and label. [-]
    regions, surfaces : tuple
        The geometry with the design surface resistances. [-]
    flanking : tuple of (str, float, float)
        ``(label, U [W/(m2 K)], length [m])`` of each flanking element. [-]
    dimensions : str
        Dimension system of the lengths. [-]
    inside, outside : tuple of str
        Inside and outside surface names. [-]
    description : str
        What was built, in words. [-]
    warnings : tuple of str
        What looks doubtful about the input. [-]

    References
    ----------
    [source: iso10211-method, 5.2, 10.3 and 11].
    """

    kind: str
    name: str
    regions: tuple
    surfaces: tuple
    flanking: tuple
    dimensions: str
    inside: tuple
    outside: tuple
    description: str = ""
    warnings: tuple = field(default=())

    def section(self, *, for_temperature: bool = False) -> Section2D:
        """The section; for the surface temperature the inside surfaces take R_si 0.25.

        Parameters
        ----------
        for_temperature : bool
            Use ``RESISTANCE_INSIDE_FRSI`` on the inside surfaces. [-]
        """
        if not for_temperature:
            return Section2D(self.regions, self.surfaces)
        surfaces = [Surface(s.x0, s.y0, s.x1, s.y1, temperature=s.temperature,
                            resistance=RESISTANCE_INSIDE_FRSI if s.name in self.inside
                            else s.resistance, name=s.name) for s in self.surfaces]
        return Section2D(self.regions, surfaces)

    def solve(self, max_cell=0.005) -> JunctionResult:
        """Solve both sections; psi, f_Rsi and the lowest inside surface temperature.

        Parameters
        ----------
        max_cell : float
            Largest cell edge. [m]

        Returns
        -------
        JunctionResult

        References
        ----------
        [source: iso10211-method, 10.3 and 11].
        """
        flow = self.section().solve(max_cell)
        temp = self.section(for_temperature=True).solve(max_cell)
        psi = flow.psi([(u, length) for _, u, length in self.flanking],
                       dimensions=self.dimensions, inside=self.inside, outside=self.outside)
        low = temp.min_surface_temperature(self.inside)
        return JunctionResult(self, flow, temp, psi, low,
                              temp.surface_factor(self.inside, self.outside))


@dataclass(frozen=True)
class JunctionResult:
    """What a junction's two solves give.

    Attributes
    ----------
    junction : Junction
        What was solved. [-]
    flow_solve, temperature_solve : Section2DResult
        The solves with design R_si and with R_si = 0.25. [-]
    psi_result : PsiResult
        psi, L_2D and the flanking sum. [-]
    lowest : SurfaceMinimum
        The lowest inside surface temperature (R_si 0.25) and where it is. [-]
    surface_factor : float
        f_Rsi at R_si 0.25. [-]

    References
    ----------
    [source: iso10211-method, 10.3 and 11].
    """

    junction: Junction
    flow_solve: object
    temperature_solve: object
    psi_result: object
    lowest: object
    surface_factor: float


def _depths(bands):
    """Depth ranges ``(name, a, b, lambda)`` of the bands from the outside face, and the
    total thickness [m]."""
    total = sum(d for _, d, _ in bands)
    out, depth = [], total
    for name, d, lam in bands:  # inside to outside: depth from the outside face falls
        out.append((name, depth - d, depth, lam))
        depth -= d
    return out, total


def external_corner(wall, *, flank=None, temp_inside=20.0, temp_outside=0.0,
                    name: str = "") -> Junction:
    """An external corner of two walls of one construction (plan section, 90 degrees).

    The outside corner is at the origin; wall A runs along +x, wall B along +y; each layer
    turns the corner as an L-shaped band. psi is given with external dimensions (each
    flank's length to the outside corner).

    Parameters
    ----------
    wall : heatledger.Construction
        The wall, inside to outside. [-]
    flank : float, optional
        Length of each wall from the outside corner; default ``d + max(1 m, 3 d)``. [m]
    temp_inside, temp_outside : float
        Ambient temperatures. [degC]
    name : str
        Label. [-]

    Returns
    -------
    Junction

    References
    ----------
    [source: iso10211-method, 5.2 and 10.3].
    """
    bands, u = layer_bands(wall)
    depths, t = _depths(bands)
    length = _flank(flank, t, t, "flank")
    regions = []
    for lname, a, b, lam in reversed(depths):  # outside first
        regions.append(Region(a, a, length, b, lam, name=f"{lname} (wall A)"))
        regions.append(Region(a, a, b, length, lam, name=f"{lname} (wall B)"))
    rsi, rse = wall.rsi, wall.rse_used
    surfaces = (Surface(0, 0, length, 0, temperature=temp_outside, resistance=rse,
                        name="outside A"),
                Surface(0, 0, 0, length, temperature=temp_outside, resistance=rse,
                        name="outside B"),
                Surface(t, t, length, t, temperature=temp_inside, resistance=rsi,
                        name="inside A"),
                Surface(t, t, t, length, temperature=temp_inside, resistance=rsi,
                        name="inside B"))
    return Junction("corner", name or f"external corner of {wall.name or 'a wall'}",
                    tuple(regions), surfaces,
                    (("wall A", u, length), ("wall B", u, length)), "external",
                    ("inside A", "inside B"), ("outside A", "outside B"),
                    f"external corner, walls {t * 1000:.0f} mm thick, flanks {length:g} m "
                    "from the outside corner (external dimensions)")


def wall_floor(wall, floor, *, bearing=None, projection=0.0, flank=None, floor_flank=None,
               temp_inside=20.0, temp_outside=0.0, name: str = "") -> Junction:
    """An intermediate floor meeting an external wall (vertical section), or a balcony slab
    through the wall (``projection`` > 0).

    The wall's outside face is at x = 0 and its inside face at x = d; the floor build-up
    (its layers top to bottom) enters the wall by ``bearing`` from the inside face and runs
    into the room to the cut at ``floor_flank``; a balcony carries the build-up through the
    wall and ``projection`` beyond it. Both rooms are at ``temp_inside``. psi is given with
    external dimensions: the wall's height between the two cuts.

    Parameters
    ----------
    wall : heatledger.Construction
        The external wall, inside to outside. [-]
    floor : heatledger.Construction
        The floor build-up, top to bottom. [-]
    bearing : float, optional
        Depth of the floor in the wall from the inside face; default the wall's layers
        inside its most insulating layer. [m]
    projection : float
        Length of a balcony slab outside the wall (0 = none). [m]
    flank : float, optional
        Wall height above and below the floor; default ``max(1 m, 3 d_wall)``. [m]
    floor_flank : float, optional
        Floor length inside from the wall's inside face; default ``max(1 m, 3 d_floor)``. [m]
    temp_inside, temp_outside : float
        Ambient temperatures. [degC]
    name : str
        Label. [-]

    Returns
    -------
    Junction

    References
    ----------
    [source: iso10211-method, 5.2 and 10.3]; [source: iso6946-surfaces, Table 7].
    """
    w_bands, u = layer_bands(wall)
    f_bands, _ = layer_bands(floor)
    depths, t = _depths(w_bands)
    h = sum(d for _, d, _ in f_bands)
    p = non_negative("projection", projection, "m")
    depth = t if p > 0 else _bearing(bearing, depths, t)
    below = _flank(flank, 0.0, t, "flank")
    top = below + h
    height = top + below
    reach = t + _flank(floor_flank, 0.0, h, "floor_flank")
    regions = [Region(a, 0.0, b, height, lam, name=lname) for lname, a, b, lam in depths]
    y = top
    for lname, d, lam in f_bands:  # top to bottom
        regions.append(Region(-p if p > 0 else t - depth, y - d, reach, y, lam,
                              name=f"{lname} (floor)"))
        y -= d
    surfaces = _floor_surfaces(wall, p, t, below, top, height, reach, temp_inside,
                               temp_outside)
    kind = "balcony" if p > 0 else "floor"
    inside = tuple(s.name for s in surfaces if s.temperature == temp_inside)
    outside = tuple(s.name for s in surfaces if s.temperature == temp_outside)
    return Junction(kind, name or f"{kind} at {wall.name or 'a wall'}", tuple(regions),
                    surfaces, (("wall", u, height),), "external", inside, outside,
                    f"{'balcony slab' if p > 0 else 'intermediate floor'} {h * 1000:.0f} mm "
                    f"in a {t * 1000:.0f} mm wall, "
                    + (f"projecting {p:g} m" if p > 0 else f"bearing {depth * 1000:.0f} mm")
                    + f"; wall {below:g} m above and below, floor {reach - t:g} m inside")


def _bearing(bearing, depths, t) -> float:
    if bearing is not None:
        value = positive("bearing", bearing, "m")
        if value > t + 1e-12:
            raise HeatLedgerError(f"bearing = {value:g} m is deeper than the wall "
                                  f"({t:g} m); a slab through the wall is a balcony "
                                  "(give projection)")
        return value
    lowest = min(depths, key=lambda item: item[3])  # the most insulating layer
    return t - lowest[2]


def _floor_surfaces(wall, p, t, below, top, height, reach, t_in, t_out) -> tuple:
    rse, rsi = wall.rse_used, wall.rsi
    down, up = surface_resistance("inside", "down"), surface_resistance("inside", "up")
    out = [Surface(0, 0, 0, below, temperature=t_out, resistance=rse, name="outside below"),
           Surface(0, top, 0, height, temperature=t_out, resistance=rse,
                   name="outside above")]
    if p > 0:
        out += [Surface(-p, top, 0, top, temperature=t_out, resistance=rse,
                        name="balcony top"),
                Surface(-p, below, 0, below, temperature=t_out, resistance=rse,
                        name="balcony soffit"),
                Surface(-p, below, -p, top, temperature=t_out, resistance=rse,
                        name="balcony edge")]
    else:
        out[0] = Surface(0, 0, 0, height, temperature=t_out, resistance=rse, name="outside")
        out.pop()
    out += [Surface(t, 0, t, below, temperature=t_in, resistance=rsi, name="wall below"),
            Surface(t, top, t, height, temperature=t_in, resistance=rsi, name="wall above"),
            Surface(t, top, reach, top, temperature=t_in, resistance=down,
                    name="floor surface"),
            Surface(t, below, reach, below, temperature=t_in, resistance=up, name="ceiling")]
    return tuple(out)


def stud_wall(construction, layer: int, *, stud_width, stud_conductivity, spacing,
              temp_inside=20.0, temp_outside=0.0, name: str = "") -> Junction:
    """Studs through an insulation layer (plan section of one stud spacing, cut at the
    symmetry planes midway between studs).

    psi is the stud's linear transmittance against the clear wall, ``L_2D - U_clear s``;
    ``L_2D / s`` is the U-value of the studded wall.

    Parameters
    ----------
    construction : heatledger.Construction
        The clear wall (without studs), inside to outside. [-]
    layer : int
        Index of the layer the studs replace (0 = inside layer). [-]
    stud_width : float
        Width of a stud. [m]
    stud_conductivity : float
        Conductivity of the studs. [W/(m K)]
    spacing : float
        Centre-to-centre spacing of the studs. [m]
    temp_inside, temp_outside : float
        Ambient temperatures. [degC]
    name : str
        Label. [-]

    Returns
    -------
    Junction

    References
    ----------
    [source: iso10211-method, 10.3]; [source: iso6946-layers, 6.7.2].
    """
    bands, u = layer_bands(construction)
    depths, t = _depths(bands)
    if not 0 <= int(layer) < len(depths):
        raise HeatLedgerError(f"layer = {layer}: the construction has counted layers 0 to "
                              f"{len(depths) - 1} (0 = inside)")
    s = positive("spacing", spacing, "m")
    w = positive("stud_width", stud_width, "m")
    if w >= s:
        raise HeatLedgerError(f"stud_width {w:g} m must be less than the spacing {s:g} m")
    lam = positive("stud_conductivity", stud_conductivity, "W/(m K)")
    regions = [Region(0.0, a, s, b, k, name=lname) for lname, a, b, k in depths]
    lname, a, b, _ = depths[int(layer)]
    regions.append(Region((s - w) / 2, a, (s + w) / 2, b, lam, name=f"stud in {lname}"))
    surfaces = (Surface(0, 0, s, 0, temperature=temp_outside, resistance=construction.rse_used,
                        name="outside"),
                Surface(0, t, s, t, temperature=temp_inside, resistance=construction.rsi,
                        name="inside"))
    return Junction("stud", name or f"studs in {quote(lname)}", tuple(regions), surfaces,
                    (("clear wall", u, s),), "external", ("inside",), ("outside",),
                    f"studs {w * 1000:.0f} mm wide at {s * 1000:.0f} mm centres through "
                    f"{lname}")


def general_junction(regions, surfaces, flanking, *, dimensions="external", inside=None,
                     outside=None, name: str = "") -> Junction:
    """A junction drawn as rectangles and surfaces, with its flanking elements.

    Parameters
    ----------
    regions : sequence of Region
        Material rectangles (later ones overlay earlier ones). [-]
    surfaces : sequence of Surface
        Outline pieces with ambient temperature and surface resistance. [-]
    flanking : sequence of (str, float, float)
        ``(label, U [W/(m2 K)], length [m])`` of each flanking element. [-]
    dimensions : str
        Dimension system of the lengths. [-]
    inside, outside : sequence of str, optional
        Surface names; default the surfaces at the higher and the lower temperature. [-]
    name : str
        Label. [-]

    Returns
    -------
    Junction

    References
    ----------
    [source: iso10211-method, 10.3].
    """
    surfaces = tuple(surfaces)
    temps = sorted({s.temperature for s in surfaces})
    if inside is None:
        inside = tuple(s.name for s in surfaces if s.temperature == temps[-1])
    if outside is None:
        outside = tuple(s.name for s in surfaces if s.temperature == temps[0])
    return Junction("rectangles", name or "junction", tuple(regions), surfaces,
                    tuple((str(lab), float(u), float(length)) for lab, u, length in flanking),
                    dimensions, tuple(inside), tuple(outside), "drawn as rectangles")
