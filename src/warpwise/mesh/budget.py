"""The default element limit of an analysis, from the memory of the machine it runs on.

A mesh is refused before it is built when it would have more elements than the limit (see
:func:`warpwise.mesh.triangulate.check_mesh_budget`, adaptive refinement and error estimates
check every mesh they build). The fixed cap :data:`~warpwise.mesh.sizing.MAX_ELEMENTS` is the
most any default allows; on a machine with less memory the default is what
:data:`MEMORY_SHARE` of the memory available at start holds at :data:`BYTES_PER_ELEMENT`.
``--max-elements N`` replaces it either way.

Examples
--------
>>> limit = default_element_limit()
>>> MIN_DEFAULT <= limit <= MAX_ELEMENTS
True
"""

from __future__ import annotations

import os
from functools import lru_cache

from .sizing import MAX_ELEMENTS

#: Peak memory of an analysis per element of its largest mesh, bytes. Measured
#: (scripts/bench_limits.py style, peak resident size of one process, a 200 x 100 rectangle):
#: 7.0 kB at 73k elements and 6.0 kB at 292k without the bound on J, 8.7 kB and 7.8 kB with
#: it; an adaptive run of a four-cell extrusion reached 13.8 GB at 940k elements (14.7 kB, the
#: factorisation's fill grows with the cells). Taken at the largest seen, 15 kB.
BYTES_PER_ELEMENT = 15_000
#: Share of the memory available at start that the default limit may take.
MEMORY_SHARE = 0.6
#: Smallest default limit, whatever the memory reads (a sample profile needs far fewer).
MIN_DEFAULT = 50_000


def available_memory() -> int | None:
    """Memory available for new processes, bytes (None when the system does not say).

    Linux: ``MemAvailable`` of /proc/meminfo (free memory plus what the caches give back);
    elsewhere the free physical pages.
    """
    try:
        with open("/proc/meminfo", encoding="ascii") as f:
            for line in f:
                if line.startswith("MemAvailable:"):
                    return int(line.split()[1]) * 1024
    except (OSError, ValueError, IndexError):
        pass
    try:
        return int(os.sysconf("SC_AVPHYS_PAGES")) * int(os.sysconf("SC_PAGE_SIZE"))
    except (AttributeError, OSError, ValueError):
        return None


def element_limit_for(memory: int | None) -> int:
    """The default element limit for ``memory`` bytes available (count).

    Examples
    --------
    >>> element_limit_for(20 * 10**9), element_limit_for(None), element_limit_for(10**6)
    (800000, 4000000, 50000)
    """
    if memory is None:
        return MAX_ELEMENTS
    return int(min(MAX_ELEMENTS, max(MIN_DEFAULT, MEMORY_SHARE * memory // BYTES_PER_ELEMENT)))


@lru_cache(maxsize=1)
def default_element_limit() -> int:
    """The element limit of an analysis when none is given: this machine's (count).

    Read once per process (the memory available when the first analysis starts).
    """
    return element_limit_for(available_memory())


__all__ = ["BYTES_PER_ELEMENT", "MEMORY_SHARE", "MIN_DEFAULT", "available_memory",
           "default_element_limit", "element_limit_for"]
