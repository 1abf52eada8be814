"""Linear solvers for the singular Neumann problems of the section.

The stiffness matrix of a pure Neumann problem is singular (the solution is defined up to a
constant). :class:`PinnedSolver` removes one node, factorises the rest once and reuses the
factorisation for every right-hand side (torsion, the two shear functions, ...).
"""

from __future__ import annotations

import numpy as np
import scipy.sparse as sp
import scipy.sparse.linalg as spla

from .errors import AnalysisError


class PinnedSolver:
    """Factorise a symmetric positive semi-definite matrix with one node pinned to zero.

    Parameters
    ----------
    matrix : scipy.sparse matrix
        (n, n) stiffness matrix whose null space is the constant vector.
    pinned : int
        Node whose value is fixed at zero.

    Examples
    --------
    >>> k = sp.csr_matrix(np.array([[1.0, -1.0], [-1.0, 1.0]]))
    >>> PinnedSolver(k, 0).solve(np.array([-1.0, 1.0])).tolist()
    [0.0, 1.0]

    """

    def __init__(self, matrix: sp.spmatrix, pinned: int = 0) -> None:
        n = matrix.shape[0]
        self.n = n
        self.pinned = int(pinned)
        self.keep = np.delete(np.arange(n), self.pinned)
        mat = sp.csr_matrix(matrix)
        reduced = mat[self.keep][:, self.keep].tocsc()
        self.matrix = mat
        try:
            self._lu = spla.splu(
                reduced, permc_spec="MMD_AT_PLUS_A",
                options={"SymmetricMode": True},
            )
        except RuntimeError as exc:
            raise AnalysisError(f"the stiffness matrix could not be factorised ({exc})") from None

    def solve(self, rhs: np.ndarray) -> np.ndarray:
        """Solve for one (n,) or several (n, r) right-hand sides; pinned value is zero."""
        rhs = np.asarray(rhs, dtype=float)
        out = np.zeros_like(rhs)
        out[self.keep] = self._lu.solve(rhs[self.keep])
        return out

    def residual(self, x: np.ndarray, rhs: np.ndarray) -> float:
        """Relative residual ||K x - f|| / ||f|| of a solution (over all nodes)."""
        r = self.matrix @ x - rhs
        scale = max(float(np.linalg.norm(rhs)), 1e-300)
        return float(np.linalg.norm(r) / scale)
