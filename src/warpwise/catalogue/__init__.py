"""Catalogue runs: many profiles analysed, one row each, failures collected, never fatal.

:func:`run_catalogue` analyses files in any :class:`concurrent.futures.Executor` (a process pool
by default; pass a Dask ``distributed`` client's executor to spread a big catalogue over a
cluster) and returns one :class:`Outcome` per file in input order. A profile that fails gives an
outcome with its one-line error; the others are unaffected.

:func:`collect_files` finds the profile files of folders (searched recursively);
:func:`catalogue_items` also reads manifests (:func:`read_manifest`, a TOML file of our own
naming each drawing with how it is read, its material, name and description) into
:class:`Item` s, each with its own options.

Examples
--------
>>> from pathlib import Path
>>> files = collect_files([Path("sample_sections")])
>>> len(files) >= 8
True
"""

from .cluster import CLUSTER_TIMEOUT, LOCAL_CLUSTER, cluster_executor
from .items import (
    MANIFEST_ENDING,
    PROFILE_ENDINGS,
    Item,
    Outcome,
    RunOptions,
    catalogue_items,
    collect_files,
    read_manifest,
)
from .run import IN_FLIGHT_CLUSTER, IN_FLIGHT_PER_WORKER, run_catalogue
from .workers import PARENT_POLL, analyse_one, usable_cpus, worker_count

__all__ = [
    "CLUSTER_TIMEOUT", "IN_FLIGHT_CLUSTER", "IN_FLIGHT_PER_WORKER", "LOCAL_CLUSTER",
    "MANIFEST_ENDING", "PARENT_POLL", "PROFILE_ENDINGS", "Item", "Outcome", "RunOptions",
    "analyse_one", "catalogue_items", "cluster_executor", "collect_files", "read_manifest",
    "run_catalogue", "usable_cpus", "worker_count",
]
