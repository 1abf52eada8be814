"""The error a result owes to its meshed outline: curved element edges against the true curves.

Where the outline follows a recorded arc (of a circle or an ellipse), each boundary element
edge is the quadratic through three points of the arc: between them it lies a little inside or
outside the true curve. The mesh then describes a slightly different section, and no
refinement of the interior sees that difference. This module measures it: Gauss points along
every such edge, the offset dn of the true curve from the edge along the edge's outward normal
(positive where the true section has material the mesh lacks), and the first-order change of
each value when the boundary moves by dn (the shape derivative):

- an area integral int f dA changes by the boundary integral of f dn;
- J = min over psi of int |grad psi - p|^2 dA, p = (y, -x) about the centroid, is an energy
  minimum with a natural boundary condition, so it changes by the boundary integral of
  |grad psi - p|^2 dn, the squared shear stress per unit twist (Hadamard's formula for
  Neumann problems; common practice, no source); the element shear-modulus ratios weight it
  in a composite section;
- Cw and the shear centre depend on the warping function inside as well: an adjoint solve each
  on the result's own factorisation gives that part (see :func:`outline_corrections`).

The shear areas and omega_max get no term: their outline error is left to the refinement,
which splits boundary edges with the rest. Interfaces between materials on an arc get no term
either (they move material from one region to the other rather than add or remove it).

Examples
--------
>>> from warpwise.geometry.shapes import tube
>>> from warpwise.properties.analysis import analyse
>>> res = analyse(tube(40.0, 30.0, segments=64))
>>> d = outline_corrections(res)
>>> exact = 3.141592653589793 * (40.0**4 - 30.0**4) / 32.0  # Ip of the true tube
>>> bool(abs(res.torsion.J + d["J"] - exact) < 1e-4 * abs(res.torsion.J - exact))
True
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..fem.p2 import assemble_vector, interpolate, shape_functions
from ..fem.points import Located, gradient_at, value_at
from ..geometry.curves import Curve
from ..mesh.core import Mesh
from ..mesh.edges import LOCAL_EDGES

#: Gauss-Legendre points along each curved boundary edge (the offset is a smooth quartic-like
#: sliver; 6 points integrate its products with the quadratic fields to round-off).
EDGE_POINTS = 6
#: A node is on a curve when its radius in the curve's scaled frame is within this of 1.
ON_CURVE = 1e-9


@dataclass(frozen=True, eq=False)
class OutlineOffsets:
    """Points along the curved boundary edges and how far the true curve is from them.

    Attributes
    ----------
    element : numpy.ndarray
        Element (g,) holding each point.
    ref : numpy.ndarray
        Reference coordinates (g, 2) of each point in its element.
    xy : numpy.ndarray
        Drawing coordinates (g, 2), L.
    weight : numpy.ndarray
        Gauss weight times edge length element ds (g,), L.
    offset : numpy.ndarray
        Distance (g,) from the edge to the true curve along the outward normal, L; positive
        where the true section extends beyond the mesh.
    """

    element: np.ndarray
    ref: np.ndarray
    xy: np.ndarray
    weight: np.ndarray
    offset: np.ndarray


def _edge_owners(mesh: Mesh, edge_ids: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Element and local edge number (0, 1, 2) of each of the given boundary edges."""
    flat = mesh.edges.of_element.reshape(-1)
    where = np.full(len(mesh.edges.nodes), -1, dtype=np.int64)
    where[flat] = np.arange(len(flat))  # a boundary edge has one element: one position
    pos = where[edge_ids]
    return pos // 3, pos % 3


def _on_curve(points: np.ndarray, curve: Curve) -> np.ndarray:
    """True where points (k, 2) lie on the curve (on its circle or ellipse, within its sweep)."""
    return (np.abs(curve.rho(points) - 1.0) <= ON_CURVE) & curve.contains_angle(curve.param(points))


