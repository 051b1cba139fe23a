"""The HTTP client: one method per route of the memsweep API (see ROUTES in routes.py)."""

from __future__ import annotations

import email.utils
import os
import random
import time
import uuid
from typing import Any, Callable, Dict, Iterator, List, Mapping, Optional, Sequence, Tuple, Union

import requests

from .events import parse_event_stream

Json = Dict[str, Any]
Status = Dict[str, Any]

TERMINAL = frozenset({"succeeded", "failed", "canceled"})

# Answers that mean "not now": the server did no work, so asking again later is safe for any method.
RETRYABLE_STATUSES = frozenset({429, 503})

_UNSET: Any = object()


class MemsweepError(Exception):
    """An error answer of the server, carrying its RFC 9457 problem document."""

    def __init__(self, status: int, problem: Union[Json, str]) -> None:
        self.status = status
        self.problem: Json = problem if isinstance(problem, dict) else {}
        self.code: Optional[str] = self.problem.get("code")
        self.errors: List[Json] = list(self.problem.get("errors") or [])
        text = self.problem.get("detail") or self.problem.get("title") or problem
        lines = ["%s %s: %s" % (status, self.code or "", text)]
        for issue in self.errors:
            lines.append("  %s: %s" % (issue.get("path") or "(spec)", issue.get("message")))
        super().__init__("\n".join(lines))


def _retry_after_seconds(value: Optional[str]) -> Optional[float]:
    """Retry-After as seconds: either a number of seconds or an HTTP date (RFC 9110, 10.2.3)."""
    if value is None or value.strip() == "":
        return None
    try:
        return max(0.0, float(value))
    except ValueError:
        pass
    try:
        when = email.utils.parsedate_to_datetime(value)
    except (TypeError, ValueError):
        return None
    return max(0.0, when.timestamp() - time.time())


def _flag(value: bool) -> str:
    return "true" if value else "false"


