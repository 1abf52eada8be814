"""The picture of a member: the angle of twist and the bimoment along its length.

Draws values the member solution gave at many positions (:class:`warpwise.member.MemberActions`);
nothing is computed here but the change to the report's units.
"""

from __future__ import annotations

import numpy as np
from matplotlib.figure import Figure

from ..member import MemberActions
from ..units import LENGTH, Converter, Dimension
from .plot_parts import EDGE_COLOUR, SHEAR_CENTRE_COLOUR, WIDTH, plain_text


def figure_member(at: MemberActions, title: str, units: str | None, source: str) -> Figure:
    """Twist phi (rad) and bimoment B (force x length^2) along a member, two stacked axes.

    Parameters
    ----------
    at : MemberActions
        Values at positions along the member (profile units), e.g. a few hundred.
    title : str
        The profile's name (drawn as written).
    units : str or None
        Report unit system (None: the profile's).
    source : str
        The profile's unit system.

    Returns
    -------
    matplotlib.figure.Figure
    """
    show = Converter.of(source, units)
    z = show(at.z, LENGTH)
    bimoment = show(at.B, Dimension(2, 1))
    fig = Figure(figsize=(WIDTH, 5.2))
    top, bottom = fig.subplots(2, 1, sharex=True)
    for ax, values, colour, label in (
            (top, at.phi, EDGE_COLOUR, "angle of twist phi (rad)"),
            (bottom, bimoment, SHEAR_CENTRE_COLOUR,
             f"bimoment B ({show.unit(Dimension(2, 1))})")):
        ax.plot(z, values, color=colour, lw=1.6)
        ax.axhline(0.0, color="#888888", lw=0.6)
        ax.fill_between(z, values, 0.0, color=colour, alpha=0.12)
        k = int(np.argmax(np.abs(values)))
        ax.plot([z[k]], [values[k]], "o", color=colour, ms=4)
        ax.annotate(f"{values[k]:.4g} at z = {z[k]:.4g}", (z[k], values[k]),
                    textcoords="offset points", xytext=(6, 4), fontsize=8)
        ax.margins(y=0.18)
        ax.set_ylabel(label)
        ax.grid(True, lw=0.3, alpha=0.5)
    bottom.set_xlabel(f"position along the member z ({show.unit(LENGTH)})")
    top.set_title(f"Torsion of a member of {title}")
    fig.tight_layout()
    return plain_text(fig)


__all__ = ["figure_member"]
