"""Pictures of recovered stresses: torsion shear stress, and combined-load stresses per material.

The figures draw stresses computed by :mod:`warpwise.stress` (the caller runs
:func:`~warpwise.stress.torsion_stress` or :func:`~warpwise.stress.combined_stress` and passes
the result). Each material is drawn from its own nodal values, so a stress that jumps at a
material interface shows the jump.
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np
from matplotlib.figure import Figure
from matplotlib.lines import Line2D
from matplotlib.patches import Circle

from ..errors import UsageError
from ..geometry.corners import Corner
from ..properties.analysis import SectionResult
from ..stress import CombinedStress, Loads, MaterialField, TorsionStress
from ..units import FORCE, MOMENT, STRESS, TWIST, Converter
from . import plot_parts as parts
from .picture_parts import ARROW_CELLS, CORNER_COLOUR, PEAK_COLOUR, arrow_nodes

#: Stress pictures :func:`figure_combined` draws: stress field attribute and axis label.
COMBINED_QUANTITIES = {
    "sigma": ("sigma", "normal stress sigma_z"),
    "tau": ("tau", "resultant shear stress tau"),
    "von_mises": ("von_mises", "von Mises stress"),
}



# ----------------------------------------------------------------------------------------------
# drawing pieces

def _nodal_fields(result: SectionResult, fields: Sequence[MaterialField], attr: str,
                  show: Converter) -> list[tuple[np.ndarray | None, np.ndarray]]:
    """(element mask, nodal stresses (n,) in ``show``'s unit) of each material's field ``attr``."""
    out = []
    for f in fields:
        z = np.zeros(result.mesh.n_nodes)
        z[f.nodes] = show(getattr(f, attr), STRESS)
        out.append((result.materials.group == f.group if result.composite else None, z))
    return out


def _draw_fields(ax: object, result: SectionResult,
                 fields: list[tuple[np.ndarray | None, np.ndarray]], levels: np.ndarray, cmap: str,
                 extend: str) -> object:
    """Filled contours of per-material nodal fields, one colour scale; the last contour set."""
    fill = None
    for mask, z in fields:
        fill = ax.tricontourf(parts.triangulation(result, mask), z, levels=levels, cmap=cmap,
                              extend=extend, zorder=1)
    fill.set_gid("stress-contours")
    return fill


def _draw_arrows(ax: object, result: SectionResult, stress: TorsionStress) -> Line2D:
    """Stress-direction arrows on a grid, lengths in proportion up to the largest stress."""
    pick = arrow_nodes(result)
    u, v = stress.tau_zx[pick], stress.tau_zy[pick]
    top = stress.tau_max
    clip = np.minimum(1.0, top / np.maximum(np.hypot(u, v), 1e-300))  # corner values would swamp the rest
    step = result.profile.size / ARROW_CELLS
    ax.quiver(result.mesh.nodes[pick, 0], result.mesh.nodes[pick, 1], u * clip, v * clip,
              angles="xy", scale_units="xy", scale=top / (0.85 * step), color="#1f2a33",
              width=0.0028, headwidth=4.0, headlength=4.5, headaxislength=4.0, pivot="mid",
              zorder=5, gid="stress-arrows")
    return Line2D([], [], marker=r"$\rightarrow$", ms=12, color="#1f2a33", ls="none",
                  label="stress direction, length in proportion to the stress")


def _mark_peak(ax: object, at: tuple[float, float], label: str, ms: float = 14) -> Line2D:
    """A star at the largest stress; return its legend entry."""
    ax.plot([at[0]], [at[1]], marker="*", ms=ms, mfc=PEAK_COLOUR, mec="white", mew=0.9, ls="none",
            zorder=9, gid="largest-stress")
    return Line2D([], [], marker="*", ms=ms - 2, mfc=PEAK_COLOUR, mec="white", ls="none", label=label)


def _draw_corners(ax: object, corners: Sequence[Corner]) -> list[Line2D]:
    """Mark sharp re-entrant corners with the circle left out of the stress maxima."""
    if not corners:
        return []
    xy = np.array([[c.x, c.y] for c in corners])
    for c in corners:
        ax.add_patch(Circle((c.x, c.y), c.radius, fill=False, ec=CORNER_COLOUR, lw=0.8, ls="--",
                            zorder=7))
    ax.plot(xy[:, 0], xy[:, 1], ls="none", marker="X", ms=8, mfc=CORNER_COLOUR, mec="white", mew=0.8,
            zorder=8, gid="sharp-corners")
    return [Line2D([], [], ls="none", marker="X", ms=8, mfc=CORNER_COLOUR, mec="white",
                   label=f"sharp re-entrant corner{'s' if len(corners) > 1 else ''} "
                         "(stress there depends on the mesh; dashed circle left out of the maximum)")]


def _loads_text(loads: Loads, show: Converter) -> str:
    dims = {"N": FORCE, "Vx": FORCE, "Vy": FORCE, "Mx": MOMENT, "My": MOMENT, "T": MOMENT}
    shown = [f"{k} = {parts.fmt(show(getattr(loads, k), dims[k]))} {show.unit(dims[k])}"
             for k in ("N", "Mx", "My", "Vx", "Vy", "T") if getattr(loads, k)]
    return ", ".join(shown)


# ----------------------------------------------------------------------------------------------
# figures

def figure_torsion(result: SectionResult, stress: TorsionStress, *, width: float = parts.WIDTH,
                   units: str | None = None) -> Figure:
    """Contours of the resultant torsion shear stress, with arrows and the largest value.

    Parameters
    ----------
    result : SectionResult
        An analysed section.
    stress : TorsionStress
        Its torsion stresses, from :func:`warpwise.stress.torsion_stress` (torque force x L,
        stresses force / L^2); the title gives the twist rate when it is known.
    width : float
        Figure width, inches.
    units : str, optional
        Unit system the picture shows its values in (default the profile's).

    Returns
    -------
    matplotlib.figure.Figure
        Bands of tau = |(tau_zx, tau_zy)| (each material from its own nodal values) up to the
        largest value away from sharp re-entrant corners (higher values near those corners
        take the top colour), stress-direction arrows on a grid (lengths in proportion to
        tau), the largest value marked, and every sharp re-entrant corner marked with the
        circle left out of the maximum.

    """
    show = Converter.of(result.units, units)
    top, at = show(stress.tau_max, STRESS), stress.tau_max_at
    fig, ax = parts.new_figure(result, show)
    fill = _draw_fields(ax, result, _nodal_fields(result, stress.by_material, "tau", show),
                        parts.contour_levels(0.0, top, signed=False), parts.MAGNITUDE_MAP, "max")
    parts.draw_boundary(ax, result)
    unit = show.unit(STRESS)
    handles = [
        _mark_peak(ax, at, f"largest shear stress {parts.fmt(top)} {unit} at "
                           f"{parts.point_text(show, at)}", ms=15),
        _draw_arrows(ax, result, stress),
        *_draw_corners(ax, result.corners),
        parts.mark_shear_centre(ax, result, show),
    ]
    parts.colour_bar(fig, ax, fill, f"resultant shear stress tau ({unit})")
    title = (f"{parts.profile_name(result)}: torsion shear stress for "
             f"T = {parts.fmt(show(stress.torque, MOMENT))} {show.unit(MOMENT)}")
    if stress.twist_rate is not None:
        title += (f"\ntwist rate theta = {show(stress.twist_rate, TWIST):.4g} {show.unit(TWIST)} "
                  f"(G = {parts.fmt(show(stress.shear_modulus, STRESS))} {unit})")
    parts.finish(fig, ax, result, title, handles, ncols=1, colour_bar=True, width=width)
    return fig


def _peak_handles(ax: object, result: SectionResult, stress: CombinedStress, quantity: str,
                  show: Converter) -> list[Line2D]:
    """Mark the largest value of each material; return the legend entries."""
    attr, label = COMBINED_QUANTITIES[quantity]
    unit, nodes = show.unit(STRESS), result.mesh.nodes
    handles = []
    for ms in stress.by_material:
        if quantity == "von_mises":
            at, value = ms.von_mises_at, ms.von_mises_max
        else:
            vals = getattr(ms, attr)
            k = int(np.argmax(np.abs(vals)))
            at, value = tuple(nodes[ms.nodes[k]]), float(vals[k])
        name = f" in {ms.material}" if ms.material else ""
        extra = ""
        if quantity == "von_mises" and ms.utilisation is not None:
            extra = f", {100 * ms.utilisation:.3g}% of fy (informative, not a code check)"
        handles.append(_mark_peak(
            ax, at, f"largest {label}{name}: {parts.fmt(show(value, STRESS))} {unit}{extra}"))
    return handles


def figure_combined(result: SectionResult, stress: CombinedStress, quantity: str = "von_mises", *,
                    width: float = parts.WIDTH, units: str | None = None) -> Figure:
    """Stress contours for combined loads, each material on its own nodal values.

    Parameters
    ----------
    result : SectionResult
        An analysed section (with materials for a composite section).
    stress : CombinedStress
        Its stresses under the loads, from :func:`warpwise.stress.combined_stress` (section
        forces N, Vx, Vy in force, Mx, My, T in force x L; stresses force / L^2).
    quantity : str
        ``von_mises`` (default), ``sigma`` (normal stress sigma_z, tension positive, with the
        line of zero stress drawn) or ``tau`` (resultant shear stress).
    width : float
        Figure width, inches.
    units : str, optional
        Unit system the picture shows its values in (default the profile's).

    Returns
    -------
    matplotlib.figure.Figure
        One colour scale for all materials, in the stress unit; the largest value of each
        material (away from sharp re-entrant corners for von Mises) is marked.

    Raises
    ------
    UsageError
        For an unknown quantity.

    """
    if quantity not in COMBINED_QUANTITIES:
        raise UsageError(f"unknown stress picture {quantity!r} (use {', '.join(COMBINED_QUANTITIES)})")
    attr, label = COMBINED_QUANTITIES[quantity]
    show = Converter.of(result.units, units)
    fields = _nodal_fields(result, [ms.field for ms in stress.by_material], attr, show)
    signed = quantity == "sigma"
    lo = show(min(float(getattr(ms, attr).min()) for ms in stress.by_material), STRESS)
    hi = show(max(float(getattr(ms, attr).max()) for ms in stress.by_material), STRESS)
    if signed:
        levels = parts.contour_levels(lo, hi, signed=True)
    else:
        top = max(getattr(ms, f"{attr}_max") for ms in stress.by_material)
        levels = parts.contour_levels(0.0, show(top, STRESS), signed=False)
    fig, ax = parts.new_figure(result, show)
    fill = _draw_fields(ax, result, fields, levels, parts.SIGNED_MAP if signed else parts.MAGNITUDE_MAP,
                        "neither" if signed else "max")
    handles = []
    if signed and lo < 0 < hi:
        for mask, z in fields:
            ax.tricontour(parts.triangulation(result, mask), z, levels=[0.0], colors=parts.EDGE_COLOUR,
                          linewidths=1.0, linestyles="dashed", zorder=4)
        handles.append(Line2D([], [], color=parts.EDGE_COLOUR, lw=1.0, ls="dashed",
                              label="zero normal stress (neutral axis)"))
    parts.draw_boundary(ax, result)
    handles += _peak_handles(ax, result, stress, quantity, show)
    handles += [] if signed else _draw_corners(ax, result.corners)
    parts.colour_bar(fig, ax, fill, f"{label} ({show.unit(STRESS)})")
    title = f"{parts.profile_name(result)}: {label}\nloads {_loads_text(stress.loads, show)}"
    parts.finish(fig, ax, result, title, handles, ncols=1, colour_bar=True, width=width)
    return fig
