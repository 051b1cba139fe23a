#!/usr/bin/env python3
"""A small client for the memsweep HTTP API: submit a sweep, follow it, download results.

Needs only `requests` and the standard library. Use it as a module:

    from memsweep_client import MemsweepClient
    client = MemsweepClient("http://127.0.0.1:8080", token=None)
    sweep = client.submit(json.load(open("examples/room-capacity.json")))
    final = client.wait(sweep["id"], on_progress=print)
    client.download(sweep["id"], "capacity.csv")

or from a shell (exit codes as the `memsweep` CLI: 0 ok, 1 sweep failed or canceled,
2 request refused, 3 server unreachable or failing):

    python3 clients/python/memsweep_client.py examples/room-capacity.json \
        --server http://127.0.0.1:8080 --output capacity.csv
"""

import argparse
import json
import os
import sys
import time

import requests

TERMINAL = {"succeeded", "failed", "canceled"}


class MemsweepError(Exception):
    """An error answer of the server, carrying its RFC 9457 problem document."""

    def __init__(self, status, problem):
        self.status = status
        self.problem = problem if isinstance(problem, dict) else {}
        self.code = self.problem.get("code")
        lines = ["%s %s: %s" % (status, self.code or "", self.problem.get("detail") or self.problem.get("title") or problem)]
        for issue in self.problem.get("errors", []):
            lines.append("  %s: %s" % (issue.get("path") or "(spec)", issue.get("message")))
        super().__init__("\n".join(lines))


class MemsweepClient:
    def __init__(self, server="http://127.0.0.1:8080", token=None, timeout=30):
        self.server = server.rstrip("/")
        self.timeout = timeout
        self.session = requests.Session()
        if token:
            self.session.headers["Authorization"] = "Bearer " + token

    # -- plumbing ---------------------------------------------------------

    def _request(self, method, path, **kwargs):
        kwargs.setdefault("timeout", self.timeout)
        response = self.session.request(method, self.server + path, **kwargs)
        if response.status_code >= 400:
            try:
                problem = response.json()
            except ValueError:
                problem = response.text
            raise MemsweepError(response.status_code, problem)
        return response

    # -- the API ----------------------------------------------------------

    def submit(self, spec, idempotency_key=None, reuse=False):
        """Queues a sweep; returns its status (with `id`). Raises MemsweepError on 4xx/5xx."""
        headers = {"Idempotency-Key": idempotency_key} if idempotency_key else {}
        params = {"reuse": "true"} if reuse else {}
        return self._request("POST", "/v1/sweeps", json=spec, headers=headers, params=params).json()

    def validate(self, spec):
        """The normalised spec, its hash and the work estimate; nothing is queued."""
        return self._request("POST", "/v1/sweeps/validate", json=spec).json()

    def theory(self, spec):
        """Theory values at every grid point of a spec, without simulating."""
        return self._request("POST", "/v1/theory", json=spec).json()

    def status(self, sweep_id):
        return self._request("GET", "/v1/sweeps/" + sweep_id).json()

    def cancel(self, sweep_id):
        return self._request("DELETE", "/v1/sweeps/" + sweep_id).json()

    def sweeps(self, status=None, page_size=50):
        """Iterates over your sweeps, newest first, following the cursor pages."""
        params = {"limit": page_size}
        if status:
            params["status"] = status
        while True:
            page = self._request("GET", "/v1/sweeps", params=params).json()
            for item in page["items"]:
                yield item
            if page["nextCursor"] is None:
                return
            params["cursor"] = page["nextCursor"]

    def events(self, sweep_id):
        """Yields (event name, status) from the sweep's Server-Sent Events until the server closes the stream."""
        response = self._request("GET", "/v1/sweeps/%s/events" % sweep_id, stream=True,
                                 headers={"Accept": "text/event-stream"}, timeout=(self.timeout, 120))
        with response:
            name, data = None, []
            for raw in response.iter_lines(decode_unicode=True):
                if raw is None:
                    continue
                if raw == "":
                    if data:
                        yield name or "message", json.loads("\n".join(data))
                    name, data = None, []
                elif raw.startswith(":"):
                    continue  # heartbeat
                elif raw.startswith("event:"):
                    name = raw[6:].strip()
                elif raw.startswith("data:"):
                    data.append(raw[5:].lstrip())

    def wait(self, sweep_id, on_progress=None, poll_seconds=2.0):
        """Follows the sweep until it ends and returns its final status.

        Uses the event stream; if the stream breaks (a proxy, a restart), reads the status,
        waits `poll_seconds` and listens again.
        """
        latest = None
        while latest is None or latest["status"] not in TERMINAL:
            try:
                for _name, latest in self.events(sweep_id):
                    if on_progress:
                        on_progress(latest)
            except (requests.ConnectionError, requests.Timeout, requests.exceptions.ChunkedEncodingError):
                pass
            if latest is None or latest["status"] not in TERMINAL:
                time.sleep(poll_seconds)
                latest = self.status(sweep_id)
        return latest

    def results(self, sweep_id, fmt="json", trials=False):
        """The results as parsed JSON (fmt="json") or CSV text (fmt="csv")."""
        params = {"format": fmt}
        if trials:
            params["trials"] = "true"
        response = self._request("GET", "/v1/sweeps/%s/results" % sweep_id, params=params)
        return response.json() if fmt == "json" else response.text

    def download(self, sweep_id, path, trials=False):
        """Writes the results to `path` (.csv or .json), via a temporary file and a rename."""
        fmt = "csv" if path.lower().endswith(".csv") else "json"
        params = {"format": fmt}
        if trials:
            params["trials"] = "true"
        response = self._request("GET", "/v1/sweeps/%s/results" % sweep_id, params=params)
        partial = path + ".partial"
        with open(partial, "wb") as out:
            out.write(response.content)
        os.replace(partial, path)
        return path


