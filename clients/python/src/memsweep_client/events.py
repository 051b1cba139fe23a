"""A reader of Server-Sent Events (the sweep's /events stream), as the HTML standard defines them."""

from __future__ import annotations

import json
from typing import Any, Dict, Iterable, Iterator, List, Optional, Tuple


def parse_event_stream(lines: Iterable[Optional[str]]) -> Iterator[Tuple[str, Dict[str, Any]]]:
    """(event name, parsed JSON data) for each event of a stream given line by line.

    Comment lines (the server's heartbeats) and `id:`/`retry:` fields are skipped; an event
    is dispatched at a blank line; several `data:` lines are joined by newlines.
    """
    name: Optional[str] = None
    data: List[str] = []
    for raw in lines:
        if raw is None:
            continue
        if raw == "":
            if data:
                yield name or "message", json.loads("\n".join(data))
            name, data = None, []
            continue
        if raw.startswith(":"):
            continue
        field, _, value = raw.partition(":")
        if value.startswith(" "):
            value = value[1:]
        if field == "event":
            name = value
        elif field == "data":
            data.append(value)
