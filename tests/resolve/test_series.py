"""Drives in series from rest: the worked example of resolve/series.py by hand."""

import math

import pytest

from helpers import minimal


def test_docstring_example():
    # downstream needs 500 N*m from rest at eta_start 0.8: dp_start = 2*pi*500/(200e-6*0.8) = 196.35 bar;
    # limit 330 bar, return 0 bar: upstream breakaway 200e-6*(330 - 196.35)e5*0.8/(2*pi) = 340.34 N*m
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    d = minimal()
    d["supplies"]["main"].update({"circuit": "series", "relief_setting": "330 bar", "return_pressure": "0 bar"})
    motor = {"kind": "radial_piston", "displacement": "200 cm^3",
             "efficiency": {"volumetric": 0.95, "hydromechanical": 0.9, "starting": 0.8}}
    duty = {"torque": "300 N*m", "speed": "50 rpm", "starting_torque": "500 N*m"}
    d["drives"] = {"up": {"supply": "main", "motor": motor, "duty_points": {"run": duty}},
                   "down": {"supply": "main", "motor": motor, "duty_points": {"run": duty}}}
    d["modes"] = {"work": {"drives": {"up": "run", "down": "run"}}}
    sm = evaluate(Source("mem.yaml", d, b"")).results.supply_mode("main", "work")
    dp_start = 2 * math.pi * 500 / (200e-6 * 0.8)
    assert sm.drive_value("up", "start_outlet_pressure").value == pytest.approx(dp_start)
    assert sm.drive_value("up", "breakaway_torque").value == pytest.approx(340.34, abs=0.01)
    assert sm.drive_value("down", "start_outlet_pressure").value == 0.0
