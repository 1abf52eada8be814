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
        self._norm = float(abs(mat).sum(axis=1).max()) if n else 0.0
        try:
            self._lu = spla.splu(
                reduced, permc_spec="MMD_AT_PLUS_A",
                options={"SymmetricMode": True},
            )
        except RuntimeError as exc:
            raise AnalysisError(f"the stiffness matrix could not be factorised ({exc})") from None

    @staticmethod
    def compatible(rhs: np.ndarray) -> np.ndarray:
        """Remove the round-off part of a Neumann right-hand side that breaks sum(f) = 0.

        The loads of the section problems sum to zero exactly in exact arithmetic (the shape
        functions sum to one); their computed sum is round-off, which would otherwise land
        entirely on the pinned node.
        """
        rhs = np.asarray(rhs, dtype=float)
        return rhs - rhs.sum(axis=0) / rhs.shape[0]

    def solve(self, rhs: np.ndarray) -> np.ndarray:
        """Solve for one (n,) or several (n, r) right-hand sides; pinned value is zero.

        The right-hand side is made compatible first (see :meth:`compatible`).
        """
        rhs = self.compatible(rhs)
        out = np.zeros_like(rhs)
        out[self.keep] = self._lu.solve(rhs[self.keep])
        return out

    def residual(self, x: np.ndarray, rhs: np.ndarray) -> float:
        """Normwise backward error ||K x - f|| / (||K|| ||x|| + ||f||) of a solution.

        Infinity norms over all nodes, the pinned one included, so a solution that does not
        satisfy the equation at the pinned node (an incompatible right-hand side) shows too.
        A right-hand side that is nearly zero (a circle's warping) does not inflate it.
        """
        rhs = self.compatible(rhs)
        r = self.matrix @ x - rhs
        scale = self._norm * float(np.abs(x).max(initial=0.0)) + float(np.abs(rhs).max(initial=0.0))
        return float(np.abs(r).max(initial=0.0) / max(scale, 1e-300))
