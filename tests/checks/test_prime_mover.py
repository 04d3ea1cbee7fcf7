"""Shared prime mover checks at their pass / warn / fail boundaries: prime_mover_load, engine_braking,
prime_mover_overspeed.

Fixture tests/engine_spec.py: at rated speed the two pumps take 38 + 30 = 68 kW (hand calculation there).
Default warning band for power (specgen/intake/defaults.py): 10 %, used by prime_mover_load and
engine_braking; the overspeed limit is a rating (pass/fail, no band).
"""

import math

import pytest

from engine_spec import shared_engine
from helpers import spec_check, spec_checks
from specgen.checks.prime_mover import engine_braking, prime_mover_load, prime_mover_overspeed
from specgen.intake.read import Source
from specgen.pipeline import evaluate
from specgen.resolve.prime_mover import resolve_prime_movers
from specgen.results import Results, SupplyModeResult
from specgen.trace import given
from specgen.units import format_si

RPM = 1 / 60


def fmt(value, kind):
    return format_si(value, kind, "SI")


def rated_power(kw: float) -> dict:
    d = shared_engine()
    d["prime_movers"]["diesel"]["power"] = f"{kw} kW"
    d["prime_movers"]["diesel"]["power_curve"][1]["power"] = f"{kw} kW"
    return d


# ---------------------------------------------------------------- prime_mover_load

@pytest.mark.parametrize("kw, status, margin", [
    # margin = (P - 68) / P (hand calculation); the band edge lies at 68 / 0.9 = 75.556 kW
    (80.0, "pass", 0.15),
    (75.6, "pass", 0.100529),
    (75.5, "warn", 0.099338),
    (75.0, "warn", 0.093333),  # the worked example: 9.3 %
    (68.1, "warn", 0.001468),
    (68.0, "fail", 0.0),       # exactly used up: at the limit fails
    (60.0, "fail", -0.133333),
])
def test_prime_mover_load_boundaries(kw, status, margin):
    c = spec_check(rated_power(kw), "prime_mover_load", prime_mover="diesel", mode="dig")
    assert c.status == status
    assert c.margin == pytest.approx(margin, abs=1e-6)
    assert c.value == pytest.approx(68e3) and c.limit == pytest.approx(kw * 1e3)
    assert "front 38.00 kW, rear 30.00 kW" in c.message


def test_prime_mover_load_reads_the_mode_speed_on_the_curve():
    # idle: 30.909 kW against 40 kW on the curve: (40 - 30.909) / 40 = 22.7 %, pass (hand calculation);
    # lowering the idle point to 33 kW: (33 - 30.909) / 33 = 6.3 %, warn
    c = spec_check(shared_engine(), "prime_mover_load", prime_mover="diesel", mode="travel_idle")
    assert c.status == "pass" and c.margin == pytest.approx(0.22727, abs=1e-5)
    d = shared_engine()
    d["prime_movers"]["diesel"]["power_curve"][0]["power"] = "33 kW"
    c = spec_check(d, "prime_mover_load", prime_mover="diesel", mode="travel_idle")
    assert c.status == "warn" and c.margin == pytest.approx((33 - 30.90909) / 33, abs=1e-5)


def test_specs_without_shared_prime_movers_have_none_of_these_checks():
    from helpers import minimal
    for check_id in ("prime_mover_load", "engine_braking", "prime_mover_overspeed"):
        assert spec_checks(minimal(), check_id) == []


# ---------------------------------------------------------------- hand-built loads (pumps driving the engine)

def _fake(supply: str, power: float, n_p: float) -> SupplyModeResult:
    t = power / (2 * math.pi * n_p)
    return SupplyModeResult(supply, "dig", (), {
        "pump_shaft_speed": given("pump_shaft_speed", "Pump shaft speed", "n_p", n_p, "speed"),
        "pump_input_power": given("pump_input_power", "Pump input power", "P_in", power, "power"),
        "pump_input_torque": given("pump_input_torque", "Pump input torque", "T_p", t, "torque")})


def returning(torque: float, motoring: str | None = None, max_speed: str | None = None):
    """The machine and results of one engine at 2200 rpm whose pump ``front`` (ratio 1.0) returns
    ``torque`` N*m: its input power is -torque * 2*pi*36.667 rev/s."""
    d = shared_engine()
    pm = d["prime_movers"]["diesel"]
    if motoring:
        pm["motoring_torque"] = motoring
    if max_speed:
        pm["max_speed"] = max_speed
    m = evaluate(Source("mem.yaml", d, b"")).machine
    n = 2200 * RPM
    x = resolve_prime_movers(m, (_fake("front", -torque * 2 * math.pi * n, n),))
    return m, Results(duties=(), supply_modes=(), prime_movers=x)


