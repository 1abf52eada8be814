"""scikit-fem as independent FE reference on the same mesh.

Source: scikit-fem (Gustafsson & McBain, J. Open Source Softw. 5 (2020) 2369), a test-only
dependency. The warpwise mesh is handed to scikit-fem as a quadratic mesh (``MeshTri2``) with
six-node Lagrange elements (``ElementTriP2``), so the geometry and the discrete space are the
same; everything else is scikit-fem's own: its P2 basis and isoparametric mapping, its
quadrature, its form assembly. The pinned Neumann warping problem is then solved here with
scipy, and the geometric properties, J, the Trefftz shear centre and Cw are computed from
the scikit-fem fields and compared with ``warpwise.analysis.analyse`` on that mesh.

Both sides discretise the same problem on the same space, so they must agree to round-off,
not just to discretisation error. The tolerances below were set by measuring the agreement
first (``python -m pytest tests/validation/test_skfem_reference.py -s`` prints it) and putting
each bound one to two orders of magnitude above it; the brief asks for 1e-8.
"""

import numpy as np
import pytest
import scipy.sparse.linalg as spla
from skfem import Basis, BilinearForm, ElementTriP2, Functional, LinearForm, MeshTri2
from skfem.helpers import dot, grad

from warpwise.fem.p2 import element_values, stiffness_matrix
from warpwise.geometry.profile import profile_from_loops
from warpwise.geometry.shapes import rectangle, tube
from warpwise.mesh.core import Mesh, build_mesh
from warpwise.properties.analysis import analyse
from warpwise.properties.torsion import torsion_load

# Tolerances (relative unless stated), with the reason for each. Measured agreement on these
# meshes (500-1200 nodes): matrices 2e-14, areas 4e-15, psi 6e-14, shear centre 1e-13,
# Cw 2e-13, J 1e-11 (channel, where J / Ip = 0.006).
#
# The two codes' copies of the 6-point degree-4 rule differ in the 15th digit (weights
# 0.223381589678011 against 2 x 0.111690794839006), which alone moves every integral by
# ~5e-15 relative; round-off in the areas adds about as much.
TOL_GEOMETRY = 1e-13
# Element matrices and load vectors add to that the cancellation in the Jacobians (node
# coordinates |x| of up to ~20 element sizes h cost |x| / h ulps).
TOL_MATRIX = 1e-12
# psi comes from a linear solve, whose relative error is bounded by eps times the condition
# number of the pinned stiffness matrix: 2e4 .. 3.5e4 on these meshes (measured with eigsh),
# so ~1e-11 at worst. The shear centre (relative to the profile size), Cw and psi inherit it.
TOL_SOLVED = 1e-10
# J = Ix + Iy - psi . f cancels most of Ix + Iy on thin-walled sections, so its error is
# bounded relative to Ip, not to J: |dJ| < TOL_SOLVED * Ip. Relative to J we also ask for
# 1e-9, ten times tighter than the 1e-8 the issue requires (measured 1e-11 at J / Ip = 0.006).
TOL_J = 1e-9


def angle_profile():
    """Unequal-leg angle 40 x 25 x 4 (asymmetric: Ixy != 0, shear centre at the leg corner)."""
    loop = np.array([[0, 0], [40, 0], [40, 4], [4, 4], [4, 25], [0, 25]], dtype=float)
    return profile_from_loops([loop], source="angle 40x25x4")


def channel_profile():
    """Channel 30 x 50, web 3, flanges 3 (symmetric about y = 25, shear centre off the web)."""
    loop = np.array([[0, 0], [30, 0], [30, 3], [3, 3], [3, 47], [30, 47], [30, 50], [0, 50]],
                    dtype=float)
    return profile_from_loops([loop], source="channel 30x50x3")


def curved(mesh: Mesh) -> Mesh:
    """The same mesh with interior mid-side nodes moved off their chords (isoparametric).

    Each interior mid-side node moves along its edge normal by 6 % of the edge length, the
    sign alternating with the node number, so most elements get curved sides while every
    Jacobian stays positive (the mesh has 30 degree minimum angles).
    """
    mids = mesh.elements[:, 3:].ravel()
    count = np.bincount(mids, minlength=mesh.n_nodes)
    a = mesh.elements[:, [0, 1, 2]].ravel()
    b = mesh.elements[:, [1, 2, 0]].ravel()
    d = mesh.nodes[b] - mesh.nodes[a]
    normal = np.column_stack([-d[:, 1], d[:, 0]])  # |normal| = edge length
    interior = count[mids] == 2
    node, first = np.unique(mids[interior], return_index=True)
    sign = np.where(node % 2 == 0, 1.0, -1.0)
    nodes = mesh.nodes.copy()
    nodes[node] += 0.06 * sign[:, None] * normal[interior][first]
    return Mesh(nodes, mesh.elements, mesh.region, mesh.size)