def outline_offsets(mesh: Mesh, arcs: tuple[Curve, ...]) -> OutlineOffsets:
    """Gauss points on the boundary edges that follow a curve, with the true curve's offset.

    Parameters
    ----------
    mesh : Mesh
        A six-node mesh whose boundary nodes on arcs lie on them (as built).
    arcs : tuple of Curve
        The recorded circular and elliptical arcs of the profile.

    Returns
    -------
    OutlineOffsets
        Empty arrays when no boundary edge follows an arc.
    """
    bnd = mesh.edges.boundary
    nodes = mesh.edges.nodes[bnd]
    element, local = _edge_owners(mesh, bnd)
    s, w = np.polynomial.legendre.leggauss(EDGE_POINTS)
    s, w = 0.5 * (s + 1.0), 0.5 * w
    parts = []
    taken = np.zeros(len(bnd), bool)
    for arc in arcs:
        on = ~taken
        for k in range(3):
            on &= _on_curve(mesh.nodes[nodes[:, k]], arc)
        taken |= on
        if not on.any():
            continue
        e, loc = element[on], local[on]
        # reference coordinates along local edge k, from its first corner to its second
        corner_ref = np.array([[0.0, 0.0], [1.0, 0.0], [0.0, 1.0]])
        start = corner_ref[LOCAL_EDGES[loc, 0]]
        end = corner_ref[LOCAL_EDGES[loc, 1]]
        ref = start[:, None, :] + s[None, :, None] * (end - start)[:, None, :]  # (k, g, 2)
        N, dN = shape_functions(ref.reshape(-1, 2))
        X = np.repeat(mesh.nodes[mesh.elements[e]], len(s), axis=0)  # (k g, 6, 2)
        xy = np.einsum("pk,pki->pi", N, X)
        jac = np.einsum("pki,pkj->pij", X, dN)  # d x_i / d xi_j
        dref = np.repeat(end - start, len(s), axis=0)
        tangent = np.einsum("pij,pj->pi", jac, dref)  # dx/ds, s in (0, 1)
        ds = np.hypot(tangent[:, 0], tangent[:, 1])
        # material on the left of the element's counter-clockwise edge: outward is the right
        outward = np.column_stack([tangent[:, 1], -tangent[:, 0]]) / ds[:, None]
        # the curve's point where the mesh puts nodes (radial in its scaled frame); its
        # component along the normal is the offset, to first order
        true = arc.onto(xy)
        parts.append((np.repeat(e, len(s)), ref.reshape(-1, 2), xy, np.tile(w, len(e)) * ds,
                      np.einsum("pi,pi->p", true - xy, outward)))
    if not parts:
        empty = np.zeros(0)
        return OutlineOffsets(np.zeros(0, np.int64), np.zeros((0, 2)), np.zeros((0, 2)), empty,
                              empty)
    return OutlineOffsets(*(np.concatenate([p[i] for p in parts]) for i in range(5)))


def _adjoint_gradients(result: object, at: Located, weights: list[np.ndarray]) -> list[np.ndarray]:
    """Gradients at ``at`` of the solutions lambda of K lambda = int w N dA, one per weight.

    Each weight (m, q) is a field at the quadrature points with zero integral on each part
    (a compatible Neumann load); the result's own factorisation solves it.
    """
    mesh, evc = result.mesh, result.basis
    out = []
    for w in weights:
        rhs = assemble_vector(mesh, np.einsum("mq,qk->mk", w * evc.dA, evc.N))
        out.append(gradient_at(mesh, result.solver.solve(rhs), at))
    return out


