"""The largest magnitude of a P2 field over the section, not only at its nodes.

On each element a six-node field is a quadratic polynomial in the reference coordinates
(xi, eta), straight-sided or curved alike (the isoparametric map carries the reference triangle
onto the element), so its largest magnitude over the element is at a corner, at a stationary
point of one of the three edges, or at the interior stationary point; all seven are evaluated
for every element at once.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from ..mesh.core import Mesh
from .p2 import NODE_POINTS, shape_functions


def _monomials(pts: np.ndarray) -> np.ndarray:
    """1, xi, eta, xi^2, xi eta, eta^2 at reference points (k, 2) -> (k, 6)."""
    xi, eta = pts[:, 0], pts[:, 1]
    return np.column_stack([np.ones_like(xi), xi, eta, xi * xi, xi * eta, eta * eta])


#: Node values -> monomial coefficients of the element's quadratic.
_TO_COEFFICIENTS = np.linalg.inv(_monomials(NODE_POINTS))


@dataclass(frozen=True)
class FieldMaximum:
    """The largest |value| of a field over the mesh and where it is.

    Attributes
    ----------
    value : float
        The field's value there (signed), the field's unit.
    element : int
        The element it is in.
    point : tuple of float
        Its drawing coordinates.
    """

    value: float
    element: int
    point: tuple[float, float]


def _inside(xi: np.ndarray, eta: np.ndarray) -> np.ndarray:
    return (xi >= 0) & (eta >= 0) & (xi + eta <= 1)


def largest_magnitude(mesh: Mesh, nodal: np.ndarray) -> FieldMaximum:
    """The largest |value| of a P2 field (n,) over every element's interior and boundary.

    Parameters
    ----------
    mesh : Mesh
        The mesh (drawing units).
    nodal : numpy.ndarray
        Nodal values (n,), any unit.

    Returns
    -------
    FieldMaximum
    """
    c = nodal[mesh.elements] @ _TO_COEFFICIENTS.T  # (m, 6): c0 + c1 xi + c2 eta + ...
    c0, c1, c2, c3, c4, c5 = c.T
    m = len(c)
    with np.errstate(divide="ignore", invalid="ignore"):
        # edges xi axis (t, 0), eta axis (0, t) and the hypotenuse (1 - t, t)
        t_a = -c1 / (2 * c3)
        t_b = -c2 / (2 * c5)
        quad = c3 - c4 + c5
        t_c = -(-c1 + c2 - 2 * c3 + c4) / (2 * quad)
        det = 4 * c3 * c5 - c4 * c4
        xi_i = (-2 * c5 * c1 + c4 * c2) / det
        eta_i = (c4 * c1 - 2 * c3 * c2) / det
    cand_xi = np.column_stack([np.zeros(m), np.ones(m), np.zeros(m), t_a, np.zeros(m), 1 - t_c,
                               xi_i])
    cand_eta = np.column_stack([np.zeros(m), np.zeros(m), np.ones(m), np.zeros(m), t_b, t_c,
                                eta_i])
    # a stationary point off its edge or outside the triangle (or none: nan) is not a candidate
    with np.errstate(invalid="ignore"):
        ok = _inside(cand_xi, cand_eta) & np.isfinite(cand_xi) & np.isfinite(cand_eta)
    cand_xi = np.where(ok, cand_xi, 0.0)
    cand_eta = np.where(ok, cand_eta, 0.0)
    vals = (c0[:, None] + c1[:, None] * cand_xi + c2[:, None] * cand_eta
            + c3[:, None] * cand_xi ** 2 + c4[:, None] * cand_xi * cand_eta
            + c5[:, None] * cand_eta ** 2)
    flat = int(np.argmax(np.abs(vals)))
    e, k = divmod(flat, vals.shape[1])
    N, _ = shape_functions(np.array([[cand_xi[e, k], cand_eta[e, k]]]))
    x, y = N[0] @ mesh.nodes[mesh.elements[e]]
    return FieldMaximum(float(vals[e, k]), int(e), (float(x), float(y)))
