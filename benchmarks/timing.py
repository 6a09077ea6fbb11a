"""Wall-clock timing shared by the benchmark scripts (imported from beside them; not a benchmark itself)."""

from __future__ import annotations

import statistics
import time
from collections.abc import Callable


def median_seconds(fn: Callable[[], object], repeat: int = 3) -> float:
    """Median wall-clock time of ``repeat`` calls of ``fn``, in seconds."""
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return statistics.median(times)
