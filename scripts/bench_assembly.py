"""Benchmark: assembly and solve of the warping problem on a large six-node mesh.

Builds a P2 mesh of about 300k nodes (a 100 x 100 square by default), then times

* assembly: ``element_values`` + ``stiffness_matrix`` (basis on every element, element
  matrices, global CSR matrix from COO triplets),
* solve: ``PinnedSolver`` factorisation plus one solve of the torsion right-hand side,
* the whole ``analyse`` on the same mesh,

and reports the peak memory of the assembly (tracemalloc, in a separate untimed run so the
tracing does not distort the times) and the peak resident size of the process.

Target (project issue): assembly of a 300k-node mesh in under 2 s on a 2-core machine.
Wall times are best and median of ``--repeat`` runs; the CPU time (all threads) is printed
too, since on a shared machine it is the steadier of the two.

With ``--skfem`` the straightforward scikit-fem assembly plus ``scipy.sparse.linalg.spsolve``
on the same mesh is timed as well (scikit-fem is a test-only dependency).

Usage::

    python scripts/bench_assembly.py [--shape square|tube] [--size H] [--repeat N] [--skfem]
"""

from __future__ import annotations

import argparse
import gc
import resource
import statistics
import sys
import time
import tracemalloc
from functools import partial

import numpy as np

from warpwise.fem.p2 import element_values, stiffness_matrix
from warpwise.fem.solve import PinnedSolver
from warpwise.geometry.shapes import rectangle, tube
from warpwise.mesh.core import build_mesh
from warpwise.properties.analysis import analyse
from warpwise.properties.geometric import geometric_properties
from warpwise.properties.torsion import torsion_load

#: Mesh sizes giving about 300k nodes for each shape.
SHAPES = {
    "square": (lambda: rectangle(100.0, 100.0), 0.49),
    "tube": (lambda: tube(100.0, 60.0), 0.35),
}


def assemble(mesh, origin):
    ev = element_values(mesh, origin)
    return ev, stiffness_matrix(mesh, ev)


def factor_solve(K, pin, f):
    s = PinnedSolver(K, pin)
    return s, s.solve(f)


def timed(fn, repeat):
    """Wall and process CPU times (CPU: all threads) of ``repeat`` calls, and the last result."""
    times, out = [], None
    for _ in range(repeat):
        out = None
        gc.collect()
        t0, c0 = time.perf_counter(), time.process_time()
        out = fn()
        times.append((time.perf_counter() - t0, time.process_time() - c0))
    return times, out


def fmt(times):
    wall = [t for t, _ in times]
    cpu = [c for _, c in times]
    return (f"wall best {min(wall):.3f} s, median {statistics.median(wall):.3f} s; "
            f"cpu median {statistics.median(cpu):.3f} s")


def skfem_reference(mesh):
    """Straightforward scikit-fem assembly and spsolve of the same pinned problem."""
    import scipy.sparse.linalg as spla
    from skfem import Basis, BilinearForm, ElementTriP2, LinearForm, MeshTri2
    from skfem.helpers import dot, grad

    t0 = time.perf_counter()
    m = MeshTri2(mesh.nodes.T.copy(), mesh.elements.T.copy())
    basis = Basis(m, ElementTriP2(), intorder=4)

    @BilinearForm
    def laplace(u, v, w):
        return dot(grad(u), grad(v))

    K = laplace.assemble(basis)
    one = LinearForm(lambda v, w: v).assemble(basis)
    xs = LinearForm(lambda v, w: w.x[0] * v).assemble(basis)
    ys = LinearForm(lambda v, w: w.x[1] * v).assemble(basis)
    c = np.array([xs.sum(), ys.sum()]) / one.sum()

    @LinearForm
    def load(v, w):
        x, y = w.x[0] - c[0], w.x[1] - c[1]
        return y * v.grad[0] - x * v.grad[1]

    f = load.assemble(basis)
    t1 = time.perf_counter()
    keep = np.arange(1, K.shape[0])
    psi = np.zeros(K.shape[0])
    psi[keep] = spla.spsolve(K[keep][:, keep].tocsc(), f[keep])
    t2 = time.perf_counter()
    return t1 - t0, t2 - t1


def main(argv=None):
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--shape", choices=sorted(SHAPES), default="square")
    p.add_argument("--size", type=float, default=None, help="mesh size (default: ~300k nodes)")
    p.add_argument("--repeat", type=int, default=5)
    p.add_argument("--skfem", action="store_true", help="also time scikit-fem + spsolve")
    args = p.parse_args(argv)

    make, default_h = SHAPES[args.shape]
    profile = make()
    h = default_h if args.size is None else args.size
    t0 = time.perf_counter()
    mesh = build_mesh(profile, h)
    t_mesh = time.perf_counter() - t0
    print(f"profile   {profile.source}, mesh size {h:g} mm")
    print(f"mesh      {mesh.n_nodes:,} nodes, {mesh.n_elements:,} elements "
          f"({t_mesh:.2f} s to mesh)")

    x0, y0, x1, y1 = profile.bounds
    origin = np.array([0.5 * (x0 + x1), 0.5 * (y0 + y1)])

    t_ev, ev0 = timed(partial(element_values, mesh, origin), args.repeat)
    t_k, _ = timed(partial(stiffness_matrix, mesh, ev0), args.repeat)
    del ev0
    t_asm, (ev, K) = timed(partial(assemble, mesh, origin), args.repeat)
    print(f"element_values    {fmt(t_ev)}")
    print(f"stiffness_matrix  {fmt(t_k)}   ({K.nnz:,} non-zeros)")
    print(f"assembly (both)   {fmt(t_asm)}   target < 2 s")

    geo, evc = geometric_properties(mesh, ev, origin)
    f = torsion_load(mesh, evc)
    pin = int(np.argmin(np.sum((mesh.nodes - np.array(geo.centroid)) ** 2, axis=1)))

    t_fs, (solver, psi) = timed(partial(factor_solve, K, pin, f), max(1, args.repeat // 2))
    print(f"factorise + solve {fmt(t_fs)}   (residual {solver.residual(psi, f):.1e})")
    t_all, res = timed(partial(analyse, profile, mesh=mesh), max(1, args.repeat // 2))
    print(f"analyse (mesh given) {fmt(t_all)}   J = {res.torsion.J:.10g}")

    del ev, K, evc, solver, psi, res
    gc.collect()
    tracemalloc.start()
    out = assemble(mesh, origin)
    _, peak = tracemalloc.get_traced_memory()
    tracemalloc.stop()
    del out
    print(f"assembly peak (tracemalloc) {peak / 2**20:.1f} MiB = "
          f"{peak / mesh.n_nodes:.0f} B/node")
    rss = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    rss_bytes = rss if sys.platform == "darwin" else rss * 1024
    print(f"process peak RSS (whole run, incl. meshing and factorisation) "
          f"{rss_bytes / 2**20:.0f} MiB = {rss_bytes / mesh.n_nodes:.0f} B/node")

    if args.skfem:
        t_sk_asm, t_sk_solve = skfem_reference(mesh)
        print(f"scikit-fem assembly {t_sk_asm:.3f} s, spsolve {t_sk_solve:.3f} s, "
              f"total {t_sk_asm + t_sk_solve:.3f} s  "
              f"(ratio to analyse: {(t_sk_asm + t_sk_solve) / min(t for t, _ in t_all):.1f}x)")


if __name__ == "__main__":
    main()
