"""Self-contained HTML datasheets and a catalogue index page.

A datasheet (:mod:`.datasheet`) is one HTML5 file per profile; the index page
(:mod:`.catalogue_page`) lists the profiles of a catalogue with links to their datasheets;
:mod:`.html_parts` holds what the pages share (HTML text of symbols, units and numbers, file
names, the page frame). This module gathers the public names.
"""

from __future__ import annotations

from .catalogue_page import (
    INDEX_KEYS,
    CatalogueEntry,
    index_html,
    thumbnail_svg,
    write_catalogue_index,
    write_index,
)
from .datasheet import PICTURE_SYMBOLS, datasheet_html, write_datasheet
from .html_parts import (
    CAUTIONS,
    datasheet_filename,
    number_html,
    relative_names,
    symbol_html,
    unique_filenames,
    unit_html,
)

__all__ = [
    # the catalogue index page
    "INDEX_KEYS", "CatalogueEntry", "index_html", "thumbnail_svg", "write_catalogue_index", "write_index",
    # the datasheet
    "PICTURE_SYMBOLS", "datasheet_html", "write_datasheet",
    # what the pages share
    "CAUTIONS", "datasheet_filename", "number_html", "relative_names", "symbol_html",
    "unique_filenames", "unit_html",
]
