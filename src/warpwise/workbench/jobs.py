"""The worker pool beside the server: jobs queued, run in worker processes, cancelled.

Each worker is a process pool of one process (a *lane*), its processes tied to the server's
process as the catalogue's are (:func:`warpwise.catalogue.workers._worker_start`). A job waits
until a lane is free; cancelling a waiting job drops it, cancelling a running one ends its
lane's process at once (the compiled mesher and solver cannot be interrupted any other way)
and puts a fresh lane in its place, so the other jobs go on.
"""

from __future__ import annotations

import os
import secrets
import threading
import time
from collections import deque
from collections.abc import Callable
from concurrent.futures import Future, ProcessPoolExecutor
from dataclasses import dataclass, field
from typing import Any

#: States of a job.
WAITING, RUNNING, DONE, FAILED, CANCELLED = "waiting", "running", "done", "failed", "cancelled"


@dataclass(eq=False)
class Job:
    """One piece of work for a worker.

    Attributes
    ----------
    id : str
        Generated identifier.
    label : str
        What it is, for the page (a file's shown name).
    state : str
        One of waiting, running, done, failed, cancelled.
    result : object
        The task's return value once done.
    error : str
        Why it failed (a bug in a task; user errors come back as results).
    """

    id: str
    label: str
    task: Callable[..., Any]
    args: tuple
    state: str = WAITING
    result: Any = None
    error: str = ""
    queued: float = field(default_factory=time.monotonic)
    started: float | None = None
    finished: float | None = None
    lane: ProcessPoolExecutor | None = None

    @property
    def over(self) -> bool:
        """Whether the job has ended (done, failed or cancelled)."""
        return self.state in (DONE, FAILED, CANCELLED)

    def seconds(self) -> float:
        """Time running so far (or in all), seconds."""
        if self.started is None:
            return 0.0
        return (self.finished or time.monotonic()) - self.started


def _new_lane() -> ProcessPoolExecutor:
    from ..catalogue.workers import _worker_start

    return ProcessPoolExecutor(max_workers=1, initializer=_worker_start, initargs=(os.getpid(),))


class JobBoard:
    """Jobs run on ``lanes`` worker processes.

    Parameters
    ----------
    lanes : int
        Worker processes (analyses at the same time).
    """

    def __init__(self, lanes: int = 1) -> None:
        self._lock = threading.Lock()
        self._free = [_new_lane() for _ in range(max(1, lanes))]
        self._all = list(self._free)
        self._waiting: deque[Job] = deque()
        self.jobs: dict[str, Job] = {}

    def submit(self, label: str, task: Callable[..., Any], *args: Any) -> Job:
        """Queue ``task(*args)`` (a picklable top-level function) and return its job."""
        job = Job(secrets.token_urlsafe(9), label, task, args)
        with self._lock:
            self.jobs[job.id] = job
            self._waiting.append(job)
            self._start_waiting()
        return job

    def get(self, ident: str) -> Job | None:
        """The job of ``ident`` (None when there is none)."""
        return self.jobs.get(ident)

    def _start_waiting(self) -> None:
        """Start waiting jobs on free lanes (the lock held)."""
        while self._free and self._waiting:
            job = self._waiting.popleft()
            job.lane = self._free.pop()
            job.state, job.started = RUNNING, time.monotonic()
            future = job.lane.submit(job.task, *job.args)
            future.add_done_callback(lambda f, job=job: self._finished(job, f))

    def _finished(self, job: Job, future: Future) -> None:
        with self._lock:
            if job.state == CANCELLED:
                return  # its lane was ended and replaced
            try:
                job.result, job.state = future.result(), DONE
            except Exception as exc:  # a bug in a task, or a worker that died
                job.error, job.state = f"internal error: {type(exc).__name__}: {exc}", FAILED
            job.finished = time.monotonic()
            if job.lane is not None:
                self._free.append(job.lane)
            self._start_waiting()

    def cancel(self, ident: str) -> bool:
        """Cancel a job; True when it was waiting or running (now cancelled)."""
        with self._lock:
            job = self.jobs.get(ident)
            if job is None or job.over:
                return False
            was = job.state
            job.state, job.finished = CANCELLED, time.monotonic()
            if was == WAITING:
                self._waiting.remove(job)
                return True
            lane, fresh = job.lane, _new_lane()
            self._all = [fresh if x is lane else x for x in self._all]
            self._free.append(fresh)
            self._start_waiting()
        threading.Thread(target=_end_lane, args=(lane,), daemon=True).start()
        return True

    def close(self) -> None:
        """End every worker now (at shutdown)."""
        with self._lock:
            for job in self._waiting:
                job.state = CANCELLED
            self._waiting.clear()
            lanes, self._all, self._free = self._all, [], []
        for lane in lanes:
            _end_lane(lane)


def _end_lane(lane: ProcessPoolExecutor) -> None:
    """End a lane's process now, not after its current job."""
    from ..catalogue.workers import _stop_workers

    _stop_workers(lane)
