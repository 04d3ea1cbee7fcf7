"""Drawing a report's charts as one batch: asked for while the page's context is built, drawn after.

Each chart is an independent matplotlib figure drawn from plain numbers, so charts can be drawn
in worker processes, one chart at a time to whichever worker is free, and taken back in the order
they were asked for. Every chart is drawn the same way in a worker as in this process (fixed hash
salt, ids from the figure's own number), so the page is byte-identical either way.

Workers come from one of two places:

- ``start_workers()``, called by ``specgen report`` before it reads and checks the specs, forks
  a helper from the still small process; the helper imports matplotlib on the other core while
  this process checks, then forks one worker a CPU, which start with it. This process never
  imports matplotlib at all, and every batch goes to the helper's workers.
- otherwise a batch of at least FORK_FROM charts forks workers of its own, after importing
  matplotlib here so that they start with it.

Serial where forking is not available (Windows, macOS's default), inside a worker process of some
other pool (a daemon process may not start children), on one CPU, for a few charts without
started workers, and for a chart whose function cannot be sent to a worker (one defined inside
another function).

Measured against drawing every chart here and against a plain pool forked per page (figures and
command in specgen/bench.py): the workers take a third off the demo report and half off a
100-drive report on 2 CPUs; the early helper keeps a gain the per-page pool mostly loses.
"""

from __future__ import annotations

import atexit
import gc
import multiprocessing
import os
import pickle
import signal
from dataclasses import dataclass
from typing import Callable

from specgen.present.charts import Chart

FORK_FROM = 8  # charts in one batch before forking workers for it pays (python -m specgen.bench)

_WORKERS = None  # the helper start_workers made, until stop_workers


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
        """Start drawing: ``workers`` None uses the started workers or decides by the count
        (workers_for); 1 draws here; more forks that many workers for this batch."""
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
    """Processes to draw ``count`` charts in when no workers were started: 1 (this one) unless
    there are many and forking works."""
    return max(1, min(usable_cpus(), count)) if count >= FORK_FROM and can_fork() else 1


def _fork_pool(n: int, initializer=None):
    # Frozen, the objects a worker inherits are left out of its garbage collections: a full sweep
    # would otherwise visit (and so copy, page by page) the whole inherited heap in every worker.
    # The workers are forked when the pool is made, so this process thaws right after.
    gc.freeze()
    try:
        return multiprocessing.get_context("fork").Pool(n, initializer=initializer)
    finally:
        gc.unfreeze()


def _quiet_worker() -> None:
    signal.signal(signal.SIGINT, signal.SIG_IGN)  # Ctrl-C is this process's to handle; it ends the workers
    signal.signal(signal.SIGTERM, signal.SIG_DFL)


def _end_on_term(signum, frame) -> None:
    raise SystemExit(0)  # leaves the pool's "with" block, which ends the workers


def _serve(conn, n: int) -> None:
    """The drawing helper: import matplotlib once, fork ``n`` workers that start with it, then draw
    each list of jobs that comes down ``conn`` and send the charts (or the error) back, until told
    to stop or this end's parent goes away."""
    from specgen.present import charts

    _quiet_worker()
    signal.signal(signal.SIGTERM, _end_on_term)  # stopped mid-batch: take the workers along
    charts.prepare()
    gc.freeze()  # matplotlib's own objects live as long as the workers: keep them out of every sweep
    with multiprocessing.get_context("fork").Pool(n, initializer=_quiet_worker) as pool:
        while True:
            try:
                jobs = conn.recv()
            except (EOFError, OSError):
                return
            if jobs is None:
                return
            try:
                conn.send((True, pool.map(_draw, jobs, chunksize=1)))
            except Exception as exc:  # the chart's own error, raised again where it was asked for
                conn.send((False, exc))


class _Helper:
    """The parent's end of the drawing helper: one process that imports matplotlib beside this
    one's work and then forks the workers, so the import is paid once and off this process."""

    def __init__(self, n: int) -> None:
        ctx = multiprocessing.get_context("fork")
        self._conn, theirs = ctx.Pipe()
        self._busy = False  # a batch sent and its answer not yet taken
        gc.freeze()  # see _fork_pool
        try:
            self._process = ctx.Process(target=_serve, args=(theirs, n), name="specgen-charts")
            self._process.start()
        finally:
            gc.unfreeze()
        theirs.close()

    def map_async(self, fn, jobs: list, chunksize: int = 1) -> "_Helper":
        self._conn.send(jobs)  # fn is always _draw; the helper's workers know it
        self._busy = True
        return self

    def get(self) -> list[Chart]:
        ok, value = self._conn.recv()
        self._busy = False
        if not ok:
            raise value
        return value

    def stop(self) -> None:
        """Let an idle helper end by itself; end one still drawing (after Ctrl-C, say) at once."""
        if not self._busy:
            try:
                self._conn.send(None)
                self._process.join(timeout=2)
            except OSError:
                pass
        self._conn.close()
        for end in (self._process.terminate, self._process.kill):
            if not self._process.is_alive():
                break
            end()
            self._process.join(timeout=2)


def start_workers() -> bool:
    """Start the chart workers now, one a CPU, by way of a helper process that imports matplotlib
    first; True if started. Call it early, before the slow serial work, and stop_workers when done
    (at the latest it runs at exit)."""
    global _WORKERS
    stop_workers()
    if not can_fork():
        return False
    _WORKERS = _Helper(usable_cpus())
    atexit.unregister(stop_workers)
    atexit.register(stop_workers)  # a non-daemon helper left running would hold up the exit
    return True


def stop_workers() -> None:
    global _WORKERS
    helper, _WORKERS = _WORKERS, None
    if helper is not None:
        helper.stop()


class Drawing:
    """Charts being drawn: by workers, or here, at once, where no workers are to be had."""

    def __init__(self, jobs: list, workers: int | None = None) -> None:
        self._jobs, self._own, self._async, self._sent = jobs, None, None, []
        self._charts: list[Chart] | None = None
        pool = _WORKERS if workers is None else None
        if pool is None:
            n = workers_for(len(jobs)) if workers is None else max(1, min(workers, len(jobs)))
            if n == 1 or not can_fork():
                self._charts = [_draw(job) for job in jobs]
                return
            from specgen.present import charts

            charts.prepare()  # import and look fonts up once, here, not in every worker
            pool = self._own = _fork_pool(n, _quiet_worker)
        sent = [k for k, job in enumerate(jobs) if _sendable(job)]
        if sent:
            try:
                self._async = pool.map_async(_draw, [jobs[k] for k in sent], chunksize=1)
                self._sent = sent
            except OSError:  # the helper is gone (killed, out of memory): all are drawn here
                pass

    def results(self) -> list[Chart]:
        if self._charts is not None:
            return self._charts
        out: list = [None] * len(self._jobs)
        try:
            sent = set(self._sent)
            for k, job in enumerate(self._jobs):  # what could not be sent is drawn here, meanwhile
                if k not in sent:
                    out[k] = _draw(job)
        finally:
            # Always take the workers' answer, even after an error here: left unread, it would
            # be taken for the answer to the next batch.
            drawn = self._collect()
        for k, chart in zip(self._sent, drawn):
            out[k] = chart
        return out

    def _collect(self) -> list[Chart]:
        try:
            if not self._sent:
                return []
            try:
                return self._async.get()
            except (EOFError, OSError):  # the helper went away mid-batch: draw its share here
                return [_draw(self._jobs[k]) for k in self._sent]
        finally:
            if self._own is not None:
                self._own.terminate()
                self._own.join()
