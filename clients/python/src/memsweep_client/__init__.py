"""Python client for the memsweep HTTP API.

    from memsweep_client import MemsweepClient
    client = MemsweepClient("http://127.0.0.1:8080", token="…")
    sweep = client.submit(spec)
    client.wait(sweep["id"], progress=True)
    frame = client.results_frame(sweep["id"])
"""

from .client import TERMINAL, MemsweepClient, MemsweepError
from .routes import ROUTES

__all__ = ["MemsweepClient", "MemsweepError", "ROUTES", "TERMINAL"]
__version__ = "0.2.0"
