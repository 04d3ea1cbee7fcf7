"""Supply checks at their pass / warn / fail boundaries: pump_flow, prime_mover_power, makeup_flow.

Fixture helpers.minimal(): pump 40 cm^3 at 1500 rpm, eta_v 0.95, eta_t 0.85; delivery
q_p = Vp * n * eta_v = 40 * 1500 * 0.95 = 57.0 L/min (pump relation, fluid-power textbook). Motor 100 cm^3, eta_v 0.95,
eta_hm 0.9: flow demand q = Vg * n / eta_v (motor relation, fluid-power textbook). Default warn margins
(specgen/intake/defaults.py): flow 5 %, power 10 %.
"""

import pytest

from helpers import minimal, spec_check, spec_checks


def spec_results(data: dict):
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", data, b"")).results

L_MIN = 1e-3 / 60  # m^3/s


def at_speed(rpm: float) -> dict:
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["speed"] = f"{rpm} rpm"
    return d


# ---------------------------------------------------------------- pump_flow

@pytest.mark.parametrize("rpm, demand, status", [
    # q = 100 cm^3 * n / 0.95; margin = (57 - q)/57 (hand calculation)
    (500, 52.6316, "pass"),    # 52.632 L/min: 7.66 %
    (513.9, 54.0947, "pass"),  # 54.095 L/min: 2.905/57 = 5.10 %
    (514.5, 54.1579, "warn"),  # 54.158 L/min: 2.842/57 = 4.99 %
    (541.0, 56.9474, "warn"),  # 56.947 L/min: 0.09 %
    (541.6, 57.0105, "fail"),  # 57.011 L/min: -0.02 %, the drives run slow
])
def test_pump_flow_boundaries(rpm, demand, status):
    c = spec_check(at_speed(rpm), "pump_flow", supply="main", mode="work")
    assert c.status == status
    assert c.value / L_MIN == pytest.approx(demand, abs=1e-4)
    assert c.limit / L_MIN == pytest.approx(57.0)  # 40 * 1500 * 0.95 / 1000


def test_pump_flow_adds_parallel_drives():
    d = minimal()
    d["drives"]["fan"] = {"supply": "main", "motor": {
        "kind": "external_gear", "displacement": "10 cm^3", "efficiency": {"volumetric": 0.9, "hydromechanical": 0.85},
        "rating": {"max_speed": "4000 rpm", "continuous_pressure": "200 bar", "peak_pressure": "250 bar"}},
        "duty_points": {"run": {"torque": "10 N*m", "speed": "500 rpm"}}}
    d["modes"]["work"]["drives"]["fan"] = "run"
    # 52.632 + 10*500/0.9/1000 = 52.632 + 5.556 = 58.187 L/min > 57: fail (either drive alone passes)
    c = spec_check(d, "pump_flow", supply="main", mode="work")
    assert c.status == "fail" and c.value / L_MIN == pytest.approx(58.1871, abs=1e-4)


# ---------------------------------------------------------------- prime_mover_power

@pytest.mark.parametrize("power, status", [
    # P_in = q_p * p_s / eta_t, p_s = 2*pi*286.5/(100e-6*0.9) + 5 bar = 205.015 bar
    # (motor and pump relations, fluid-power textbook):
    # 57 * 205.015 / 600 / 0.85 = 22.9134 kW; margin = (P_pm - 22.9134)/P_pm (hand calculation)
    ("30 kW", "pass"),      # 23.62 %
    ("25.49 kW", "pass"),   # 2.5766/25.49 = 10.11 %
    ("25.43 kW", "warn"),   # 2.5166/25.43 = 9.90 %
    ("22.93 kW", "warn"),   # 0.07 %
    ("22.90 kW", "fail"),   # -0.06 %: the engine stalls
])
def test_prime_mover_power_boundaries(power, status):
    d = minimal()
    d["supplies"]["main"]["prime_mover_power"] = power
    c = spec_check(d, "prime_mover_power", supply="main", mode="work")
    assert c.status == status
    assert c.value == pytest.approx(22913.4, abs=0.1)
    assert c.limit == pytest.approx(float(power.split()[0]) * 1e3)


def test_prime_mover_power_absent_without_a_rating():
    d = minimal()
    del d["supplies"]["main"]["prime_mover_power"]
    assert spec_checks(d, "prime_mover_power") == []


# ---------------------------------------------------------------- makeup_flow

def lowering(rpm: float, load_holding: str) -> dict:
    """hoist lowers (overrunning) at ``rpm`` while a 20 cm^3 fan runs at 1000 rpm on the same pump."""
    d = minimal()
    d["drives"]["hoist"]["load_holding"] = load_holding
    d["drives"]["hoist"]["duty_points"]["lift"].update({"direction": "overrunning", "speed": f"{rpm} rpm"})
    d["drives"]["fan"] = {"supply": "main", "motor": {
        "kind": "external_gear", "displacement": "20 cm^3", "efficiency": {"volumetric": 0.9, "hydromechanical": 0.85},
        "rating": {"continuous_pressure": "200 bar", "peak_pressure": "250 bar", "max_speed": "4000 rpm"}},
        "duty_points": {"run": {"torque": "20 N*m", "speed": "1000 rpm"}}}
    d["modes"]["work"]["drives"]["fan"] = "run"
    return d


