"""Build the machine's shared prime movers and check what names them: supplies and modes.

A prime mover (engine or electric motor) has a rated power, named speeds, optionally a power curve
against speed, an overspeed limit and the motoring (braking) torque it can absorb. A supply names one
with ``prime_mover: <id>`` instead of its own ``prime_mover_power`` and ``prime_mover_speed``; a mode
names the speed it runs one at with ``prime_mover_speeds: {<id>: <speed name>}``.

Rules (each refusal is a problem at its field):
- default speed: the speed named ``rated``, else the only one; several speeds and none called
  ``rated`` is refused (no mode could leave its speed out without guessing).
- power curve: speeds strictly rising; every named speed must lie within the curve's speeds
  (nothing is extrapolated, so a speed outside it is refused here, never judged by a guess).
- a supply on a prime mover gives neither ``prime_mover_power`` nor ``prime_mover_speed`` nor its
  pump's ``shaft_speed``: the pump turns at the prime mover's speed in the mode times ``drive_ratio``;
  its pump is given by displacement, not by a delivered flow (which could not follow the speed).

Example: ``{diesel: {kind: engine, power: 75 kW, speeds: {idle: 1000 rpm, rated: 2200 rpm}}}``
builds one PrimeMover with power 75000.0 W, speeds {"idle": 16.67, "rated": 36.67} rev/s and
default speed "rated".
"""

from __future__ import annotations

from specgen.intake.model import PowerPoint, PrimeMover
from specgen.intake.quantities import Builder

DEFAULT_SPEED = "rated"
# a supply's own prime mover figures, which a shared prime mover gives instead: no corner may move them there
_OWN_FIGURES = (("prime_mover_power",), ("prime_mover_speed",), ("pump", "shaft_speed"))


def build_prime_movers(b: Builder, d: dict) -> tuple[PrimeMover, ...]:
    return tuple(_prime_mover(b, pid, p) for pid, p in (d.get("prime_movers") or {}).items())


def _prime_mover(b: Builder, pid: str, p: dict) -> PrimeMover:
    path = ("prime_movers", pid)
    speeds = {name: b.quantity(p["speeds"], name, path + ("speeds",), "speed") for name in p["speeds"]}
    names = list(speeds)
    if DEFAULT_SPEED in names:
        default = DEFAULT_SPEED
    elif len(names) == 1:
        default = names[0]
    else:
        default = names[0]
        b.fail(path + ("speeds",), f"{len(names)} speeds and none named '{DEFAULT_SPEED}': call the speed modes run at "
                                   f"by default '{DEFAULT_SPEED}' (speeds given: {', '.join(names)})")
    curve = tuple(PowerPoint(b.quantity(pt, "speed", path + ("power_curve", i), "speed"),
                             b.quantity(pt, "power", path + ("power_curve", i), "power"))
                  for i, pt in enumerate(p.get("power_curve") or ()))
    _check_curve(b, path, curve, speeds)
    power = b.quantity(p, "power", path, "power")
    return PrimeMover(id=pid, title=p.get("title", pid), kind=p["kind"], power=power, speeds=speeds,
                      default_speed=default, power_curve=curve, max_speed=b.quantity(p, "max_speed", path, "speed"),
                      motoring_torque=b.quantity(p, "motoring_torque", path, "torque"),
                      curve_basis=power if curve else None)


def _finite(x) -> bool:
    return x is not None and x == x and abs(x) != float("inf")


def _check_curve(b: Builder, path: tuple, curve: tuple[PowerPoint, ...], speeds) -> None:
    if not curve or not all(_finite(pt.speed) for pt in curve):
        return  # no curve, or a point refused at its own field
    for i in range(1, len(curve)):
        if curve[i].speed <= curve[i - 1].speed:
            b.fail(path + ("power_curve", i, "speed"), "the power curve's speeds must rise from point to point")
            return
    lo, hi = curve[0].speed, curve[-1].speed
    for name, n in speeds.items():
        if _finite(n) and not lo <= n <= hi:
            b.fail(path + ("speeds", name),
                   f"speed '{name}' ({n * 60:.6g} rpm) lies outside the power curve ({lo * 60:.6g} to {hi * 60:.6g} rpm); "
                   "the curve is never extrapolated: extend it to cover every named speed")


def check_prime_mover_references(b: Builder, d: dict) -> None:
    """Supplies that name a prime mover (and give nothing that contradicts it), and modes' speed names."""
    movers = d.get("prime_movers") or {}
    known = ", ".join(movers) or "none defined"
    for sid, s in d["supplies"].items():
        if "prime_mover" not in s:
            continue
        path = ("supplies", sid)
        if s["prime_mover"] not in movers:
            b.fail(path + ("prime_mover",), f"supply '{sid}' names prime mover '{s['prime_mover']}', which is not "
                                            f"defined under prime_movers (prime movers: {known})")
        for key in ("prime_mover_power", "prime_mover_speed"):
            if key in s:
                b.fail(path + (key,), f"supply '{sid}' is driven by prime mover '{s['prime_mover']}', whose power and "
                                      f"speeds apply; remove {key} (give one or the other, not both)")
        if "shaft_speed" in s["pump"]:
            b.fail(path + ("pump", "shaft_speed"),
                   f"supply '{sid}' is driven by prime mover '{s['prime_mover']}': its pump turns at the prime mover's "
                   "speed in each mode times drive_ratio; remove shaft_speed")
        if "delivery" in s["pump"]:
            b.fail(path + ("pump", "delivery"),
                   f"supply '{sid}' is driven by prime mover '{s['prime_mover']}', whose speed changes from mode to "
                   "mode: give the pump's displacement (its delivery follows the speed), not a delivered flow")
    driven = {s["prime_mover"] for s in d["supplies"].values() if "prime_mover" in s}
    # a supply naming an unknown prime mover is reported on its own: the one it meant may be the one left bare
    for pid in movers if driven <= set(movers) else ():
        if pid not in driven:
            b.fail(("prime_movers", pid), f"prime mover '{pid}' drives no supply; name it from a supply's "
                                          "prime_mover or remove it")
    shared = {sid: s["prime_mover"] for sid, s in d["supplies"].items() if "prime_mover" in s}
    for cid, c in (d.get("corners") or {}).items():
        for how in ("set", "scale"):
            for key in c.get(how) or {}:
                parts = key.split(".")
                if parts[:1] == ["supplies"] and len(parts) > 2 and parts[1] in shared and tuple(parts[2:]) in _OWN_FIGURES:
                    b.fail(("corners", cid, how, key),
                           f"supply '{parts[1]}' takes its power and speed from prime mover '{shared[parts[1]]}': "
                           f"move prime_movers.{shared[parts[1]]}.power or max_speed, or name another speed in a mode")
    for mid, m in d["modes"].items():
        for pid, name in (m.get("prime_mover_speeds") or {}).items():
            here = ("modes", mid, "prime_mover_speeds", pid)
            if pid not in movers:
                b.fail(here, f"mode '{mid}' names prime mover '{pid}', which is not defined under prime_movers "
                             f"(prime movers: {known})")
            elif name not in movers[pid]["speeds"]:
                b.fail(here, f"mode '{mid}' runs prime mover '{pid}' at speed '{name}', which it does not define "
                             f"(its speeds: {', '.join(movers[pid]['speeds'])})")
