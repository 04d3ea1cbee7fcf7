"""Each duty cycle over the computed modes: heat and power averaged over the cycle, time above the
continuous pressure rating, and the oil temperature from ambient over repeated cycles.

Pure: reads the model and the modes' results already computed (ModeResult, SupplyModeResult,
DutyResult); the relations are in calc/thermal.py.
"""

from __future__ import annotations

from specgen.calc import thermal
from specgen.intake.model import DutyCycle, Machine
from specgen.resolve.record import Record
from specgen.results import CycleResult, DutyResult, ModeResult, SupplyModeResult
from specgen.trace import Input, Value, indexed

SRC_MEAN = "time average over the cycle"
SRC_COOLER = "cooler capacity scaled linearly with the entering temperature difference (common practice, no source)"
SRC_NATURAL = "natural convection from the reservoir wall, h*A (h from memory)"
SRC_CAPACITY = "lumped heat capacity, c_oil 1.9 kJ/(kg*K) and c_steel 0.47 kJ/(kg*K) (from memory)"
SRC_BALANCE = "first-order lumped heat balance C*dT/dt = P - k*(T - T_amb), exact per step (textbook heat transfer)"
NO_ETD = ("the cooler's capacity is given without the entering temperature difference it is rated at, so the "
          "oil temperature cannot be computed; give cooler.entering_temperature_difference")
NO_AMBIENT = "the oil temperature needs the ambient_temperature"
NO_COOLING = "the oil temperature needs a cooler with its entering temperature difference, or a reservoir"


def _working_pressure(r: DutyResult) -> float:
    """The pressure the continuous rating is judged against (as the continuous_pressure check does)."""
    return r["braking_pressure"] if r.direction == "overrunning" else r["inlet_pressure"]


def _steps(cycle: DutyCycle) -> list[tuple[str | None, float]]:
    """(mode id, duration) of every step, and the idle rest of the period as (None, time)."""
    steps = [(s.mode, s.duration) for s in cycle.steps]
    rest = cycle.period - sum(t for _, t in steps)
    if rest > 1e-9 * cycle.period:
        steps.append((None, rest))
    return steps


def cycle_values(machine: Machine, cycle: DutyCycle, modes: dict[str, ModeResult],
                 supply_modes: dict[tuple[str, str], SupplyModeResult], duties: dict) -> CycleResult:
    rec = Record()
    steps = _steps(cycle)
    heat = [(modes[m]["heat_load"] if m in modes else 0.0, t) for m, t in steps]
    step_inputs = tuple(Input(indexed("Q", m or "idle"), f"heat in {m or 'idle time'} for {t:g} s", q, "power")
                        for (m, t), (q, _) in zip(steps, heat))
    p_mean = rec.put(Value("mean_heat_load", "Mean heat load over the cycle", "Q_mean", thermal.mean_heat(heat),
                           "power", "Q_mean = sum(Q_i * t_i) / sum(t_i)", "heat of each step weighted by its time",
                           step_inputs, SRC_MEAN, note=f"period {cycle.period:g} s"))
    rec.put(Value("peak_heat_load", "Peak heat load in the cycle", "Q_peak", max(q for q, _ in heat), "power",
                  "Q_peak = max(Q_i)", "the step putting the most heat into the oil", step_inputs, SRC_MEAN))
    per_supply = {}
    for sup in machine.supplies:
        power = [(supply_modes[(sup.id, m)]["pump_input_power"] if (sup.id, m) in supply_modes else 0.0, t)
                 for m, t in steps]
        if any(p for p, _ in power):
            per_supply[sup.id] = thermal.mean_heat(power)
    above = {}
    for drive in machine.drives:
        limit = drive.motor.rating.continuous_pressure
        if limit is None:
            continue
        flags = []
        runs = False
        for m, t in steps:
            duty = dict(machine_mode(machine, m).running).get(drive.id) if m else None
            runs = runs or duty is not None
            flags.append((duty is not None and _working_pressure(duties[(drive.id, duty)]) > limit, t))
        if runs:
            above[drive.id] = thermal.share_above(flags)
    series, settled, missing = (), True, ""
    temperature = _oil_temperature(machine, rec, heat, p_mean)
    if isinstance(temperature, str):
        missing = temperature
    else:
        series, settled = temperature
    return CycleResult(cycle.id, rec.values, per_supply, above, series, settled, missing)


def machine_mode(machine: Machine, mode_id: str):
    return next(m for m in machine.modes if m.id == mode_id)


