"""Motor checks at their boundaries: displacement_choice, breakaway, load_holding.

Fixture helpers.minimal(): relief 250 bar, return 5 bar, a 100 cm^3 motor with eta_hm 0.9 and
eta_start 0.85, duty 286.5 N*m at 500 rpm. Relations (positive-displacement motor relations and
gear-stage power balance, fluid-power textbook):
  breakaway torque from rest  T_start = Vg * (p_relief - p_out) * eta_start / (2*pi)
    = 100e-6 * 245e5 * 0.85 / (2*pi) = 331.440 N*m  (with eta_hm 0.9 it would be 350.937 N*m)
  starting torque needed at the motor  T_need = T_L,start / (i * eta_g)
  smallest displacement at a target inlet pressure  Vg_min = 2*pi*T / ((p_target - p_out) * eta_hm)
Default breakaway warn margin 10 % (specgen/intake/defaults.py): warn when (T_start - T_need)/T_need < 10 %.
"""

import pytest

from helpers import minimal, spec_check, spec_checks

T_START = 331.4402  # N*m, hand calculation above


# ---------------------------------------------------------------- breakaway

def starting(torque: str, gear=None) -> dict:
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["starting_torque"] = torque
    if gear:
        d["drives"]["hoist"]["gear_stage"] = gear
        d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "5 kN*m"
        d["drives"]["hoist"]["duty_points"]["lift"]["speed"] = "25 rpm"
    return d


@pytest.mark.parametrize("need, status", [
    # margin = (331.440 - T_need)/T_need; in brackets the margin with eta_hm instead of eta_start (hand calc)
    (250.0, "pass"),   # 32.58 %   (40.37 %)
    (301.0, "pass"),   # 10.11 %   (16.59 %)
    (301.6, "warn"),   # 9.89 %    (16.36 %: would pass)
    (331.0, "warn"),   # 0.13 %    (6.02 %)
    (331.9, "fail"),   # -0.14 %   (5.74 %: would only warn): the load does not start
    (335.0, "fail"),   # -1.06 %   (4.76 %)
])
def test_breakaway_boundaries(need, status):
    c = spec_check(starting(f"{need} N*m"), "breakaway", drive="hoist", duty="lift")
    assert c.status == status
    assert c.value == pytest.approx(T_START, abs=1e-3)
    assert c.limit == pytest.approx(need)


@pytest.mark.parametrize("load_start, need, status", [
    # gear stage i = 20, eta_g = 0.95: T_need = T_L,start / (20 * 0.95) = T_L,start / 19 (gear-stage power balance)
    ("6.2 kN*m", 326.3158, "warn"),  # 6200/19 = 326.316 N*m: margin 1.57 % (eta_g multiplied: 294.5, would pass)
    ("6.3 kN*m", 331.5789, "fail"),  # 6300/19 = 331.579 N*m > 331.440: margin -0.04 %
])
def test_breakaway_refers_the_starting_torque_through_the_gear(load_start, need, status):
    c = spec_check(starting(load_start, gear={"ratio": 20, "efficiency": 0.95}), "breakaway", drive="hoist")
    assert c.status == status
    assert c.value == pytest.approx(T_START, abs=1e-3) and c.limit == pytest.approx(need, abs=1e-4)


def test_breakaway_subtracts_the_back_pressure():
    d = starting("300 N*m")
    d["drives"]["hoist"]["back_pressure"] = "30 bar"
    # T_start = 100e-6 * (250 - 30)e5 * 0.85 / (2*pi) = 1870/(2*pi) = 297.620 N*m < 300: fail
    # (with the relief setting alone, 100e-6*250e5*0.85/(2*pi) = 338.2 N*m, it would pass)
    c = spec_check(d, "breakaway", drive="hoist", duty="lift")
    assert c.status == "fail" and c.value == pytest.approx(297.6198, abs=1e-3)


def test_breakaway_reads_the_spec_threshold():
    d = starting("250 N*m")
    d["thresholds"] = {"breakaway_margin_warn": 0.4}
    assert spec_check(d, "breakaway", drive="hoist").status == "warn"  # 32.58 % < 40 %


