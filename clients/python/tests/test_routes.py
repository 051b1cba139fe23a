"""Every operation of the API has a client method: the committed OpenAPI document and the one the
server serves are both checked against ROUTES, so a new route without a method fails here."""

from __future__ import annotations

import email.utils
import json
import time
from typing import Any, Dict, Set

import pytest

from conftest import REPO
from memsweep_client import ROUTES, MemsweepClient
from memsweep_client.client import _retry_after_seconds
from memsweep_client.events import parse_event_stream

pytestmark = pytest.mark.backend_agnostic

HTTP_METHODS = {"get", "put", "post", "delete", "patch", "head", "options", "trace"}


def operations(document: Dict[str, Any]) -> Set[str]:
    return {"%s %s" % (method.upper(), path)
            for path, item in document["paths"].items() for method in item if method in HTTP_METHODS}


def test_every_operation_of_the_committed_document_has_a_method() -> None:
    document = json.loads((REPO / "openapi" / "openapi.json").read_text())
    assert sorted(operations(document) - set(ROUTES)) == [], "routes without a client method (add them to routes.py)"
    assert sorted(set(ROUTES) - operations(document)) == [], "ROUTES names operations the API does not have"


def test_every_method_of_the_map_exists(client: MemsweepClient) -> None:
    missing = [name for name in ROUTES.values() if not callable(getattr(client, name, None))]
    assert missing == []


def test_the_served_document_has_the_same_operations(client: MemsweepClient) -> None:
    assert operations(client.openapi()) == set(ROUTES)


def test_retry_after_reads_seconds_and_http_dates() -> None:
    assert _retry_after_seconds("7") == 7.0
    assert _retry_after_seconds(None) is None
    assert _retry_after_seconds("soon") is None
    later = email.utils.formatdate(time.time() + 30, usegmt=True)
    assert 28.0 <= (_retry_after_seconds(later) or 0) <= 30.5


def test_event_stream_parsing_skips_heartbeats_and_joins_data_lines() -> None:
    lines = ["retry: 3000", "", ": ping", "id: 1", "event: snapshot", 'data: {"a":', "data: 1}", "", "data:{\"b\":2}", ""]
    assert list(parse_event_stream(lines)) == [("snapshot", {"a": 1}), ("message", {"b": 2})]
