"""The line a long analysis shows on a terminal, and nothing off a terminal."""

import io
import time

from warpwise.io.progress import Running


class Terminal(io.StringIO):
    """A text stream that says it is a terminal."""

    def isatty(self):
        return True


def test_line_appears_after_the_delay_names_the_step_and_is_cleared():
    out = Terminal()
    with Running("analysing", stream=out, delay=0.05) as running:
        running.step("analysing plate.dxf (1 of 1)")
        time.sleep(0.3)
    text = out.getvalue()
    assert "analysing plate.dxf (1 of 1) ... 0 s" in text
    shown = text.split("\r")[-2]
    assert text.endswith("\r" + " " * len(shown) + "\r")  # cleared at the end


def test_a_quick_step_shows_nothing():
    out = Terminal()
    with Running("analysing", stream=out, delay=5.0):
        pass
    assert out.getvalue() == ""


def test_nothing_off_a_terminal():
    out = io.StringIO()
    with Running("analysing", stream=out, delay=0.0):
        time.sleep(0.05)
    assert out.getvalue() == ""
