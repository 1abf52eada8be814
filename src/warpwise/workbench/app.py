"""The workbench as an ASGI application (Starlette): pages, uploads, jobs and downloads.

Routes
------
``GET /``                        the files opened, the form to open more
``POST /upload``                 one or several files (multipart form, field ``files``)
``GET /file/{id}``               what was read and the choices (query: the choices to check with)
``POST /file/{id}/analyse``      analyse with the choices made; to the job's page
``POST /file/{id}/remove``       forget a file
``GET /job/{id}``                a job's page: progress and cancel, then the results or the refusal
``GET /job/{id}/state``          its state as JSON (polled by the page)
``POST /job/{id}/cancel``        cancel it
``GET /job/{id}/download/{kind}``  csv, json, html (the datasheet), stress.txt, stress.json
``GET|POST /catalogue``, ``GET /catalogue/{id}`` and below: :mod:`.catalogue_pages`
``GET /static/...``              the style sheet and the script
"""

from __future__ import annotations

import asyncio
import contextlib
from collections.abc import Mapping
from dataclasses import dataclass
from pathlib import Path

from jinja2 import Environment, PackageLoader, select_autoescape
from starlette.applications import Starlette
from starlette.requests import Request
from starlette.responses import HTMLResponse, JSONResponse, RedirectResponse, Response
from starlette.routing import Mount, Route
from starlette.staticfiles import StaticFiles

from ..errors import WarpwiseError
from .choices import Choices, form_choices
from .downloads import attachment
from .jobs import JobBoard
from .pages import NotFoundError, chosen_table, found, option_lists, tables
from .pages import bench as _bench
from .tasks import Analysis, Inspection, Refusal, analyse_upload, inspect_upload
from .uploads import (
    FOLDER_ENDINGS,
    MAX_FILE_BYTES,
    MAX_FILES_PER_UPLOAD,
    MAX_UPLOAD_BYTES,
    Upload,
    UploadStore,
    from_folder,
)

#: How long a page waits for a file to be read before it shows "still reading".
INSPECT_WAIT = 60.0


@dataclass
class Workbench:
    """The state of one running workbench: its uploads, its jobs, its templates."""

    store: UploadStore
    board: JobBoard
    templates: Environment
    inspections: dict[tuple, str]
    catalogues: dict

    def render(self, name: str, status: int = 200, **values) -> HTMLResponse:
        """A page from its template (every value escaped unless marked safe)."""
        from ..report.table import CAUTION

        text = self.templates.get_template(name).render(caution=CAUTION, **values)
        return HTMLResponse(text, status_code=status)

    def close(self) -> None:
        """End the workers and remove the uploads."""
        self.board.close()
        self.store.close()


def _templates() -> Environment:
    return Environment(loader=PackageLoader("warpwise.workbench", "templates"),
                       autoescape=select_autoescape(default=True, default_for_string=True))


def _upload_or_404(request: Request) -> Upload:
    return found(request, _bench(request).store.get, "fid", "file")


async def home(request: Request) -> Response:
    """The files opened and the form to open more."""
    return _home(_bench(request), [])


