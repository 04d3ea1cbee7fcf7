"""Building a load-sensing supply: its keys become SI values, and every contradiction is one located
error (exit status 2, no traceback)."""

import pytest

from helpers import minimal, run_cli, write_spec
from resolve.test_load_sensing import rig


def model(data):
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", data, b"")).machine


def test_load_sensing_keys_become_si():
    d = rig(standby_pressure="25 bar", input_power_limit="40 kW")
    d["supplies"]["main"]["flow_divider"] = {"drives": ["hoist", "slew"], "ratio": "60 %", "pressure_drop": "10 bar"}
    s = model(d).supply("main")
    assert s.load_sensing and s.strokes_back and not s.compensated
    assert s.pump.ls_margin == pytest.approx(20e5) and s.pump.standby_pressure.value == pytest.approx(25e5)
    assert s.pump.input_power_limit == pytest.approx(40e3)
    assert s.ls_valves == "post_compensated"
    assert s.flow_divider.drives == ("hoist", "slew") and s.flow_divider.ratio == pytest.approx(0.6)
    assert s.flow_divider.pressure_drop == pytest.approx(10e5)


def test_standby_defaults_to_the_margin_marked_assumed():
    s = model(rig()).supply("main")
    assert s.pump.standby_pressure.value == pytest.approx(20e5) and s.pump.standby_pressure.assumed


def _error(tmp_path, data) -> str:
    path = write_spec(tmp_path, data)
    code, out, err = run_cli("check", path)
    assert code == 2 and "Traceback" not in err, err
    return err


@pytest.mark.parametrize("edit, message", [
    (lambda s: s["pump"].pop("ls_margin"), "needs ls_margin"),
    (lambda s: s.pop("ls_valves"), "needs ls_valves"),
    (lambda s: s.update(circuit="series"), "remove circuit: series"),
    (lambda s: s.update(surplus_to="relief"), "delivers no surplus flow"),
    (lambda s: s["pump"].update(ls_margin="260 bar"), "ls_margin must be below the relief setting"),
    (lambda s: s["pump"].update(standby_pressure="300 bar"), "standby_pressure must be below the relief"),
    (lambda s: s["pump"].update(input_power_limit="40 kW", input_torque_limit="200 N*m"), "not both"),
    (lambda s: s["pump"].update(input_torque_limit="200 N*m"), "needs the pump's shaft speed"),
    (lambda s: s.update(priority=["boom"]), "'boom' is not a drive on supply 'main'"),
    (lambda s: s.update(priority=["slew", "slew"]), "listed twice"),
    (lambda s: s.update(flow_divider={"drives": ["hoist", "hoist"], "ratio": 0.5, "pressure_drop": "5 bar"}),
     "two different drives"),
    (lambda s: s.update(flow_divider={"drives": ["hoist", "slew"], "ratio": 1.2, "pressure_drop": "5 bar"}),
     "between 0 and 1"),
    (lambda s: s.update(priority=["slew"], flow_divider={"drives": ["hoist", "slew"], "ratio": 0.5,
                                                         "pressure_drop": "5 bar"}), "cannot also be a priority"),
])
def test_load_sensing_contradictions(tmp_path, edit, message):
    d = rig()
    edit(d["supplies"]["main"])
    assert message in _error(tmp_path, d)


def test_flow_divider_needs_its_pressure_drop(tmp_path):
    d = rig()
    d["supplies"]["main"]["flow_divider"] = {"drives": ["hoist", "slew"], "ratio": 0.5}
    assert "pressure_drop" in _error(tmp_path, d)


@pytest.mark.parametrize("key, value", [("ls_margin", "20 bar"), ("standby_pressure", "20 bar"),
                                        ("input_power_limit", "30 kW")])
def test_load_sensing_keys_refused_on_other_pumps(tmp_path, key, value):
    d = minimal()
    d["supplies"]["main"]["pump"][key] = value
    assert f"{key} applies only with control: load_sensing" in _error(tmp_path, d)


def test_ls_valves_refused_on_a_fixed_pump(tmp_path):
    d = minimal()
    d["supplies"]["main"]["ls_valves"] = "post_compensated"
    assert "ls_valves applies only to a pump with control: load_sensing" in _error(tmp_path, d)


def test_missing_margin_is_reported_at_the_control_line(tmp_path):
    d = rig()
    del d["supplies"]["main"]["pump"]["ls_margin"]
    path = write_spec(tmp_path, d)
    code, out, err = run_cli("check", path)
    line = next(n for n, t in enumerate(path.read_text().splitlines(), 1) if t.strip().startswith("control:"))
    assert code == 2 and f":{line}:" in err and "supplies.main.pump.control" in err
