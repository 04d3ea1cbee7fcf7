"""Checks on a shared prime mover in each mode: the summed pump load against the power it gives at the
mode's speed, the braking torque it must absorb when the pumps drive it, and its overspeed limit.

    prime_mover_load       (power available at the mode's speed - summed pump input power) / power available;
                           warning band: thresholds.power_margin_warn, as prime_mover_power
    engine_braking         only when the summed power is negative (the pumps drive the prime mover):
                           (motoring torque - braking torque returned) / motoring torque, same band;
                           no motoring_torque given: a warning that it cannot be judged (never a silent pass);
                           also a warning for a supply with its own prime_mover_power whose pump is driven
    prime_mover_overspeed  (max_speed - mode speed) / max_speed, a rating (band 0); when the pumps return
                           more torque than the motoring torque the prime mover cannot hold its speed:
                           (motoring torque - returned) / motoring torque, a fail; returned with no motoring
                           torque given: a warning. Without max_speed it is shown only in those two cases
                           (a prime mover that holds its speed cannot overspeed).

The summed torque at the prime mover's shaft against the torque available there, P_avail / (2*pi*n),
is the same ratio at the same speed: prime_mover_load names both rather than judging it twice.
Nothing is recomputed here: every number is a value of Results.prime_movers (resolve/prime_mover.py).
Worked example: 68 kW taken of 75 kW available: (75 - 68) / 75 = 9.3 %, inside the default 10 % band:
a warning. 240 N*m returned against a 200 N*m motoring torque: (200 - 240) / 200 = -20 %, a fail.
"""

from __future__ import annotations

from typing import TYPE_CHECKING, Iterator

from specgen.checks.status import Check, Fmt, below, status
from specgen.intake.model import Machine

if TYPE_CHECKING:
    from specgen.results import Results

NOUN = {"engine": "engine", "electric_motor": "electric motor"}


def _noun(machine: Machine, pm_id: str) -> str:
    return NOUN[machine.prime_mover(pm_id).kind]


def _shares(r, fmt: Fmt) -> str:
    return ", ".join(f"{sid} {fmt(v['pump_input_power'].value, 'power')}" for sid, v in r.per_supply.items())