# name: (profile, mesh size, bend interior edges, kind of elements expected in the mesh)
# "straight": every mid-side node on its chord (constant Jacobians);
# "arcs": the mesher puts the boundary mid-side nodes of circular outlines on the true arcs;
# "curved": most elements curved by :func:`curved` (isoparametric everywhere).
CASES = {
    "rectangle": (lambda: rectangle(30.0, 12.0), 1.5, False, "straight"),
    "tube": (lambda: tube(40.0, 28.0, segments=64), 2.5, False, "arcs"),
    "angle": (angle_profile, 2.0, False, "straight"),
    "channel": (channel_profile, 2.5, False, "straight"),
    "angle-curved": (angle_profile, 2.0, True, "curved"),
}


def skfem_section(mesh: Mesh) -> dict:
    """Section properties of ``mesh`` computed with scikit-fem forms and a scipy solve."""
    # MeshTri2 takes every node and a (6, m) connectivity: corners, then the mid-side nodes of
    # edges (0, 1), (1, 2), (0, 2) -- scikit-fem's local edge order, the same as warpwise's
    # (0, 1), (1, 2), (2, 0). It renumbers the nodes (corners first); map them back below.
    m = MeshTri2(np.ascontiguousarray(mesh.nodes.T), np.ascontiguousarray(mesh.elements.T))
    basis = Basis(m, ElementTriP2(), intorder=4)  # degree-4 rule: exact for omega^2 (straight)
    dofs = basis.element_dofs  # (6, m), scikit-fem numbering
    ours = np.full(basis.N, -1)
    ours[dofs] = mesh.elements.T
    assert np.array_equal(ours[dofs], mesh.elements.T), "node numbering is not one-to-one"
    assert np.array_equal(m.doflocs.T, mesh.nodes[ours]), "scikit-fem moved a node"

    def integral(fun, **fields):
        return float(Functional(fun).assemble(basis, **fields))

    A = integral(lambda w: w.x[0] ** 0)
    cx = integral(lambda w: w.x[0]) / A
    cy = integral(lambda w: w.x[1]) / A
    Ix = integral(lambda w: (w.x[1] - cy) ** 2)
    Iy = integral(lambda w: (w.x[0] - cx) ** 2)
    Ixy = integral(lambda w: (w.x[0] - cx) * (w.x[1] - cy))

    @BilinearForm
    def laplace(u, v, w):
        return dot(grad(u), grad(v))

    @LinearForm
    def load(v, w):
        x, y = w.x[0] - cx, w.x[1] - cy
        return y * v.grad[0] - x * v.grad[1]

    K = laplace.assemble(basis).tocsr()
    f = load.assemble(basis)
    # pinned Neumann problem: fix scikit-fem's dof 0, solve the rest, shift to zero mean
    keep = np.arange(1, basis.N)
    psi = np.zeros(basis.N)
    psi[keep] = spla.spsolve(K[keep][:, keep].tocsc(), f[keep])
    psi -= integral(lambda w: w.psi, psi=basis.interpolate(psi)) / A
    J = Ix + Iy - float(psi @ f)

    # Trefftz shear centre (x0, y0) relative to the centroid: omega = psi - y0 x + x0 y is
    # orthogonal to x and y, i.e. Ipx - y0 Iy + x0 Ixy = 0 and Ipy - y0 Ixy + x0 Ix = 0.
    Ipx = integral(lambda w: w.psi * (w.x[0] - cx), psi=basis.interpolate(psi))
    Ipy = integral(lambda w: w.psi * (w.x[1] - cy), psi=basis.interpolate(psi))
    x0, y0 = np.linalg.solve(np.array([[Ixy, -Iy], [Ix, -Ixy]]), -np.array([Ipx, Ipy]))
    # x and y are P2 (isoparametric) fields, so their nodal values represent them exactly
    X, Y = m.doflocs[0] - cx, m.doflocs[1] - cy
    omega = psi - y0 * X + x0 * Y
    omega -= integral(lambda w: w.om, om=basis.interpolate(omega)) / A
    Cw = integral(lambda w: w.om**2, om=basis.interpolate(omega))

    # Flexure (shear) functions of a unit Vx and a unit Vy: laplace(Theta) = -(a x + b y) with
    # d(Theta)/dn = h . n (h the Poisson split field, c = nu / (2 (1 + nu))), in the weak form
    # int grad(Theta) . grad(v) = int (h . grad(v) + v (a x + b y)); then tau = grad(Theta) - h
    # and C_ij = int tau_i . tau_j dA. Written here from the elasticity problem (Pilkey 2002,
    # from memory), with scikit-fem's forms: for nu = 0.3 and for nu = 0.
    D = Ix * Iy - Ixy**2
    gradients = np.array([[Ix, -Ixy], [-Ixy, Iy]]) / D  # rows (a, b) for a unit Vx, Vy

    def split(x, y, a, b, c):
        return (c * (a * 0.5 * (x * x - y * y) + b * x * y),
                c * (a * x * y + b * 0.5 * (y * y - x * x)))

    def flexibility(nu):
        c = nu / (2.0 * (1.0 + nu))
        fields = []
        for a, b in gradients:
            @LinearForm
            def flexure_load(v, w, a=a, b=b):
                x, y = w.x[0] - cx, w.x[1] - cy
                hx, hy = split(x, y, a, b, c)
                return hx * v.grad[0] + hy * v.grad[1] + v * (a * x + b * y)

            rhs = flexure_load.assemble(basis)
            theta = np.zeros(basis.N)
            theta[keep] = spla.spsolve(K[keep][:, keep].tocsc(), rhs[keep])
            fields.append((basis.interpolate(theta), a, b))

        def energy(i, j):
            (ti, ai, bi), (tj, aj, bj) = fields[i], fields[j]

            @Functional
            def product(w):
                x, y = w.x[0] - cx, w.x[1] - cy
                hxi, hyi = split(x, y, ai, bi, c)
                hxj, hyj = split(x, y, aj, bj, c)
                return ((w.ti.grad[0] - hxi) * (w.tj.grad[0] - hxj)
                        + (w.ti.grad[1] - hyi) * (w.tj.grad[1] - hyj))

            return float(product.assemble(basis, ti=ti, tj=tj))

        return np.array([[energy(i, j) for j in range(2)] for i in range(2)])

    return {"A": A, "centroid": np.array([cx, cy]), "Ix": Ix, "Iy": Iy, "Ixy": Ixy, "J": J,
            "shear_centre": np.array([cx + x0, cy + y0]), "Cw": Cw, "K": K, "f": f,
            "psi": psi, "ours": ours, "C_poisson": flexibility(0.3), "C_beam": flexibility(0.0)}


