"""Linear solvers for the singular Neumann problems of the section.

The stiffness matrix of a pure Neumann problem is singular (the solution is defined up to a
constant on each connected part of the mesh). :class:`PinnedSolver` finds the connected parts
(:func:`connected_parts`), removes one node of each, factorises the rest once and reuses the
factorisation for every right-hand side (torsion, the two shear functions, ...).

Three methods, chosen by measurement (``scripts/bench.py``): SuperLU (scipy) for small and
medium systems; Intel MKL PARDISO (through pypardiso, x86-64 only) above
:data:`DIRECT_LARGE`, where its nested-dissection Cholesky is several times faster; and, where
PARDISO is not installed, conjugate gradients preconditioned by smoothed-aggregation algebraic
multigrid (pyamg) above :data:`AMG_LARGE`.
"""

from __future__ import annotations

import numpy as np
import scipy.sparse as sp
import scipy.sparse.linalg as spla
from scipy.sparse.csgraph import connected_components

from ..errors import AnalysisError, UsageError

#: Unknowns above which PARDISO is used when available.
DIRECT_LARGE = 100_000
#: Unknowns above which AMG-preconditioned CG replaces SuperLU when PARDISO is missing.
AMG_LARGE = 300_000
#: Relative residual at which the iterative method stops.
CG_TOLERANCE = 1e-12

METHODS = ("auto", "superlu", "pardiso", "amg")


def _pardiso_available() -> bool:
    """True when pypardiso and its MKL library can be loaded.

    pypardiso searches the whole installation tree for the MKL runtime each time a solver is
    made (about a second); the pip wheel of MKL puts it in ``sys.prefix/lib``, so point
    pypardiso there once.
    """
    import glob
    import os
    import sys

    if "PYPARDISO_MKL_RT" not in os.environ:
        found = sorted(glob.glob(f"{sys.prefix}/lib/libmkl_rt.so*"), key=len)
        if found:
            os.environ["PYPARDISO_MKL_RT"] = found[0]
    try:
        import pypardiso  # noqa: F401
    except (ImportError, OSError):
        return False
    return True


class PardisoCholesky:
    """A PARDISO Cholesky factorisation of a sparse SPD matrix, released with this object.

    pypardiso's own solver object keeps a copy of the matrix, compares it with the matrix
    passed on every solve, and never frees MKL's internal memory (the factor: about 0.9 kB per
    unknown at 400k unknowns), so each factorisation made in a long-lived process (a catalogue
    worker, a refinement loop) would stay in memory. This class uses pypardiso only to load the
    MKL library and make the calls: phase 12 (analysis and factorisation) once, phase 33 (solve)
    for each set of right-hand sides, and phase -1 (release everything) when it is garbage
    collected.

    Parameters
    ----------
    upper : scipy.sparse.csr_matrix
        Upper triangle (diagonal included) of the (n, n) symmetric positive definite matrix.
    """

    def __init__(self, upper: sp.csr_matrix) -> None:
        import weakref

        import pypardiso

        upper = sp.csr_matrix(upper, dtype=float)
        upper.sort_indices()  # PARDISO needs sorted column indices in each row
        if upper.shape[0] and not np.diff(upper.indptr).all():  # an empty row crashes MKL
            raise ValueError("the matrix has an empty row")
        self.n = upper.shape[0]
        self._upper = upper
        self._lib = pypardiso.PyPardisoSolver(mtype=2)  # real symmetric positive definite
        weakref.finalize(self, self._lib.free_memory, True)
        self._run(12, np.zeros((self.n, 1), order="F"))

    def _run(self, phase: int, rhs: np.ndarray) -> np.ndarray:
        """One PARDISO call of the given phase with Fortran-ordered right-hand sides."""
        from pypardiso.pardiso_wrapper import PyPardisoError

        self._lib.set_phase(phase)
        try:
            return self._lib._call_pardiso(self._upper, rhs)
        except PyPardisoError as exc:  # e.g. -4, a zero pivot: not positive definite
            raise RuntimeError(str(exc)) from None

    def solve(self, rhs: np.ndarray) -> np.ndarray:
        """Solve for one (n,) or several (n, r) right-hand sides; the units are the inverse matrix's."""
        rhs = np.asarray(rhs, dtype=float)
        return self._run(33, np.asfortranarray(rhs)).reshape(rhs.shape)


