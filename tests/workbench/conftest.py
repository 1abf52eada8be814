import pytest

pytest.importorskip("starlette", reason="the workbench needs starlette (pip install -e .)")
pytest.importorskip("httpx", reason="Starlette's test client needs httpx (the 'test' extra)")


@pytest.fixture(scope="module")
def client():
    """The workbench application under Starlette's test client (one worker process)."""
    from starlette.testclient import TestClient

    from warpwise.workbench.app import create_app

    app = create_app()
    with TestClient(app) as c:
        c.bench = app.state.bench
        yield c