# ---------------------------------------------------------------- engine_braking

@pytest.mark.parametrize("returned, status, margin", [
    # margin = (200 - T_ret) / 200 (hand calculation); band 10 %: the edge at 180 N*m
    (150.0, "pass", 0.25),
    (179.0, "pass", 0.105),
    (181.0, "warn", 0.095),
    (199.0, "warn", 0.005),
    (200.0, "fail", 0.0),
    (240.0, "fail", -0.2),
])
def test_engine_braking_boundaries(returned, status, margin):
    m, r = returning(returned, motoring="200 N*m")
    (c,) = engine_braking(m, r, fmt)
    assert c.status == status and c.margin == pytest.approx(margin, abs=1e-9)
    assert c.value == pytest.approx(returned) and c.limit == pytest.approx(200.0)
    assert (c.prime_mover, c.mode) == ("diesel", "dig")


def test_engine_braking_without_a_motoring_torque_warns_it_cannot_be_judged():
    m, r = returning(50.0)
    (c,) = engine_braking(m, r, fmt)
    assert c.status == "warn" and c.margin is None and c.limit is None
    assert "cannot be judged" in c.message


def test_no_braking_check_while_the_pumps_load_the_engine():
    o = evaluate(Source("mem.yaml", shared_engine(), b""))
    assert list(engine_braking(o.machine, o.results, fmt)) == []


def test_prime_mover_load_passes_when_the_pumps_return_power_and_says_so():
    m, r = returning(150.0, motoring="200 N*m")
    (c,) = prime_mover_load(m, r, fmt)
    assert c.status == "pass" and "return" in c.message and "engine_braking" in c.message


# ---------------------------------------------------------------- prime_mover_overspeed

@pytest.mark.parametrize("limit_rpm, status", [
    # margin = (n_max - n) / n_max with n = 2200 rpm at rated (hand calculation); a rating: no band
    (2400, "pass"),   # 8.3 %
    (2201, "pass"),   # 0.045 %
    (2200, "fail"),   # at the limit
    (2100, "fail"),   # -4.8 %
])
def test_overspeed_boundaries(limit_rpm, status):
    d = shared_engine()
    d["prime_movers"]["diesel"]["max_speed"] = f"{limit_rpm} rpm"
    c = spec_check(d, "prime_mover_overspeed", prime_mover="diesel", mode="dig")
    assert c.status == status
    assert c.margin == pytest.approx((limit_rpm - 2200) / limit_rpm, abs=1e-9)


def test_overspeed_fails_when_the_returned_torque_exceeds_the_motoring_torque():
    # 240 N*m returned against 200 N*m: the engine cannot hold its speed, margin (200 - 240) / 200 = -20 %
    m, r = returning(240.0, motoring="200 N*m", max_speed="2600 rpm")
    (c,) = prime_mover_overspeed(m, r, fmt)
    assert c.status == "fail" and c.margin == pytest.approx(-0.2)
    assert "cannot hold its speed" in c.message and c.kind == "torque"


def test_overspeed_judges_the_speed_when_the_engine_holds_the_returned_torque():
    m, r = returning(150.0, motoring="200 N*m", max_speed="2600 rpm")
    (c,) = prime_mover_overspeed(m, r, fmt)
    assert c.status == "pass" and c.kind == "speed" and "holds it" in c.message
    assert c.margin == pytest.approx((2600 - 2200) / 2600)


def test_overspeed_warns_when_returned_torque_meets_no_motoring_torque():
    m, r = returning(50.0, max_speed="2600 rpm")
    (c,) = prime_mover_overspeed(m, r, fmt)
    assert c.status == "warn" and c.margin is None and "cannot be judged" in c.message


def test_no_overspeed_check_without_a_limit_or_returned_torque():
    assert spec_checks(shared_engine(), "prime_mover_overspeed") == []


def test_an_electric_motor_is_named_as_such():
    d = rated_power(60.0)  # 68 kW of 60 kW: fail
    d["prime_movers"]["diesel"]["kind"] = "electric_motor"
    c = spec_check(d, "prime_mover_load", prime_mover="diesel", mode="dig")
    assert c.status == "fail" and "the electric motor will stall or trip" in c.message
