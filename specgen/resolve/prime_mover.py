"""Shared prime movers: each mode's speed, the pumps' speeds from it, and the summed load on it.

For a supply that names a prime mover (``Supply.prime_mover``) the pump turns at the prime mover's
speed in the mode times the supply's drive ratio (``mode_base``: the supply's base values computed at
that speed; a supply with its own prime mover figures keeps its one base for every mode). The values
that belong to no mode (suction line, pump inlet, the flow a variable motor's control may use) are
computed at the fastest speed any of the supply's modes runs the prime mover at (``fastest_speed``). After every
supply in every mode is resolved, ``resolve_prime_movers`` adds up, per prime mover and mode, the input
power of every pump on it that runs in the mode, and their input torques referred to its shaft, beside
the power it gives at that speed (its power curve, else its rated power) and the torque that power
gives there. A negative sum is power the pumps return to the prime mover (an overrunning load on a
closed loop): ``torque_returned`` is then the braking torque it must absorb.

Relations: specgen/calc/prime_mover.py. Pure: SI floats in, traced Values out.

Example (hand calculation): engine 75 kW rated at 2200 rpm; pump A on ratio 1.0 takes 38 kW, pump B
on ratio 1.2 takes 30 kW at rated speed: A turns at 2200 rpm, B at 2640 rpm, the sum is 68 kW against
75 kW (margin 7/75 = 9.3 %).
"""

from __future__ import annotations

import math

from specgen.calc import prime_mover as pm_calc
from specgen.calc import supply as pump
from specgen.intake.model import Machine, Mode, PrimeMover, Supply
from specgen.resolve.record import Record
from specgen.resolve.supply import supply_base
from specgen.results import FluidResult, PrimeMoverModeResult, SupplyModeResult
from specgen.trace import Input, Value, indexed

SRC_SHARED = "power balance at the prime mover's shaft: the input powers (and torques) of the pumps it drives add"
SRC_CURVE = "linear interpolation between the points of the prime mover's power curve (maker's data as entered)"
SRC_TORQUE = "power balance through the pump drive, T = P / (2*pi*n) (losses of the drive neglected)"


def mode_speed(mover: PrimeMover, mode: Mode | None) -> tuple[str, float]:
    """The speed name and speed (rev/s) ``mover`` runs at in ``mode`` (None: its default speed)."""
    name = (mode.speed_name(mover.id) if mode is not None else None) or mover.default_speed
    return name, mover.speed(name)


def fastest_speed(machine: Machine, sup: Supply) -> tuple[str, float]:
    """The fastest speed ``sup``'s shared prime mover runs at in any mode that runs a drive on the supply
    (its default speed when no such mode names another): the supply's mode-independent values (suction
    line, pump inlet, the flow a variable motor's control may use) are computed there, the pump's worst."""
    mover = machine.prime_mover(sup.prime_mover)
    names = {mover.default_speed}
    for mode in machine.modes:
        if any(machine.drive(d).supply == sup.id for d, _ in mode.running):
            names.add(mode_speed(mover, mode)[0])
    return max(((name, mover.speed(name)) for name in names), key=lambda x: (x[1], x[0] == mover.default_speed))


def speed_value(machine: Machine, sup: Supply, mode: Mode | None = None) -> Value | None:
    """The shared prime mover's speed for ``sup`` in ``mode`` (None: its fastest, ``fastest_speed``) as a
    traced value; None when the supply has no shared prime mover."""
    if sup.prime_mover is None:
        return None
    mover = machine.prime_mover(sup.prime_mover)
    name, n = mode_speed(mover, mode) if mode is not None else fastest_speed(machine, sup)
    return Value("prime_mover_speed", "Prime mover speed", "n_pm", n, "speed", "",
                 f"prime mover {mover.id} at its '{name}' speed, as entered", (), "")


def mode_base(machine: Machine, sup: Supply, mode: Mode, base: dict, fluid: FluidResult) -> dict:
    """The supply's pump speed and full delivery in ``mode``: ``base`` unchanged for a supply with its own
    prime mover figures, else computed at the shared prime mover's speed in the mode."""
    if sup.prime_mover is None:
        return base
    speed = speed_value(machine, sup, mode)
    if speed == base["prime_mover_speed"]:
        return base  # the base was computed at this speed
    return supply_base(sup, fluid, speed)


def power_available(mover: PrimeMover, name: str, n: float) -> Value:
    """The power ``mover`` gives at speed ``n`` (named ``name``): its curve, else its rated power. A curve
    follows its rated power when an operating corner moves it: P = k * P_curve(n), k = P_rated / P_basis
    (k is exactly 1 at the nominal point and left out of the trace there)."""
    if not mover.power_curve:
        return Value("power_available", "Prime mover power available", "P_avail", mover.power, "power",
                     "P_avail = P_rated", "rated power (no power curve given)",
                     (Input("P_rated", "rated power", mover.power, "power"),), "as entered")
    curve = tuple((p.speed, p.power) for p in mover.power_curve)
    k = mover.power / mover.curve_basis if mover.curve_basis else 1.0
    value = pm_calc.power_at(n, mover.power, curve) * k
    a = max((p for p in mover.power_curve if p.speed <= n), key=lambda p: p.speed, default=mover.power_curve[0])
    b = min((p for p in mover.power_curve if p.speed >= n), key=lambda p: p.speed, default=mover.power_curve[-1])
    scaled = (Input("k", "rated power at this corner / as entered", k, "number"),) if k != 1.0 else ()
    pre, post = ("k * (", ")") if scaled else ("", "")
    if a.speed == b.speed:
        return Value("power_available", "Prime mover power available", "P_avail", value, "power",
                     f"P_avail = {pre}P(n){post}", f"the power curve's point at the '{name}' speed",
                     (Input("n", f"speed '{name}'", n, "speed"), Input("P(n)", "power at that point", a.power, "power"))
                     + scaled, SRC_CURVE)
    return Value("power_available", "Prime mover power available", "P_avail", value, "power",
                 f"P_avail = {pre}P_a + (P_b - P_a) * (n - n_a) / (n_b - n_a){post}",
                 f"power curve read linearly at the '{name}' speed between its neighbouring points",
                 (Input("n", f"speed '{name}'", n, "speed"), Input("n_a", "curve point below", a.speed, "speed"),
                  Input("P_a", "power there", a.power, "power"), Input("n_b", "curve point above", b.speed, "speed"),
                  Input("P_b", "power there", b.power, "power")) + scaled, SRC_CURVE)


