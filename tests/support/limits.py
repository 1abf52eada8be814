"""Runs of the command line in a child process under a time and a memory limit.

The limits are safety nets of the resource tests (a runaway input must not take the machine
down with the test run); the timings themselves live in scripts/bench_limits.py.
"""

from __future__ import annotations

import os
import subprocess
import sys


def _cap(memory: int):
    """A child-process hook that limits its address space to ``memory`` bytes (Linux)."""
    if not sys.platform.startswith("linux"):
        return None

    def cap() -> None:
        import resource

        resource.setrlimit(resource.RLIMIT_AS, (memory, memory))

    return cap


def python_limited(*args, memory: int, seconds: float) -> tuple[int, str, str]:
    """``python ARGS`` in a child process; (exit code, stdout, stderr).

    ``memory`` is the address space in bytes, ``seconds`` the wall time; one thread per
    numerical library, so that the memory limit is not spent on thread stacks.
    """
    env = dict(os.environ, OMP_NUM_THREADS="1", OPENBLAS_NUM_THREADS="1", MKL_NUM_THREADS="1")
    proc = subprocess.run([sys.executable, *map(str, args)], capture_output=True, text=True,
                          timeout=seconds, env=env, preexec_fn=_cap(memory))
    return proc.returncode, proc.stdout, proc.stderr


def warpwise_limited(*args, memory: int, seconds: float) -> tuple[int, str, str]:
    """``warpwise ARGS`` in a child process under the limits (see :func:`python_limited`)."""
    return python_limited("-m", "warpwise.cli", *args, memory=memory, seconds=seconds)
