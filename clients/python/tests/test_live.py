"""The client against a live memsweep server (one run per queue backend): every route, the
sweep lifecycle (extend, partial results, cancel, resume, purge), data frames, retries."""

from __future__ import annotations

import os
import subprocess
import sys
import time
import zipfile
from pathlib import Path
from typing import Any, Callable, Dict, List

import pandas as pd
import pytest
import requests

from conftest import Gate, until
from memsweep_client import MemsweepClient, MemsweepError

Spec = Callable[..., Dict[str, Any]]


def test_service_routes(client: MemsweepClient, server: str, admin_token: str) -> None:
    assert client.health() == {"status": "ok"}
    assert client.ready()["status"] == "ready"
    assert client.openapi()["openapi"].startswith("3.")
    with pytest.raises(MemsweepError) as forbidden:
        client.metrics()
    assert forbidden.value.status == 403
    assert "# TYPE" in MemsweepClient(server, admin_token).metrics()


@pytest.mark.backend_agnostic
def test_validate_theory_and_problems(client: MemsweepClient, spec: Spec) -> None:
    validation = client.validate(spec())
    assert validation["work"]["trials"] == 16
    assert len(client.theory(spec())["points"]) == 2
    with pytest.raises(MemsweepError) as refused:
        client.submit({"neurons": 0, "patterns": 1})
    assert refused.value.status == 422
    assert refused.value.code == "MEMSWEEP_SPEC_INVALID"
    assert [issue["path"] for issue in refused.value.errors] == ["neurons"]
    with pytest.raises(MemsweepError) as missing:
        client.get("no-such-sweep")
    assert missing.value.status == 404
    # The callback target reaches the server: a loopback address is refused by its SSRF guard.
    with pytest.raises(MemsweepError) as loopback:
        client.submit(spec(), callback_url="http://127.0.0.1:9/done")
    assert loopback.value.status == 422
    assert loopback.value.code == "MEMSWEEP_CALLBACK_REFUSED"


def test_submission_is_idempotent_and_always_keyed(client: MemsweepClient, spec: Spec) -> None:
    body = spec()
    key = "py-notebook-cell-%d" % body["seed"]
    first = client.submit(body, idempotency_key=key)
    again = client.submit(body, idempotency_key=key)
    assert again["id"] == first["id"]
    sent: List[str] = []
    client.session.hooks["response"].append(lambda response, **_: sent.append(response.request.headers.get("Idempotency-Key", "")))
    other = client.submit(body)
    assert sent[0].startswith("py-") and len(sent[0]) > 20
    assert other["id"] != first["id"]
    for sweep_id in (first["id"], other["id"]):
        assert client.wait(sweep_id)["status"] == "succeeded"


def test_follow_and_read(client: MemsweepClient, spec: Spec, tmp_path: Path, capsys: pytest.CaptureFixture[str]) -> None:
    sweep = client.submit(spec(label="rooms of a library"))
    seen: List[Dict[str, Any]] = []
    final = client.wait(sweep["id"], on_progress=seen.append, progress=True)
    assert final["status"] == "succeeded"
    assert seen[-1]["progress"]["trialsDone"] == 16
    assert "16/16" in capsys.readouterr().err  # the tqdm bar, fed by the event stream

    result = client.results(sweep["id"])
    assert [row["values"]["load"] for row in result["rows"]] == [0.05, 0.15]
    csv = client.results_csv(sweep["id"])
    header = csv.splitlines()[0].split(",")
    assert header[0] == "sweepId" and "point" in header and "load" in header
    assert len(csv.strip().splitlines()) == 3
    trials = client.trials(sweep["id"])
    assert [len(point) for point in trials] == [8, 8]
    assert len(client.results_csv(sweep["id"], trials=True).strip().splitlines()) == 17
    target = tmp_path / "library.csv"
    client.download(sweep["id"], str(target))
    assert target.read_bytes().decode() == csv

    events = list(client.events(sweep["id"]))
    assert events[-1][1]["status"] == "succeeded"


@pytest.mark.backend_agnostic
def test_figures_and_bundle(client: MemsweepClient, spec: Spec, tmp_path: Path) -> None:
    sweeps = [client.submit(spec(label=label)) for label in ("rooms of a museum", "rooms of a gallery")]
    for sweep in sweeps:
        client.wait(sweep["id"])
    assert "<svg" in client.figure(sweeps[0]["id"], measure="overlap", errorBars="se")
    assert "<svg" in client.overlay_figure([sweep["id"] for sweep in sweeps], measure="success")
    assert client.figure(sweeps[0]["id"], fmt="png")[:8] == b"\x89PNG\r\n\x1a\n"
    assert client.overlay_figure([sweep["id"] for sweep in sweeps], fmt="pdf")[:5] == b"%PDF-"
    with pytest.raises(ValueError):
        client.figure(sweeps[0]["id"], fmt="gif")
    bundle = tmp_path / "museum.zip"
    client.bundle(sweeps[0]["id"], str(bundle))
    with zipfile.ZipFile(bundle) as archive:
        assert any(name.endswith(".csv") for name in archive.namelist())