def prime_mover_power_at(machine: Machine, supply_id: str, mode_id: str) -> float | None:
    """Power (W) the prime mover of supply ``supply_id`` can give in mode ``mode_id``: the supply's own
    ``prime_mover_power``, or its shared prime mover's power at that mode's speed (the whole prime
    mover's, which every pump on it shares); None when the spec gives neither."""
    sup = machine.supply(supply_id)
    if sup.prime_mover is None:
        return sup.prime_mover_power
    mover = machine.prime_mover(sup.prime_mover)
    mode = next((m for m in machine.modes if m.id == mode_id), None)
    name, n = mode_speed(mover, mode)
    return power_available(mover, name, n).value


def resolve_prime_movers(machine: Machine, supply_modes) -> tuple[PrimeMoverModeResult, ...]:
    """Every shared prime mover in every mode that runs a pump on it, in the spec's order of modes."""
    by_key = {(r.supply, r.mode): r for r in supply_modes}
    out = []
    for mode in machine.modes:
        for mover in machine.prime_movers:
            parts = [(s, by_key[(s.id, mode.id)]) for s in machine.supplies
                     if s.prime_mover == mover.id and (s.id, mode.id) in by_key]
            if parts:
                out.append(_load(mover, mode, parts))
    return tuple(out)


def _load(mover: PrimeMover, mode: Mode, parts: list[tuple[Supply, SupplyModeResult]]) -> PrimeMoverModeResult:
    name, n = mode_speed(mover, mode)
    rec, per_supply = Record(), {}
    for sup, r in parts:
        mine = {k: r.values[k] for k in ("pump_shaft_speed", "pump_input_power", "pump_input_torque") if k in r.values}
        if "pump_input_torque" not in mine:  # a supply kind that gives power and speed only
            n_p, p_in = mine["pump_shaft_speed"].value, mine["pump_input_power"].value
            mine["pump_input_torque"] = Value(
                "pump_input_torque", "Pump input torque", "T_p", pump.input_torque(p_in, n_p), "torque",
                "T_p = P_in / (2*pi*n_p)", "input power over the pump's angular speed",
                (Input("P_in", "pump input power", p_in, "power"), Input("n_p", "pump shaft speed", n_p, "speed")),
                SRC_TORQUE)
        t_p = mine["pump_input_torque"].value
        mine["prime_mover_torque"] = Value(
            "prime_mover_torque", "Torque at the prime mover's shaft", "T_pm", pm_calc.referred_torque(t_p, sup.drive_ratio),
            "torque", "T_pm = T_p * i_pd", "pump input torque referred to the prime mover through the drive ratio",
            (Input("T_p", "pump input torque", t_p, "torque"), Input("i_pd", "pump drive ratio", sup.drive_ratio, "ratio")),
            SRC_TORQUE)
        per_supply[sup.id] = mine
    rec.put(Value("prime_mover_speed", "Prime mover speed", "n_pm", n, "speed", "", f"the '{name}' speed, as entered"))
    p_avail = rec.put(power_available(mover, name, n))
    rec.put(Value("torque_available", "Torque available at this speed", "T_avail", pump.input_torque(p_avail, n),
                  "torque", "T_avail = P_avail / (2*pi*n_pm)", "the power available over the angular speed",
                  (Input("P_avail", "power available", p_avail, "power"), Input("n_pm", "prime mover speed", n, "speed")),
                  SRC_TORQUE))
    powers = tuple(Input(indexed("P_in", sid), f"pump of supply {sid}", v["pump_input_power"].value, "power")
                   for sid, v in per_supply.items())
    p_sum = rec.put(Value("power_used", "Summed pump input power", "P_sum", math.fsum(i.value for i in powers),
                          "power", "P_sum = sum(P_in,i)", "the input powers of every pump on the prime mover add",
                          powers, SRC_SHARED))
    torques = tuple(Input(indexed("T_pm", sid), f"pump of supply {sid} at the prime mover's shaft",
                          v["prime_mover_torque"].value, "torque") for sid, v in per_supply.items())
    t_sum = rec.put(Value("torque_used", "Summed torque at the prime mover's shaft", "T_sum",
                          math.fsum(i.value for i in torques), "torque", "T_sum = sum(T_p,i * i_pd,i)",
                          "each pump's input torque referred to the prime mover's shaft, added", torques, SRC_SHARED))
    if p_sum < 0:
        rec.put(Value("torque_returned", "Braking torque the pumps put on the prime mover", "T_ret", -t_sum, "torque",
                      "T_ret = -T_sum", "the pumps return power: they drive the prime mover, which must absorb it",
                      (Input("T_sum", "summed torque", t_sum, "torque"),), SRC_SHARED))
    return PrimeMoverModeResult(mover.id, mode.id, name, rec.values, per_supply)