@pytest.fixture(scope="module", params=sorted(CASES))
def case(request):
    make, size, bend, _ = CASES[request.param]
    profile = make()
    mesh = build_mesh(profile, size)
    if bend:
        mesh = curved(mesh)
    return request.param, profile, mesh, skfem_section(mesh), analyse(profile, mesh=mesh)


def rel(a, b, scale=None):
    """Largest difference of a and b over the largest |b| (or over ``scale``)."""
    if hasattr(b, "tocsr"):  # sparse matrices
        return float(abs(a - b).max() / (abs(b).max() if scale is None else scale))
    return float(np.max(np.abs(np.asarray(a) - np.asarray(b))) / (
        np.max(np.abs(b)) if scale is None else scale))


def test_mesh_is_what_the_case_says(case):
    """Both element paths (constant and varying Jacobian) are really compared."""
    name, _, mesh, _, _ = case
    X = mesh.nodes[mesh.elements]
    off = np.abs(X[:, 3:] - 0.5 * (X[:, :3] + X[:, [1, 2, 0]])).max(axis=(1, 2))
    bent = float(np.mean(off > 1e-9 * np.abs(X).max()))
    kind = CASES[name][3]
    if kind == "straight":
        assert bent == 0.0
    elif kind == "arcs":
        assert 0.0 < bent < 1.0, f"{bent:.0%} of the elements are curved"
    else:
        assert bent > 0.5, f"only {bent:.0%} of the elements are curved"


