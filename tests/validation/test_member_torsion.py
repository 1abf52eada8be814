"""Member torsion with restrained warping against published closed forms and solve_bvp.

Closed forms: AISC Design Guide 9, Torsional Analysis of Structural Steel Members (Seaburg &
Carter, 1997), Appendix B cases; the formulas are written here from memory of the cases and
each was checked by substitution into E Cw phi'''' - G J phi'' = m and its end conditions.
The member solution is exact (closed form per segment), so the agreement is round-off: 1e-12
relative to the largest value of the case. The independent check is scipy's solve_bvp on the
same ODE at a tight tolerance (1e-10 on the collocation residual): agreement 1e-7 of the
largest value, the accuracy solve_bvp reaches on these smooth problems.
"""

from __future__ import annotations

import numpy as np
import pytest
from scipy.integrate import solve_bvp

from warpwise.errors import UsageError
from warpwise.member import ENDS, MemberLoads, extremes, solve_member

GJ = 2.0e9       # N*mm^2 (an invented section)
A_LEN = 400.0    # torsion bending length a, mm
ECW = GJ * A_LEN**2
L = 3000.0
T0 = 1.0e6       # N*mm
M0 = 500.0       # N*mm/mm
ROUND_OFF = 1e-12  # exact solution: only round-off of cosh/sinh and a 4n x 4n solve


def _close(got, want):
    scale = np.max(np.abs(want))
    assert np.max(np.abs(got - want)) <= ROUND_OFF * scale, np.max(np.abs(got - want)) / scale


def test_pinned_concentrated_midspan():
    # AISC DG9 Appendix B, pinned ends (twist fixed, warping free), concentrated torque at
    # midspan (from memory): phi = T a / (2 G J) (z/a - sinh(z/a) / cosh(L / 2a)), z <= L/2
    m = solve_member(L, GJ, ECW, ("pinned", "pinned"), MemberLoads(((T0, L / 2),)))
    z = np.linspace(0.0, L / 2, 41)
    a, c = A_LEN, np.cosh(L / (2 * A_LEN))
    phi = T0 * a / (2 * GJ) * (z / a - np.sinh(z / a) / c)
    phi2 = -T0 / (2 * GJ * a) * np.sinh(z / a) / c
    got = m.actions(z, "left")
    _close(got.phi, phi)
    _close(got.phi2, phi2)
    # the torque is shared half and half (statics, common practice, no source)
    _close(got.T, np.full_like(z, T0 / 2))


def test_pinned_uniform():
    # AISC DG9 Appendix B, pinned ends, uniformly distributed torque (from memory):
    # phi = m a^2 / (G J) [L^2 / (2 a^2) (z/L - z^2/L^2) + cosh(z/a) - tanh(L/2a) sinh(z/a) - 1]
    m = solve_member(L, GJ, ECW, ("pinned", "pinned"), MemberLoads(distributed=M0))
    z = np.linspace(0.0, L, 61)
    a = A_LEN
    shape = np.cosh(z / a) - np.tanh(L / (2 * a)) * np.sinh(z / a)
    phi = M0 * a**2 / GJ * (L**2 / (2 * a**2) * (z / L - z**2 / L**2) + shape - 1.0)
    phi2 = M0 / GJ * (shape - 1.0)
    got = m.actions(z)
    _close(got.phi, phi)
    _close(got.phi2, phi2)
    _close(got.T, M0 * (L / 2 - z))  # statics


def test_fixed_concentrated_midspan():
    # AISC DG9 Appendix B, fixed ends (twist and warping fixed), concentrated torque at
    # midspan (from memory): phi = T a / (2 G J) [(cosh(L/2a) - 1) / sinh(L/2a)
    # (cosh(z/a) - 1) - sinh(z/a) + z/a], z <= L/2
    m = solve_member(L, GJ, ECW, ("fixed", "fixed"), MemberLoads(((T0, L / 2),)))
    z = np.linspace(0.0, L / 2, 41)
    a, h = A_LEN, L / (2 * A_LEN)
    r = (np.cosh(h) - 1.0) / np.sinh(h)
    phi = T0 * a / (2 * GJ) * (r * (np.cosh(z / a) - 1.0) - np.sinh(z / a) + z / a)
    B = -ECW * T0 / (2 * GJ * a) * (r * np.cosh(z / a) - np.sinh(z / a))
    got = m.actions(z, "left")
    _close(got.phi, phi)
    _close(got.B, B)


