"""The live server the suite runs against, named by the environment (test/clients/python.test.ts
starts one per queue backend and runs this suite once against each):

    MEMSWEEP_TEST_SERVER            base URL of the server
    MEMSWEEP_TEST_TOKEN             a bearer token it accepts (role submit)
    MEMSWEEP_TEST_ADMIN_TOKEN       a token of the admin role (for the metrics)
    MEMSWEEP_TEST_BACKEND           embedded or redis (shown in the report)
    MEMSWEEP_TEST_CHUNK_GATE        the server's chunk gate directory (src/runtime/chunk-gate.ts)
    MEMSWEEP_TEST_THROTTLED_SERVER  optional: a server with a tiny rate limit, for the retry test
"""

from __future__ import annotations

import itertools
import os
import random
import time
from pathlib import Path
from typing import Any, Callable, Dict, Iterator, List

import pytest

from memsweep_client import MemsweepClient

REPO = Path(__file__).resolve().parents[3]


def pytest_report_header(config: Any) -> str:
    return "memsweep backend: %s at %s" % (os.environ.get("MEMSWEEP_TEST_BACKEND", "?"), os.environ.get("MEMSWEEP_TEST_SERVER", "?"))


def _required(name: str) -> str:
    value = os.environ.get(name)
    if not value:
        raise RuntimeError("%s is not set: run this suite through test/clients/python.test.ts (npm test)" % name)
    return value


@pytest.fixture(scope="session")
def server() -> str:
    return _required("MEMSWEEP_TEST_SERVER")


@pytest.fixture(scope="session")
def token() -> str:
    return _required("MEMSWEEP_TEST_TOKEN")


@pytest.fixture(scope="session")
def admin_token() -> str:
    return _required("MEMSWEEP_TEST_ADMIN_TOKEN")


@pytest.fixture()
def client(server: str, token: str) -> MemsweepClient:
    return MemsweepClient(server, token, timeout=30)


_seeds = itertools.count(random.SystemRandom().randrange(1, 1 << 30))


@pytest.fixture()
def spec() -> Callable[..., Dict[str, Any]]:
    """A small sweep in the rooms scenario with a seed of its own (so no point is reused from another test)."""

    def make(**overrides: Any) -> Dict[str, Any]:
        base: Dict[str, Any] = {"label": "rooms of a school", "neurons": 64, "load": {"values": [0.05, 0.15]},
                                "trials": 8, "seed": next(_seeds)}
        base.update(overrides)
        return base

    return make


class Gate:
    """Drives the server's chunk gate through its directory: hold chunks, let them through one by one."""

    def __init__(self, directory: str) -> None:
        self.dir = Path(directory)
        self._passes = itertools.count()

    def hold(self) -> None:
        (self.dir / "closed").write_text("")

    def release(self, count: int = 1) -> None:
        for _ in range(count):
            (self.dir / ("pass-py-%d-%d" % (os.getpid(), next(self._passes)))).write_text("")

    def open(self) -> None:
        (self.dir / "closed").unlink(missing_ok=True)

    def waiting(self) -> int:
        return sum(1 for entry in self.dir.iterdir() if entry.name.startswith("at-"))


@pytest.fixture()
def gate() -> Iterator[Gate]:
    held = Gate(_required("MEMSWEEP_TEST_CHUNK_GATE"))
    try:
        yield held
    finally:
        held.open()


def until(predicate: Callable[[], Any], timeout: float = 30.0, what: str = "condition") -> Any:
    """Polls `predicate` (a cheap read) until it gives a true value; fails after `timeout` seconds."""
    deadline = time.monotonic() + timeout
    while True:
        value = predicate()
        if value:
            return value
        if time.monotonic() > deadline:
            raise AssertionError("timed out waiting for " + what)
        time.sleep(0.02)


