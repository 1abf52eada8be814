"""``warpwise workbench``: the application served by uvicorn on this computer, the browser opened.

Bound to 127.0.0.1 unless another address is asked for (the workbench has no log-in: anyone
who can reach the address can use it). The uploads and the workers go when the server stops.
"""

from __future__ import annotations

import socket
import threading
import webbrowser
from dataclasses import dataclass

from ..errors import UsageError

#: The address served by default: this computer only.
DEFAULT_ADDRESS = "127.0.0.1"
DEFAULT_PORT = 8765


@dataclass(frozen=True)
class ServeOptions:
    """Where the workbench listens and whether a browser is opened."""

    address: str = DEFAULT_ADDRESS
    port: int = DEFAULT_PORT
    browser: bool = True
    workers: int = 1


def free_port(address: str = DEFAULT_ADDRESS) -> int:
    """A port free on ``address`` now (for tests and ``--port 0``)."""
    with socket.socket(socket.AF_INET, socket.SOCK_STREAM) as s:
        s.bind((address, 0))
        return s.getsockname()[1]


def _check_bind(address: str, port: int) -> int:
    """The port to serve on (a free one for 0); refuses one that cannot be served, in one line."""
    try:
        with socket.socket(socket.AF_INET6 if ":" in address else socket.AF_INET) as s:
            s.bind((address, port))
            return s.getsockname()[1]
    except OSError as exc:
        raise UsageError(f"cannot serve on {address} port {port}: {exc.strerror or exc}") from None


def serve(options: ServeOptions) -> None:
    """Run the workbench until Ctrl-C (the uploads removed and the workers ended then)."""
    import uvicorn

    from .app import create_app
    from .jobs import JobBoard

    port = _check_bind(options.address, options.port)
    host = f"[{options.address}]" if ":" in options.address else options.address
    url = f"http://{host}:{port}/"
    print(f"warpwise workbench on {url} (Ctrl-C stops it and deletes the files opened)",
          flush=True)
    if options.address not in ("127.0.0.1", "localhost", "::1"):
        print("warpwise: note: the workbench has no log-in; anyone who reaches this address "
              "can use it", flush=True)
    if options.browser:
        threading.Timer(1.0, webbrowser.open, args=(url,)).start()
    local = options.address in ("127.0.0.1", "localhost", "::1")
    app = create_app(board=JobBoard(options.workers),
                     hosts=["127.0.0.1", "localhost", "::1"] if local else None)
    uvicorn.run(app, host=options.address, port=port, log_level="warning")
