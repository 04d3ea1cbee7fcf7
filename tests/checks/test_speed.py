"""Speed checks at their pass / warn / fail boundaries: max_speed, min_speed, min_displacement_speed.

Fixture helpers.minimal(): no gear stage, so motor speed = duty speed (gear stage: n_motor =
n_load * i with i = 1); maximum speed rating 3000 rpm. Default speed warn margin 5 %
(specgen/intake/defaults.py): warn when (n_max - n)/n_max < 5 %, i.e. above 2850 rpm.
A variable motor's speed at its minimum displacement: n = q * eta_v / Vg_min (motor speed relation,
fluid-power textbook).
"""

import pytest

from helpers import minimal, spec_check, spec_checks


def at_speed(speed: str, **rating) -> dict:
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"] = {"torque": "10 N*m", "speed": speed}
    d["drives"]["hoist"]["motor"]["rating"].update(rating)
    return d


# ---------------------------------------------------------------- max_speed

@pytest.mark.parametrize("rpm, status", [
    # margin = (3000 - n)/3000 (hand calculation)
    (500, "pass"),    # 83.3 %
    (2847, "pass"),   # 153/3000 = 5.1 %
    (2853, "warn"),   # 147/3000 = 4.9 %
    (2997, "warn"),   # 0.1 %
    (3003, "fail"),   # -0.1 %: over-speed
])
def test_max_speed_boundaries(rpm, status):
    c = spec_check(at_speed(f"{rpm} rpm"), "max_speed", drive="hoist", duty="lift")
    assert c.status == status
    assert c.value == pytest.approx(rpm / 60) and c.limit == pytest.approx(3000 / 60)  # rev/s


def test_max_speed_with_gear_stage_checks_the_motor_side():
    d = at_speed("143 rpm")
    d["drives"]["hoist"]["gear_stage"] = {"ratio": 20, "efficiency": 0.95}
    # n_motor = n_load * i = 143 * 20 = 2860 rpm (gear stage); margin 140/3000 = 4.67 %: warn
    c = spec_check(d, "max_speed", drive="hoist", duty="lift")
    assert c.status == "warn" and c.value == pytest.approx(2860 / 60)


def test_max_speed_exactly_at_rating_fails():
    assert spec_check(at_speed("3000 rpm"), "max_speed", drive="hoist", duty="lift").status == "fail"


def test_max_speed_without_rating_warns():
    d = at_speed("500 rpm")
    del d["drives"]["hoist"]["motor"]["rating"]["max_speed"]
    c = spec_check(d, "max_speed", drive="hoist")
    assert (c.status, c.value, c.limit) == ("warn", None, None)


# ---------------------------------------------------------------- min_speed

@pytest.mark.parametrize("rpm, status", [
    (500, "pass"),
    (50.5, "pass"),   # above the 50 rpm smooth-running minimum
    (49.5, "warn"),   # below it: uneven rotation, a warning
    (5, "warn"),      # far below: still a warning, never a fail
])
def test_min_speed_boundaries(rpm, status):
    c = spec_check(at_speed(f"{rpm} rpm", min_speed="50 rpm"), "min_speed", drive="hoist", duty="lift")
    assert c.status == status
    assert c.value == pytest.approx(rpm / 60) and c.limit == pytest.approx(50 / 60)


def test_min_speed_absent_without_rating():
    assert spec_checks(at_speed("5 rpm"), "min_speed") == []


# ---------------------------------------------------------------- min_displacement_speed

def variable(available: str, rating=True) -> dict:
    d = minimal()
    m = d["drives"]["hoist"]["motor"]
    m["displacement"] = {"min": "38 cm^3", "max": "160 cm^3"}
    if not rating:
        del m["rating"]["max_speed"]
    d["drives"]["hoist"]["duty_points"]["lift"] = {"torque": "100 N*m", "speed": "1200 rpm"}
    d["drives"]["hoist"]["available_flow"] = available
    return d


@pytest.mark.parametrize("flow, rpm, status", [
    # n = q * eta_v / Vg_min = q[cm^3/min] * 0.95 / 38 = q/40
    # (motor speed relation, fluid-power textbook; hand calculation)
    ("80 L/min", 2000, "pass"),       # 80000/40 = 2000 rpm
    ("113.88 L/min", 2847, "pass"),   # 113880/40 = 2847 rpm: margin 5.1 %
    ("114.12 L/min", 2853, "warn"),   # 2853 rpm: margin 4.9 %
    ("119.88 L/min", 2997, "warn"),   # 2997 rpm: margin 0.1 %
    ("120.12 L/min", 3003, "fail"),   # 3003 rpm: over the 3000 rpm rating
])
def test_min_displacement_speed_boundaries(flow, rpm, status):
    c = spec_check(variable(flow), "min_displacement_speed", drive="hoist")
    assert c.status == status
    assert c.value == pytest.approx(rpm / 60) and c.limit == pytest.approx(3000 / 60)


def test_min_displacement_speed_without_rating_warns():
    c = spec_check(variable("80 L/min", rating=False), "min_displacement_speed", drive="hoist")
    assert (c.status, c.limit) == ("warn", None) and c.value == pytest.approx(2000 / 60)


def test_fixed_motor_has_no_min_displacement_speed():
    assert spec_checks(minimal(), "min_displacement_speed") == []
