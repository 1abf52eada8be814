"""Torsion of a member with restrained warping (Vlasov), solved exactly.

The twist phi(z) of a prismatic member of length L solves

    E Cw phi'''' - G J phi'' = m

with m the distributed torque per length (one uniform value here) and concentrated torques
T_i at positions z_i. The internal torque is T = G J phi' - E Cw phi''' (its Saint-Venant part
T_sv = G J phi', its warping part T_w = -E Cw phi'''), equilibrium dT/dz = -m, and a
concentrated torque T_i makes T jump by -T_i. The bimoment is B = -E Cw phi''.

Between load points the solution is, with a = sqrt(E Cw / (G J)), s the distance from the
segment's start and h its length,

    phi = C1 + C2 s / a + C3 exp(-s/a) + C4 exp(-(h - s)/a) - m s^2 / (2 G J),

each exponential shifted to the end where it is largest, so nothing overflows and no digits
are lost for any L/a (cosh(L/a) overflows for L/a > 710). Continuity of phi, phi', phi'' and
the torque jump at each load point and two conditions at each end give 4 n equations for the
4 n constants of n segments, solved directly (exact up to round-off).

With Cw = 0 (a closed tube, a solid circle) warping is not restrained: pure Saint-Venant
torsion, phi = C1 + C2 s - m s^2 / (2 G J), no bimoment and no warping torque.

Units: any consistent set (length L, force F): z in L, torques in F*L, m in F*L/L, G J in
F*L^2, E Cw in F*L^4; phi in rad, phi' rad/L, phi'' rad/L^2, phi''' rad/L^3, B in F*L^2.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from ..errors import UsageError

#: End conditions by name: (twist fixed, warping fixed).
ENDS = {"fixed": (True, True), "pinned": (True, False), "free": (False, False),
        "warping-fixed": (False, True)}

#: What each end condition means, for messages and help.
END_TEXT = {"fixed": "twist and warping fixed", "pinned": "twist fixed, warping free",
            "free": "twist and warping free",
            "warping-fixed": "twist free, warping fixed"}


@dataclass(frozen=True)
class MemberLoads:
    """Torques on a member (F*L and F*L/L).

    Attributes
    ----------
    torques : tuple of (float, float)
        Concentrated torques (T, z): torque F*L about the member axis at position z, L.
    distributed : float
        Uniformly distributed torque over the whole length, F*L per L.
    """

    torques: tuple[tuple[float, float], ...] = ()
    distributed: float = 0.0


@dataclass(frozen=True, eq=False)
class MemberTorsion:
    """The exact solution of one member: constants per segment and how to evaluate them.

    Attributes
    ----------
    length : float
        Member length L.
    GJ, ECw : float
        Torsional stiffness F*L^2 and warping stiffness F*L^4 (ECw 0: pure Saint-Venant).
    ends : (str, str)
        End conditions at z = 0 and z = L (keys of :data:`ENDS`).
    loads : MemberLoads
        The loads.
    starts : numpy.ndarray
        Start of each segment (n + 1,) with the member end last, L.
    constants : numpy.ndarray
        (n, 4) constants C1..C4 per segment (rad); C3 = C4 = 0 for pure Saint-Venant, where C2
        is then phi' in rad/L.
    """

    length: float
    GJ: float
    ECw: float
    ends: tuple[str, str]
    loads: MemberLoads
    starts: np.ndarray
    constants: np.ndarray

    @property
    def saint_venant_only(self) -> bool:
        """True when Cw = 0: no restrained warping, no bimoment."""
        return self.ECw == 0.0

    @property
    def a(self) -> float:
        """Torsion bending length sqrt(E Cw / (G J)), L (0 for pure Saint-Venant)."""
        return float(np.sqrt(self.ECw / self.GJ))

    def derivatives(self, z: np.ndarray, side: str = "right") -> np.ndarray:
        """phi, phi', phi'', phi''' at positions z (k,) as a (4, k) array.

        At a load point, ``side`` chooses the segment: "right" (the limit from above, the
        default) or "left" (the limit from below); phi''' jumps there.
        """
        z = np.atleast_1d(np.asarray(z, dtype=float))
        if side == "left":
            seg = np.searchsorted(self.starts, z, side="left") - 1
        else:
            seg = np.searchsorted(self.starts, z, side="right") - 1
        seg = np.clip(seg, 0, len(self.constants) - 1)
        s = z - self.starts[seg]
        h = self.starts[seg + 1] - self.starts[seg]
        c = self.constants[seg]
        q = self.loads.distributed / self.GJ
        if self.saint_venant_only:
            zero = np.zeros_like(s)
            return np.array([c[:, 0] + c[:, 1] * s - 0.5 * q * s * s, c[:, 1] - q * s,
                             zero - q, zero])
        a = self.a
        e1, e2 = np.exp(-s / a), np.exp(-(h - s) / a)
        return np.array([
            c[:, 0] + c[:, 1] * s / a + c[:, 2] * e1 + c[:, 3] * e2 - 0.5 * q * s * s,
            (c[:, 1] - c[:, 2] * e1 + c[:, 3] * e2) / a - q * s,
            (c[:, 2] * e1 + c[:, 3] * e2) / a**2 - q,
            (-c[:, 2] * e1 + c[:, 3] * e2) / a**3])

    def actions(self, z: np.ndarray, side: str = "right") -> MemberActions:
        """Twist, its derivatives, the torques and the bimoment at positions z (k,)."""
        z = np.atleast_1d(np.asarray(z, dtype=float))
        d = self.derivatives(z, side)
        return MemberActions(z=z, phi=d[0], phi1=d[1], phi2=d[2], phi3=d[3],
                             T_sv=self.GJ * d[1], T_w=-self.ECw * d[3], B=-self.ECw * d[2])


@dataclass(frozen=True, eq=False)
class MemberActions:
    """Values along a member at positions z (each array (k,)).

    Attributes
    ----------
    z : numpy.ndarray
        Positions, L.
    phi, phi1, phi2, phi3 : numpy.ndarray
        Twist rad and its derivatives rad/L, rad/L^2, rad/L^3.
    T_sv, T_w : numpy.ndarray
        Saint-Venant torque G J phi' and warping torque -E Cw phi''', F*L.
    B : numpy.ndarray
        Bimoment -E Cw phi'', F*L^2.
    """

    z: np.ndarray
    phi: np.ndarray
    phi1: np.ndarray
    phi2: np.ndarray
    phi3: np.ndarray
    T_sv: np.ndarray
    T_w: np.ndarray
    B: np.ndarray

    @property
    def T(self) -> np.ndarray:
        """Internal torque T_sv + T_w, F*L."""
        return self.T_sv + self.T_w


def check_member(length: float, ends: Sequence[str], loads: MemberLoads) -> None:
    """Refuse a bad length, supports or loads with one line naming the input and the defect.

    Any unit system (length L, torques F*L); the section is not needed.
    """
    if not (np.isfinite(length) and length > 0):
        raise UsageError(f"the member length must be a positive number, got {length}")
    if len(ends) != 2:
        raise UsageError(f"give two end conditions (at z = 0 and z = L), got {len(ends)}")
    for end in ends:
        if end not in ENDS:
            raise UsageError(f"unknown end condition {end!r} (use {', '.join(ENDS)})")
    if not (ENDS[ends[0]][0] or ENDS[ends[1]][0]):
        raise UsageError("both ends have their twist free: the member turns as a rigid body "
                         "(a mechanism); fix the twist at one end at least (fixed or pinned)")
    for T, z in loads.torques:
        if not (np.isfinite(T) and np.isfinite(z)):
            raise UsageError(f"a concentrated torque must be finite, got {T} at {z}")
        if not 0.0 <= z <= length:
            raise UsageError(f"the torque {T:g} at z = {z:g} lies outside the member "
                             f"(z from 0 to {length:g})")
    if not np.isfinite(loads.distributed):
        raise UsageError(f"the distributed torque must be finite, got {loads.distributed}")


def _segments(length: float, loads: MemberLoads) -> tuple[np.ndarray, np.ndarray, float, float]:
    """Segment starts (with L last), the torque at each inner point, and at the two ends."""
    tol = 1e-12 * length
    inner = sorted({z for _T, z in loads.torques if tol < z < length - tol})
    starts = np.array([0.0, *inner, length])
    jump = np.zeros(len(inner))
    at0 = atL = 0.0
    for T, z in loads.torques:
        if z <= tol:
            at0 += T
        elif z >= length - tol:
            atL += T
        else:
            jump[int(np.argmin(np.abs(np.array(inner) - z)))] += T
    return starts, jump, at0, atL


def _rows(s: float, h: float, a: float) -> np.ndarray:
    """Rows phi, a phi', a^2 phi'', a T / GJ of one segment's homogeneous part at s."""
    e1, e2 = np.exp(-s / a), np.exp(-(h - s) / a)
    return np.array([[1.0, s / a, e1, e2], [0.0, 1.0, -e1, e2], [0.0, 0.0, e1, e2],
                     [0.0, 1.0, 0.0, 0.0]])


def _particular(s: float, a: float, q: float) -> np.ndarray:
    """The particular part of phi, a phi', a^2 phi'', a T / GJ at s (q = m / GJ)."""
    return np.array([-0.5 * q * s * s, -a * q * s, -a * a * q, -a * q * s])


