"""Finite elements: the six-node triangle, vectorised assembly and the linear solvers."""

from .p2 import ElementValues, element_values, integrate, nodal_gradient, stiffness_matrix
from .solve import METHODS, PinnedSolver, SPDFactor

__all__ = ["METHODS", "ElementValues", "PinnedSolver", "SPDFactor", "element_values",
           "integrate", "nodal_gradient", "stiffness_matrix"]
