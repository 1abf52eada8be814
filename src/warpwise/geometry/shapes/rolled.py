"""Rolled and welded open sections: a web (or stem) and flanges of their own thicknesses.

I-beams (H when the flanges are wide), channels, angles and tees, with root fillets where web
and flange meet (and toe radii on angles). Straight edges are exact; every fillet is a recorded arc.
"""

from __future__ import annotations

from ..profile import Profile
from .dimensions import check_sizes, require
from .outline import rounded_profile


def _web_and_flanges(label: str, h: object, b: object, tw: object, tf: object, r: object, *,
                     flanges: int, outstands: int, web: str = "web"
                     ) -> tuple[float, float, float, float, float]:
    """Check the dimensions of a web (or stem) with one or two flanges; return them as floats.

    Parameters
    ----------
    label : str
        Shape named in messages.
    h, b, tw, tf : object
        Overall depth, flange width, web and flange thicknesses, drawing unit.
    r : object
        Root radius, drawing unit (0: sharp).
    flanges : int
        1 (a flange at the top of a stem) or 2 (one at each end of the web).
    outstands : int
        Outstands each flange has beside the web: 2 (the web in the middle), 1 (at the end).
    web : str
        What the part between the flanges is called in messages.

    Returns
    -------
    tuple of float
        ``(h, b, tw, tf, r)``, drawing unit.

    Raises
    ------
    ProfileError
        For a dimension that is not positive (r: negative) or does not fit.

    """
    h, b, tw, tf, r = check_sizes(label, dict(h=h, b=b, tw=tw, tf=tf), dict(r=r))
    require(tw < b, label, f"{web} thickness tw={tw:g} must be less than the flange width b={b:g}")
    if flanges == 2:
        require(2 * tf < h, label, f"two flanges of tf={tf:g} do not fit in the depth h={h:g}")
    else:
        require(tf < h, label, f"flange thickness tf={tf:g} must be less than the depth h={h:g}")
    outstand, text = ((b - tw) / 2, "(b - tw)/2") if outstands == 2 else (b - tw, "b - tw")
    require(r <= outstand, label,
            f"root radius r={r:g} is larger than the flange outstand {text} = {outstand:g}")
    if flanges == 2:
        require(2 * r <= h - 2 * tf, label,
                f"root radius r={r:g} is larger than half the web depth between flanges, "
                f"(h - 2 tf)/2 = {(h - 2 * tf) / 2:g}")
    else:
        require(r <= h - tf, label, f"root radius r={r:g} is longer than the stem below the "
                f"flange, h - tf = {h - tf:g}")
    return h, b, tw, tf, r


def i_beam(h: float, b: float, tw: float, tf: float, r: float = 0.0, *,
           units: str = "mm") -> Profile:
    """I-beam (an H when the flanges are wide) with parallel flanges and root fillets.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Flange width (along x), drawing unit.
    tw : float
        Web thickness, drawing unit; ``tw < b``.
    tf : float
        Flange thickness, drawing unit; ``2 tf < h``.
    r : float
        Root radius between web and flanges, drawing unit (0: sharp corners);
        ``r <= (b - tw) / 2`` and ``2 r <= h - 2 tf``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Centroid at the origin, web along y.

    Examples
    --------
    >>> p = i_beam(200.0, 100.0, 5.6, 8.5, 12.0)
    >>> round(p.area, 1)  # of the polygon; the arcs give 2 b tf + (h - 2 tf) tw + (4 - pi) r^2
    2849.4

    """
    label = "I-beam"
    h, b, tw, tf, r = _web_and_flanges(label, h, b, tw, tf, r, flanges=2, outstands=2)
    x, y, u, v = b / 2, h / 2, tw / 2, h / 2 - tf
    corners = [(-x, -y), (x, -y), (x, -v), (u, -v), (u, v), (x, v), (x, y), (-x, y), (-x, v),
               (-u, v), (-u, -v), (-x, -v)]
    radii = [0, 0, 0, r, r, 0, 0, 0, 0, r, r, 0]
    return rounded_profile(label, corners, radii, max(b, h), units, h=h, b=b, tw=tw, tf=tf, r=r)


