"""``warpwise workbench`` on the command line: its defaults and its one-line refusals
(common practice, no source)."""

from conftest import assert_one_line_error, run_cli
from warpwise.cli.options import build_parser
from warpwise.workbench.server import DEFAULT_ADDRESS, ServeOptions


def test_defaults_bind_this_computer_only():
    args = build_parser("workbench").parse_args(["workbench"])
    assert (args.address, args.port, args.no_browser, args.workers) == ("127.0.0.1", 8765, False, 1)
    assert ServeOptions().address == DEFAULT_ADDRESS == "127.0.0.1"


def test_help_names_the_address():
    code, out, _ = run_cli("workbench", "--help")
    assert code == 0 and "127.0.0.1" in out and "--no-browser" in out


def test_port_out_of_range_is_refused():
    code, _, err = run_cli("workbench", "--no-browser", "--port", "70000")
    assert code == 2
    assert_one_line_error(code, err, "--port must be 0 to 65535, got 70000")


def test_address_that_cannot_be_served_is_refused():
    code, _, err = run_cli("workbench", "--no-browser", "--address", "192.0.2.1", "--port", "0")
    assert code == 2
    assert_one_line_error(code, err, "cannot serve on 192.0.2.1")
