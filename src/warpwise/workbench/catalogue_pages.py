"""The catalogue pages: several opened files analysed in the background, one row each.

Each profile is one job of the workbench's pool running the catalogue's own worker function
(:func:`.tasks.catalogue_one` around :func:`warpwise.catalogue.workers.analyse_one`); the page
polls the state of every row; failures are listed with their one-line errors; the downloads
are the catalogue command's CSV and JSON of the profiles analysed.
"""

from __future__ import annotations

import secrets
from dataclasses import dataclass

from starlette.requests import Request
from starlette.responses import RedirectResponse, Response
from starlette.routing import Route

from .choices import Choices, form_choices
from .downloads import attachment
from .pages import NotFoundError, chosen_table, found, option_lists, tables
from .pages import bench as _bench
from .tasks import catalogue_one


@dataclass
class Catalogue:
    """One catalogue run: its jobs in row order and the report units asked for."""

    id: str
    jobs: list
    report_units: str | None
    choices: Choices

    def rows(self) -> list[dict]:
        """Each profile's name, state, seconds, and J or error (plain data for page and JSON)."""
        rows = []
        for job in self.jobs:
            out = job.result if job.state == "done" else None
            row = {"name": job.label, "state": job.state, "seconds": round(job.seconds(), 1),
                   "J": None, "A": None, "units": "", "error": job.error}
            if out is not None and out.ok:
                rec = out.record.in_units(self.report_units or out.record.units)
                row.update(J=rec.values["J"], A=rec.values["A"], units=rec.units)
            elif out is not None:
                row.update(state="failed", error=out.error)
            rows.append(row)
        return rows

    def outcomes(self) -> tuple[list, list]:
        """The outcomes of the profiles analysed and of those that failed, in row order."""
        done = [j.result for j in self.jobs if j.state == "done" and j.result is not None]
        return [o for o in done if o.ok], [o for o in done if not o.ok]

    def records(self) -> list:
        """The records of the profiles analysed, in row order."""
        return [o.record for o in self.outcomes()[0]]


def _catalogue(request: Request) -> Catalogue:
    return found(request, _bench(request).catalogues.get, "cid", "catalogue")


async def catalogue_form(request: Request) -> Response:
    """The form: which opened files, with which options."""
    bench = _bench(request)
    return bench.render("catalogue_new.html", uploads=bench.store.all(),
                        tables=tables(bench.store), **option_lists())


async def catalogue_start(request: Request) -> Response:
    """Queue every chosen file as one job each; to the catalogue's page."""
    bench = _bench(request)
    async with request.form(max_files=0, max_fields=400) as form:
        chosen = [str(v) for v in form.getlist("file")]
        choices = form_choices(form, table=chosen_table(bench.store, form))
        units = str(form.get("report_units") or "") or None
    uploads = [u for u in (bench.store.get(c) for c in chosen) if u is not None]
    if not uploads:
        return bench.render("message.html", status=400, title="Nothing to analyse",
                            message="choose at least one opened file for the catalogue")
    jobs = [bench.board.submit(u.name, catalogue_one, u.path, u.name, choices) for u in uploads]
    cat = Catalogue(secrets.token_urlsafe(9), jobs, units, choices)
    bench.catalogues[cat.id] = cat
    return RedirectResponse(f"/catalogue/{cat.id}", status_code=303)


async def catalogue_page(request: Request) -> Response:
    """Progress per profile; the failures with their errors; the downloads when done."""
    cat = _catalogue(request)
    rows = cat.rows()
    return _bench(request).render("catalogue.html", cat=cat, rows=rows,
                                  over=all(j.over for j in cat.jobs),
                                  good=len(cat.records()))


async def catalogue_state(request: Request) -> Response:
    """Every row's state for the page's polling (standard JSON: no NaN)."""
    from ..report.files import standard_json

    cat = _catalogue(request)
    body = standard_json({"over": all(j.over for j in cat.jobs), "rows": cat.rows()})
    return Response(body, media_type="application/json")


async def catalogue_cancel(request: Request) -> Response:
    """Cancel every profile not yet finished."""
    cat = _catalogue(request)
    for job in cat.jobs:
        _bench(request).board.cancel(job.id)
    return RedirectResponse(f"/catalogue/{cat.id}", status_code=303)


#: The catalogue's downloads: kind -> (file ending, media type).
CATALOGUE_DOWNLOADS = {
    "csv": (".csv", "text/csv"), "json": (".json", "application/json"),
    "xlsx": (".xlsx", "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"),
    "pdf": (".pdf", "application/pdf")}


async def catalogue_download(request: Request) -> Response:
    """The catalogue's CSV, JSON, workbook or PDF pages, as ``warpwise catalogue`` writes them."""
    from ..cli.catalogue_command import pdf_pages, workbook_of
    from ..report.files import csv_text, json_text
    from ..report.records import report_units
    from .tasks import run_options

    cat = _catalogue(request)
    kind = request.path_params["kind"]
    good, bad = cat.outcomes()
    if kind not in CATALOGUE_DOWNLOADS or not good:
        raise NotFoundError("no such download: no profile of the catalogue has been analysed yet")
    records = [o.record for o in good]
    units = report_units([r.units for r in records], cat.report_units)
    body = {"csv": lambda: csv_text(records, units=units),
            "json": lambda: json_text([r.in_units(units) for r in records]),
            "xlsx": lambda: workbook_of(good, bad, run_options(cat.choices), units),
            "pdf": lambda: pdf_pages(good, cat.report_units)}[kind]()
    return attachment(body, "catalogue", *CATALOGUE_DOWNLOADS[kind])


ROUTES = [Route("/catalogue", catalogue_form), Route("/catalogue", catalogue_start, methods=["POST"]),
          Route("/catalogue/{cid}", catalogue_page),
          Route("/catalogue/{cid}/state", catalogue_state),
          Route("/catalogue/{cid}/cancel", catalogue_cancel, methods=["POST"]),
          Route("/catalogue/{cid}/download/{kind}", catalogue_download)]