@pytest.mark.parametrize("rpm, holding, need, status", [
    # Lowered through a counterbalance valve the pump fills the inlet: left for the lowering motor
    # 57 - 20*1000/0.9/1000 = 57 - 22.222 = 34.778 L/min (continuity); it needs q = 100 * n / 0.95;
    # margin = (34.778 - q)/q (hand calculation). A counterbalance valve caps the verdict at warn:
    # short of flow it throttles the load down.
    (300, "counterbalance_valve", 31.5789, "pass"),              # 10.13 %
    (314.3, "counterbalance_valve", 33.0842, "pass"),            # 1.6936/33.0842 = 5.12 %
    (315, "counterbalance_valve_and_brake", 33.1579, "warn"),    # 1.6199/33.1579 = 4.89 %
    (331, "counterbalance_valve", 34.8421, "warn"),              # -0.18 %, capped at warn
])
def test_makeup_flow_boundaries_pump_fed(rpm, holding, need, status):
    c = spec_check(lowering(rpm, holding), "makeup_flow", drive="hoist", supply="main", mode="work")
    assert c.status == status
    assert c.value / L_MIN == pytest.approx(34.7778, abs=1e-4)
    assert c.limit / L_MIN == pytest.approx(need, abs=1e-4)


@pytest.mark.parametrize("rpm, holding, need, status", [
    # Without a counterbalance valve the inlet fills through makeup valves from the return line
    # (the pump is not charged for it; changed deliberately from the pump-fed reading): what reaches
    # tank is the fan's return 22.222 L/min plus the fixed pump's surplus 57 - 22.222 = 34.778 L/min,
    # 57.000 L/min in all (continuity, hand calculation); need q = 100 * n / 0.95 L/min.
    (500, "none", 52.6316, "pass"),               # (57 - 52.6316)/52.6316 = 8.30 %
    (530, "brake_valve", 55.7895, "warn"),        # 2.17 %: capped at warn, the brake valve meters
    (530, "none", 55.7895, "warn"),               # 2.17 % < 5 %
    (545, "none", 57.3684, "fail"),               # -0.64 %: cavitates, the load can run away
    (545, "spring_applied_brake", 57.3684, "fail"),  # a brake does not meter the lowering
])
def test_makeup_flow_boundaries_through_makeup_valves(rpm, holding, need, status):
    found = [c for c in spec_checks(lowering(rpm, holding), "makeup_flow", drive="hoist", supply="main",
                                    mode="work") if c.kind == "flow"]
    assert len(found) == 1
    c = found[0]
    assert c.status == status
    assert c.value / L_MIN == pytest.approx(57.0, abs=1e-4)
    assert c.limit / L_MIN == pytest.approx(need, abs=1e-4)


@pytest.mark.parametrize("p_return, status", [
    ("1.2 bar", "pass"),   # (1.2 - 1)/1 = 20 %
    ("1 bar", "warn"),     # at the 1 bar of common practice (no source): the makeup valves may not fill the inlet
    ("0.3 bar", "warn"),   # a warning at worst: the flow check judges the cavitation itself
])
def test_makeup_return_pressure(p_return, status):
    d = lowering(300, "none")
    d["supplies"]["main"]["return_pressure"] = p_return
    found = [c for c in spec_checks(d, "makeup_flow", drive="hoist", mode="work") if c.kind == "pressure"]
    assert [c.status for c in found] == [status]


def test_braking_drive_draws_no_pump_power():
    # a slew stop braked by crossover reliefs, alone in its mode, on a compensated pump: the pump
    # delivers nothing for it (before: charged its flow at the compensator setting)
    d = minimal()
    d["supplies"]["main"]["pump"].update({"control": "pressure_compensated", "compensator_setting": "240 bar"})
    d["drives"]["hoist"]["duty_points"]["lift"].update({"direction": "overrunning"})
    d["drives"]["hoist"]["port_relief"] = "200 bar"
    r = spec_results(d)
    sm = r.supply_mode("main", "work")
    assert sm["flow_demand"] == 0.0
    assert sm["pump_input_power"] == pytest.approx(0.0, abs=1e-9)
    # before, its 52.63 L/min were charged at 240 bar: 52.63/60e3 * 240e5 / 0.85 = 24.77 kW > 5 kW, a false fail
    d["supplies"]["main"]["prime_mover_power"] = "5 kW"
    assert spec_check(d, "prime_mover_power", supply="main", mode="work").status == "pass"


def test_makeup_flow_only_for_overrunning_drives():
    assert spec_checks(minimal(), "makeup_flow") == []
