"""Sections of one wall thickness: the hollow rectangle, the Z-shape and the channel with lips.

The hollow rectangle has an outer and an inner corner radius; the bent (cold-formed) sections have
bends of inside radius r and outside radius r + t about one centre. Every corner radius is a
recorded arc.
"""

from __future__ import annotations

from ..profile import Profile
from .dimensions import check_sizes, require
from .outline import rounded_loop, rounded_profile, shape_profile


def hollow_rectangle(h: float, b: float, t: float, ro: float = 0.0, ri: float | None = None, *,
                     units: str = "mm") -> Profile:
    """Hollow rectangle (or square), a rectangular tube, with rounded corners.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Overall width (along x), drawing unit.
    t : float
        Wall thickness, drawing unit; ``2 t < min(h, b)``.
    ro : float
        Outer corner radius, drawing unit (0: sharp); ``2 ro <= min(h, b)``.
    ri : float, optional
        Inner corner radius, drawing unit; default ``max(ro - t, 0)`` (concentric with the
        outer corner). At least ``ro - t`` (the corner is not thinner than the wall) and
        ``2 ri <= min(h, b) - 2 t``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Centroid at the origin.

    Examples
    --------
    >>> p = hollow_rectangle(100.0, 50.0, 4.0, ro=8.0)
    >>> [round(a.r, 9) for a in p.arcs][:2], len(p.arcs)
    ([8.0, 8.0], 8)

    """
    label = "hollow rectangle"
    h, b, t, ro = check_sizes(label, dict(h=h, b=b, t=t), dict(ro=ro))
    given = ri is not None
    ri = max(ro - t, 0.0) if ri is None else check_sizes(label, {}, dict(ri=ri))[0]
    small = min(h, b)
    require(2 * t < small, label, f"two walls of t={t:g} do not fit in the width {small:g}")
    require(2 * ro <= small, label, f"outer corner radius ro={ro:g} is more than half the "
            f"smaller side ({small / 2:g})")
    require(ri >= ro - t - 1e-12 * small, label,
            f"inner corner radius ri={ri:g} must be at least ro - t = {ro - t:g} (the corner "
            f"would be thinner than the wall)")
    require(2 * ri <= small - 2 * t, label, f"inner corner radius ri={ri:g} is more than half "
            f"the smaller inner side ({(small - 2 * t) / 2:g})")
    x, y = b / 2, h / 2
    outer, arcs_o = rounded_loop([(-x, -y), (x, -y), (x, y), (-x, y)], [ro] * 4, max(b, h), label)
    u, v = x - t, y - t
    inner, arcs_i = rounded_loop([(-u, -v), (u, -v), (u, v), (-u, v)], [ri] * 4, max(b, h), label)
    return shape_profile(label, [outer, inner], arcs_o + arcs_i, units, h=h, b=b, t=t, ro=ro,
                         ri=ri if given else None)


def z_shape(h: float, b: float, t: float, r: float = 0.0, *, units: str = "mm") -> Profile:
    """Z-shape of constant thickness with equal flanges, cold-formed (bent) or plain.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Overall flange width, from the outer face of the web to the flange tip, drawing unit.
    t : float
        Thickness, drawing unit.
    r : float
        Inside bend radius, drawing unit; the outside radius is ``r + t`` (concentric).
        0 gives a plain Z-shape with sharp corners inside and out. ``r + t <= b`` and
        ``2 (r + t) <= h``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Centroid (the centre of point symmetry) at the origin; web centred on x = 0, top
        flange towards +x, bottom flange towards -x.

    """
    label = "Z-shape"
    h, b, t, r = check_sizes(label, dict(h=h, b=b, t=t), dict(r=r))
    require(t < b, label, f"thickness t={t:g} must be less than the flange width b={b:g}")
    require(2 * t < h, label, f"two flanges of t={t:g} do not fit in the depth h={h:g}")
    require(r + t <= b, label,
            f"bend radius r={r:g} plus thickness t={t:g} is more than the flange width b={b:g}")
    require(2 * (r + t) <= h, label,
            f"two bends of outside radius r + t = {r + t:g} do not fit in the depth h={h:g}")
    u, y = t / 2, h / 2
    f = b - t / 2  # flange tip from the web centre line
    corners = [(-f, -y), (u, -y), (u, y - t), (f, y - t), (f, y), (-u, y), (-u, -y + t), (-f, -y + t)]
    o = r + t if r > 0 else 0.0
    radii = [0, o, r, 0, 0, o, r, 0]
    return rounded_profile(label, corners, radii, max(b, h), units, h=h, b=b, t=t, r=r)


def channel_with_lips(h: float, b: float, c: float, t: float, r: float = 0.0, *,
                      units: str = "mm") -> Profile:
    """Cold-formed channel of constant thickness with lips turned in at the flange tips.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Overall flange width, from the back of the web, drawing unit.
    c : float
        Overall lip length, from the outer face of the flange to the lip tip, drawing unit;
        ``r + t <= c`` and ``2 c < h`` (the lips must not meet).
    t : float
        Thickness, drawing unit.
    r : float
        Inside radius of the four bends, drawing unit (outside radius ``r + t``, concentric);
        0 gives sharp corners inside and out. ``2 (r + t) <= b`` and ``2 (r + t) <= h``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Back of the web on x = 0, mid-depth on y = 0 (the axis of symmetry), flanges towards
        +x, lips turned in towards y = 0.

    """
    label = "channel with lips"
    h, b, c, t, r = check_sizes(label, dict(h=h, b=b, c=c, t=t), dict(r=r))
    o = r + t
    require(2 * c < h, label, f"lip length c={c:g} must be less than half the depth h={h:g} "
            f"(the lips would meet)")
    require(o <= c, label, f"lip length c={c:g} is shorter than the bend, r + t = {o:g}")
    require(2 * o <= b, label,
            f"flange width b={b:g} is less than two bends, 2 (r + t) = {2 * o:g}")
    require(2 * o <= h, label, f"depth h={h:g} is less than two bends, 2 (r + t) = {2 * o:g}")
    y = h / 2
    corners = [(0, -y), (b, -y), (b, -y + c), (b - t, -y + c), (b - t, -y + t), (t, -y + t),
               (t, y - t), (b - t, y - t), (b - t, y - c), (b, y - c), (b, y), (0, y)]
    ro = o if r > 0 else 0.0
    radii = [ro, ro, 0, 0, r, r, r, r, 0, 0, ro, ro]
    return rounded_profile(label, corners, radii, max(b, h), units, h=h, b=b, c=c, t=t, r=r)
