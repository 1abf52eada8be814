"""Geometric section properties from the mesh: area, centroid, second moments, moduli.

All integrals are taken with coordinates relative to the centroid; reported points are in
drawing coordinates. Units follow the drawing's length unit L: areas L^2, second moments L^4,
section moduli L^3. With element weights E / E_ref the same integrals give the transformed
(modulus-weighted) section.
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace

import numpy as np

from ..fem.p2 import ElementValues, integrate
from ..geometry.curves import Curve
from ..mesh.core import Mesh


@dataclass(frozen=True)
class GeometricProperties:
    """Area properties of the section (drawing length unit L).

    Attributes
    ----------
    A : float
        Area, L^2.
    centroid : tuple of float
        Centroid (x, y) in drawing coordinates, L.
    Ix, Iy, Ixy : float
        Second moments about centroidal axes parallel to x and y: int y^2, int x^2, int x y; L^4.
    I1, I2 : float
        Principal second moments (major, minor), L^4.
    alpha_deg : float
        Angle from +x to principal axis 1, counter-clockwise, degrees, in (-90, 90].
    Ip : float
        Polar second moment about the centroid Ix + Iy, L^4.
    rx, ry, r1, r2 : float
        Radii of gyration sqrt(I/A), L.
    Wel : dict of str to float
        Elastic section moduli I / c to the extreme fibres, L^3. Keys ``x_top``, ``x_bottom``
        (about the x axis, fibre at largest and smallest y), ``y_right``, ``y_left``, ``1_pos``,
        ``1_neg``, ``2_pos``, ``2_neg`` (principal axes; ``pos`` is the side of +axis 2 for axis 1
        and of +axis 1 for axis 2), and the smaller of each pair: ``x``, ``y``, ``1``, ``2``.
    fibres : dict of str to float
        The extreme fibre distances c matching ``Wel``, L.

    """

    A: float
    centroid: tuple[float, float]
    Ix: float
    Iy: float
    Ixy: float
    I1: float
    I2: float
    alpha_deg: float
    Ip: float
    rx: float
    ry: float
    r1: float
    r2: float
    Wel: dict[str, float] = field(default_factory=dict)
    fibres: dict[str, float] = field(default_factory=dict)


def _moduli(
    nodes_local: np.ndarray, Ix: float, Iy: float, I1: float, I2: float, alpha: float
) -> tuple[dict[str, float], dict[str, float]]:
    """Elastic section moduli to the extreme fibres (nodes in centroidal coordinates)."""
    x, y = nodes_local[:, 0], nodes_local[:, 1]
    c, s = np.cos(alpha), np.sin(alpha)
    u = x * c + y * s  # along axis 1
    v = -x * s + y * c  # along axis 2
    fib = {
        "x_top": float(y.max()), "x_bottom": float(-y.min()),
        "y_right": float(x.max()), "y_left": float(-x.min()),
        "1_pos": float(v.max()), "1_neg": float(-v.min()),
        "2_pos": float(u.max()), "2_neg": float(-u.min()),
    }
    moment = {"x": Ix, "y": Iy, "1": I1, "2": I2}
    wel = {k: moment[k.split("_")[0]] / max(d, 1e-300) for k, d in fib.items()}
    for axis, (a, b) in {"x": ("x_top", "x_bottom"), "y": ("y_right", "y_left"),
                         "1": ("1_pos", "1_neg"), "2": ("2_pos", "2_neg")}.items():
        wel[axis] = min(wel[a], wel[b])
    return wel, fib


def arc_extremes(arcs: tuple[Curve, ...], alpha: float) -> np.ndarray:
    """Points of the curves farthest along +-x, +-y and +-the axes at ``alpha`` (radians), (k, 2).

    Between two mesh nodes a circular or elliptical arc bulges beyond both; these points make
    the extreme fibres exact on the true curves. Only points within each arc's sweep are
    returned, drawing unit.
    """
    if not arcs:
        return np.empty((0, 2))
    turns = np.concatenate([np.arange(4) * 0.5 * np.pi, alpha + np.arange(4) * 0.5 * np.pi])
    directions = np.stack([np.cos(turns), np.sin(turns)], axis=1)
    return np.vstack([a.farthest(directions) for a in arcs])


def geometric_properties(mesh: Mesh, ev: ElementValues, origin: np.ndarray,
                         weight: np.ndarray | None = None, *, arcs: tuple[Curve, ...] = ()
                         ) -> tuple[GeometricProperties, ElementValues]:
    """Area, centroid, second moments, principal axes, moduli and radii of gyration.

    Parameters
    ----------
    mesh : Mesh
        The mesh.
    ev : ElementValues
        Basis values with coordinates relative to ``origin``.
    origin : numpy.ndarray
        The origin used for ``ev``, drawing coordinates, L.
    weight : numpy.ndarray, optional
        Element-wise modulus ratio E / E_ref (m,): the properties are then those of the
        transformed section (modulus-weighted, about the modulus-weighted centroid).
    arcs : tuple of Curve
        True circular and elliptical arcs of the outline (:attr:`Profile.arcs`): the extreme
        fibres include their farthest points, not only the mesh nodes.

    Returns
    -------
    GeometricProperties
        The properties.
    ElementValues
        ``ev`` with coordinates shifted to the centroid.

    """
    x, y = ev.xy[..., 0], ev.xy[..., 1]
    one = np.ones_like(x)
    A = integrate(ev, one, weight)
    cx, cy = integrate(ev, x, weight) / A, integrate(ev, y, weight) / A
    evc = replace(ev, xy=ev.xy - np.array([cx, cy]))
    x, y = evc.xy[..., 0], evc.xy[..., 1]
    Ix, Iy = integrate(evc, y * y, weight), integrate(evc, x * x, weight)
    Ixy = integrate(evc, x * y, weight)
    if abs(Ixy) < 1e-13 * (Ix + Iy):  # round-off of a symmetric section
        Ixy = 0.0
    mean, half = 0.5 * (Ix + Iy), 0.5 * (Ix - Iy)
    rad = float(np.hypot(half, Ixy))
    I1, I2 = mean + rad, mean - rad
    alpha = 0.5 * float(np.arctan2(-2.0 * Ixy, Ix - Iy))
    if alpha <= -np.pi / 2 + 1e-15:
        alpha += np.pi
    centroid = (float(origin[0] + cx), float(origin[1] + cy))
    outline = np.vstack([mesh.nodes, arc_extremes(arcs, alpha)])
    wel, fib = _moduli(outline - np.array(centroid), Ix, Iy, I1, I2, alpha)
    props = GeometricProperties(
        A=A, centroid=centroid, Ix=Ix, Iy=Iy, Ixy=Ixy, I1=I1, I2=I2,
        alpha_deg=float(np.degrees(alpha)), Ip=Ix + Iy,
        rx=float(np.sqrt(Ix / A)), ry=float(np.sqrt(Iy / A)),
        r1=float(np.sqrt(I1 / A)), r2=float(np.sqrt(max(I2, 0.0) / A)),
        Wel=wel, fibres=fib,
    )
    return props, evc


__all__ = ["GeometricProperties", "arc_extremes", "geometric_properties"]