def test_fixed_uniform():
    # AISC DG9 Appendix B, fixed ends, uniformly distributed torque; the formula in the
    # symmetric coordinate x = z - L/2 (from memory, checked by substitution):
    # phi = m / (2 G J) (L^2/4 - x^2) - m a L / (2 G J) (cosh(L/2a) - cosh(x/a)) / sinh(L/2a)
    m = solve_member(L, GJ, ECW, ("fixed", "fixed"), MemberLoads(distributed=M0))
    z = np.linspace(0.0, L, 61)
    x, a, h = z - L / 2, A_LEN, L / (2 * A_LEN)
    phi = M0 / (2 * GJ) * (L**2 / 4 - x**2) - M0 * a * L / (2 * GJ) * (
        np.cosh(h) - np.cosh(x / a)) / np.sinh(h)
    got = m.actions(z)
    _close(got.phi, phi)
    # warping fixed: phi' = 0 at both ends, to round-off of the largest phi'
    assert np.max(np.abs(got.phi1[[0, -1]])) <= ROUND_OFF * np.max(np.abs(got.phi1))


def test_cantilever_end_torque():
    # AISC DG9 Appendix B, cantilever (fixed at z = 0, free at z = L), torque at the free end
    # (from memory): phi = T a / (G J) [z/a + (sinh((L - z)/a) - sinh(L/a)) / cosh(L/a)]
    m = solve_member(L, GJ, ECW, ("fixed", "free"), MemberLoads(((T0, L),)))
    z = np.linspace(0.0, L, 61)
    a = A_LEN
    phi = T0 * a / GJ * (z / a + (np.sinh((L - z) / a) - np.sinh(L / a)) / np.cosh(L / a))
    got = m.actions(z)
    _close(got.phi, phi)
    _close(got.T, np.full_like(z, T0))
    # the bimoment at the root: |B| = T a tanh(L/a) (same case, from memory); with
    # B = -E Cw phi'' and phi'' > 0 at the root it is negative
    assert got.B[0] == pytest.approx(-T0 * A_LEN * np.tanh(L / A_LEN), rel=ROUND_OFF)


def _bvp(ends, z0, T, m_dist, length=L):
    """phi, phi', phi'', phi''' by solve_bvp: two segments [0, z0], [z0, L] stacked.

    Each segment is mapped to t in [0, 1]; y = (phi, phi', phi'', phi''') of segment 1 then
    segment 2, in scaled form (lengths in a), so the residual tolerance is relative.
    """
    a = A_LEN
    h1, h2 = z0 / a, (length - z0) / a
    q = m_dist * a * a / GJ  # phi'''' = phi'' + q in units of a

    def f(t, y):
        d = []
        for k, h in ((0, h1), (4, h2)):
            d += [h * y[k + 1], h * y[k + 2], h * y[k + 3], h * (y[k + 2] + q)]
        return np.array(d)

    def bc(ya, yb):
        out = []
        for y, k, s in ((ya, 0, 0.0), (yb, 4, 1.0)):
            twist, warping = ENDS[ends[int(s)]]
            # T a / GJ = phi' - phi''' (scaled)
            out.append(y[k] if twist else y[k + 1] - y[k + 3])
            out.append(y[k + 1] if warping else y[k + 2])
        jump = T * a / GJ
        out += [yb[0] - ya[4], yb[1] - ya[5], yb[2] - ya[6],
                (ya[5] - ya[7]) - (yb[1] - yb[3]) + jump]
        return np.array(out)

    t = np.linspace(0.0, 1.0, 201)
    sol = solve_bvp(f, bc, t, np.zeros((8, t.size)), tol=1e-10, max_nodes=200000)
    assert sol.success, sol.message
    return sol, a


@pytest.mark.parametrize("ends", [("fixed", "pinned"), ("pinned", "fixed"), ("fixed", "free"),
                                  ("warping-fixed", "fixed"), ("pinned", "warping-fixed")])
def test_against_solve_bvp(ends):
    # scipy's solve_bvp as an independent solution of the same ODE: a torque at 0.3 L and a
    # uniform torque, mixed ends (no published closed form for every mix)
    z0 = 0.3 * L
    m = solve_member(L, GJ, ECW, ends, MemberLoads(((T0, z0),), M0))
    sol, a = _bvp(ends, z0, T0, M0)
    t = np.linspace(0.0, 1.0, 101)
    y = sol.sol(t)
    for k, z in ((0, t * z0), (4, z0 + t * (L - z0))):
        side = "left" if k == 0 else "right"
        got = m.derivatives(z, side)
        for d in range(4):  # phi^(d) = y / a^d
            want = y[k + d] / a**d
            scale = max(np.max(np.abs(m.derivatives(np.linspace(0, L, 301))[d])), 1e-300)
            assert np.max(np.abs(got[d] - want)) <= 1e-7 * scale, (d, ends)


