"""The benchmark: its generated specs are valid and of the stated size, and it runs end to end.

No timing is asserted here: speed is read from `python -m specgen.bench`, not from tests.
"""

from __future__ import annotations

import pytest
import yaml
from helpers import EXAMPLE, example_data

from specgen import bench
from specgen.pipeline import run_file


ORDER = {"pass": 0, "warn": 1, "fail": 2}


def _worst(outcome) -> dict[str, int]:
    """The worst status of each check id, as 0 pass, 1 warn, 2 fail."""
    worst: dict[str, int] = {}
    for c in outcome.results.checks:
        worst[c.id] = max(worst.get(c.id, 0), ORDER[c.status])
    return worst


@pytest.mark.parametrize("drives, modes", [(1, 1), (13, 3), (100, 50), (1000, 50)])
def test_generated_spec_is_valid_of_the_stated_size_and_no_worse_than_the_demo(tmp_path, drives, modes):
    path = bench.write_spec(tmp_path / "big.yaml", bench.generate(example_data(), drives, modes))
    o = run_file(path)  # raises SpecError if the spec were invalid
    assert len(o.machine.drives) == drives and len(o.machine.modes) == modes
    assert len({d.id for d in o.machine.drives}) == drives
    assert 1 <= len(o.machine.supplies) <= 50 and all(m.running for m in o.machine.modes)
    # Several groups of drives share a supply copy in one mode; its pump and prime mover (and the
    # one cooler) are scaled to match, so no check ends worse than on the demo and the large spec
    # does the work a sound machine would, not a page of failures.
    big, demo = _worst(o), _worst(run_file(EXAMPLE))
    assert {k: v for k, v in big.items() if v > demo[k]} == {}
    if drives >= 100:
        assert set(big) == set(demo)  # every kind of check runs
        assert big["pressure_margin"] == demo["pressure_margin"]  # the drives are the demo's own


def test_scaled_keeps_the_unit():
    assert bench._scaled("71 cm^3", 3) == "213 cm^3" and bench._scaled("90 kW", 1) == "90 kW"


def _case(name: str, seconds: float, peak_mb: float = 50.0) -> bench.Case:
    return bench.Case(name, [], seconds=[seconds], cpu=[seconds], peak_kb=[int(peak_mb * 1024)])


def test_targets_are_ratios_of_medians_and_a_miss_is_seen():
    cases = {c.name: c for c in [
        _case(bench.BASE_CHECK, 0.20), _case("check demo", 0.32), _case("check 100 drives", 0.5),
        _case("check 1000 drives", 3.4, peak_mb=120), _case("check 50 specs", 0.9),
    ]}
    rows = {what: (value, bench.met(value, op, limit)) for what, value, op, limit in bench.targets(cases, (100, 1000), 50)}
    assert rows[f"check demo / {bench.BASE_CHECK}"] == (pytest.approx(1.6), False)  # 0.32 / 0.20 > 1.5
    assert rows["check 1000 drives / check demo"] == (pytest.approx(10.625), False)
    assert rows["check 1000 drives / check 100 drives"] == (pytest.approx(6.8), True)
    assert rows["check 50 specs / check demo"] == (pytest.approx(2.8125), True)
    assert rows["peak memory of check 1000 drives, MB"] == (pytest.approx(120.0), True)
    assert not any("report" in what for what in rows)  # no report cases ran: no report target


def test_bench_runs_end_to_end_on_a_tiny_case(capsys):
    code = bench.main(["--quick", "--repeats", "1", "--sizes", "2,4", "--modes", "2", "--copies", "2", "--no-report"])
    out = capsys.readouterr().out
    assert code in (0, 1)  # a missed target on a loaded machine is a result, not an error
    for line in ("check demo / import yaml, jsonschema, pint", "check 4 drives / check demo",
                 "check 4 drives / check 2 drives", "check 2 specs / check demo", "peak memory of check 4 drives",
                 "modules check loads for plotting or templates: none"):
        assert line in out
    assert ("all targets met" in out) == (code == 0)


def test_bench_exits_2_when_a_case_cannot_run(tmp_path, capsys):
    data = example_data()
    data["supplies"]["main"]["relief_setting"] = "280 barr"
    demo = tmp_path / "broken.yaml"
    demo.write_text(yaml.safe_dump(data, sort_keys=False), encoding="utf-8")
    code = bench.main(["--repeats", "1", "--sizes", "2,4", "--modes", "1", "--copies", "1", "--no-report",
                       "--demo", str(demo)])
    assert code == 2 and "exit 2" in capsys.readouterr().err


def test_demo_spec_is_found_without_a_checkout_path(tmp_path):
    demo = bench.demo_spec()
    assert demo.is_file() and demo.name == "reed_harvester.yaml"
    assert demo.read_bytes() == EXAMPLE.read_bytes()  # the wheel's copy is the example spec itself


def test_charts_option_adds_serial_report_cases(tmp_path):
    env = bench._env(tmp_path)
    cases, _ = bench.build_cases(tmp_path, EXAMPLE, (2, 4), 1, 1, env, with_report=True, charts=True)
    serial = [c for name, c in cases.items() if name.endswith(bench.SERIAL)]
    assert [c.name for c in serial] == ["report demo" + bench.SERIAL, "report 2 drives" + bench.SERIAL]
    assert all(c.argv[1] == "-c" and "can_fork = lambda: False" in c.argv[2] for c in serial)
    (tmp_path / "plain").mkdir()
    plain, _ = bench.build_cases(tmp_path / "plain", EXAMPLE, (2, 4), 1, 1, env, with_report=True)
    assert not any(name.endswith(bench.SERIAL) for name in plain)
