"""Drawing a report's charts as one batch: asked for while the page's context is built, drawn after.

Each chart is an independent matplotlib figure drawn from plain numbers, so charts can be drawn
in worker processes, one chart at a time to whichever worker is free, and taken back in the order
they were asked for. Every chart is drawn the same way in a worker as in this process (fixed hash
salt, ids from the figure's own number), so the page is byte-identical either way.

A batch of at least FORK_FROM charts imports matplotlib here and then forks one worker a CPU
(a plain multiprocessing pool), so the workers start with it. Serial where forking is not
available (Windows, macOS's default), inside a worker process of some other pool (a daemon
process may not start children), on one CPU, for a few charts, and for a chart whose function
cannot be sent to a worker (one defined inside another function).

Measured (python -m specgen.bench --charts; figures in bench.py): on 2 CPUs the workers take
about a third off the demo report's time and near half off a 100-drive report's. An earlier
helper process that imported matplotlib while the specs were checked gained nothing measurable
over this plain pool and was removed.
"""

from __future__ import annotations

import gc
import multiprocessing
import os
import pickle
import signal
from dataclasses import dataclass
from typing import Callable

from specgen.present.charts import Chart

FORK_FROM = 8  # charts in one batch before forking workers for it pays (python -m specgen.bench)


@dataclass
class Pending:
    """A chart asked for and not yet drawn; stands in for the Chart in the page's context."""

    fig_id: str
    chart: Chart | None = None

    @property
    def id(self) -> str:
        return self.fig_id

    @property
    def svg(self) -> str:
        return self._drawn().svg

    @property
    def alt(self) -> str:
        return self._drawn().alt

    def _drawn(self) -> Chart:
        if self.chart is None:
            raise RuntimeError(f"chart {self.fig_id} was asked for but the batch was not drawn")
        return self.chart


class Batch:
    """``batch(fn, fig_id, *args, **kwargs)`` asks for the chart ``fn(fig_id, *args, **kwargs)``;
    ``batch.start()`` sets the drawing going and ``batch.finish()`` fills every chart in, so the
    caller can do other work while workers draw; ``batch.draw()`` is the two together."""

    def __init__(self) -> None:
        self._jobs: list[tuple[Callable[..., Chart], str, tuple, dict]] = []
        self._pending: list[Pending] = []
        self._drawing: Drawing | None = None

    def __call__(self, fn: Callable[..., Chart], fig_id: str, *args, **kwargs) -> Pending:
        self._jobs.append((fn, fig_id, args, kwargs))
        self._pending.append(Pending(fig_id))
        return self._pending[-1]

    def __len__(self) -> int:
        return len(self._pending)

    def start(self, workers: int | None = None) -> None:
        """Start drawing: ``workers`` None decides by the count (workers_for); 1 draws here;
        more forks that many workers for this batch."""
        self._drawing = Drawing(self._jobs, workers)
        self._jobs = []

    def finish(self) -> None:
        """Wait for the charts and fill them in."""
        if self._drawing is None:
            self.start()
        drawing, self._drawing = self._drawing, None
        for pending, chart in zip(self._pending, drawing.results()):
            pending.chart = chart

    def draw(self, workers: int | None = None) -> None:
        self.start(workers)
        self.finish()


def _draw(job) -> Chart:
    fn, fig_id, args, kwargs = job
    return fn(fig_id, *args, **kwargs)


def _sendable(job) -> bool:
    try:
        pickle.dumps(job[0])  # module-level functions go by name; a nested one cannot go at all
    except (pickle.PicklingError, AttributeError, TypeError):
        return False
    return True


def usable_cpus() -> int:
    return len(os.sched_getaffinity(0)) if hasattr(os, "sched_getaffinity") else (os.cpu_count() or 1)


def can_fork() -> bool:
    return ("fork" in multiprocessing.get_all_start_methods() and not multiprocessing.current_process().daemon
            and usable_cpus() > 1)


def workers_for(count: int) -> int:
    """Processes to draw ``count`` charts in: 1 (this one) unless there are many and forking works."""
    return max(1, min(usable_cpus(), count)) if count >= FORK_FROM and can_fork() else 1


def _fork_pool(n: int):
    # Frozen, the objects a worker inherits are left out of its garbage collections: a full sweep
    # would otherwise visit (and so copy, page by page) the whole inherited heap in every worker.
    # The workers are forked when the pool is made, so this process thaws right after.
    gc.freeze()
    try:
        return multiprocessing.get_context("fork").Pool(n, initializer=_quiet_worker)
    finally:
        gc.unfreeze()


def _quiet_worker() -> None:
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # Ctrl-C is this process's to handle; it ends the workers
    signal.signal(signal.SIGTERM, signal.SIG_DFL)


class Drawing:
    """Charts being drawn: by workers forked for this batch, or here, at once."""

    def __init__(self, jobs: list, workers: int | None = None) -> None:
        self._jobs, self._pool, self._async, self._sent = jobs, None, None, []
        self._charts: list[Chart] | None = None
        n = workers_for(len(jobs)) if workers is None else max(1, min(workers, len(jobs)))
        if n == 1 or not can_fork():
            self._charts = [_draw(job) for job in jobs]
            return
        from specgen.present import charts

        charts.prepare()  # import and look fonts up once, here, not in every worker
        self._pool = _fork_pool(n)
        self._sent = [k for k, job in enumerate(jobs) if _sendable(job)]
        if self._sent:
            self._async = self._pool.map_async(_draw, [jobs[k] for k in self._sent], chunksize=1)

    def results(self) -> list[Chart]:
        if self._charts is not None:
            return self._charts
        out: list = [None] * len(self._jobs)
        try:
            sent = set(self._sent)
            for k, job in enumerate(self._jobs):  # what could not be sent is drawn here, meanwhile
                if k not in sent:
                    out[k] = _draw(job)
            drawn = self._async.get() if self._sent else []
        finally:
            self._pool.terminate()
            self._pool.join()
        for k, chart in zip(self._sent, drawn):
            out[k] = chart
        return out