def _oil_temperature(machine: Machine, rec: Record, heat: list[tuple[float, float]], p_mean: float):
    """Steady and peak oil temperature; a sentence saying what is missing when it cannot be computed."""
    cooler, res = machine.cooler, machine.reservoir
    if machine.ambient_temperature is None:
        return NO_AMBIENT
    if cooler is not None and cooler.entering_temperature_difference is None:
        return NO_ETD
    if cooler is None and res is None:
        return NO_COOLING
    amb = machine.ambient_temperature
    amb_in = Input("T_amb", "ambient temperature", amb, "temperature")
    k_terms, k_inputs = [], []
    if cooler is not None:
        k_c = rec.put(Value("cooler_coefficient", "Cooler rejection per kelvin", "k_c",
                            thermal.cooler_coefficient(cooler.capacity, cooler.entering_temperature_difference),
                            "thermal_conductance", "k_c = P_rated / ETD_rated",
                            "rated capacity over the entering temperature difference it is rated at",
                            (Input("P_rated", "cooler capacity", cooler.capacity, "power"),
                             Input("ETD_rated", "rated entering temperature difference",
                                   cooler.entering_temperature_difference, "temperature_difference")), SRC_COOLER))
        k_terms.append(k_c)
        k_inputs.append(Input("k_c", "cooler rejection per kelvin", k_c, "thermal_conductance"))
    if res is not None:
        h = res.heat_transfer_coefficient
        k_n = rec.put(Value("natural_coefficient", "Natural dissipation per kelvin", "k_n",
                            thermal.natural_coefficient(res.surface_area, h.value), "thermal_conductance",
                            "k_n = h * A",
                            "still-air heat transfer over the reservoir's surface",
                            (Input("h", "heat transfer coefficient", h.value, "heat_transfer_coefficient", h.assumed,
                                   ("reservoir", "heat_transfer_coefficient") if h.assumed else (), h.basis),
                             Input("A", "surface area", res.surface_area, "area")), SRC_NATURAL))
        k_terms.append(k_n)
        k_inputs.append(Input("k_n", "natural dissipation per kelvin", k_n, "thermal_conductance"))
    k = sum(k_terms)
    if k <= 0:
        return NO_COOLING
    rec.put(Value("steady_temperature", "Steady oil temperature", "T_ss", thermal.steady_temperature(amb, p_mean, k),
                  "temperature", "T_ss = T_amb + Q_mean / (k_c + k_n)",
                  "ambient plus the mean heat over the dissipation per kelvin",
                  (amb_in, Input("Q_mean", "mean heat load", p_mean, "power"), *k_inputs), SRC_BALANCE))
    if res is None:
        # Without a heat capacity the oil follows each step at once: the hottest step's equilibrium.
        q_peak = max(q for q, _ in heat)
        rec.put(Value("peak_temperature", "Peak oil temperature", "T_peak", thermal.steady_temperature(amb, q_peak, k),
                      "temperature", "T_peak = T_amb + Q_peak / (k_c + k_n)",
                      "no reservoir given: no heat capacity, the oil settles at each step's equilibrium",
                      (amb_in, Input("Q_peak", "peak heat load", q_peak, "power"), *k_inputs),
                      SRC_BALANCE, note="no reservoir: heat capacity not known"))
        return (), True
    c = rec.put(Value("heat_capacity", "Heat capacity of oil and steel", "C",
                      thermal.heat_capacity(res.oil_mass, res.steel_mass), "heat_capacity",
                      "C = m_oil * c_oil + m_steel * c_steel", "oil and reservoir steel warm together",
                      (Input("m_oil", "oil mass", res.oil_mass, "mass"),
                       Input("c_oil", "specific heat of oil (from memory)", thermal.C_OIL, "specific_heat"),
                       Input("m_steel", "steel mass", res.steel_mass, "mass"),
                       Input("c_steel", "specific heat of steel (from memory)", thermal.C_STEEL, "specific_heat")),
                      SRC_CAPACITY))
    rec.put(Value("time_constant", "Thermal time constant", "tau", thermal.time_constant(c, k), "time",
                  "tau = C / (k_c + k_n)", "heat capacity over the dissipation per kelvin",
                  (Input("C", "heat capacity", c, "heat_capacity"), *k_inputs), SRC_BALANCE))
    w = thermal.warmup(heat, amb, k, c)
    rec.put(Value("peak_temperature", "Peak oil temperature", "T_peak", w.peak, "temperature",
                  "T = T_eq + (T0 - T_eq) * exp(-t/tau) per step, T_eq = T_amb + Q_i / (k_c + k_n)",
                  f"highest temperature over {w.cycles} repeated cycles from ambient",
                  (amb_in, Input("C", "heat capacity", c, "heat_capacity"), *k_inputs), SRC_BALANCE,
                  note="" if w.settled else f"repeating cycle's peak; the series stops after {w.cycles} cycles"))
    return tuple(zip(w.times, w.temperatures)), w.settled


def resolve_cycles(machine: Machine, modes, supply_modes, duties: dict) -> tuple[CycleResult, ...]:
    """Every duty cycle of the machine, in the spec's order."""
    by_mode = {m.mode: m for m in modes}
    by_supply_mode = {(r.supply, r.mode): r for r in supply_modes}
    return tuple(cycle_values(machine, c, by_mode, by_supply_mode, duties) for c in machine.duty_cycles)
