"""The one status rule every check uses, and the margin of each check (the Check record and the order of
severity live in results.py, beside the results every output reads).

Margin: how far a compared quantity is from its limit, as a fraction of a stated reference, signed
so that a negative margin means the limit is crossed.

    margin = (limit - value) / reference    for a value that must stay below its limit
    margin = (value - limit) / reference    for a value that must reach its limit

Status rule (``status``): "fail" at or past the limit (margin <= 0), "warn" inside the warning
band (0 < margin < band), else "pass". A rating is pass/fail only: band 0. A check whose worst
verdict is a warning caps the rule there (``worst="warn"``). Where there is nothing to measure
(a rating or a setting not given, no stocked size) the margin is None and the status is the
check's worst.

Each check's margin, and what it is a fraction of:

    pressure_margin         (pressure limit - required inlet pressure [+ pressure-line and valve loss]) / limit,
                            the drive's limit: lowest of relief, compensator and port relief settings
    supply_pressure         (relief or compensator setting - supply working pressure) / that setting
    peak_pressure           (peak rating - relief setting or a lower port relief) / peak rating
    continuous_pressure     (rating - inlet or held outlet pressure) / rating, the rating step the duty
                            point's duration names; in series the inlet in each mode
    port_relief_braking     (braking torque the port relief allows - braking torque needed) / needed
    counterbalance_setting  (setting - factor x highest load-induced pressure) / that product; and
                            (peak rating - setting) / peak rating
    pump_inlet_pressure     (absolute pump inlet pressure - minimum inlet pressure) / minimum
    outlet_pressure         (allowed outlet pressure - back or series outlet pressure) / allowed outlet pressure
    case_pressure           (case rating - case pressure) / case rating
    max_speed               (maximum speed - motor speed) / maximum speed
    min_speed               (motor speed - smooth-running minimum) / minimum; worst status: warn
    min_displacement_speed  (maximum speed - speed at the minimum displacement) / maximum speed
    pump_flow               (pump delivery - flow demand) / pump delivery; load sensing: the flow the pump
                            can give (its power limiter at the pump pressure) instead of the delivery
    reached_speed           load sensing: (flow offered to the drive - flow it needs) / flow it needs, the offer
                            from the pump, priority valve, flow divider and compensators (checks/load_sensing.py)
    prime_mover_power       (prime mover power - pump input power) / prime mover power
    prime_mover_load        (power available at the mode's speed - summed input power of the pumps on a shared
                            prime mover) / power available
    engine_braking          (motoring torque - braking torque the pumps return) / motoring torque; no motoring
                            torque given: None, worst status warn
    prime_mover_overspeed   (max speed - mode speed) / max speed, a rating; returned torque above the motoring
                            torque: (motoring torque - returned) / motoring torque, a fail (checks/prime_mover.py)
    makeup_flow             (flow left for the inlet - overrunning motor's flow) / that motor's flow;
                            worst status warn where a counterbalance or brake valve is declared;
                            through makeup valves also (return pressure - 1 bar) / 1 bar, worst warn
    line_velocity           pressure and return lines: (failing velocity - velocity) / failing velocity,
                            the failing velocity being 1.5 times the rule-of-thumb upper limit, so the
                            warning band 1/3 starts at the upper limit; suction lines: (upper limit -
                            velocity) / upper limit, worst status warn
    heat_load               (cooler capacity - heat load) / cooler capacity; with duty cycles, a mode a
                            cycle lists (not declared continuous) is judged by the cycle instead:
                            (cooler capacity - the cycle's mean heat load) / cooler capacity
    oil_temperature         (max oil temperature - peak oil temperature) / (max oil temperature - ambient),
                            a warning band of 5 K below the limit expressed in that fraction; worst
                            status warn when the cooler's rated temperature difference is missing
    displacement_choice     (displacement used or proposed - smallest for the target pressure) / that smallest;
                            a variable motor's duty speed: (speed reached - speed needed) / speed needed
    breakaway               (breakaway torque at the pressure limit - starting torque needed) / torque needed;
                            in series per mode, the downstream drives' starting differentials at the outlet
    intermittent_share      (allowed share - share of the duty cycle above the continuous rating) / allowed
                            share, the motor's intermittent_share; warning band 0.10 (checks/intermittent.py)
    pump_stroke             (1 - a closed loop's pump displacement setting); charge_flow (charge flow - leakage
                            and flushing) / that need; loop_direction None (checks/closed_loop.py)
    efficiency_table        None: inside or outside the maker's grid (fail outside: nothing is extrapolated)
    load_holding            None: a declaration, not a number (pass when a way to hold the load is declared)
    adhesion                (adhesion limit mu * W_driven * cos(theta) - a travel duty point's tractive or braking
                            effort) / adhesion limit
    tractive_envelope       (transmission's effort at the duty point's ground speed - its tractive effort) / that
                            effort; above the top travel speed: (top speed - ground speed) / top speed
    wheel_spin              None: informative (effort at the pressure limit against the adhesion limit)

Worked example: relief 250 bar, inlet needs 260 bar: margin (250 - 260)/250 = -0.04, fail.
Motor at 3300 rpm against a 3000 rpm maximum: (3000 - 3300)/3000 = -0.10, fail.
"""

from __future__ import annotations

from typing import Callable

from specgen.results import RANK, Check

def status(margin: float | None, band: float = 0.0, worst: str = "fail") -> str:
    """"fail" at or past the limit, "warn" inside the warning band, else "pass"; never beyond ``worst``.

    ``margin``: signed fraction (negative: limit crossed); None when there is nothing to measure,
    which gives ``worst``. ``band``: the warning band as a fraction (0 for a rating).
    Example: status(0.05, 0.10) == "warn"; status(0.0, 0.10) == "fail"; status(-0.2, worst="warn") == "warn".
    """
    if margin is None:
        found = worst
    else:
        found = "fail" if margin <= 0 else "warn" if margin < band else "pass"
    return found if RANK[found] <= RANK[worst] else worst


def below(value: float, limit: float) -> float:
    """Margin of a value that must stay below ``limit``, as a fraction of the limit."""
    return (limit - value) / limit


def reaches(value: float, need: float) -> float:
    """Margin of a value that must reach ``need``, as a fraction of the need (infinite for a zero need)."""
    return (value - need) / need if need > 0 else float("inf")


Fmt = Callable[[float, str], str]  # (SI value, units kind) -> text in the machine's display units


def missing(check_id: str, title: str, what: str, drive: str) -> Check:
    """A rating the check needs is not given: a warning with no margin."""
    return Check(check_id, title, status(None, worst="warn"), None, None, "",
                 f"No {what} rating given; enter the motor maker's figure.", drive=drive)


def against(value: float, limit: float, ok: bool, words: tuple[str, str] = ("within", "above")) -> str:
    """How a value stands to its limit in a message: ``words[0]`` when the check passes, "at" on the
    limit itself, else ``words[1]``."""
    return words[0] if ok else "at" if value == limit else words[1]