def test_long_member_no_overflow():
    # L/a = 5000: cosh(L/a) overflows; far from the ends phi'' -> -m / GJ, the pure
    # Saint-Venant value (common practice, no source), and phi of pinned ends tends to the
    # parabola m z (L - z) / (2 G J) minus the end boundary layers m a^2 / GJ
    length = 5000.0 * A_LEN
    m = solve_member(length, GJ, ECW, ("pinned", "pinned"), MemberLoads(distributed=M0))
    z = np.array([length / 2])
    got = m.actions(z)
    assert np.all(np.isfinite(m.constants))
    assert got.phi2[0] == pytest.approx(-M0 / GJ, rel=1e-12)
    assert got.phi[0] == pytest.approx(M0 * length**2 / (8 * GJ) - M0 * A_LEN**2 / GJ, rel=1e-12)


def test_saint_venant_only():
    # Cw = 0: pure Saint-Venant; twist fixed at both ends with a torque at alpha L: the ends
    # take T (1 - alpha) and T alpha, phi_max = T alpha (1 - alpha) L / (G J) (statics,
    # common practice, no source)
    alpha = 0.3
    m = solve_member(L, GJ, 0.0, ("fixed", "pinned"), MemberLoads(((T0, alpha * L),)))
    assert m.saint_venant_only
    got = m.actions(np.array([alpha * L]))
    assert got.phi[0] == pytest.approx(T0 * alpha * (1 - alpha) * L / GJ, rel=ROUND_OFF)
    assert got.B[0] == 0.0 and got.T_w[0] == 0.0
    left = m.actions(np.array([0.0]))
    assert left.T_sv[0] == pytest.approx(T0 * (1 - alpha), rel=ROUND_OFF)


def test_small_warping_tends_to_saint_venant():
    # a -> 0: the restrained solution tends to pure Saint-Venant torsion (common practice,
    # no source); each warping-fixed end and the load point shift phi by about a |phi'|, so
    # the difference is bounded by 3 a max|phi'| (a = 1e-4 L)
    a = 1e-4 * L
    tiny = GJ * a**2
    loads = MemberLoads(((T0, 0.3 * L),), M0)
    z = np.linspace(0.0, L, 31)
    sv = solve_member(L, GJ, 0.0, ("fixed", "fixed"), loads).actions(z)
    vl = solve_member(L, GJ, tiny, ("fixed", "fixed"), loads).actions(z)
    assert np.max(np.abs(vl.phi - sv.phi)) <= 3 * a * np.max(np.abs(sv.phi1))
    assert np.max(np.abs(vl.phi - sv.phi)) >= 0.1 * a * np.max(np.abs(sv.phi1))  # not equal


def test_extremes_of_pinned_midspan_torque():
    # the largest twist and bimoment are at midspan: phi = T a / (2GJ) (L/2a - tanh(L/2a)),
    # B = T a tanh(L/2a) / 2 (AISC DG9 Appendix B, pinned ends, torque at midspan, from memory)
    m = solve_member(L, GJ, ECW, ("pinned", "pinned"), MemberLoads(((T0, L / 2),)))
    found = {e.name: e for e in extremes(m)}
    h = L / (2 * A_LEN)
    assert found["phi"].z == pytest.approx(L / 2, rel=1e-9)
    assert found["phi"].value == pytest.approx(T0 * A_LEN / (2 * GJ) * (h - np.tanh(h)), rel=1e-12)
    assert found["B"].value == pytest.approx(T0 * A_LEN * np.tanh(h) / 2, rel=1e-12)
    # at the load point the warping torque takes all of the half torque T/2 (phi' = 0 there)
    assert found["T_w"].value == pytest.approx(T0 / 2, rel=1e-12)


@pytest.mark.parametrize("ends, text", [(("free", "free"), "mechanism"),
                                        (("free", "warping-fixed"), "mechanism"),
                                        (("fixed", "clamped"), "unknown end condition")])
def test_refusals(ends, text):
    with pytest.raises(UsageError, match=text):
        solve_member(L, GJ, ECW, ends, MemberLoads(((T0, L / 2),)))


def test_torque_outside_refused():
    with pytest.raises(UsageError, match="outside the member"):
        solve_member(L, GJ, ECW, ("fixed", "fixed"), MemberLoads(((T0, 1.5 * L),)))