def _progress_line(status):
    p = status["progress"]
    left = p.get("estimatedSecondsLeft")
    sys.stderr.write("%s: %s %3d%% (%d/%d trials)%s\n" % (
        status["id"][:8], status["status"], int(100 * p["fraction"]), p["trialsDone"], p["trialsTotal"],
        "" if left is None else ", ~%d s left" % round(left)))


def main(argv=None):
    parser = argparse.ArgumentParser(description="Submit a memsweep sweep, wait for it, download the results.")
    parser.add_argument("spec", help="sweep spec (JSON file)")
    parser.add_argument("--server", default=os.environ.get("MEMSWEEP_SERVER", "http://127.0.0.1:8080"))
    parser.add_argument("--token", default=os.environ.get("MEMSWEEP_TOKEN"))
    parser.add_argument("--output", help="results file (.csv or .json); without it, only submit")
    parser.add_argument("--trials", action="store_true", help="per-trial rows")
    args = parser.parse_args(argv)

    with open(args.spec) as handle:
        spec = json.load(handle)
    client = MemsweepClient(args.server, args.token)
    try:
        sweep = client.submit(spec)
        print(sweep["id"])
        if not args.output:
            return 0
        final = client.wait(sweep["id"], on_progress=_progress_line)
        if final["status"] != "succeeded":
            error = final.get("error") or {}
            sys.stderr.write("sweep %s %s %s\n" % (final["id"], final["status"], error.get("message", "")))
            return 1
        client.download(sweep["id"], args.output, trials=args.trials)
        sys.stderr.write("results written to %s\n" % args.output)
        return 0
    except MemsweepError as error:
        sys.stderr.write(str(error) + "\n")
        return 3 if error.status >= 500 else 2
    except requests.RequestException as error:
        sys.stderr.write("cannot reach %s: %s\n" % (args.server, error))
        return 3


if __name__ == "__main__":
    sys.exit(main())
