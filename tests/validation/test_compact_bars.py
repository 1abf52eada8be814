"""Compact solid bars at the default and the fine mesh: J and Cw against outside references.

Cw of a compact bar is a small remainder (the warping of a nearly round section), so its
relative error is far larger than that of J on the same mesh; DESIGN.md's targets are 1e-3 at
the default mesh and 1e-5 at ``--accuracy fine`` (refine 2).

References:

- Rectangles: the series solution (Timoshenko & Goodier, Theory of Elasticity, torsion of
  rectangular bars, from memory): J by its series, Cw = int psi^2 dA by the series integrated
  term by term (``rectangle_J``, ``rectangle_Cw`` of test_error_estimates, derived there).
- Regular hexagon and octagon (no closed form for Cw): scikit-fem (Gustafsson & McBain, J. Open
  Source Softw. 5 (2020) 2369) with its own P2 elements on its own meshes, the centre fan of
  the polygon refined uniformly 4, 5 and 6 times (up to 49.5k unknowns), nothing of warpwise
  used, then Richardson extrapolation at the observed rate. Measured on the hexagon: the Cw
  differences between levels fall by 8.26 (rate h^3, the r^(3/2) term at the 120 degree
  corners), and the extrapolation from levels 4-6 agrees with that from 5-7 to 2e-7.
"""

from functools import cache

import numpy as np
import pytest
import scipy.sparse.linalg as spla
from skfem import Basis, BilinearForm, ElementTriP2, Functional, LinearForm, MeshTri
from skfem.helpers import dot, grad
from test_error_estimates import rectangle_Cw, rectangle_J

from warpwise.geometry.shapes import hexagon, polygon, rectangle
from warpwise.properties.analysis import analyse

ACROSS_FLATS = 24.0


def regular_polygon(sides: int, across_flats: float) -> np.ndarray:
    """Vertices (sides, 2) of a regular polygon about the origin with a flat parallel to x."""
    r = across_flats / 2.0 / np.cos(np.pi / sides)
    ang = np.pi / sides + 2.0 * np.pi * np.arange(sides) / sides
    if sides == 6:  # corners on the x axis, as warpwise's hexagon
        ang = ang - np.pi / 6.0
    return np.column_stack([r * np.cos(ang), r * np.sin(ang)])


def skfem_J_Cw(points: np.ndarray, level: int) -> tuple[float, float]:
    """J and Cw of the polygon about its centre (its centroid and shear centre) by scikit-fem.

    The fan of triangles from the centre, refined uniformly ``level`` times; the pinned
    Neumann warping problem d(psi)/dn = y n_x - x n_y solved with P2 elements; psi shifted to
    zero mean, so that for these doubly symmetric sections omega = psi and Cw = int psi^2 dA.
    """
    n = len(points)
    p = np.vstack([[0.0, 0.0], points])
    t = np.array([[0, 1 + k, 1 + (k + 1) % n] for k in range(n)])  # the polygon's few sides
    basis = Basis(MeshTri(p.T, t.T).refined(level), ElementTriP2(), intorder=4)

    def integral(fun, **fields):
        return float(Functional(fun).assemble(basis, **fields))

    @BilinearForm
    def laplace(u, v, w):
        return dot(grad(u), grad(v))

    @LinearForm
    def load(v, w):
        return w.x[1] * v.grad[0] - w.x[0] * v.grad[1]

    K = laplace.assemble(basis).tocsr()
    f = load.assemble(basis)
    keep = np.arange(1, basis.N)
    psi = np.zeros(basis.N)
    psi[keep] = spla.spsolve(K[keep][:, keep].tocsc(), f[keep])
    area = integral(lambda w: w.x[0] ** 0)
    psi -= integral(lambda w: w.p, p=basis.interpolate(psi)) / area
    J = integral(lambda w: w.x[0] ** 2 + w.x[1] ** 2) - float(psi @ f)
    return J, integral(lambda w: w.p ** 2, p=basis.interpolate(psi))


@cache
def polygon_reference(sides: int) -> tuple[float, float]:
    """J and Cw of the regular polygon, Richardson-extrapolated from levels 4, 5, 6."""
    values = np.array([skfem_J_Cw(regular_polygon(sides, ACROSS_FLATS), k) for k in (4, 5, 6)])
    d1, d2 = values[1] - values[0], values[2] - values[1]
    ratio = d1 / d2  # the observed reduction per halving
    J, Cw = values[2] + d2 / (ratio - 1.0)
    return float(J), float(Cw)


def relative(a: float, b: float) -> float:
    return abs(a / b - 1.0)


# Measured relative errors (J, Cw) at default / fine (nodes):
#   square 20       3.9e-6, 1.8e-5 (2161) / 3.4e-7, 2.4e-6 (7961)
#   rectangle 40x20 4.0e-6, 2.9e-6 (2153) / 3.4e-7, 2.4e-7 (8245)
# (the earlier default of 0.125 sqrt(A), right angles ungraded: Cw of the square +1.6e-3 at
# 465 nodes). Bounds: about twice the measured errors, below DESIGN.md's targets.
@pytest.mark.parametrize("bx, by, refine, tol_J, tol_Cw", [
    (20.0, 20.0, 1.0, 1e-5, 4e-5), (20.0, 20.0, 2.0, 1e-6, 5e-6),
    (40.0, 20.0, 1.0, 1e-5, 1e-5), (40.0, 20.0, 2.0, 1e-6, 1e-6)])
def test_rectangle(bx, by, refine, tol_J, tol_Cw):
    res = analyse(rectangle(bx, by), refine=refine)
    assert relative(res.torsion.J, rectangle_J(bx, by)) < tol_J
    assert relative(res.torsion.Cw, rectangle_Cw(bx, by)) < tol_Cw


# Measured relative errors (J, Cw) at default / fine (nodes), 24 mm across flats:
#   hexagon 6.5e-6, +1.9e-5 (2501) / 8.2e-7, +6.8e-6 (8493)
#   octagon 6.9e-6, -1.0e-4 (2753) / 8.9e-7, -2.0e-7 (9141)
# (earlier default, against a refine-8 warpwise mesh: Cw -7.2e-4 and -1.3e-3; at fine -7.4e-5
# and -2.6e-4). Bounds about twice the measured errors; for Cw at fine the 1e-5 target itself
# (the hexagon's 6.8e-6 leaves no room for a tighter one).
@pytest.mark.parametrize("sides, refine, tol_J, tol_Cw", [
    (6, 1.0, 2e-5, 5e-5), (6, 2.0, 2e-6, 1e-5), (8, 1.0, 2e-5, 2e-4), (8, 2.0, 2e-6, 1e-5)])
def test_regular_polygon(sides, refine, tol_J, tol_Cw):
    J, Cw = polygon_reference(sides)
    profile = hexagon(ACROSS_FLATS) if sides == 6 else polygon(regular_polygon(sides, ACROSS_FLATS))
    res = analyse(profile, refine=refine)
    assert relative(res.torsion.J, J) < tol_J
    assert relative(res.torsion.Cw, Cw) < tol_Cw
