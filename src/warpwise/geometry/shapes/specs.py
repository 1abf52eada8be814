"""The table of parametric shapes, the ``--shape`` spec parser and the listing for ``--help``."""

from __future__ import annotations

import inspect
import math
from collections.abc import Callable
from dataclasses import dataclass

from ...errors import UsageError
from ..profile import Profile
from .bars import circle, hexagon, rectangle, shaft_with_keyway, tube
from .constant_thickness import channel_with_lips, hollow_rectangle, z_shape
from .rolled import angle, channel, i_beam, tee


@dataclass(frozen=True)
class ShapeKind:
    """A parametric shape of :data:`SHAPES`.

    Attributes
    ----------
    name : str
        Plain name used in specs.
    function : callable
        Builds the Profile from the parameters (lengths, drawing unit) and ``units``.
    summary : str
        What the shape is.
    origin : str
        Where the shape sits relative to the origin.
    parameters : tuple of ShapeParameter
        Parameters in the function's order.
    example : str
        A valid spec.
    """

    name: str
    function: Callable[..., Profile]
    summary: str
    origin: str
    parameters: tuple[ShapeParameter, ...]
    example: str

    @classmethod
    def from_function(cls, name: str, function: Callable[..., Profile], summary: str, origin: str,
                      example: str, **meanings: str) -> ShapeKind:
        """The kind of a shape function, its parameters read from the function's signature.

        The parameters are the arguments that may be given by position (the dimensions), in
        order; one without a default must be given in a spec, one with a default takes it.

        Parameters
        ----------
        name : str
            Plain name used in specs.
        function : callable
            The shape function; its keyword-only arguments (``units``...) are not dimensions.
        summary, origin, example : str
            What the shape is, where it sits relative to the origin, a valid spec.
        **meanings : str
            What each dimension is, in plain words, by parameter name (lengths, drawing unit).

        Returns
        -------
        ShapeKind

        Raises
        ------
        TypeError
            When ``meanings`` does not name exactly the function's dimensions.

        """
        dims = [p for p in inspect.signature(function).parameters.values()
                if p.kind is p.POSITIONAL_OR_KEYWORD]
        if set(meanings) != {p.name for p in dims}:
            raise TypeError(f"shape {name}: meanings {sorted(meanings)} do not match the "
                            f"dimensions {[p.name for p in dims]} of {function.__name__}")
        params = tuple(ShapeParameter(p.name, meanings[p.name],
                                      None if p.default is p.empty else p.default,
                                      p.default is p.empty) for p in dims)
        return cls(name, function, summary, origin, params, example)


@dataclass(frozen=True)
class ShapeParameter:
    """One parameter of a parametric shape.

    Attributes
    ----------
    name : str
        Keyword of the shape function and of the spec text.
    meaning : str
        What it is, in plain words.
    default : float or None
        Default value (a length in the drawing unit), or None when it must be given; for
        ``ri`` of ``hollow_rectangle`` the default is computed (see
        :func:`~warpwise.geometry.shapes.hollow_rectangle`).
    required : bool
        True when the spec must give it.
    """

    name: str
    meaning: str
    default: float | None = None
    required: bool = True


#: Meanings shared by the sections of a web (or stem) and flanges.
_WEB_AND_FLANGES = {"h": "overall depth", "tf": "flange thickness", "r": "root radius"}

#: Origin of both channels.
_BACK_OF_WEB = "back of web on x = 0, mid-depth on y = 0, flanges towards +x"

_kind = ShapeKind.from_function

_KINDS: tuple[ShapeKind, ...] = (
    _kind("rectangle", rectangle, "solid rectangle", "centroid at the origin", "rectangle:b=40,h=20",
          b="width along x", h="height along y"),
    _kind("circle", circle, "solid circle", "centre at the origin", "circle:d=30",
          d="diameter"),
    _kind("tube", tube, "circular tube", "centre at the origin", "tube:d_outer=60,d_inner=50",
          d_outer="outer diameter", d_inner="inner diameter"),
    _kind("hollow_rectangle", hollow_rectangle, "hollow rectangle with rounded corners",
          "centroid at the origin", "hollow_rectangle:h=100,b=50,t=4,ro=8",
          h="overall depth along y", b="overall width along x", t="wall thickness",
          ro="outer corner radius",
          ri="inner corner radius (default max(ro - t, 0))"),
    _kind("i_beam", i_beam, "I-beam (or H) with root fillets", "centroid at the origin",
          "i_beam:h=200,b=100,tw=5.6,tf=8.5,r=12",
          b="flange width", tw="web thickness", **_WEB_AND_FLANGES),
    _kind("channel", channel, "channel with parallel flanges and root fillets", _BACK_OF_WEB,
          "channel:h=160,b=65,tw=7.5,tf=10.5,r=10.5",
          b="overall flange width", tw="web thickness", **_WEB_AND_FLANGES),
    _kind("angle", angle, "angle with root radius and toe radii",
          "heel at the origin, legs along +x and +y", "angle:h=80,b=60,t=8,r=8,r_toe=4",
          h="leg along y", b="leg along x", t="thickness", r="root radius", r_toe="toe radius"),
    _kind("tee", tee, "tee with root fillets",
          "axis on x = 0, foot of the stem on y = 0, flange on top",
          "tee:h=100,b=100,tw=11,tf=11,r=11",
          b="flange width", tw="stem thickness", **_WEB_AND_FLANGES),
    _kind("z_shape", z_shape, "Z-shape of constant thickness, bent (r > 0) or plain",
          "centroid at the origin, top flange towards +x", "z_shape:h=200,b=75,t=2,r=3",
          h="overall depth", b="overall flange width", t="thickness", r="inside bend radius"),
    _kind("channel_with_lips", channel_with_lips, "cold-formed channel with lips", _BACK_OF_WEB,
          "channel_with_lips:h=150,b=60,c=18,t=2,r=3", h="overall depth", b="overall flange width",
          c="overall lip length", t="thickness", r="inside bend radius"),
    _kind("hexagon", hexagon, "regular hexagon bar", "centre at the origin, flats parallel to x",
          "hexagon:s=24", s="size across flats"),
    _kind("shaft_with_keyway", shaft_with_keyway, "round shaft with a keyway",
          "shaft centre at the origin, keyway at +y", "shaft_with_keyway:d=40,w=12,k=5",
          d="shaft diameter", w="keyway width", k="keyway depth from the circle on the centreline"),
)

