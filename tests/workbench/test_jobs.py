"""The worker pool beside the server: jobs run in other processes, and cancelling a running job
ends its worker at once while the others go on (common practice, no source)."""

import os
import time

import pytest

from warpwise.workbench.jobs import CANCELLED, DONE, FAILED, JobBoard

from .support import wait


def pid_after(seconds):
    """The worker's process id, after sleeping (a long run stood in for)."""
    time.sleep(seconds)
    return os.getpid()


def broken():
    raise RuntimeError("a bug")


def finished(board, job, timeout=30):
    end = time.monotonic() + timeout
    while not job.over and time.monotonic() < end:
        time.sleep(0.05)
    return job.state


@pytest.fixture
def board():
    b = JobBoard(lanes=1)
    yield b
    b.close()


def test_jobs_run_outside_the_server_process(board):
    job = board.submit("quick", pid_after, 0)
    assert finished(board, job) == DONE and job.result != os.getpid()


def test_a_waiting_job_is_dropped(board):
    first = board.submit("long", pid_after, 30)
    second = board.submit("next", pid_after, 0)
    assert second.state == "waiting"
    assert board.cancel(second.id) and second.state == CANCELLED
    assert board.cancel(first.id)
    assert not board.cancel(first.id)  # over already


def test_a_running_job_is_ended_and_the_next_one_runs(board):
    long = board.submit("long", pid_after, 60)
    time.sleep(1.0)  # it is running in the worker
    worker = next(iter(long.lane._processes))
    start = time.monotonic()
    assert board.cancel(long.id) and long.state == CANCELLED
    after = board.submit("after", pid_after, 0)
    assert finished(board, after) == DONE and after.result != worker
    assert time.monotonic() - start < 20  # not the 60 s of the cancelled run
    end = time.monotonic() + 10
    while time.monotonic() < end:
        try:
            os.kill(worker, 0)
        except ProcessLookupError:
            break
        time.sleep(0.1)
    else:
        raise AssertionError("the cancelled job's worker is still running")


def test_a_bug_in_a_task_is_a_failed_job(board):
    job = board.submit("bug", broken)
    assert finished(board, job) == FAILED and job.error == "internal error: RuntimeError: a bug"


def test_cancel_through_the_page(client):
    job = client.bench.board.submit("a long run", pid_after, 60)
    time.sleep(0.5)
    r = client.post(f"/job/{job.id}/cancel")
    assert r.status_code == 200 and 'id="cancelled"' in r.text
    assert wait(client, f"/job/{job.id}") == "cancelled"


def test_running_page_offers_cancel(client):
    job = client.bench.board.submit("a long run", pid_after, 60)
    page = client.get(f"/job/{job.id}").text
    assert 'id="cancel-button"' in page and f'data-state-url="/job/{job.id}/state"' in page
    client.bench.board.cancel(job.id)
