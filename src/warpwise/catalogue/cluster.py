"""Catalogue runs on a Dask cluster (Dask's ``distributed`` package, an optional dependency)."""

from __future__ import annotations

from collections.abc import Iterator
from concurrent.futures import Executor
from contextlib import contextmanager

from ..errors import UsageError
from .workers import usable_cpus

#: The --cluster value that starts a cluster of worker processes on this machine.
LOCAL_CLUSTER = "local"
#: Longest wait for a Dask scheduler to answer, s.
CLUSTER_TIMEOUT = 20.0


@contextmanager
def cluster_executor(address: str, workers: int | None = None) -> Iterator[Executor]:
    """An executor on a Dask cluster: the scheduler at ``address``, or a local one.

    Parameters
    ----------
    address : str
        The scheduler's address (``tcp://host:8786``), or :data:`LOCAL_CLUSTER` for a cluster of
        ``workers`` worker processes (one thread each) on this machine, closed at the end.
    workers : int, optional
        Worker processes of a local cluster (default: the CPUs, :func:`usable_cpus`).

    Raises
    ------
    UsageError
        When Dask's ``distributed`` package is missing or the scheduler does not answer.
    """
    try:
        from distributed import Client, LocalCluster
    except ImportError:
        raise UsageError("--cluster needs Dask's distributed package: pip install "
                         "'warpwise[cluster]'") from None
    cluster = None
    try:
        if address == LOCAL_CLUSTER:
            cluster = LocalCluster(n_workers=workers or usable_cpus(), threads_per_worker=1,
                                   processes=True, dashboard_address=None)
            client = Client(cluster)
        else:
            client = Client(address, timeout=CLUSTER_TIMEOUT)
    except (OSError, TimeoutError, ValueError) as exc:
        if cluster is not None:
            cluster.close()
        raise UsageError(f"cannot reach the Dask scheduler at {address} ({exc})") from None
    try:
        yield client.get_executor(pure=False)
    finally:
        client.close()
        if cluster is not None:
            cluster.close()
