"""Load-sensing (LS) open-circuit supplies: pump pressure, throttling loss, sharing the flow when the
pump cannot deliver every demand, the power limiter, priority valves and flow dividers.

SI units: pressure Pa, flow m^3/s, power W, torque N*m, speed rev/s.

Relations (fluid-power practice for LS systems; the saturation and priority rules are common
practice, no single source):
  p_pump  = min(max_i(p_i) + dp_LS, p_relief)               pump pressure
  q_pump  = min(sum_i(q_i), q_avail)                          pump flow
  P_loss,i = (p_pump - p_i) * q_i                             throttling loss in drive i's valve
  q_avail = min(q_max, P_limit * eta_t / p_pump)              power limiter
  post-compensated (flow sharing): q_i' = q_i * q_avail / sum(q)
  pre-compensated: the lowest p_i is served first; the highest slows or stops
  metering at a reduced margin (orifice law): q' = q * sqrt(dp / dp_LS)

Worked example (hand calculation): hoist 210 bar at 60 L/min, slew 90 bar at 30 L/min, dp_LS 20 bar,
q_max 100 L/min: p_pump = 230 bar, q_pump = 90 L/min, losses hoist 20 bar * 60 L/min = 2.0 kW,
slew 140 bar * 30 L/min = 7.0 kW. With q_max 75 L/min and flow sharing each drive gets 75/90 = 0.8333
of its demand: hoist 50 L/min, slew 25 L/min.
"""

from __future__ import annotations

import math
from dataclasses import dataclass


def pump_pressure(needs: list[float], margin: float, relief: float) -> tuple[float, bool]:
    """Pump outlet pressure  p_pump = min(max(p_i) + dp_LS, p_relief), and whether the relief caps it.

    ``needs``: pressure each running drive needs at the supply (its inlet plus valve and line drops), Pa;
    ``margin``: dp_LS, Pa; ``relief``: relief setting, Pa.
    Source: LS pump control (the pump holds dp_LS over the highest load-sense pressure; fluid-power
    textbook); the relief valve bounds every pressure on the supply.
    Example: needs 210 and 90 bar, margin 20 bar, relief 250 bar: (230 bar, False); relief 220 bar: (220 bar, True).
    """
    wanted = max(needs) + margin
    return (relief, True) if wanted > relief else (wanted, False)


def metering_factor(available: float, margin: float) -> float:
    """Share of its demand a valve section passes when less than the margin stands across it:
    sqrt(dp / dp_LS), 1 at or above the margin, 0 with no pressure difference.

    The section's metering orifice is sized to pass the demand at dp_LS; the orifice law
    q = k * sqrt(dp) (turbulent flow through a fixed restriction; textbook) scales it below.
    Example: 5 bar across a section sized for 20 bar: sqrt(5/20) = 0.5.
    """
    if available <= 0:
        return 0.0
    ratio = available / margin
    # p_pump - p_need for the highest drive is the margin itself, up to the rounding of the subtraction:
    # that must not read as a valve short of its margin
    return 1.0 if ratio >= 1.0 - 1e-9 else math.sqrt(ratio)


def power_limited_flow(power_limit: float, eta_t: float, pressure: float, q_max: float) -> float:
    """Flow a power-limited pump delivers at ``pressure``:  q = min(q_max, P_limit * eta_t / p).

    From the pump input P = q * p / eta_t (fluid-power textbook) held at P_limit.
    Example: 40 kW limit, eta_t 0.85, 230 bar, q_max 100 L/min: 40000*0.85/230e5 = 1.4783e-3 m^3/s
    = 88.70 L/min.
    """
    return min(q_max, power_limit * eta_t / pressure) if pressure > 0 else q_max


def torque_limit_power(torque_limit: float, shaft_speed: float) -> float:
    """Input power a torque limit allows at the pump shaft speed  P = 2*pi*n*T.

    Example: 180 N*m at 1800 rpm (30 rev/s): 2*pi*30*180 = 33 929 W.
    """
    return 2.0 * math.pi * shaft_speed * torque_limit


def throttling_loss(p_pump: float, p_need: float, flow: float) -> float:
    """Power throttled in a drive's valve section  P = (p_pump - p_need) * q  (W), all heat.

    For the drive needing the highest pressure that is the margin times its flow.
    Example: 230 bar pump, slew needs 90 bar at 30 L/min: 140e5 * 5e-4 = 7000 W.
    """
    return max(p_pump - p_need, 0.0) * flow


@dataclass(frozen=True)
class Consumer:
    """One flow taker on the supply: a drive, or a flow divider feeding two.

    ``demand``: the flow it asks, m^3/s; ``pressure``: the pressure it needs at the supply, Pa;
    ``priority``: its place behind a priority valve (0 first), None when it shares the rest.
    """

    demand: float
    pressure: float
    priority: int | None = None


def offered_flows(consumers: list[Consumer], available: float, valves: str) -> list[float]:
    """The flow each consumer can get from ``available`` (m^3/s): at most its demand is taken, but
    the offer may exceed it (the margin of the reached-speed check is measured against it).

    Priority consumers first, in their order, each offered what is left; then the rest by
    ``valves``: "post_compensated" (flow sharing) offers each q_i * R / sum(q), R the flow left;
    "pre_compensated" serves the lowest pressure first, each offered what is left at its turn
    (equal pressures in the given order).
    Source: priority-valve and compensator behaviour of LS valve banks (common practice, no source).
    Example: demands 60 and 30 L/min, 75 L/min available, post-compensated: 50 and 25 L/min;
    pre-compensated, hoist at 210 bar and slew at 90 bar: slew offered 75, takes 30; hoist offered 45.
    """
    offer = [0.0] * len(consumers)
    left = available
    ranked = sorted((c.priority, i) for i, c in enumerate(consumers) if c.priority is not None)
    for _, i in ranked:
        offer[i] = left
        left -= min(consumers[i].demand, left)
    rest = [i for i, c in enumerate(consumers) if c.priority is None]
    if valves == "post_compensated":
        total = sum(consumers[i].demand for i in rest)
        for i in rest:
            offer[i] = consumers[i].demand * left / total if total > 0 else left
    else:
        for i in sorted(rest, key=lambda k: (consumers[k].pressure, k)):
            offer[i] = left
            left -= min(consumers[i].demand, left)
    return offer


def divider_inlet_demand(q_first: float, q_second: float, ratio: float) -> float:
    """Inlet flow a flow divider needs so that both legs get their demand:
    q_in = max(q_1 / r, q_2 / (1 - r)), ``ratio`` r the share to the first leg.

    Source: a flow divider splits its inlet flow at a fixed ratio (hydraulic valve practice).
    Example: 30 and 20 L/min at r = 0.5: max(60, 40) = 60 L/min; the second leg gets 30 L/min.
    """
    return max(q_first / ratio, q_second / (1.0 - ratio))


def divider_loss(q_in: float, ratio: float, drop: float, p_first: float, p_second: float) -> float:
    """Power lost in a flow divider  P = dp_div * q_in + |p_1 - p_2| * q_low  (W): its own drop on the
    whole flow, and the lower-pressure leg throttled down to its load (both legs leave at the
    higher pressure inside the divider).

    Source: energy balance on the divider (first law); divider drop from the maker's data.
    Example: 60 L/min, r 0.5, 10 bar drop, legs at 150 and 100 bar: 10e5*1e-3 + 50e5*5e-4 = 3500 W.
    """
    q_low = q_in * (1.0 - ratio) if p_second < p_first else q_in * ratio
    return drop * q_in + abs(p_first - p_second) * q_low
