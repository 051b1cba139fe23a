"""`python -m memsweep_client spec.json --server URL --output results.csv`: submit, follow, download.

Exit codes as the `memsweep` CLI: 0 ok, 1 sweep failed or canceled, 2 request refused,
3 server unreachable or failing.
"""

from __future__ import annotations

import argparse
import json
import os
import sys
from typing import Any, Dict, List, Optional

import requests

from .client import MemsweepClient, MemsweepError


def _progress_line(status: Dict[str, Any]) -> None:
    p = status["progress"]
    left = p.get("estimatedSecondsLeft")
    sys.stderr.write("%s: %s %3d%% (%d/%d trials)%s\n" % (
        status["id"][:8], status["status"], int(100 * p["fraction"]), p["trialsDone"], p["trialsTotal"],
        "" if left is None else ", ~%d s left" % round(left)))


def main(argv: Optional[List[str]] = None) -> int:
    parser = argparse.ArgumentParser(prog="python -m memsweep_client",
                                     description="Submit a memsweep sweep, wait for it, download the results.")
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
        print(sweep["id"], flush=True)
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