class SPDFactor:
    """A symmetric positive definite matrix, factorised (or preconditioned) once.

    Parameters
    ----------
    matrix : scipy.sparse matrix
        (n, n) symmetric positive definite matrix.
    method : str
        ``auto``, ``superlu``, ``pardiso`` or ``amg``.

    Examples
    --------
    >>> a = sp.csr_matrix(np.array([[2.0, -1.0], [-1.0, 2.0]]))
    >>> SPDFactor(a, "superlu").solve(np.array([1.0, 1.0])).round(12).tolist()
    [1.0, 1.0]
    """

    def __init__(self, matrix: sp.spmatrix, method: str = "auto") -> None:
        if method not in METHODS:
            raise UsageError(f"unknown solver {method!r} (use {', '.join(METHODS)})")
        a = sp.csr_matrix(matrix)
        n = a.shape[0]
        if method == "auto":
            if n > DIRECT_LARGE and _pardiso_available():
                method = "pardiso"
            elif n > AMG_LARGE:
                method = "amg"
            else:
                method = "superlu"
        if method == "pardiso" and not _pardiso_available():
            raise UsageError("the pardiso solver needs the pypardiso package (x86-64 only)")
        self.method = method
        self.n = n
        try:
            if method == "superlu":
                self._lu = spla.splu(a.tocsc(), permc_spec="MMD_AT_PLUS_A",
                                     options={"SymmetricMode": True})
            elif method == "pardiso":
                upper = sp.triu(a, format="csr")
                del a
                self._pardiso = PardisoCholesky(upper)
            else:
                import pyamg

                self._amg = pyamg.smoothed_aggregation_solver(a, symmetry="symmetric", max_coarse=2000)
        except (RuntimeError, ValueError) as exc:
            raise AnalysisError(f"the stiffness matrix could not be factorised ({exc})") from None

    def solve(self, rhs: np.ndarray) -> np.ndarray:
        """Solve for one (n,) or several (n, r) right-hand sides."""
        rhs = np.asarray(rhs, dtype=float)
        if self.method == "superlu":
            return self._lu.solve(rhs)
        if self.method == "pardiso":
            return self._pardiso.solve(rhs)
        cols = rhs.reshape(rhs.shape[0], -1)
        out = np.column_stack([
            self._amg.solve(cols[:, k], tol=CG_TOLERANCE, accel="cg", maxiter=500)
            for k in range(cols.shape[1])])
        return out.reshape(rhs.shape)


def connected_parts(matrix: sp.spmatrix) -> tuple[int, np.ndarray]:
    """The connected parts of a stiffness matrix's graph (of the mesh): count and node labels.

    Examples
    --------
    >>> k = sp.csr_matrix(np.array([[1.0, -1.0, 0.0], [-1.0, 1.0, 0.0], [0.0, 0.0, 1.0]]))
    >>> count, labels = connected_parts(k)
    >>> count, labels.tolist()
    (2, [0, 0, 1])

    """
    count, labels = connected_components(sp.csr_matrix(matrix), directed=False)
    return int(count), labels.astype(np.int64)


class PinnedSolver:
    """Factorise a symmetric positive semi-definite matrix with one node of each part pinned.

    Parameters
    ----------
    matrix : scipy.sparse matrix
        (n, n) stiffness matrix whose null space is the constant vector on each connected
        part of its graph.
    pinned : int
        Node whose value is fixed at zero; in each other part, its first node is pinned.
    method : str
        Linear solver, see :class:`SPDFactor`.

    Attributes
    ----------
    n_parts : int
        Number of connected parts.
    labels : numpy.ndarray
        Part of each node (n,), 0-based; the part of ``pinned`` is 0 only by chance.
    pins : numpy.ndarray
        The pinned node of each part.

    Examples
    --------
    >>> k = sp.csr_matrix(np.array([[1.0, -1.0], [-1.0, 1.0]]))
    >>> PinnedSolver(k, 0).solve(np.array([-1.0, 1.0])).tolist()
    [0.0, 1.0]
    >>> two = sp.block_diag([k, k]).tocsr()  # two separate parts: each defined up to a constant
    >>> s = PinnedSolver(two, 1)
    >>> s.n_parts, s.pins.tolist(), s.solve(np.array([-1.0, 1.0, 2.0, -2.0])).tolist()
    (2, [1, 2], [-1.0, 0.0, 0.0, -2.0])

    """

    def __init__(self, matrix: sp.spmatrix, pinned: int = 0, method: str = "auto") -> None:
        n = matrix.shape[0]
        self.n = n
        self.pinned = int(pinned)
        mat = sp.csr_matrix(matrix)
        self.n_parts, self.labels = connected_parts(mat) if n else (0, np.zeros(0, np.int64))
        first = np.full(self.n_parts, n, dtype=np.int64)
        np.minimum.at(first, self.labels, np.arange(n))
        if n:
            first[self.labels[self.pinned]] = self.pinned
        self.pins = np.sort(first)
        self.keep = np.delete(np.arange(n), self.pins)
        self.matrix = mat
        self._norm = float(abs(mat).sum(axis=1).max()) if n else 0.0
        self._factor = SPDFactor(mat[self.keep][:, self.keep], method)
        self.method = self._factor.method

    def compatible(self, rhs: np.ndarray) -> np.ndarray:
        """Remove the round-off part of a Neumann right-hand side that breaks sum(f) = 0 on a part.

        The loads of the section problems sum to zero on each part exactly in exact arithmetic
        (the shape functions sum to one there); their computed sum is round-off, which would
        otherwise land entirely on the part's pinned node.
        """
        rhs = np.asarray(rhs, dtype=float)
        cols = rhs.reshape(rhs.shape[0], -1)
        count = np.bincount(self.labels, minlength=self.n_parts)
        sums = np.stack([np.bincount(self.labels, weights=c, minlength=self.n_parts)
                         for c in cols.T], axis=1)
        return (cols - (sums / count[:, None])[self.labels]).reshape(rhs.shape)

    def solve(self, rhs: np.ndarray) -> np.ndarray:
        """Solve for one (n,) or several (n, r) right-hand sides; pinned value is zero.

        The right-hand side is made compatible first (see :meth:`compatible`).
        """
        rhs = self.compatible(rhs)
        out = np.zeros_like(rhs)
        out[self.keep] = self._factor.solve(rhs[self.keep])
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