def channel(h: float, b: float, tw: float, tf: float, r: float = 0.0, *,
            units: str = "mm") -> Profile:
    """Channel with parallel flanges and root fillets.

    Parameters
    ----------
    h : float
        Overall depth (along y), drawing unit.
    b : float
        Overall flange width, from the back of the web (along x), drawing unit; ``tw < b``.
    tw : float
        Web thickness, drawing unit.
    tf : float
        Flange thickness, drawing unit; ``2 tf < h``.
    r : float
        Root radius between web and flanges, drawing unit (0: sharp);
        ``r <= b - tw`` and ``2 r <= h - 2 tf``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Back of the web on x = 0, mid-depth on y = 0 (the axis of symmetry), flanges towards +x.

    """
    label = "channel"
    h, b, tw, tf, r = _web_and_flanges(label, h, b, tw, tf, r, flanges=2, outstands=1)
    y, v = h / 2, h / 2 - tf
    corners = [(0, -y), (b, -y), (b, -v), (tw, -v), (tw, v), (b, v), (b, y), (0, y)]
    radii = [0, 0, 0, r, r, 0, 0, 0]
    return rounded_profile(label, corners, radii, max(b, h), units, h=h, b=b, tw=tw, tf=tf, r=r)


def angle(h: float, b: float, t: float, r: float = 0.0, r_toe: float = 0.0, *,
          units: str = "mm") -> Profile:
    """Angle (L section) with a root radius and optional toe radii.

    Parameters
    ----------
    h : float
        Overall length of the leg along y, drawing unit.
    b : float
        Overall length of the leg along x, drawing unit.
    t : float
        Thickness of both legs, drawing unit; ``t < min(h, b)``.
    r : float
        Root radius at the inside corner, drawing unit (0: sharp).
    r_toe : float
        Radius at each toe, between the inside face of a leg and its end, drawing unit;
        ``r_toe <= t`` and ``r + r_toe <= min(h, b) - t``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Heel (outer corner, sharp) at the origin, legs along +x and +y.

    """
    label = "angle"
    h, b, t, r, r_toe = check_sizes(label, dict(h=h, b=b, t=t), dict(r=r, r_toe=r_toe))
    require(t < min(h, b), label, f"thickness t={t:g} must be less than both legs h={h:g}, b={b:g}")
    require(r_toe <= t, label, f"toe radius r_toe={r_toe:g} must not exceed the thickness t={t:g}")
    leg = min(h, b) - t
    require(r + r_toe <= leg, label,
            f"root radius r={r:g} and toe radius r_toe={r_toe:g} do not fit on the inside face "
            f"of the shorter leg ({leg:g} long)")
    corners = [(0, 0), (b, 0), (b, t), (t, t), (t, h), (0, h)]
    radii = [0, 0, r_toe, r, r_toe, 0]
    return rounded_profile(label, corners, radii, max(b, h), units, h=h, b=b, t=t, r=r,
                           r_toe=r_toe or None)


def tee(h: float, b: float, tw: float, tf: float, r: float = 0.0, *, units: str = "mm") -> Profile:
    """Tee section with root fillets.

    Parameters
    ----------
    h : float
        Overall depth, flange included (along y), drawing unit.
    b : float
        Flange width (along x), drawing unit; ``tw < b``.
    tw : float
        Stem thickness, drawing unit.
    tf : float
        Flange thickness, drawing unit; ``tf < h``.
    r : float
        Root radius between stem and flange, drawing unit (0: sharp);
        ``r <= (b - tw)/2`` and ``r <= h - tf``.
    units : str
        Length unit.

    Returns
    -------
    Profile
        Axis of symmetry on x = 0, foot of the stem on y = 0, top of the flange at y = h.

    """
    label = "tee"
    h, b, tw, tf, r = _web_and_flanges(label, h, b, tw, tf, r, flanges=1, outstands=2, web="stem")
    x, u, v = b / 2, tw / 2, h - tf
    corners = [(-u, 0), (u, 0), (u, v), (x, v), (x, h), (-x, h), (-x, v), (-u, v)]
    radii = [0, 0, r, 0, 0, 0, 0, r]
    return rounded_profile(label, corners, radii, max(b, h), units, h=h, b=b, tw=tw, tf=tf, r=r)
