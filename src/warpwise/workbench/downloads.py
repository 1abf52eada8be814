"""Downloads built in memory and sent under a safe file name."""

from __future__ import annotations

from starlette.responses import Response

from ..report.html_parts import datasheet_filename


def download_name(shown: str, ending: str) -> str:
    """A safe file name for a download of the profile ``shown``: letters, digits, ``._-`` only.

    The stem is that of the datasheet's file name (:func:`datasheet_filename`), so a hostile
    name cannot reach a folder or a header.

    Examples
    --------
    >>> download_name('../../"evil".dxf', ".csv")
    'evil-dxf.csv'
    >>> download_name("rail.dxf", "-stress.json")
    'rail-dxf-stress.json'
    """
    return datasheet_filename(shown).removesuffix(".html") + ending


def attachment(text: str | bytes, shown: str, ending: str, media: str) -> Response:
    """A response that the browser saves as a file named after the profile ``shown``."""
    body = text.encode("utf-8") if isinstance(text, str) else text
    name = download_name(shown, ending)
    charset = "; charset=utf-8" if media.startswith("text/") or media.endswith("json") else ""
    return Response(body, media_type=media + charset, headers={
        "Content-Disposition": f'attachment; filename="{name}"',
        "X-Content-Type-Options": "nosniff"})