def _home(bench: Workbench, refusals: list[str], status: int = 200) -> HTMLResponse:
    limits = (MAX_FILES_PER_UPLOAD, MAX_FILE_BYTES // 2**20, MAX_UPLOAD_BYTES // 2**20)
    return bench.render("home.html", status=status, uploads=bench.store.all(),
                        refusals=refusals, limits=limits)


async def upload(request: Request) -> Response:
    """Store the files sent (field ``files``, or ``folder``: the profile files of a folder).

    One file goes straight to its page; refusals are listed on the files page.
    """
    bench = _bench(request)
    if int(request.headers.get("content-length") or 0) > MAX_UPLOAD_BYTES + 2**20:
        return _home(bench, ["the upload is larger than the workbench takes "
                             f"({MAX_UPLOAD_BYTES // 2**20} MB in all)"], 413)
    refusals, added, passed_over = [], [], 0
    try:
        async with request.form(max_files=MAX_FILES_PER_UPLOAD, max_fields=20) as form:
            sent = [(item, False) for item in form.getlist("files")] + \
                [(item, True) for item in form.getlist("folder")]
            for item, in_folder in sent:
                if isinstance(item, str) or (in_folder and not from_folder(item.filename)):
                    passed_over += not isinstance(item, str) and bool(item.filename)
                    continue
                try:
                    added.append(bench.store.add(item.filename, await item.read(MAX_FILE_BYTES + 1)))
                except WarpwiseError as exc:
                    refusals.append(str(exc))
    except Exception as exc:  # the multipart parser's own refusals (too many files...)
        refusals.append(f"the upload was refused: {getattr(exc, 'detail', exc)}")
    if not added and not refusals:
        refusals.append("no file was sent: choose a drawing or outline file")
    if passed_over:
        refusals.append(f"{passed_over} files of the folder passed over: not a profile file "
                        f"({', '.join(FOLDER_ENDINGS)}) or hidden")
    if len(added) == 1 and not refusals:
        return RedirectResponse(f"/file/{added[0].id}", status_code=303)
    return _home(bench, refusals, 400 if refusals and not added else 200)


def _choices(form: Mapping[str, str], layers: list[str], chosen: list[str],
             inspection: Inspection | None, table: tuple[str, str] | None = None) -> Choices:
    default = [layer.name for layer in inspection.layers if layer.used] if inspection else []
    return form_choices(form, layers, chosen if "layers_shown" in form else default, default,
                        table)


async def _inspection(bench: Workbench, upload: Upload, choices: Choices,
                      wait: float = INSPECT_WAIT) -> Inspection | Refusal | None:
    """The check of a file with the reading choices, from the workers (None: not yet done)."""
    key = (upload.id, choices.read)
    ident = bench.inspections.get(key)
    if ident is None:
        job = bench.board.submit(upload.name, inspect_upload, upload.path, upload.name,
                                 choices, bench.store.scratch(".svg"))
        ident = bench.inspections[key] = job.id
    job = bench.board.get(ident)
    steps = int(wait / 0.05)
    for _ in range(steps):
        if job.over:
            break
        await asyncio.sleep(0.05)
    if not job.over:
        return None
    if job.state != "done":
        bench.inspections.pop(key, None)
        return Refusal(f"{upload.name}: {job.error or 'reading was cancelled'}")
    return job.result


async def file_page(request: Request) -> Response:
    """What was read from a file and the choices it offers (checked with those in the query)."""
    bench = _bench(request)
    upload = _upload_or_404(request)
    query = request.query_params
    first = await _inspection(bench, upload, form_choices({}))
    layers = [layer.name for layer in first.layers] if isinstance(first, Inspection) else []
    choices = _choices(query, layers, query.getlist("layer"),
                       first if isinstance(first, Inspection) else None)
    seen = await _inspection(bench, upload, choices) if choices.read else first
    return bench.render("file.html", upload=upload, seen=seen, query=query, layers=layers,
                        first=first if isinstance(first, Inspection) else None,
                        chosen=set(query.getlist("layer")) if "layers_shown" in query else
                        {layer.name for layer in first.layers if layer.used}
                        if isinstance(first, Inspection) else set(),
                        tables=tables(bench.store), **option_lists())


async def analyse(request: Request) -> Response:
    """Queue the analysis of a file with the choices of the form; to the job's page."""
    bench = _bench(request)
    upload = _upload_or_404(request)
    async with request.form(max_files=0, max_fields=200) as form:
        first = await _inspection(bench, upload, form_choices({}))
        inspection = first if isinstance(first, Inspection) else None
        layers = [layer.name for layer in inspection.layers] if inspection else []
        choices = _choices(form, layers, [str(v) for v in form.getlist("layer")], inspection,
                           chosen_table(bench.store, form))
    job = bench.board.submit(upload.name, analyse_upload, upload.path, upload.name, choices)
    return RedirectResponse(f"/job/{job.id}", status_code=303)


async def remove(request: Request) -> Response:
    """Forget a file and delete it."""
    _bench(request).store.remove(request.path_params["fid"])
    return RedirectResponse("/", status_code=303)


def _job_or_404(request: Request):
    return found(request, _bench(request).board.get, "jid", "job")


async def job_page(request: Request) -> Response:
    """A job's page: running (with cancel), or its results, or its refusal."""
    job = _job_or_404(request)
    result = job.result if job.state == "done" else None
    return _bench(request).render(
        "job.html", job=job, analysis=result if isinstance(result, Analysis) else None,
        refusal=result.message if isinstance(result, Refusal) else job.error)


async def job_state(request: Request) -> Response:
    """A job's state for the page's polling."""
    job = _job_or_404(request)
    return JSONResponse({"state": job.state, "seconds": round(job.seconds(), 1)})


async def job_cancel(request: Request) -> Response:
    """Cancel a job (its worker ended at once when it was running)."""
    job = _job_or_404(request)
    _bench(request).board.cancel(job.id)
    return RedirectResponse(f"/job/{job.id}", status_code=303)


#: The downloads of a job: kind -> (attribute of the Analysis, file ending, media type).
DOWNLOADS = {"csv": ("csv", ".csv", "text/csv"), "json": ("json", ".json", "application/json"),
             "html": ("datasheet", ".html", "text/html"),
             "stress.txt": ("stress", "-stress.txt", "text/plain"),
             "stress.json": ("stress_json", "-stress.json", "application/json")}


async def job_download(request: Request) -> Response:
    """One output of a finished analysis, built in memory, under a safe file name."""
    job = _job_or_404(request)
    kind = request.path_params["kind"]
    if kind not in DOWNLOADS or job.state != "done" or not isinstance(job.result, Analysis):
        raise NotFoundError("no such download: the analysis has not finished or has no such output")
    field, ending, media = DOWNLOADS[kind]
    text = getattr(job.result, field)
    if not text:
        raise NotFoundError("no such download: give a load for the stresses")
    return attachment(text, job.result.name, ending, media)


async def not_found(request: Request, exc: Exception) -> Response:
    """A plain page for a missing file, job or download."""
    return _bench(request).render("message.html", status=404, title="Not found",
                                  message=str(exc) or "no such page")


def create_app(store: UploadStore | None = None, board: JobBoard | None = None,
               hosts: list[str] | None = None) -> Starlette:
    """The workbench application (its uploads and workers removed when it shuts down).

    POSTs from other web sites are refused; with ``hosts``, so is any other Host header
    (:mod:`.guard`).
    """
    from starlette.middleware import Middleware

    from .catalogue_pages import ROUTES
    from .guard import SameOrigin

    bench = Workbench(store or UploadStore(), board or JobBoard(), _templates(), {}, {})
    static = Path(__file__).with_name("static")
    routes = [Route("/", home), Route("/upload", upload, methods=["POST"]),
              Route("/file/{fid}", file_page),
              Route("/file/{fid}/analyse", analyse, methods=["POST"]),
              Route("/file/{fid}/remove", remove, methods=["POST"]),
              Route("/job/{jid}", job_page), Route("/job/{jid}/state", job_state),
              Route("/job/{jid}/cancel", job_cancel, methods=["POST"]),
              Route("/job/{jid}/download/{kind}", job_download), *ROUTES,
              Mount("/static", StaticFiles(directory=static), name="static")]

    @contextlib.asynccontextmanager
    async def lifespan(app: Starlette):
        yield
        bench.close()

    app = Starlette(routes=routes, exception_handlers={NotFoundError: not_found, 404: not_found},
                    lifespan=lifespan, middleware=[Middleware(SameOrigin, hosts=hosts)])
    app.state.bench = bench
    return app
