"""Requests from other web sites refused: a page elsewhere must not drive the workbench.

A browser sends the ``Origin`` of the page a form or script came from with every POST; a POST
whose origin is not the workbench's own address is refused (another site's page cannot open
files or start analyses here). With ``hosts`` given, a request naming another host in its
``Host`` header is refused too (a name of another site pointed at this computer).
"""

from __future__ import annotations

from collections.abc import Sequence
from urllib.parse import urlsplit

from starlette.responses import PlainTextResponse
from starlette.types import ASGIApp, Receive, Scope, Send


class SameOrigin:
    """ASGI middleware refusing cross-site POSTs and, with ``hosts``, other host names."""

    def __init__(self, app: ASGIApp, hosts: Sequence[str] | None = None) -> None:
        self.app = app
        self.hosts = None if hosts is None else {h.lower() for h in hosts}

    async def __call__(self, scope: Scope, receive: Receive, send: Send) -> None:  # noqa: D102
        if scope["type"] == "http":
            headers = {k.decode("latin-1").lower(): v.decode("latin-1")
                       for k, v in scope["headers"]}
            host = headers.get("host", "")
            name = urlsplit(f"//{host}").hostname or ""
            refused = ""
            if self.hosts is not None and name.lower() not in self.hosts:
                refused = f"the workbench answers to {', '.join(sorted(self.hosts))} only"
            origin = headers.get("origin")
            if scope["method"] not in ("GET", "HEAD") and origin not in (None, "null") \
                    and urlsplit(origin).netloc.lower() != host.lower():
                refused = "a request from another web site is refused"
            if refused:
                await PlainTextResponse(refused, status_code=403)(scope, receive, send)
                return
        await self.app(scope, receive, send)
