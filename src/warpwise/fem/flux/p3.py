"""The degree-2 Raviart-Thomas element RT2 on the reference triangle, and its quadrature.

RT2 = P2^2 + x P2~ (P2~ the homogeneous quadratics) has dimension 15; its functions are vector
cubics with a quadratic normal trace on each edge and a quadratic divergence (Raviart & Thomas
1977; Boffi, Brezzi & Fortin, Mixed Finite Element Methods, 2013, sec. 2.3.1). The basis here is
dual to these 15 degrees of freedom:

- 9 edge values: on reference edge l (corners (0,1), (1,2), (2,0) as in :mod:`warpwise.fem.p2`),
  running from its first corner to its second with parameter t in [0, 1], the normal flux
  density ``v . n |e|`` (outward unit normal n, edge length |e|) at the three Gauss-Legendre
  points :data:`EDGE_POINTS`; dof ``3 l + k`` for point k;
- 6 interior moments ``int v . e_i m dA`` for m in (1, xi, eta), i = 0, 1 (dofs 9 ... 14).

The contravariant Piola map v(x) = J v^(xi) / det J of a straight-sided (affine) element keeps
``v . n ds`` and so the edge values; an edge shared by two elements runs the other way in the
second one, which sees point k as point 2 - k and the normal reversed (:mod:`.patches`). A
basis function not dual to a dof of edge l has zero normal trace on edge l (a quadratic with
three zeros), so the normal trace on an edge depends on that edge's three dofs alone.

Everything is polynomial on the reference triangle, so the reference matrices are integrated
exactly by :data:`DEGREE_6` (collapsed Gauss, 16 points; RT2 times RT2 is degree 6).
"""

from __future__ import annotations

from functools import cache

import numpy as np

from ..p2 import QuadratureRule, shape_functions

#: Gauss-Legendre points and weights on [0, 1] (exact for degree 5): the edge dof points.
EDGE_POINTS = 0.5 + 0.5 * np.sqrt(0.6) * np.array([-1.0, 0.0, 1.0])
EDGE_WEIGHTS = np.array([5.0, 8.0, 5.0]) / 18.0

#: Reference corners and, per local edge l, its first and second corner.
CORNERS = np.array([[0.0, 0.0], [1.0, 0.0], [0.0, 1.0]])
EDGE_CORNERS = np.array([[0, 1], [1, 2], [2, 0]])

#: Centre and scale of the monomial variables (see :func:`monomials`).
_CENTRE, _SCALE = 1.0 / 3.0, 3.0
#: Exponents (i, j) of the monomials xi^i eta^j of degree <= 3.
_EXPONENTS = np.array([(d - j, j) for d in range(4) for j in range(d + 1)])

N_RT = 15
N_EDGE_DOFS = 9
N_BUBBLE = 6


def collapsed_gauss(n: int) -> QuadratureRule:
    """Collapsed (Duffy) Gauss-Legendre rule of n^2 points, exact to degree 2 n - 2.

    xi = u, eta = v (1 - u) with Gauss-Legendre u, v on [0, 1] and the Jacobian 1 - u in the
    weights (Stroud, Approximate Calculation of Multiple Integrals, 1971, from memory).
    """
    g, w = np.polynomial.legendre.leggauss(n)
    g, w = 0.5 * (g + 1.0), 0.5 * w
    u, v = np.meshgrid(g, g, indexing="ij")
    wu, wv = np.meshgrid(w, w, indexing="ij")
    pts = np.column_stack([u.ravel(), (v * (1.0 - u)).ravel()])
    return QuadratureRule(pts, (wu * wv * (1.0 - u)).ravel(), 2 * n - 2)


#: The rule the reference matrices and the reconstructed flux are integrated with.
DEGREE_6 = collapsed_gauss(4)