def outline_corrections(result: object, offsets: OutlineOffsets | None = None) -> dict[str, float]:
    """First-order changes of a result's values from its meshed outline to the true one.

    J, the areas and second moments take the boundary integrals of the module notes. Cw and
    the shear centre, which depend on the warping function inside, take its change as well,
    through an adjoint solve each on the result's factorisation: with omega = psi + b x + c y
    (the projection that gives the shear centre) and lambda solving the warping problem under
    the load 2 E omega, dCw = int (E omega^2 - G (grad psi - p) . grad lambda) dn; the
    coefficients b, c of the normal equations S (b, c) = -(int E x psi, int E y psi) change by
    -S^-1 (dS (b, c) + dr), each dr from the boundary term and an adjoint under the load E x or
    E y (the Lagrangian of the warping problem; common practice, no source).

    Parameters
    ----------
    result : SectionResult
        An analysis (its mesh, profile arcs, warping function, materials, factorisation).
    offsets : OutlineOffsets, optional
        Where the true outline is (default :func:`outline_offsets` of the profile's arcs).

    Returns
    -------
    dict of str to float
        ``A`` (L^2), ``Ix``, ``Iy``, ``Ixy``, ``I1``, ``I2`` (L^4, about the centroid and the
        principal axes), ``J`` (L^4), ``Cw`` (L^6), ``xs``, ``ys`` (L): what to add to the
        mesh's value to get the true outline's, to first order in the offset; all zero
        without recorded arcs. ``Cw``, ``xs`` and ``ys`` stay zero for a profile of separate
        parts (each part's own shear centre).
    """
    mesh = result.mesh
    off = outline_offsets(mesh, result.profile.arcs) if offsets is None else offsets
    keys = ("A", "Ix", "Iy", "Ixy", "I1", "I2", "J", "Cw", "xs", "ys")
    out = dict.fromkeys(keys, 0.0)
    if len(off.weight) == 0:
        return out
    geo = result.geometric
    wdn = off.weight * off.offset
    x, y = (off.xy - np.array(geo.centroid)).T
    a = np.radians(geo.alpha_deg)
    u, v = x * np.cos(a) + y * np.sin(a), -x * np.sin(a) + y * np.cos(a)
    out.update({"A": float(wdn.sum()), "Ix": float(wdn @ (y * y)), "Iy": float(wdn @ (x * x)),
                "Ixy": float(wdn @ (x * y)), "I1": float(wdn @ (v * v)), "I2": float(wdn @ (u * u))})
    # the warping quantities about the weighted centroid, as torsion_properties computes them
    wgeo = result.weighted
    wx, wy = (off.xy - np.array(wgeo.centroid)).T
    at = Located(off.element, off.ref, np.ones(len(off.element), bool))
    tor = result.torsion
    grad = gradient_at(mesh, tor.psi, at)
    strain = np.column_stack([grad[:, 0] - wy, grad[:, 1] + wx])  # grad psi - p
    E, G = result.materials.E[off.element], result.materials.G[off.element]
    out["J"] = float((wdn * G) @ (strain * strain).sum(axis=1))
    if result.solver.n_parts > 1:
        return out
    evc = result.basis
    omega_q = interpolate(mesh, evc, tor.omega)
    qx, qy = evc.xy[..., 0], evc.xy[..., 1]
    wE = result.materials.E[:, None]
    g_omega, g_x, g_y = _adjoint_gradients(result, at, [2.0 * wE * omega_q, wE * qx, wE * qy])
    omega_b = value_at(mesh, tor.omega, at)
    psi_b = value_at(mesh, tor.psi, at)
    work = lambda g: (strain * g).sum(axis=1)  # noqa: E731  (G (grad psi - p) . grad lambda)
    out["Cw"] = float(wdn @ (E * omega_b**2 - G * work(g_omega)))
    S = np.array([[wgeo.Iy, wgeo.Ixy], [wgeo.Ixy, wgeo.Ix]])
    b, c = -tor.shear_centre[1] + wgeo.centroid[1], tor.shear_centre[0] - wgeo.centroid[0]
    dS = np.array([[wdn @ (E * wx * wx), wdn @ (E * wx * wy)],
                   [wdn @ (E * wx * wy), wdn @ (E * wy * wy)]])
    dr = np.array([wdn @ (E * wx * psi_b - G * work(g_x)), wdn @ (E * wy * psi_b - G * work(g_y))])
    db, dc = -np.linalg.solve(S, dS @ np.array([b, c]) + dr)
    out["xs"], out["ys"] = float(dc), float(-db)
    return out
