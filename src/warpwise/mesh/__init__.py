"""Meshing: Triangle (through meshpy) to six-node triangles that follow the profile's arcs."""

from .core import Mesh, Triangulation, build_mesh, default_size, refine_mesh

__all__ = ["Mesh", "Triangulation", "build_mesh", "default_size", "refine_mesh"]