#: The parametric shapes by plain name, each a function returning a Profile.
SHAPES: dict[str, Callable[..., Profile]] = {kind.name: kind.function for kind in _KINDS}

#: Name, parameters, origin and an example spec of each shape in :data:`SHAPES`.
SHAPE_KINDS: dict[str, ShapeKind] = {kind.name: kind for kind in _KINDS}


def _spec_values(kind: ShapeKind, key: str, spec: str, rest: str) -> dict[str, float]:
    """The ``PARAM=VALUE`` items after the colon of a spec, checked against the shape's table."""
    params = {p.name: p for p in kind.parameters}
    values: dict[str, float] = {}
    items = [item.strip() for item in rest.split(",")] if rest.strip() else []
    for item in items:
        if not item:
            raise UsageError(f"shape {key}: empty item in {spec.strip()!r} (a doubled comma?)")
        pname, eq, text = item.partition("=")
        pname = pname.strip()
        if not eq or not pname:
            raise UsageError(f"shape {key}: {item!r} is not PARAM=VALUE")
        if pname not in params:
            raise UsageError(f"shape {key}: unknown parameter {pname!r} "
                             f"(parameters: {', '.join(params)})")
        if pname in values:
            raise UsageError(f"shape {key}: parameter {pname} is given twice")
        try:
            v = float(text)
        except ValueError:
            raise UsageError(f"shape {key}: {pname}={text.strip()!r} is not a number") from None
        if not math.isfinite(v):
            raise UsageError(f"shape {key}: {pname}={text.strip()} is not a finite number")
        values[pname] = v
    missing = [p for p in kind.parameters if p.required and p.name not in values]
    if missing:
        what = ", ".join(f"{p.name} ({p.meaning})" for p in missing)
        plural = "s" if len(missing) > 1 else ""
        raise UsageError(f"shape {key}: missing parameter{plural} {what}")
    return values


def shape_from_spec(spec: str, units: str = "mm") -> Profile:
    """Build a parametric profile from a text ``NAME:PARAM=VALUE,PARAM=VALUE,...``.

    Parameters
    ----------
    spec : str
        Shape name (a key of :data:`SHAPES`; case, spaces and ``-`` for ``_`` are forgiven)
        and its parameters, lengths in the drawing unit.
    units : str
        Length unit of the values and of the profile (mm, cm, m or in).

    Returns
    -------
    Profile

    Raises
    ------
    UsageError
        For an empty spec, an unknown shape or parameter, a value that is not a finite
        number, a parameter given twice or a missing one.
    ProfileError
        For a dimension that is not positive or an impossible combination.

    Examples
    --------
    >>> shape_from_spec("hollow rectangle: h=100, b=50, t=4, ro=8").source
    'hollow rectangle h=100 b=50 t=4 ro=8'
    >>> shape_from_spec("i_beam:h=200,b=100,tw=5.6")
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: shape i_beam: missing parameter tf (flange thickness)
    >>> shape_from_spec("box:h=1")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    warpwise.errors.UsageError: unknown shape 'box' (shapes: rectangle, circle, tube, hollow_rectangle, ...)

    """
    if not isinstance(spec, str) or not spec.strip():
        raise UsageError("empty shape spec: give NAME:PARAM=VALUE,... (e.g. rectangle:b=40,h=20)")
    name, _, rest = spec.partition(":")
    key = name.strip().lower().replace("-", "_").replace(" ", "_")
    kind = SHAPE_KINDS.get(key)
    if kind is None:
        raise UsageError(f"unknown shape {name.strip()!r} (shapes: {', '.join(SHAPES)})")
    return kind.function(**_spec_values(kind, key, spec, rest), units=units)


def describe_shapes(units: str = "mm") -> str:
    """A plain-text list of the parametric shapes and their parameters, for ``--help``.

    Parameters
    ----------
    units : str
        Length unit shown beside each parameter (the drawing unit the values are in).

    Returns
    -------
    str
        Several lines, ending with a newline.

    Examples
    --------
    >>> for line in describe_shapes().splitlines()[2:7]:
    ...     print(line)
      rectangle: solid rectangle
          origin   centroid at the origin
          b        width along x, mm
          h        height along y, mm
          example  rectangle:b=40,h=20

    """
    lines = [f"Parametric shapes, NAME:PARAM=VALUE,... (all values are lengths in {units}):", ""]
    for kind in _KINDS:
        lines.append(f"  {kind.name}: {kind.summary}")
        lines.append(f"      {'origin':<8} {kind.origin}")
        for p in kind.parameters:
            note = "" if p.required else (f", default {p.default:g}" if p.default is not None
                                          else ", optional")
            lines.append(f"      {p.name:<8} {p.meaning}, {units}{note}")
        lines.append(f"      {'example':<8} {kind.example}")
    return "\n".join(lines) + "\n"