def test_no_starting_torque_no_breakaway_check():
    assert spec_checks(minimal(), "breakaway") == []


# ---------------------------------------------------------------- displacement_choice

@pytest.mark.parametrize("target, need_cc, status", [
    # Vg_min = 2*pi*286.5 / ((p_target - 5 bar) * 0.9) (hand calculation); the motor has 100 cm^3
    ("250 bar", 81.6387, "pass"),    # 1800.13 / (245e5 * 0.9) = 81.639 cm^3
    ("205.1 bar", 99.9574, "pass"),  # 1800.13 / (200.1e5 * 0.9) = 99.957 cm^3 <= 100
    ("204.9 bar", 100.0574, "fail"),  # 1800.13 / (199.9e5 * 0.9) = 100.057 cm^3 > 100
])
def test_displacement_choice_given_displacement(target, need_cc, status):
    d = minimal()
    d["drives"]["hoist"]["motor"]["target_pressure"] = target
    c = spec_check(d, "displacement_choice", drive="hoist")
    assert c.status == status
    assert c.value == pytest.approx(100e-6) and c.limit * 1e6 == pytest.approx(need_cc, abs=1e-3)


def test_displacement_choice_proposes_a_size_when_none_is_given():
    d = minimal()
    del d["drives"]["hoist"]["motor"]["displacement"]
    d["drives"]["hoist"]["motor"]["target_pressure"] = "200 bar"
    # Vg_min = 1800.13 / (195e5 * 0.9) = 102.572 cm^3; next ISO 3 R10 size up: 125 cm^3
    c = spec_check(d, "displacement_choice", drive="hoist")
    assert c.status == "pass"
    assert c.value == pytest.approx(125e-6) and c.limit * 1e6 == pytest.approx(102.5717, abs=1e-3)


@pytest.mark.parametrize("flow, checks", [
    # n_reached = q * eta_v / Vg_min = q[cm^3/min] * 0.95 / 40
    # (motor speed relation, fluid-power textbook; hand calculation)
    ("50 L/min", 1),  # 50000 * 0.95 / 40 = 1187.5 rpm < 1200 rpm: cannot reach the duty speed
    ("51 L/min", 0),  # 51000 * 0.95 / 40 = 1211.25 rpm >= 1200 rpm: reaches it
])
def test_displacement_choice_variable_motor_reaches_the_speed(flow, checks):
    d = minimal()
    d["drives"]["hoist"]["motor"]["displacement"] = {"min": "40 cm^3", "max": "160 cm^3"}
    d["drives"]["hoist"]["duty_points"]["lift"] = {"torque": "100 N*m", "speed": "1200 rpm"}
    d["drives"]["hoist"]["available_flow"] = flow
    found = spec_checks(d, "displacement_choice", drive="hoist", duty="lift")
    assert len(found) == checks
    if found:
        c = found[0]
        assert c.status == "fail"
        assert c.value == pytest.approx(1187.5 / 60) and c.limit == pytest.approx(1200 / 60)


def test_no_target_no_displacement_choice():
    assert spec_checks(minimal(), "displacement_choice") == []


# ---------------------------------------------------------------- load_holding

@pytest.mark.parametrize("holding, status", [
    (None, "fail"),            # nothing declared: the load can run away
    ("none", "fail"),
    ("counterbalance_valve", "pass"),
    ("brake_valve", "pass"),
    ("spring_applied_brake", "pass"),
    ("counterbalance_valve_and_brake", "pass"),
])
def test_load_holding_on_an_overrunning_duty(holding, status):
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["direction"] = "overrunning"
    if holding:
        d["drives"]["hoist"]["load_holding"] = holding
    c = spec_check(d, "load_holding", drive="hoist", duty="lift")
    assert c.status == status and (c.value, c.limit) == (None, None)


def test_load_holding_only_for_overrunning_duties():
    d = minimal()
    d["drives"]["hoist"]["load_holding"] = "none"
    assert spec_checks(d, "load_holding") == []