class MemsweepClient:
    """A memsweep server. Every call raises MemsweepError on a 4xx/5xx answer.

    Answers 429 and 503 are retried up to `max_retries` times, waiting what the server's
    Retry-After asks for, or else an exponential backoff (`backoff` seconds doubling up to
    `max_backoff`, with jitter). Connection failures are retried for reads and for keyed
    submissions, which the server deduplicates.
    """

    def __init__(
        self,
        server: Optional[str] = None,
        token: Optional[str] = None,
        *,
        timeout: float = 30.0,
        max_retries: int = 5,
        backoff: float = 0.5,
        max_backoff: float = 30.0,
        session: Optional[requests.Session] = None,
        sleep: Callable[[float], None] = time.sleep,
    ) -> None:
        self.server = (server or os.environ.get("MEMSWEEP_SERVER") or "http://127.0.0.1:8080").rstrip("/")
        self.timeout = timeout
        self.max_retries = max_retries
        self.backoff = backoff
        self.max_backoff = max_backoff
        self.retries_done = 0
        self._sleep = sleep
        self.session = session or requests.Session()
        token = token if token is not None else os.environ.get("MEMSWEEP_TOKEN")
        if token:
            self.session.headers["Authorization"] = "Bearer " + token

    # -- plumbing -----------------------------------------------------------------------

    def _wait_before_retry(self, attempt: int, response: Optional[requests.Response]) -> None:
        asked = _retry_after_seconds(response.headers.get("Retry-After")) if response is not None else None
        if asked is None:
            asked = min(self.max_backoff, self.backoff * (2 ** attempt)) * (0.5 + random.random() / 2)
        self.retries_done += 1
        self._sleep(min(asked, self.max_backoff))

    def request(self, method: str, path: str, *, retry_connection: Optional[bool] = None, **kwargs: Any) -> requests.Response:
        """Sends one request (with retries); returns the 2xx/304 response or raises MemsweepError."""
        kwargs.setdefault("timeout", self.timeout)
        if retry_connection is None:
            retry_connection = method in ("GET", "HEAD")
        attempt = 0
        while True:
            try:
                response = self.session.request(method, self.server + path, **kwargs)
            except (requests.ConnectionError, requests.Timeout):
                if not retry_connection or attempt >= self.max_retries:
                    raise
                self._wait_before_retry(attempt, None)
                attempt += 1
                continue
            if response.status_code in RETRYABLE_STATUSES and attempt < self.max_retries:
                response.close()
                self._wait_before_retry(attempt, response)
                attempt += 1
                continue
            if response.status_code >= 400:
                try:
                    problem: Union[Json, str] = response.json()
                except ValueError:
                    problem = response.text
                raise MemsweepError(response.status_code, problem)
            return response

    def _json(self, method: str, path: str, **kwargs: Any) -> Any:
        return self.request(method, path, **kwargs).json()

    @staticmethod
    def _sweep_path(sweep_id: str, suffix: str = "") -> str:
        return "/v1/sweeps/%s%s" % (requests.utils.quote(sweep_id, safe=""), suffix)

    # -- service ------------------------------------------------------------------------

    def health(self) -> Json:
        """Liveness: the process answers (GET /healthz)."""
        return self._json("GET", "/healthz")

    def ready(self) -> Json:
        """Readiness: storage and queue backend answer (GET /readyz); 503 when not ready."""
        return self._json("GET", "/readyz")

    def metrics(self) -> str:
        """The Prometheus metrics text (GET /metrics)."""
        return self.request("GET", "/metrics").text

    def openapi(self) -> Json:
        """The server's OpenAPI document (GET /openapi.json)."""
        return self._json("GET", "/openapi.json")

    # -- sweeps -------------------------------------------------------------------------

    def submit(
        self,
        spec: Mapping[str, Any],
        *,
        idempotency_key: Optional[str] = None,
        reuse: bool = False,
        reuse_points: Optional[bool] = None,
        callback_url: Optional[str] = None,
    ) -> Status:
        """Queues a sweep and returns its status (with `id`).

        Every submission carries an Idempotency-Key (a fresh one unless given), so a retry
        after a lost answer returns the first sweep instead of queuing a second one.
        `callback_url` asks the server to POST a signed event there when the sweep ends
        (docs/callbacks.md).
        """
        params: Dict[str, str] = {}
        if callback_url is not None:
            params["callbackUrl"] = callback_url
        if reuse:
            params["reuse"] = "true"
        if reuse_points is not None:
            params["reusePoints"] = _flag(reuse_points)
        key = idempotency_key or "py-" + uuid.uuid4().hex
        return self._json("POST", "/v1/sweeps", json=dict(spec), params=params,
                          headers={"Idempotency-Key": key}, retry_connection=True)

    def validate(self, spec: Mapping[str, Any]) -> Json:
        """The normalised spec, its hash and the work estimate; nothing is queued."""
        return self._json("POST", "/v1/sweeps/validate", json=dict(spec), retry_connection=True)

    def theory(self, spec: Mapping[str, Any]) -> Json:
        """Mean-field theory at every grid point of a spec, without simulating."""
        return self._json("POST", "/v1/theory", json=dict(spec), retry_connection=True)

    def list_page(
        self,
        *,
        status: Optional[str] = None,
        tag: Optional[str] = None,
        q: Optional[str] = None,
        replicates_of: Optional[str] = None,
        owner: Optional[str] = None,
        limit: int = 50,
        cursor: Optional[str] = None,
    ) -> Json:
        """One page of the sweep list (GET /v1/sweeps): `items` and `nextCursor`."""
        params: Dict[str, Any] = {"limit": limit}
        for name, value in (("status", status), ("tag", tag), ("q", q), ("replicatesOf", replicates_of),
                            ("owner", owner), ("cursor", cursor)):
            if value is not None:
                params[name] = value
        return self._json("GET", "/v1/sweeps", params=params)

    def sweeps(self, *, page_size: int = 50, **filters: Any) -> Iterator[Status]:
        """Every sweep matching the filters of list_page, newest first, following the pages."""
        cursor: Optional[str] = None
        while True:
            page = self.list_page(limit=page_size, cursor=cursor, **filters)
            yield from page["items"]
            cursor = page["nextCursor"]
            if cursor is None:
                return

    def get(self, sweep_id: str) -> Status:
        """The sweep's status with its normalised spec (GET /v1/sweeps/{id})."""
        return self._json("GET", self._sweep_path(sweep_id))

    status = get

    def cancel(self, sweep_id: str) -> Status:
        """Cancels an active sweep; its finished points stay readable and it can be resumed."""
        return self._json("DELETE", self._sweep_path(sweep_id))

    def purge(self, sweep_id: str) -> None:
        """Removes a finished sweep, its stored chunks and results for good (owner only)."""
        self.request("DELETE", self._sweep_path(sweep_id), params={"purge": "true"})

    def annotate(self, sweep_id: str, *, label: Any = _UNSET, tags: Any = _UNSET, notes: Any = _UNSET) -> Status:
        """Edits label, tags and notes (PATCH); a member left out keeps its value, None clears it."""
        body = {name: value for name, value in (("label", label), ("tags", tags), ("notes", notes)) if value is not _UNSET}
        return self._json("PATCH", self._sweep_path(sweep_id), json=body)

    def extend(
        self,
        sweep_id: str,
        *,
        trials: Optional[int] = None,
        add: Optional[Mapping[str, Sequence[float]]] = None,
        label: Optional[str] = None,
        tags: Optional[Sequence[str]] = None,
        notes: Optional[str] = None,
    ) -> Status:
        """A new sweep with more trials per point and/or extra axis values, reusing every finished trial."""
        body: Json = {}
        if trials is not None:
            body["trials"] = trials
        if add is not None:
            body["add"] = {axis: list(values) for axis, values in add.items()}
        for name, value in (("label", label), ("tags", None if tags is None else list(tags)), ("notes", notes)):
            if value is not None:
                body[name] = value
        return self._json("POST", self._sweep_path(sweep_id, "/extend"), json=body)

    def resume(self, sweep_id: str) -> Status:
        """Requeues a canceled or failed sweep; finished points are not computed again."""
        return self._json("POST", self._sweep_path(sweep_id, "/resume"))

    # -- results ------------------------------------------------------------------------

    def _results(self, sweep_id: str, fmt: str, trials: bool, partial: bool, timing: bool = False,
                 series: Optional[str] = None) -> requests.Response:
        params = {"format": fmt}
        if trials:
            params["trials"] = "true"
        if partial:
            params["partial"] = "true"
        if timing:
            params["timing"] = "true"
        if series is not None:
            params["series"] = series
        return self.request("GET", self._sweep_path(sweep_id, "/results"), params=params)

    def results(self, sweep_id: str, *, trials: bool = False, partial: bool = False, timing: bool = False) -> Json:
        """The results as JSON. `partial=True` reads the points finished so far of a sweep that
        has not succeeded (marked by a `partial` member); `trials=True` adds every trial's record."""
        return self._results(sweep_id, "json", trials, partial, timing).json()

    def results_csv(self, sweep_id: str, *, trials: bool = False, partial: bool = False,
                    series: Optional[str] = None) -> str:
        """The results as tidy CSV text: one row per grid point (or per trial with `trials=True`);
        `series="trajectory"` gives the overlap trajectories in long format instead."""
        return self._results(sweep_id, "csv", trials, partial, series=series).text

    def trials(self, sweep_id: str, *, partial: bool = False) -> List[List[Json]]:
        """Every trial's record, one list per grid point."""
        return self.results(sweep_id, trials=True, partial=partial)["trials"]

    def download(self, sweep_id: str, path: str, *, trials: bool = False, partial: bool = False) -> str:
        """Writes the results to `path` (.csv or .json) via a temporary file and a rename."""
        fmt = "csv" if path.lower().endswith(".csv") else "json"
        return _save(self._results(sweep_id, fmt, trials, partial), path)

    def bundle(self, sweep_id: str, path: str) -> str:
        """Writes the sweep's bundle for supplementary material (a zip: spec, results, figure,
        provenance and how to reproduce them) to `path`, via a temporary file and a rename."""
        return _save(self.request("GET", self._sweep_path(sweep_id, "/bundle.zip")), path)

    def figure(self, sweep_id: str, *, fmt: str = "svg", **options: Any) -> Union[str, bytes]:
        """The sweep's figure: SVG text (fmt="svg"), or PNG or PDF bytes (fmt="png", "pdf").
        Options are the route's query parameters (measure, x, series, xScale, yScale,
        errorBars, theory, width, height, title, partial, …)."""
        return _figure(self.request("GET", self._sweep_path(sweep_id, "/figure." + _figure_format(fmt)), params=_query(options)))

    def overlay_figure(self, sweep_ids: Sequence[str], *, fmt: str = "svg", **options: Any) -> Union[str, bytes]:
        """Several succeeded sweeps on one figure (at most 8): SVG text, or PNG or PDF bytes."""
        params = _query(options)
        params["sweeps"] = ",".join(sweep_ids)
        return _figure(self.request("GET", "/v1/figures/overlay." + _figure_format(fmt), params=params))

    # -- following a sweep --------------------------------------------------------------

    def events(self, sweep_id: str) -> Iterator[Tuple[str, Status]]:
        """(event name, status) from the sweep's Server-Sent Events, until the server closes the stream."""
        response = self.request("GET", self._sweep_path(sweep_id, "/events"), stream=True,
                                headers={"Accept": "text/event-stream"}, timeout=(self.timeout, 120))
        with response:
            yield from parse_event_stream(response.iter_lines(decode_unicode=True))

    def wait(
        self,
        sweep_id: str,
        *,
        on_progress: Optional[Callable[[Status], None]] = None,
        progress: bool = False,
        poll_seconds: float = 2.0,
    ) -> Status:
        """Follows the sweep until it ends and returns its final status.

        Listens to the event stream; if the stream breaks (a proxy, a restart), reads the
        status, waits `poll_seconds` and listens again. `progress=True` shows a tqdm bar of
        trials done (needs the `tqdm` extra).
        """
        bar = None
        if progress:
            from .progress import TrialBar

            bar = TrialBar(sweep_id)
        latest: Optional[Status] = None
        try:
            while latest is None or latest["status"] not in TERMINAL:
                try:
                    for _name, latest in self.events(sweep_id):
                        if bar is not None:
                            bar.show(latest)
                        if on_progress is not None:
                            on_progress(latest)
                except (requests.ConnectionError, requests.Timeout, requests.exceptions.ChunkedEncodingError):
                    pass
                if latest is None or latest["status"] not in TERMINAL:
                    self._sleep(poll_seconds)
                    latest = self.get(sweep_id)
        finally:
            if bar is not None:
                bar.close()
        return latest

    # -- data frames (the `pandas` extra) -----------------------------------------------

    def results_frame(self, *sweep_ids: str, partial: bool = False) -> Any:
        """One pandas DataFrame of the sweeps' rows: `sweepId` and `label` columns, then one
        row per grid point with the model parameters as columns and numbers as numbers."""
        from .frames import frame_of_sweeps

        return frame_of_sweeps(self, sweep_ids, trials=False, partial=partial)

    def trials_frame(self, *sweep_ids: str, partial: bool = False) -> Any:
        """As results_frame, with one row per trial."""
        from .frames import frame_of_sweeps

        return frame_of_sweeps(self, sweep_ids, trials=True, partial=partial)


FIGURE_FORMATS = ("svg", "png", "pdf")


def _figure_format(fmt: str) -> str:
    if fmt not in FIGURE_FORMATS:
        raise ValueError("fmt must be one of %s, not %r" % (", ".join(FIGURE_FORMATS), fmt))
    return fmt


def _figure(response: requests.Response) -> Union[str, bytes]:
    """SVG as text, the raster and print formats as bytes."""
    return response.text if response.headers.get("content-type", "").startswith("image/svg") else response.content


def _save(response: requests.Response, path: str) -> str:
    """Writes a response's body to `path` through a temporary file and a rename, so a broken
    download never leaves a truncated file under the final name."""
    temporary = path + ".partial"
    with open(temporary, "wb") as out:
        out.write(response.content)
    os.replace(temporary, path)
    return path


def _query(options: Mapping[str, Any]) -> Dict[str, str]:
    """Query parameters as the API spells them: booleans as true/false, None left out."""
    return {name: (_flag(value) if isinstance(value, bool) else str(value)) for name, value in options.items() if value is not None}
