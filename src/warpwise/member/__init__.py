"""Members: torsion with restrained warping along a member of given length and supports.

Needs only the stiffnesses G J and E Cw of a section (:mod:`warpwise.properties`), so it sits
just above the properties and below the stresses.
"""

from .extremes import QUANTITIES, Extreme, extremes, stations
from .solution import (
    END_TEXT,
    ENDS,
    MemberActions,
    MemberLoads,
    MemberTorsion,
    check_member,
    solve_member,
)
from .terms import MEMBER_TERMS, TERM_BY_KEY, Term

__all__ = ["END_TEXT", "ENDS", "MEMBER_TERMS", "QUANTITIES", "TERM_BY_KEY", "Extreme",
           "MemberActions", "MemberLoads", "MemberTorsion", "Term", "check_member", "extremes",
           "solve_member", "stations"]
