"""A tqdm progress bar of a sweep's trials, fed by its event stream (the `tqdm` extra)."""

from __future__ import annotations

from typing import Any, Dict, Optional

try:
    from tqdm.auto import tqdm
except ImportError as missing:  # pragma: no cover - depends on the environment
    raise ImportError("progress=True needs tqdm: pip install 'memsweep-client[tqdm]'") from missing


class TrialBar:
    """Shows trials done of trials total; the totals may grow (precision targets add trial blocks)."""

    def __init__(self, sweep_id: str) -> None:
        self.bar: Any = tqdm(total=None, desc=sweep_id[:8], unit="trial")
        self.shown = 0

    def show(self, status: Dict[str, Any]) -> None:
        progress: Dict[str, Any] = status["progress"]
        total: Optional[int] = progress.get("trialsTotal")
        if total is not None and self.bar.total != total:
            self.bar.total = total
        done = int(progress.get("trialsDone", 0))
        if done > self.shown:
            self.bar.update(done - self.shown)
            self.shown = done
        self.bar.set_postfix_str(status["status"], refresh=True)

    def close(self) -> None:
        self.bar.close()