def _warping_system(starts, jump, at0, atL, ends, a, q, GJ):
    """The 4 n equations of the restrained-warping member (rows scaled to rad)."""
    n = len(starts) - 1
    h = np.diff(starts)
    A = np.zeros((4 * n, 4 * n))
    b = np.zeros(4 * n)
    row = 0
    for end, seg, s, torque, sign in ((ends[0], 0, 0.0, at0, -1.0),
                                      (ends[1], n - 1, h[-1], atL, 1.0)):
        twist, warping = ENDS[end]
        vals, part = _rows(s, h[seg], a), _particular(s, a, q)
        # twist fixed: phi = 0; free: T = sign * torque at the end; warping fixed: phi' = 0,
        # free: phi'' = 0
        pick = [0 if twist else 3, 1 if warping else 2]
        rhs = [0.0 if twist else sign * torque * a / GJ, 0.0]
        for k, r in zip(pick, rhs, strict=True):
            A[row, 4 * seg:4 * seg + 4] = vals[k]
            b[row] = r - part[k]
            row += 1
    for j in range(n - 1):  # a handful of load points
        left, right = _rows(h[j], h[j], a), _rows(0.0, h[j + 1], a)
        pl, pr = _particular(h[j], a, q), _particular(0.0, a, q)
        A[row:row + 4, 4 * j:4 * j + 4] = left
        A[row:row + 4, 4 * j + 4:4 * j + 8] = -right
        b[row:row + 4] = pr - pl
        b[row + 3] += jump[j] * a / GJ  # T_right - T_left = -T_j
        row += 4
    return A, b


