"""Oil temperature over a duty cycle: mean heat, cooler and reservoir dissipation, warm-up.

Units: power W, temperature K (differences K), time s, mass kg, area m^2, specific heat J/(kg*K),
heat capacity J/K, dissipation coefficient W/K. The oil, the reservoir steel and the cooler are
taken as one lumped heat capacity at one temperature (common practice, no source: the usual
first estimate before a maker's cooler selection).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

C_OIL = 1900.0  # J/(kg*K), mineral hydraulic oil, from memory
C_STEEL = 470.0  # J/(kg*K), carbon steel, from memory
H_STILL_AIR = 12.0  # W/(m^2*K), reservoir wall and pipes in still air (10-15), from memory
MAX_OIL_TEMPERATURE = 353.15  # K (80 degC), mineral oil upper limit, from memory, common practice


def mean_heat(steps: list[tuple[float, float]]) -> float:
    """Time-weighted mean heat load of a cycle ``[(P_i W, t_i s), ...]``: P_mean = sum(P_i*t_i)/sum(t_i).

    Source: definition of a time average. Example: 20 kW for 40 s and 2 kW for 160 s ->
    (800 + 320) kJ / 200 s = 5.6 kW.
    """
    total = sum(t for _, t in steps)
    return sum(p * t for p, t in steps) / total


def cooler_coefficient(rated_capacity: float, rated_etd: float) -> float:
    """Heat the cooler rejects per kelvin of entering temperature difference: k_c = P_rated / ETD_rated (W/K).

    The rejected heat scales linearly with (oil in - ambient air) at the rated flows (common practice,
    no source). Example: 15 kW rated at 40 K -> 375 W/K.
    """
    return rated_capacity / rated_etd


def cooler_capacity_at(rated_capacity: float, rated_etd: float, oil: float, ambient: float) -> float:
    """P_c = P_rated * (T_oil - T_amb) / ETD_rated (W). Example: 15 kW at 40 K, oil 30 K over ambient -> 11.25 kW."""
    return rated_capacity * (oil - ambient) / rated_etd


def natural_coefficient(area: float, h: float = H_STILL_AIR) -> float:
    """Natural dissipation of reservoir and pipes per kelvin: h*A (W/K), h about 10-15 W/(m^2*K) in still
    air (from memory). Example: 2.5 m^2 at 12 W/(m^2*K) -> 30 W/K."""
    return h * area


def heat_capacity(oil_mass: float, steel_mass: float = 0.0, c_oil: float = C_OIL,
                  c_steel: float = C_STEEL) -> float:
    """C = m_oil*c_oil + m_steel*c_steel (J/K). Example: 200 kg oil and 150 kg steel ->
    200*1900 + 150*470 = 380000 + 70500 = 450500 J/K."""
    return oil_mass * c_oil + steel_mass * c_steel


def steady_temperature(ambient: float, mean_heat_load: float, k_total: float) -> float:
    """T_ss = T_amb + P_mean / (k_c + h*A) (K), the temperature the oil settles at over many cycles
    when the cycle is short beside the time constant. Example: 20 degC ambient, 5.6 kW, 405 W/K ->
    293.15 + 13.83 = 306.98 K (33.83 degC)."""
    return ambient + mean_heat_load / k_total


def time_constant(capacity: float, k_total: float) -> float:
    """tau = C / (k_c + h*A) (s). Example: 450500 J/K over 405 W/K -> 1112.3 s."""
    return capacity / k_total


def segment_end(t0: float, t_eq: float, duration: float, tau: float) -> float:
    """Exact solution of C*dT/dt = P - k*(T - T_amb) over a step of constant heat:
    T(t) = T_eq + (T0 - T_eq)*exp(-t/tau), T_eq = T_amb + P/k. Example: from 293.15 K toward 343.15 K
    for one time constant -> 343.15 - 50*exp(-1) = 324.76 K."""
    return t_eq + (t0 - t_eq) * math.exp(-duration / tau)


@dataclass(frozen=True)
class Warmup:
    """Oil temperature over repeated cycles, from ambient: the time series at every step boundary."""

    times: tuple[float, ...]  # s from the start
    temperatures: tuple[float, ...]  # K at each time
    peak: float  # K, highest temperature reached
    cycles: int  # cycles run
    settled: bool  # the cycle-to-cycle change fell below the tolerance before the cap (when it did not,
    # ``peak`` is still the repeating cycle's, found from the last cycle's linear map)


def warmup(steps: list[tuple[float, float]], ambient: float, k_total: float, capacity: float,
           tolerance: float = 0.01, max_cycles: int = 2000) -> Warmup:
    """Repeat the cycle ``[(P_i W, t_i s), ...]`` from ambient until the temperature at the end of a
    cycle is within ``tolerance`` K of the repeating state, judged from the cycle-to-cycle change
    (or ``max_cycles`` ran).

    Each step is solved exactly (``segment_end``), so the temperature peaks at a step boundary: the
    end of a step heating toward a higher equilibrium. The series records every boundary of the first
    cycles and then only cycle ends, so a long warm-up stays a short list. Source: first-order lumped
    heat balance, exact solution per piecewise-constant segment (textbook heat transfer).
    Example: one step of 4 kW for 100 s, k = 100 W/K, C = 1e5 J/K (tau 1000 s) from 293.15 K settles
    at T_eq = 333.15 K; after 10 cycles (1000 s) T = 333.15 - 40*exp(-1) = 318.43 K.
    """
    tau = time_constant(capacity, k_total)
    r = math.exp(-sum(dt for _, dt in steps) / tau)
    t, temp = 0.0, ambient
    times, temps = [0.0], [ambient]
    peak = ambient
    detail = 3  # cycles whose every step boundary is recorded
    settled = False
    cycles = 0
    while cycles < max_cycles:
        start = temp
        for p, dt in steps:
            temp = segment_end(temp, ambient + p / k_total, dt, tau)
            t += dt
            peak = max(peak, temp)
            if cycles < detail:
                times.append(t)
                temps.append(temp)
        cycles += 1
        if cycles >= detail:
            times.append(t)
            temps.append(temp)
        # End-of-cycle temperatures approach the repeating state geometrically with ratio r = exp(-period/tau),
        # so the gap left is change * r / (1 - r): a short cycle on a slow reservoir changes little per cycle
        # while still far from settled.
        if abs(temp - start) * r / (1.0 - r) < tolerance:
            settled = True
            break
    # The last settled cycle shown in full: its boundaries give the chart the cycle's ripple.
    for p, dt in steps:
        temp = segment_end(temp, ambient + p / k_total, dt, tau)
        t += dt
        peak = max(peak, temp)
        times.append(t)
        temps.append(temp)
    if not settled and r < 1.0:
        # Capped before settling: the cycle maps its start to its end linearly (end = r*start + b), so the
        # repeating cycle starts at b / (1 - r); its peak is taken, though the series stops short of it.
        periodic = (temp - r * temps[-1 - len(steps)]) / (1.0 - r)
        for p, dt in steps:
            periodic = segment_end(periodic, ambient + p / k_total, dt, tau)
            peak = max(peak, periodic)
    return Warmup(tuple(times), tuple(temps), peak, cycles, settled)


def share_above(steps: list[tuple[bool, float]]) -> float:
    """Time share of a cycle spent in steps flagged True: sum(t_i where flagged) / sum(t_i).
    Example: 40 s above in a 200 s cycle -> 0.2."""
    total = sum(t for _, t in steps)
    return sum(t for above, t in steps if above) / total