def test_frames_keep_sweeps_apart_with_numbers_as_numbers(client: MemsweepClient, spec: Spec) -> None:
    by_load = client.submit(spec(label="east wing"))
    by_size = client.submit(spec(label="west wing", neurons={"values": [48, 80]}, load=0.1, trials=4))
    for sweep in (by_load, by_size):
        client.wait(sweep["id"])
    frame = client.results_frame(by_load["id"], by_size["id"])
    assert len(frame) == 4
    assert list(frame.columns[:2]) == ["sweepId", "label"]
    assert frame.groupby("sweepId").size().to_dict() == {by_load["id"]: 2, by_size["id"]: 2}
    assert frame.set_index("sweepId").loc[by_size["id"], "label"].tolist() == ["west wing", "west wing"]
    for column in ("load", "neurons", "trials", "success.rate", "overlap.mean"):
        assert pd.api.types.is_numeric_dtype(frame[column]), column
    assert frame.loc[frame["sweepId"] == by_load["id"], "load"].tolist() == [0.05, 0.15]
    assert frame.loc[frame["sweepId"] == by_size["id"], "neurons"].tolist() == [48, 80]

    trials = client.trials_frame(by_load["id"], by_size["id"])
    assert trials.groupby("sweepId").size().to_dict() == {by_load["id"]: 16, by_size["id"]: 8}
    assert pd.api.types.is_numeric_dtype(trials["load"])


def test_annotate_list_and_filter(client: MemsweepClient, spec: Spec) -> None:
    sweep = client.submit(spec(label="rooms of a hospital"))
    client.wait(sweep["id"])
    tag = "ward-%d" % os.getpid()
    annotated = client.annotate(sweep["id"], tags=[tag, "pilot"], notes="night shift, cue noise 0.1")
    assert annotated["tags"] == [tag, "pilot"] and annotated["label"] == "rooms of a hospital"
    assert client.annotate(sweep["id"], notes=None)["notes"] is None
    assert [s["id"] for s in client.sweeps(tag=tag)] == [sweep["id"]]
    assert sweep["id"] in [s["id"] for s in client.sweeps(q="hospital", page_size=1)]
    assert sweep["id"] in [s["id"] for s in client.sweeps(replicates_of=sweep["id"])]
    page = client.list_page(status="succeeded", limit=1)
    assert len(page["items"]) == 1


def test_extend_reuses_the_finished_trials(client: MemsweepClient, spec: Spec) -> None:
    parent = client.submit(spec(label="rooms of a station"))
    client.wait(parent["id"])
    child = client.extend(parent["id"], trials=12, add={"load": [0.1]}, tags=["extended"])
    assert child["extends"] == parent["id"]
    assert child["reused"]["trials"] == 16
    assert client.wait(child["id"])["status"] == "succeeded"
    rows = client.results(child["id"])["rows"]
    assert [(row["values"]["load"], row["summary"]["trials"]) for row in rows] == [(0.05, 12), (0.1, 12), (0.15, 12)]


def test_partial_results_cancel_resume_and_purge(client: MemsweepClient, spec: Spec, gate: Gate) -> None:
    gate.hold()
    sweep = client.submit(spec(label="rooms of an airport"))

    released = [0]

    def one_point_done() -> bool:
        # One chunk at a time: the next is let through only once the last one let through is done.
        progress = client.get(sweep["id"])["progress"]
        if progress["pointsDone"] >= 1:
            return True
        if progress["chunksDone"] >= released[0] and gate.waiting() > 0:
            gate.release(1)
            released[0] += 1
        return False

    until(one_point_done, what="a first finished point")
    partial = client.results(sweep["id"], partial=True)
    assert partial["partial"]["pointsTotal"] == 2
    assert 1 <= len(partial["rows"]) < 2
    assert len(client.results_csv(sweep["id"], partial=True).strip().splitlines()) == 2
    assert "<svg" in client.figure(sweep["id"], partial=True)
    with pytest.raises(MemsweepError) as not_ready:
        client.results(sweep["id"])
    assert not_ready.value.status == 409

    assert client.cancel(sweep["id"])["status"] == "canceled"
    resumed = client.resume(sweep["id"])
    assert resumed["status"] in ("queued", "running")
    gate.open()
    final = client.wait(sweep["id"])
    assert final["status"] == "succeeded"
    assert final["progress"]["pointsDone"] == 2

    client.purge(sweep["id"])
    with pytest.raises(MemsweepError) as gone:
        client.get(sweep["id"])
    assert gone.value.status == 404


@pytest.mark.backend_agnostic
def test_retries_honour_retry_after(token: str) -> None:
    throttled = os.environ["MEMSWEEP_TEST_THROTTLED_SERVER"]
    waits: List[float] = []

    def sleep(seconds: float) -> None:
        waits.append(seconds)
        time.sleep(seconds)

    client = MemsweepClient(throttled, token, sleep=sleep)
    for _ in range(4):
        assert client.list_page(limit=1)["items"] is not None
    assert client.retries_done >= 1
    assert all(0 < wait <= 2 for wait in waits), waits  # what the server asked for (a 1 s window)
    impatient = MemsweepClient(throttled, token, max_retries=0)
    with pytest.raises(MemsweepError) as limited:
        for _ in range(4):
            impatient.list_page(limit=1)
    assert limited.value.status == 429


@pytest.mark.backend_agnostic
def test_command_line(server: str, token: str, spec: Spec, tmp_path: Path) -> None:
    spec_file = tmp_path / "spec.json"
    spec_file.write_text(requests.compat.json.dumps(spec(label="rooms of a port")))
    out = tmp_path / "port.csv"
    run = subprocess.run([sys.executable, "-m", "memsweep_client", str(spec_file), "--server", server, "--output", str(out)],
                         env={**os.environ, "MEMSWEEP_TOKEN": token}, capture_output=True, text=True, timeout=60)
    assert run.returncode == 0, run.stderr
    sweep_id = run.stdout.strip()
    assert "succeeded 100%" in run.stderr
    assert out.read_bytes().decode() == MemsweepClient(server, token).results_csv(sweep_id)
    refused = subprocess.run([sys.executable, "-m", "memsweep_client", str(spec_file), "--server", server],
                             env={**os.environ, "MEMSWEEP_TOKEN": "wrong-token-0000000000"}, capture_output=True, text=True, timeout=60)
    assert refused.returncode == 2, refused.stderr