def test_stiffness_and_load_match(case):
    name, profile, mesh, ref, res = case
    ours = ref["ours"]
    ev = element_values(mesh, np.asarray(res.geometric.centroid))
    K = stiffness_matrix(mesh, ev)[ours][:, ours]
    f = torsion_load(mesh, ev)[ours]
    # f_i ~ |x| |grad N_i| h^2 ~ size * h; on the polygonal tube every f_i is zero by
    # symmetry (both codes give round-off), so f is measured against that scale
    f_scale = max(float(np.abs(ref["f"]).max()), profile.size * mesh.size)
    errs = {"K": rel(K, ref["K"]), "f": rel(f, ref["f"], scale=f_scale)}
    print(f"\n  {name}: {mesh.n_nodes} nodes, "
          + ", ".join(f"{k} {v:.1e}" for k, v in errs.items()))
    assert max(errs.values()) < TOL_MATRIX, errs


def test_geometric_properties_match(case):
    name, profile, _, ref, res = case
    g = res.geometric
    size = profile.size
    errs = {"A": rel(g.A, ref["A"]),
            "centroid": rel(g.centroid, ref["centroid"], scale=size),
            "Ix": rel(g.Ix, ref["Ix"]), "Iy": rel(g.Iy, ref["Iy"]),
            "Ixy": rel(g.Ixy, ref["Ixy"], scale=np.hypot(ref["Ix"], ref["Iy"]))}
    print(f"\n  {name}: " + ", ".join(f"{k} {v:.1e}" for k, v in errs.items()))
    assert max(errs.values()) < TOL_GEOMETRY, errs


def test_torsion_and_warping_match(case):
    name, profile, mesh, ref, res = case
    t = res.torsion
    size = profile.size
    Ip = ref["Ix"] + ref["Iy"]
    # Cw of a compact section is small beside its natural scale Ip^2 / A (psi ~ r^2); the
    # difference is measured against that scale too, so near-zero Cw (tube) stays meaningful.
    cw_scale = max(abs(ref["Cw"]), 1e-6 * Ip**2 / ref["A"])
    errs = {"J": rel(t.J, ref["J"]), "J/Ip": rel(t.J, ref["J"], scale=Ip),
            "shear_centre": rel(t.shear_centre, ref["shear_centre"], scale=size),
            "Cw": rel(t.Cw, ref["Cw"], scale=cw_scale),
            "psi": rel(t.psi[ref["ours"]], ref["psi"], scale=size**2)}
    print(f"\n  {name} ({mesh.n_nodes} nodes, J/Ip {ref['J'] / Ip:.3f}): "
          + ", ".join(f"{k} {v:.1e}" for k, v in errs.items()))
    assert errs["J"] < TOL_J, errs
    for key in ("J/Ip", "shear_centre", "Cw", "psi"):
        assert errs[key] < TOL_SOLVED, errs


def test_shear_flexibility_matches(case):
    # both shear fields (Poisson's ratio 0.3 of the default material, and 0 for the beam's
    # shear areas): the same weak problem on the same space, so to the round-off of the solves
    # (TOL_SOLVED, measured below 1e-12)
    name, _, _, ref, res = case
    sh = res.shear
    assert sh.poisson == 0.3
    errs = {"C_poisson": rel(sh.flexibility_poisson, ref["C_poisson"]),
            "C_beam": rel(sh.flexibility, ref["C_beam"])}
    print(f"\n  {name}: " + ", ".join(f"{k} {v:.1e}" for k, v in errs.items()))
    assert max(errs.values()) < TOL_SOLVED, errs
    # the two fields differ on these sections (else the comparison would test one thing)
    assert rel(ref["C_poisson"], ref["C_beam"]) > 1e-4


def test_asymmetric_cases_are_not_trivial(case):
    """The angle and channel really test the shear centre and Cw (not zero by symmetry)."""
    name, profile, _, ref, _ = case
    offset = np.hypot(*(ref["shear_centre"] - ref["centroid"])) / profile.size
    if name.startswith(("angle", "channel")):
        assert offset > 0.1
        assert ref["Cw"] > 0
    if name.startswith("angle"):
        assert abs(ref["Ixy"]) > 0.1 * np.hypot(ref["Ix"], ref["Iy"])
