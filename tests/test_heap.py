"""Full garbage collections wait while the pipeline runs (its one entry), and the setting comes back after it."""

from __future__ import annotations

import gc

import pytest
from helpers import EXAMPLE

from specgen import pipeline
from specgen.heap import FULL_SWEEP_AFTER, few_full_collections


def test_full_sweeps_wait_inside_and_the_setting_comes_back_even_after_an_error():
    before = gc.get_threshold()
    with pytest.raises(RuntimeError):
        with few_full_collections():
            inside = gc.get_threshold()
            raise RuntimeError
    assert inside == (before[0], before[1], max(before[2], FULL_SWEEP_AFTER))
    assert gc.get_threshold() == before


def test_the_pipeline_runs_with_full_sweeps_waiting_and_rendering_does_not(monkeypatch):
    seen = []
    real = pipeline.resolve
    monkeypatch.setattr(pipeline, "resolve", lambda machine: seen.append(gc.get_threshold()[2]) or real(machine))
    before = gc.get_threshold()
    outcome = pipeline.run_file(EXAMPLE)
    # once at the nominal point and once at each of the demo's operating corners, for the base design and
    # each of its design variants
    runs = (1 + len(outcome.results.corners)) * (1 + len(outcome.variants))
    assert seen == [max(before[2], FULL_SWEEP_AFTER)] * runs and gc.get_threshold() == before
    assert outcome.results.checks  # the real work was done under the setting


def test_only_the_pipeline_defers_full_sweeps_not_the_command_around_it(monkeypatch):
    from specgen import cli
    from specgen.present import text

    seen = []
    real = text.render
    monkeypatch.setattr(text, "render", lambda *a, **k: seen.append(gc.get_threshold()[2]) or real(*a, **k))
    before = gc.get_threshold()
    assert cli.main(["check", "-q", str(EXAMPLE)]) == 0
    assert seen == [before[2]] and gc.get_threshold() == before
