"""Closed-loop checks (specgen/checks/closed_loop.py) at their pass, warn and fail boundaries.

Rig: helpers.closed_loop(). Charge need = pump leakage 100*2000*(1 - 0.95) = 10 L/min + motor
leakage 100*902.5*(1 - 0.95) = 4.5125 L/min + flushing (primer section 15; hand calculation).
Stroke x = q / (Vp*n_p*eta_v) with a full-stroke delivery of 100*2000*0.95 = 190 L/min.
"""

import copy

import pytest

from helpers import closed_loop, spec_check, spec_checks
from specgen.checks.closed_loop import CHARGE_MARGIN_WARN


def _charge(flow: str) -> dict:
    data = closed_loop()
    loop = data["supplies"]["loop"]["closed_loop"]
    loop["charge"] = {"flow": flow, "pressure": "25 bar", "overall_efficiency": 0.8}
    loop["flushing_flow"] = "5.4875 L/min"  # need: 10 + 4.5125 + 5.4875 = 20 L/min
    return data


@pytest.mark.parametrize("flow, expected", [
    ("25.1 L/min", "pass"),  # (25.1 - 20) / 20 = 0.255, above the 25 % band
    ("24.9 L/min", "warn"),  # 0.245: inside the band (wear raises leakage; common practice, no source)
    ("20.1 L/min", "warn"),  # 0.005
    ("19.9 L/min", "fail"),  # -0.005: the low side cannot hold the charge pressure
])
def test_charge_flow_boundaries(flow, expected):
    c = spec_check(_charge(flow), "charge_flow", supply="loop", mode="driving")
    assert c.status == expected
    assert c.limit == pytest.approx(20 / 60000, rel=1e-9)
    assert c.margin == pytest.approx((float(flow.split()[0]) - 20) / 20, rel=1e-6)


def test_charge_flow_band_is_a_quarter():
    assert CHARGE_MARGIN_WARN == 0.25


def _speed(rpm: str, direction: str = "driving") -> dict:
    data = closed_loop()
    duty = data["drives"]["wheel"]["duty_points"]["drive" if direction == "driving" else "brake"]
    duty["speed"] = rpm
    duty["torque"] = "100 N*m"
    return data


@pytest.mark.parametrize("rpm, x, expected", [
    ("902.5 rpm", 0.5, "pass"),  # 95 L/min of 190
    ("1750.85 rpm", 0.97, "warn"),  # 100*1750.85/0.95 = 184.3 L/min; 1 - 0.97 = 0.03 under the 5 % band
    ("1895 rpm", 1.049861, "fail"),  # 100*1895/0.95 = 199.47 L/min; 199.47/190 = 1.049861: beyond full stroke
])
def test_pump_stroke_boundaries_driving(rpm, x, expected):
    c = spec_check(_speed(rpm), "pump_stroke", supply="loop", mode="driving")
    assert c.value == pytest.approx(x, rel=1e-4)
    assert c.status == expected
    assert c.margin == pytest.approx(1 - x, abs=1e-4)


def test_pump_stroke_fails_when_the_pump_cannot_take_the_overrunning_flow_back():
    # hand calculation: the motor pumps 100*2300*0.95 = 218.5 L/min; x = 218.5*0.95/200 = 1.0379
    c = spec_check(_speed("2300 rpm", "overrunning"), "pump_stroke", supply="loop", mode="braking")
    assert c.value == pytest.approx(1.0379, abs=1e-4)
    assert c.status == "fail" and "engine over its speed" in c.message


def test_open_circuit_pump_flow_check_leaves_a_closed_loop_to_pump_stroke():
    assert spec_checks(closed_loop(), "pump_flow") == []
    assert len(spec_checks(closed_loop(), "pump_stroke")) == 2


def _two_motors(second_direction: str) -> dict:
    data = closed_loop()
    data["drives"]["wheel_2"] = copy.deepcopy(data["drives"]["wheel"])
    data["modes"]["mixed"] = {"drives": {"wheel": "drive", "wheel_2": "drive" if second_direction == "driving"
                                         else "brake"}}
    return data


def test_motors_of_one_loop_in_both_directions_fail():
    c = spec_check(_two_motors("overrunning"), "loop_direction", supply="loop", mode="mixed")
    assert c.status == "fail" and "wheel_2" in c.message


def test_motors_of_one_loop_in_one_direction_give_no_direction_check():
    assert spec_checks(_two_motors("driving"), "loop_direction") == []


def test_a_driven_pump_on_its_own_prime_mover_warns_that_braking_cannot_be_judged():
    # The rig's overrunning duty point returns power through the pump (primer section 15: the pump motors
    # the prime mover). A supply's own prime_mover_power carries no motoring torque: never a silent pass.
    c = spec_check(closed_loop(), "engine_braking", supply="loop", mode="braking")
    assert c.status == "warn" and c.value > 0 and "cannot be judged" in c.message
    p = spec_check(closed_loop(), "prime_mover_power", supply="loop", mode="braking")
    assert p.value < 0 and "driven, not loaded" in p.message
    # driving, the pump takes power: no braking check in that mode
    assert spec_checks(closed_loop(), "engine_braking", mode="driving") == []
