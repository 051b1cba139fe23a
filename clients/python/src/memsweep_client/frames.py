"""Results as pandas data frames (the `pandas` extra)."""

from __future__ import annotations

import io
from typing import TYPE_CHECKING, Any, Sequence

try:
    import pandas as pd
except ImportError as missing:  # pragma: no cover - depends on the environment
    raise ImportError("results_frame and trials_frame need pandas: pip install 'memsweep-client[pandas]'") from missing

if TYPE_CHECKING:
    from .client import MemsweepClient


def frame_of_sweeps(client: "MemsweepClient", sweep_ids: Sequence[str], *, trials: bool, partial: bool) -> Any:
    """The sweeps' CSV results in one frame, each row marked by its sweep's id (`sweepId`, the
    first column, as the server's tables have it) and label.

    The server's CSV is already tidy (one row per grid point or per trial, the grid
    parameters and every measure as columns), so pandas parses numbers as numbers; the
    columns of sweeps with different grids are the union, missing cells are NaN.
    """
    if len(sweep_ids) == 0:
        raise ValueError("name at least one sweep id")
    frames = []
    for sweep_id in sweep_ids:
        label = client.get(sweep_id).get("label")
        frame = pd.read_csv(io.StringIO(client.results_csv(sweep_id, trials=trials, partial=partial)))
        if "sweepId" in frame.columns:
            frame.pop("sweepId")
        frame.insert(0, "sweepId", sweep_id)
        frame.insert(1, "label", label)
        frames.append(frame)
    combined = pd.concat(frames, ignore_index=True, sort=False) if len(frames) > 1 else frames[0]
    combined["sweepId"] = combined["sweepId"].astype("string")
    combined["label"] = combined["label"].astype("string")
    return combined