def prime_mover_load(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """Summed input power of every pump on a prime mover in each mode against the power at that speed."""
    warn = machine.thresholds.power_margin_warn.value
    for r in results.prime_movers:
        need, have = r["power_used"], r["power_available"]
        noun = _noun(machine, r.prime_mover)
        margin = below(need, have)
        st = status(margin, warn)
        speed = f"at its '{r.speed_name}' speed {fmt(r['prime_mover_speed'], 'speed')}"
        head = (f"The pumps return {fmt(-need, 'power')} to the {noun} ({_shares(r, fmt)}): it is driven, not "
                "loaded (engine_braking judges it)" if need < 0 else
                f"The pumps take {fmt(need, 'power')} ({_shares(r, fmt)}) of the {noun}'s {fmt(have, 'power')} "
                f"{speed}, {fmt(r['torque_used'], 'torque')} of {fmt(r['torque_available'], 'torque')} at its shaft")
        tail = {"fail": f": the {noun} will stall or trip; lower the pumps' load or raise the speed.",
                "warn": f": under {warn:.0%} in hand.", "pass": "."}[st]
        yield Check("prime_mover_load", "Shared prime mover covers its pumps", st, need, have, "power", head + tail,
                    mode=r.mode, prime_mover=r.prime_mover, margin=margin)


def engine_braking(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """When the pumps drive the prime mover (negative summed power), the braking torque it must absorb
    against the motoring torque it can give."""
    warn = machine.thresholds.power_margin_warn.value
    for r in results.supply_modes:
        # a supply with its own prime_mover_power has no motoring torque to judge against
        if "prime_mover_power" in r.values and r["pump_input_power"] < 0:
            yield Check("engine_braking", "Prime mover absorbs the returned power", status(None, worst="warn"),
                        -r["pump_input_torque"], None, "torque",
                        f"The pump drives its prime mover with {fmt(-r['pump_input_torque'], 'torque')} "
                        f"({fmt(-r['pump_input_power'], 'power')}); a supply's own prime_mover_power carries no "
                        "motoring torque, so whether it can absorb that cannot be judged: declare the prime mover "
                        "under prime_movers with its motoring_torque, or brake the load another way.",
                        supply=r.supply, mode=r.mode)
    for r in results.prime_movers:
        if "torque_returned" not in r.values:
            continue
        mover = machine.prime_mover(r.prime_mover)
        noun = NOUN[mover.kind]
        t_ret, t_mot = r["torque_returned"], mover.motoring_torque
        if t_mot is None:
            yield Check("engine_braking", "Prime mover absorbs the returned power", status(None, worst="warn"),
                        t_ret, None, "torque",
                        f"The pumps drive the {noun} with {fmt(t_ret, 'torque')} ({fmt(-r['power_used'], 'power')}); "
                        f"no motoring_torque is given, so whether it can absorb that cannot be judged: enter the "
                        f"maker's figure or brake the load another way (retarder, brake valve).",
                        mode=r.mode, prime_mover=r.prime_mover)
            continue
        margin = below(t_ret, t_mot)
        st = status(margin, warn)
        tail = {"fail": f": the {noun} cannot hold the load back and speeds up; add a retarder or brake valve.",
                "warn": f": under {warn:.0%} in hand.", "pass": "."}[st]
        yield Check("engine_braking", "Prime mover absorbs the returned power", st, t_ret, t_mot, "torque",
                    f"The pumps drive the {noun} with {fmt(t_ret, 'torque')} against its motoring torque "
                    f"{fmt(t_mot, 'torque')}{tail}", mode=r.mode, prime_mover=r.prime_mover, margin=margin)


def prime_mover_overspeed(machine: Machine, results: Results, fmt: Fmt) -> Iterator[Check]:
    """The mode's speed at or below the overspeed limit, and no speed-up from returned torque it cannot hold."""
    for r in results.prime_movers:
        mover = machine.prime_mover(r.prime_mover)
        noun = NOUN[mover.kind]
        n, n_max = r["prime_mover_speed"], mover.max_speed
        t_ret = r.values["torque_returned"].value if "torque_returned" in r.values else None
        where = {"mode": r.mode, "prime_mover": r.prime_mover}
        title = "Prime mover stays within its overspeed limit"
        limit_words = f"its overspeed limit {fmt(n_max, 'speed')}" if n_max is not None else "its overspeed limit"
        if t_ret is not None and mover.motoring_torque is not None and t_ret > mover.motoring_torque:
            t_mot = mover.motoring_torque
            yield Check("prime_mover_overspeed", title, "fail", t_ret, t_mot, "torque",
                        f"The pumps return {fmt(t_ret, 'torque')}, more than the {noun}'s motoring torque "
                        f"{fmt(t_mot, 'torque')}: the {noun} cannot hold its speed and is driven past it, towards "
                        f"{limit_words}.", margin=below(t_ret, t_mot), **where)
        elif t_ret is not None and mover.motoring_torque is None:
            yield Check("prime_mover_overspeed", title, status(None, worst="warn"), t_ret, None, "torque",
                        f"The pumps return {fmt(t_ret, 'torque')} to the {noun}; with no motoring_torque given, "
                        f"whether it holds its speed (and stays under {limit_words}) cannot be judged.", **where)
        elif n_max is not None:
            margin = below(n, n_max)
            st = status(margin)
            held = " (it absorbs the returned torque and holds it)" if t_ret is not None else ""
            yield Check("prime_mover_overspeed", title, st, n, n_max, "speed",
                        f"The '{r.speed_name}' speed {fmt(n, 'speed')}{held} is "
                        + ("within" if st == "pass" else "at" if n == n_max else "above")
                        + f" the {noun}'s overspeed limit {fmt(n_max, 'speed')}.", margin=margin, **where)
