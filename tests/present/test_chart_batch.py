"""Charts drawn as one batch: in order, to the same bytes in worker processes as in this one."""

from __future__ import annotations

import pytest

from helpers import EXAMPLE
from specgen.fingerprint import Fingerprint
from specgen.pipeline import run_file
from specgen.present import chart_batch, charts, report
from specgen.present.charts import Limit, Line, MarginRow, Point

FIXED = Fingerprint("0" * 64)
forking = pytest.mark.skipif(not chart_batch.can_fork(), reason="needs fork and two CPUs to draw in workers")


def ask(batch: chart_batch.Batch, n: int) -> list:
    """n charts of three kinds, each with numbers of its own."""
    out = []
    for k in range(n):
        if k % 3 == 0:
            out.append(batch(charts.torque_vs_pressure, f"fig{k}", f"Drive {k}", x_unit="bar", y_unit="N*m",
                             lines=[Line("Vg 80.00 cm^3/rev", 1.2 + k)], points=[Point("lift", 100.0 + k, 120.0 + k)],
                             limits=[Limit("relief setting", "250.0 bar", 245.0, "relief")]))
        elif k % 3 == 1:
            out.append(batch(charts.power_by_mode, f"fig{k}", f"Supply {k}", unit="kW", modes=["a", "b"],
                             power=[10.0 + k, 20.0], available=30.0))
        else:
            out.append(batch(charts.margin_overview, f"fig{k}", f"Margins {k}",
                             [MarginRow("x: speed vs max rating", 0.01 * k, "pass", 0.05)]))
    return out


@forking
def test_workers_draw_the_same_bytes_in_the_same_order_as_this_process():
    serial, parallel = chart_batch.Batch(), chart_batch.Batch()
    a, b = ask(serial, 9), ask(parallel, 9)
    serial.draw(workers=1)
    parallel.draw(workers=2)
    assert [c.id for c in b] == [f"fig{k}" for k in range(9)]
    assert [(c.id, c.svg, c.alt) for c in a] == [(c.id, c.svg, c.alt) for c in b]
    assert all(f'id="fig{k}"' in c.svg for k, c in enumerate(b))  # each chart where it was asked for


@forking
def test_report_page_is_identical_with_started_workers_and_without():
    o = run_file(EXAMPLE)
    assert chart_batch.workers_for(10**6) > 1 and chart_batch.workers_for(chart_batch.FORK_FROM - 1) == 1
    try:
        assert report.start_drawing()
        with_workers = report.render(o, fp=FIXED)
    finally:
        chart_batch.stop_workers()
    real = chart_batch.FORK_FROM
    try:
        chart_batch.FORK_FROM = 10**6  # no workers at all: every chart drawn here
        serial = report.render(o, fp=FIXED)
    finally:
        chart_batch.FORK_FROM = real
    assert with_workers == serial and serial.count("<svg") == 10  # as test_charts counts them


@forking
def test_a_chart_that_cannot_go_to_a_worker_is_drawn_here_and_its_error_reaches_the_caller():
    drawn_here = []

    def local(fig_id, title):  # a nested function cannot be sent to another process
        drawn_here.append(fig_id)
        raise RuntimeError(f"{title} failed")

    batch = chart_batch.Batch()
    ask(batch, 8)
    batch(local, "fig8", "the local chart")
    with pytest.raises(RuntimeError, match="the local chart failed"):
        batch.draw(workers=2)
    assert drawn_here == ["fig8"]


def _broken_chart(fig_id, title):
    raise RuntimeError(f"{title} drawn wrong")


@forking
def test_started_workers_pass_a_chart_error_back_and_then_draw_the_next_batch():
    try:
        assert chart_batch.start_workers()
        batch = chart_batch.Batch()
        ask(batch, 8)
        batch(_broken_chart, "fig8", "the ninth chart")
        with pytest.raises(RuntimeError, match="the ninth chart drawn wrong"):
            batch.draw()
        again, alone = chart_batch.Batch(), chart_batch.Batch()
        drawn, expected = ask(again, 3), ask(alone, 3)
        again.draw()
        alone.draw(workers=1)
        assert [c.svg for c in drawn] == [c.svg for c in expected]  # its own answer, not the one before
    finally:
        chart_batch.stop_workers()


@forking
def test_charts_are_drawn_here_when_the_started_workers_are_gone():
    try:
        assert chart_batch.start_workers()
        chart_batch._WORKERS._process.kill()
        chart_batch._WORKERS._process.join()
        batch, alone = chart_batch.Batch(), chart_batch.Batch()
        drawn, expected = ask(batch, 9), ask(alone, 9)
        batch.draw()
        alone.draw(workers=1)
        assert [c.svg for c in drawn] == [c.svg for c in expected]
    finally:
        chart_batch.stop_workers()


def test_a_chart_asked_for_and_not_drawn_says_so():
    batch = chart_batch.Batch()
    pending = ask(batch, 1)[0]
    assert pending.id == "fig0"
    with pytest.raises(RuntimeError, match="fig0 was asked for but the batch was not drawn"):
        pending.svg
