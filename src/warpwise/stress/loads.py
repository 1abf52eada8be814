"""Section forces and the shear modulus that turns a torque into a twist.

Loads (any subset), in the profile's unit system (N and N*mm with mm; see :mod:`warpwise.units`):

- N: axial force, positive in tension, through the modulus-weighted centroid;
- Mx: bending moment about the x axis, positive when it puts fibres at +y in tension;
- My: bending moment about the y axis, positive when it puts fibres at +x in tension;
- Vx, Vy: shear forces through the elastic shear centre;
- T: torque about the shear centre;
- B: bimoment -E Cw phi'' (force x length^2, N*mm2 with mm), the warping normal stress
  sigma_w = -B omega / Cw of :mod:`warpwise.stress.warping`.

Examples
--------
>>> Loads(T=1000.0).check()
>>> Loads().check()
Traceback (most recent call last):
...
warpwise.errors.UsageError: no load given (N, Mx, My, Vx, Vy, T or B)
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, fields

import numpy as np

from ..errors import UsageError
from ..materials import check_poisson
from ..units import FORCE, MOMENT, Dimension, convert

#: Dimension of a bimoment: force x length^2.
BIMOMENT = Dimension(2, 1)

#: What a load needs when no material is known (the one wording, used everywhere).
NEEDS_MATERIAL = "a torque needs a material: give the shear modulus G, or E with Poisson's ratio"


@dataclass(frozen=True)
class Loads:
    """Section forces (force unit F, length unit L).

    Attributes
    ----------
    N : float
        Axial force, F, tension positive.
    Mx, My : float
        Bending moments, F*L (see the module notes for signs).
    Vx, Vy : float
        Shear forces through the shear centre, F.
    T : float
        Torque, F*L.
    B : float
        Bimoment -E Cw phi'', F*L^2.
    """

    N: float = 0.0
    Mx: float = 0.0
    My: float = 0.0
    Vx: float = 0.0
    Vy: float = 0.0
    T: float = 0.0
    B: float = 0.0

    @classmethod
    def of(cls, loads: Loads | Mapping[str, float]) -> Loads:
        """Loads from a Loads or a mapping of its field names (F, F*L)."""
        if isinstance(loads, Loads):
            return loads
        unknown = set(loads) - {f.name for f in fields(cls)}
        if unknown:
            raise UsageError(f"unknown load {sorted(unknown)[0]!r} (use N, Mx, My, Vx, Vy, T, B)")
        return cls(**{k: float(v) for k, v in loads.items()})

    def converted(self, source: str, target: str) -> Loads:
        """The same loads from one unit system to another (:mod:`warpwise.units`).

        Examples
        --------
        >>> Loads(T=1.0, Vx=1.0, B=1.0).converted("cm", "mm")  # kN*cm2 to N*mm2
        Loads(N=0.0, Mx=0.0, My=0.0, Vx=1000.0, Vy=0.0, T=10000.0, B=100000.0)
        """
        def force(v: float) -> float:
            return convert(v, FORCE, source, target)

        def moment(v: float) -> float:
            return convert(v, MOMENT, source, target)

        return Loads(N=force(self.N), Mx=moment(self.Mx), My=moment(self.My),
                     Vx=force(self.Vx), Vy=force(self.Vy), T=moment(self.T),
                     B=convert(self.B, BIMOMENT, source, target))

    def check(self) -> None:
        """Raise a UsageError for a non-finite load or no load at all."""
        for f in fields(self):
            v = getattr(self, f.name)
            if not np.isfinite(v):
                raise UsageError(f"load {f.name} must be a finite number, got {v}")
        if not any(getattr(self, f.name) for f in fields(self)):
            raise UsageError("no load given (N, Mx, My, Vx, Vy, T or B)")


def shear_modulus(
    shear_modulus: float | None = None, youngs_modulus: float | None = None,
    poisson: float | None = None,
) -> float:
    """Shear modulus G, given directly or as E / (2 (1 + nu)).

    Parameters
    ----------
    shear_modulus : float, optional
        G, force / L^2 (MPa with mm and N).
    youngs_modulus : float, optional
        E, same unit as G.
    poisson : float, optional
        Poisson's ratio nu, in (-1, 0.5).

    Returns
    -------
    float
        G.

    Examples
    --------
    >>> shear_modulus(youngs_modulus=70000.0, poisson=0.33)  # doctest: +ELLIPSIS
    26315.78...
    >>> shear_modulus()
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: a torque needs a material: give the shear modulus G, or E with Poisson's ratio

    """
    if shear_modulus is not None:
        if youngs_modulus is not None:
            raise UsageError("give either G or E with Poisson's ratio, not both")
        if not (np.isfinite(shear_modulus) and shear_modulus > 0):
            raise UsageError(f"shear modulus must be positive, got {shear_modulus}")
        return float(shear_modulus)
    if youngs_modulus is None or poisson is None:
        raise UsageError(NEEDS_MATERIAL)
    if not (np.isfinite(youngs_modulus) and youngs_modulus > 0):
        raise UsageError(f"Young's modulus must be positive, got {youngs_modulus}")
    nu = check_poisson(poisson)
    return float(youngs_modulus) / (2.0 * (1.0 + nu))