def monomials(points: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Values (q, 10) and (xi, eta)-derivatives (q, 10, 2) of the scaled monomials of degree <= 3.

    The monomials are of (s, t) = 3 (xi - 1/3, eta - 1/3), centred on the reference centroid:
    the dual basis over them is computed with a condition number of 6e2 instead of 1e4 for
    plain monomials (measured), so its dofs are the identity to 3e-14.
    """
    x, y = _SCALE * (points[:, :1] - _CENTRE), _SCALE * (points[:, 1:] - _CENTRE)
    i, j = _EXPONENTS[:, 0], _EXPONENTS[:, 1]
    val = x**i * y**j
    dx = np.where(i > 0, i * x ** np.maximum(i - 1, 0) * y**j, 0.0) * _SCALE
    dy = np.where(j > 0, j * x**i * y ** np.maximum(j - 1, 0), 0.0) * _SCALE
    return val, np.stack([dx, dy], axis=-1)


def _spanning_set() -> np.ndarray:
    """Coefficients (15, 2, 10) of a spanning set of RT2 over the monomials, per component."""
    index = {tuple(e): k for k, e in enumerate(_EXPONENTS.tolist())}
    out = np.zeros((N_RT, 2, len(_EXPONENTS)))
    s = 0
    for e in ((0, 0), (1, 0), (0, 1), (2, 0), (1, 1), (0, 2)):  # P2^2
        for c in range(2):
            out[s, c, index[e]] = 1.0
            s += 1
    for i, j in ((2, 0), (1, 1), (0, 2)):  # (s, t) times a homogeneous quadratic (module notes)
        out[s, 0, index[(i + 1, j)]] = 1.0
        out[s, 1, index[(i, j + 1)]] = 1.0
        s += 1
    return out


def _dof_matrix(coef: np.ndarray) -> np.ndarray:
    """Dofs (15, s) of the functions of coefficients ``coef`` (s, 2, 10)."""
    rows = []
    for a, b in EDGE_CORNERS:
        p, q = CORNERS[a], CORNERS[b]
        d = q - p
        n_len = np.array([d[1], -d[0]])  # outward normal times edge length (counter-clockwise)
        val, _ = monomials(p + EDGE_POINTS[:, None] * d)  # (3, 10)
        rows.append(np.einsum("pm,scm,c->ps", val, coef, n_len))
    rule = DEGREE_6
    val, _ = monomials(rule.points)
    vec = np.einsum("pm,scm->psc", val, coef)  # (q, s, 2)
    weights = np.column_stack([np.ones(len(rule.points)), rule.points])  # 1, xi, eta
    for c in range(2):
        rows.append(np.einsum("p,pm,ps->ms", rule.weights, weights, vec[:, :, c]))
    return np.vstack(rows)


@cache
def basis_coefficients() -> np.ndarray:
    """Coefficients (15, 2, 10) of the dual RT2 basis over the monomials of degree <= 3."""
    span = _spanning_set()
    A = np.linalg.inv(_dof_matrix(span)).T  # basis_b = sum_s A[b, s] span_s
    return np.einsum("bs,scm->bcm", A, span)


def rt_values(points: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Values (q, 15, 2) and divergences (q, 15) of the reference RT2 basis at ``points``."""
    coef = basis_coefficients()
    val, der = monomials(points)
    v = np.einsum("pm,bcm->pbc", val, coef)
    div = np.einsum("pm,bm->pb", der[..., 0], coef[:, 0]) + np.einsum("pm,bm->pb", der[..., 1],
                                                                       coef[:, 1])
    return v, div


def multiplier_values(points: np.ndarray) -> np.ndarray:
    """Values (q, 6) of the divergence-space basis: 1, then five quadratics of zero mean."""
    val, _ = monomials(points)
    p2 = val[:, 1:6]  # s, t, s^2, s t, t^2
    mean = DEGREE_6.weights @ monomials(DEGREE_6.points)[0][:, 1:6] / 0.5
    return np.column_stack([np.ones(len(points)), p2 - mean])


__all__ = ["CORNERS", "DEGREE_6", "EDGE_CORNERS", "EDGE_POINTS", "EDGE_WEIGHTS", "N_BUBBLE",
           "N_EDGE_DOFS", "N_RT", "basis_coefficients", "collapsed_gauss", "monomials",
           "multiplier_values", "rt_values", "shape_functions"]