def _saint_venant_system(starts, jump, at0, atL, ends, q, GJ):
    """The 2 n equations of pure Saint-Venant torsion: phi continuous, T jumps."""
    n = len(starts) - 1
    h = np.diff(starts)
    A = np.zeros((2 * n, 2 * n))
    b = np.zeros(2 * n)
    L = starts[-1]
    row = 0
    for end, seg, s, torque, sign in ((ends[0], 0, 0.0, at0, -1.0),
                                      (ends[1], n - 1, h[-1], atL, 1.0)):
        if ENDS[end][0]:  # phi = 0, scaled by 1/L so every row is in rad
            A[row, 2 * seg:2 * seg + 2] = [1.0 / L, s / L]
            b[row] = 0.5 * q * s * s / L
        else:  # T / GJ = phi' = C2 - q s
            A[row, 2 * seg + 1] = 1.0
            b[row] = sign * torque / GJ + q * s
        row += 1
    for j in range(n - 1):
        A[row, 2 * j:2 * j + 2] = [1.0 / L, h[j] / L]
        A[row, 2 * j + 2] = -1.0 / L
        b[row] = 0.5 * q * h[j] ** 2 / L
        A[row + 1, 2 * j + 1], A[row + 1, 2 * j + 3] = 1.0, -1.0
        b[row + 1] = q * h[j] + jump[j] / GJ
        row += 2
    return A, b


def solve_member(length: float, GJ: float, ECw: float, ends: Sequence[str],
                 loads: MemberLoads) -> MemberTorsion:
    """Solve the torsion of a member with restrained warping exactly.

    Parameters
    ----------
    length : float
        Member length L.
    GJ : float
        Torsional stiffness G J, F*L^2 (> 0).
    ECw : float
        Warping stiffness E Cw, F*L^4 (0: pure Saint-Venant torsion).
    ends : (str, str)
        End conditions at z = 0 and z = L, each a key of :data:`ENDS`.
    loads : MemberLoads
        Concentrated torques F*L at positions L, uniform torque F*L/L.

    Returns
    -------
    MemberTorsion

    Examples
    --------
    >>> m = solve_member(1000.0, 1.0e9, 0.0, ("fixed", "free"), MemberLoads(((2.0e5, 1000.0),)))
    >>> round(float(m.actions([1000.0]).phi[0]), 6)  # T L / (G J)
    0.2
    """
    ends = tuple(ends)
    check_member(length, ends, loads)
    if not (np.isfinite(GJ) and GJ > 0):
        raise UsageError(f"the torsional stiffness GJ must be positive, got {GJ}")
    if not (np.isfinite(ECw) and ECw >= 0):
        raise UsageError(f"the warping stiffness ECw must be zero or positive, got {ECw}")
    starts, jump, at0, atL = _segments(length, loads)
    q = loads.distributed / GJ
    if ECw == 0.0:
        A, b = _saint_venant_system(starts, jump, at0, atL, ends, q, GJ)
        c = np.linalg.solve(A, b).reshape(-1, 2)
        constants = np.hstack([c, np.zeros_like(c)])
    else:
        a = float(np.sqrt(ECw / GJ))
        A, b = _warping_system(starts, jump, at0, atL, ends, a, q, GJ)
        constants = np.linalg.solve(A, b).reshape(-1, 4)
    return MemberTorsion(length=float(length), GJ=float(GJ), ECw=float(ECw), ends=ends,
                         loads=loads, starts=starts, constants=constants)


__all__ = ["END_TEXT", "ENDS", "MemberActions", "MemberLoads", "MemberTorsion", "check_member",
           "solve_member"]
