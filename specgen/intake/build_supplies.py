"""Build each supply from a schema-valid spec: its pump and pump control, relief and return
pressures, prime mover power and speed, drive ratio, circuit, where surplus flow goes, suction line.

Quantities become SI floats (Pa, m^3/rev, rev/s, m^3/s, W); every refused value or contradiction
is a problem in the builder, located at its field.
"""

from __future__ import annotations

import math

from specgen.intake import defaults
from specgen.intake.build_closed_loop import with_closed_loop
from specgen.intake.build_fluid import NEEDS_FLUID, build_line, viscosity_known
from specgen.intake.model import FlowDivider, Fluid, Pump, Ratio, Supply
from specgen.intake.quantities import Builder

# With nothing running a load-sensing pump idles at its standby pressure, typically a little above its
# margin; taken equal to the margin when not given (common practice, no source). It sets only the idle
# pump pressure; no check rests on it.
STANDBY_BASIS = "taken equal to the load-sensing margin (common practice, no source); use the pump maker's figure"
LS_KEYS = ("ls_margin", "standby_pressure", "input_power_limit", "input_torque_limit")
LS_SUPPLY_KEYS = ("ls_valves", "priority", "flow_divider")


def build_supply(b: Builder, sid: str, s: dict, fluid: Fluid | None) -> Supply:
    path = ("supplies", sid)
    pump = _pump(b, s["pump"], path + ("pump",))
    relief = b.quantity(s, "relief_setting", path, "pressure")
    ret = b.quantity(s, "return_pressure", path, "pressure", sign="nonnegative", default=0.0)
    if relief is not None and relief > 0 and ret is not None and ret >= relief:  # relief <= 0 is reported already
        b.fail(path + ("return_pressure",), "return pressure must be below the relief setting")
    prime_mover_power = b.quantity(s, "prime_mover_power", path, "power")
    _control(b, s, path, pump, relief)
    pm_speed, ratio = _prime_mover_speed(b, s, path, pump)
    divider = _load_sensing(b, s, path, pump, relief, pm_speed)
    surplus = s.get("surplus_to", "working_pressure")
    oc = b.quantity(s, "open_centre_pressure", path, "pressure")
    if surplus == "open_centre" and oc is None:
        b.fail(path + ("surplus_to",), "surplus_to: open_centre needs open_centre_pressure")
    elif surplus != "open_centre" and oc is not None:
        b.fail(path + ("open_centre_pressure",), "open_centre_pressure applies only with surplus_to: open_centre")
    elif oc is not None and relief is not None and oc >= relief:
        b.fail(path + ("open_centre_pressure",), "the open-centre pressure must be below the relief setting")
    suction = build_line(b, s.get("suction_line"), path + ("suction_line",))
    if suction is not None and not viscosity_known(fluid):
        b.fail(path + ("suction_line",), NEEDS_FLUID)
    return with_closed_loop(b, s, path, Supply(
        id=sid, title=s.get("title", sid), pump=pump, relief_setting=relief, return_pressure=ret,
        prime_mover_power=prime_mover_power, prime_mover_speed=pm_speed,
        drive_ratio=float(ratio) if ratio is not None else 1.0, circuit=s.get("circuit", "parallel"),
        surplus_to=surplus, open_centre_pressure=oc, suction_line=suction,
        suction_head=b.quantity(s.get("suction", {}), "head", path + ("suction",), "length", sign="any"),
        strainer_drop=b.quantity(s.get("suction", {}), "strainer_drop", path + ("suction",), "pressure",
                                 sign="nonnegative", default=0.0),
        feeds=s.get("feeds"), ls_valves=s.get("ls_valves"), priority=tuple(s.get("priority", ())),
        flow_divider=divider,
        prime_mover=s.get("prime_mover"),
    ))


def _pump(b: Builder, p: dict, ppath: tuple) -> Pump:
    displacement = b.quantity(p, "displacement", ppath, "displacement")
    shaft_speed = b.quantity(p, "shaft_speed", ppath, "speed")
    delivery = b.quantity(p, "delivery", ppath, "flow")
    volumetric = b.ratio(p, "volumetric_efficiency", ppath, defaults.PUMP_VOLUMETRIC, defaults.PUMP_BASIS)
    overall = b.ratio(p, "overall_efficiency", ppath, defaults.PUMP_OVERALL, defaults.PUMP_BASIS)
    if "delivery" in p and "volumetric_efficiency" not in p:
        # a delivered flow already includes leakage; no assumption is made about it
        volumetric = Ratio(1.0)
    if "min_inlet_pressure" in p:
        min_inlet = Ratio(b.quantity(p, "min_inlet_pressure", ppath, "pressure"))
    else:
        min_inlet = Ratio(defaults.PUMP_MIN_INLET, assumed=True, basis=defaults.PUMP_MIN_INLET_BASIS)
    margin = b.quantity(p, "ls_margin", ppath, "pressure")
    if "standby_pressure" in p:
        standby = Ratio(b.quantity(p, "standby_pressure", ppath, "pressure"))
    else:
        standby = Ratio(margin, assumed=True, basis=STANDBY_BASIS) if margin is not None else None
    return Pump(displacement, shaft_speed, delivery, volumetric, overall, control=p.get("control", "fixed"),
                compensator_setting=b.quantity(p, "compensator_setting", ppath, "pressure"),
                min_inlet_pressure=min_inlet, ls_margin=margin, standby_pressure=standby,
                input_power_limit=b.quantity(p, "input_power_limit", ppath, "power"),
                input_torque_limit=b.quantity(p, "input_torque_limit", ppath, "torque"))


def _control(b: Builder, s: dict, path: tuple, pump: Pump, relief: float | None) -> None:
    """A pressure-compensated pump needs a compensator setting below the relief setting."""
    ppath = path + ("pump",)
    comp = pump.compensator_setting
    if pump.control == "pressure_compensated":
        if comp is None:
            b.fail(ppath + ("control",), "a pressure-compensated pump needs compensator_setting")
        elif relief is not None and comp >= relief:
            b.fail(ppath + ("compensator_setting",),
                   "the compensator setting must be below the relief setting, or the relief valve dumps the flow")
        if "surplus_to" in s:
            b.fail(path + ("surplus_to",), "a pressure-compensated pump delivers no surplus flow; remove surplus_to")
    elif comp is not None:
        b.fail(ppath + ("compensator_setting",), "compensator_setting applies only with control: pressure_compensated")


def _prime_mover_speed(b: Builder, s: dict, path: tuple, pump: Pump) -> tuple[float | None, float | None]:
    """The prime mover speed (rev/s) and the drive ratio (pump shaft speed / prime mover speed):
    give two of pump shaft speed, prime mover speed and drive ratio, or all three in agreement."""
    ppath = path + ("pump",)
    pm_speed = b.quantity(s, "prime_mover_speed", path, "speed")
    ratio = s.get("drive_ratio")
    if ratio is not None and not math.isfinite(ratio):
        b.fail(path + ("drive_ratio",), f"drive ratio {ratio!r} must be a finite number above zero")
        ratio = None
    shaft = pump.shaft_speed
    if "displacement" in s["pump"] and shaft is None and pm_speed is None and "prime_mover" not in s:
        b.fail(ppath, "give the pump's shaft_speed, or the supply's prime_mover_speed (the pump then turns at "
                      "prime_mover_speed times drive_ratio)")
    if shaft is not None and pm_speed is not None and math.isfinite(shaft) and math.isfinite(pm_speed):
        implied = shaft / pm_speed
        if ratio is not None and abs(implied - ratio) > 1e-6 * ratio:
            b.fail(path + ("drive_ratio",),
                   f"pump shaft speed / prime mover speed is {implied:.4g}, not the drive ratio {ratio:g}; "
                   "give two of the three")
        ratio = implied if ratio is None else ratio
    return pm_speed, ratio


def _load_sensing(b: Builder, s: dict, path: tuple, pump: Pump, relief: float | None,
                  pm_speed: float | None) -> FlowDivider | None:
    """A load-sensing pump needs its margin and the kind of its valves' compensators; the margin and
    standby pressure lie below the relief setting; a power and a torque limit are not both given.
    The load-sensing keys are refused on any other pump. Returns the flow divider, if any."""
    ppath = path + ("pump",)
    p = s["pump"]
    if pump.control != "load_sensing":
        for key in LS_KEYS:
            if key in p:
                b.fail(ppath + (key,), f"{key} applies only with control: load_sensing")
        for key in LS_SUPPLY_KEYS:
            if key in s:
                b.fail(path + (key,), f"{key} applies only to a pump with control: load_sensing")
        return None
    if pump.ls_margin is None:
        b.fail(ppath + ("control",), "a load-sensing pump needs ls_margin (its pressure above the highest load, "
                                     "from the pump maker's data)")
    if "ls_valves" not in s:
        b.fail(path, "a load-sensing supply needs ls_valves: post_compensated (flow sharing) or pre_compensated, "
                     "which decides how the flow is shared when the pump cannot deliver every demand")
    if s.get("circuit", "parallel") != "parallel":
        b.fail(path + ("circuit",), "a load-sensing supply feeds its drives in parallel; remove circuit: series")
    if "surplus_to" in s:
        b.fail(path + ("surplus_to",), "a load-sensing pump delivers no surplus flow; remove surplus_to")
    if relief is not None and relief > 0:
        for key, value in (("ls_margin", pump.ls_margin),
                           ("standby_pressure", pump.standby_pressure.value if "standby_pressure" in p else None)):
            if value is not None and value >= relief:
                b.fail(ppath + (key,), f"{key} must be below the relief setting")
    if "input_power_limit" in p and "input_torque_limit" in p:
        b.fail(ppath + ("input_torque_limit",), "give the power limiter as input_power_limit or input_torque_limit, "
                                                "not both")
    if "input_torque_limit" in p and pump.shaft_speed is None and pm_speed is None:
        b.fail(ppath + ("input_torque_limit",), "an input torque limit needs the pump's shaft speed (shaft_speed, "
                                                "or the supply's prime_mover_speed)")
    priority = s.get("priority", [])
    if len(set(priority)) != len(priority):
        b.fail(path + ("priority",), "a drive is listed twice under priority")
    fd = s.get("flow_divider")
    if fd is None:
        return None
    fpath = path + ("flow_divider",)
    drives = tuple(fd["drives"])
    if drives[0] == drives[1]:
        b.fail(fpath + ("drives",), "a flow divider splits between two different drives")
    if set(drives) & set(priority):
        b.fail(fpath + ("drives",), "a drive behind the flow divider cannot also be a priority drive")
    ratio = b.parse(fd["ratio"], "ratio", fpath + ("ratio",))
    if ratio is not None and not 0 < ratio < 1:
        b.fail(fpath + ("ratio",), f"{fd['ratio']!r} must lie between 0 and 1 (the share to {drives[0]})")
    drop = b.quantity(fd, "pressure_drop", fpath, "pressure", sign="nonnegative")
    if ratio is None or drop is None or not 0 < ratio < 1:
        return None
    return FlowDivider(drives, ratio, drop)


def ls_references(b: Builder, d: dict) -> None:
    """Priority and flow-divider drives must be drives on their own supply."""
    for sid, s in d["supplies"].items():
        for key, names in (("priority", s.get("priority", [])), ("flow_divider", (s.get("flow_divider") or {})
                                                                              .get("drives", []))):
            for i, name in enumerate(names):
                dr = d["drives"].get(name)
                if dr is None or dr["supply"] != sid:
                    here = ("supplies", sid, key) + (("drives",) if key == "flow_divider" else ()) + (i,)
                    b.fail(here, f"'{name}' is not a drive on supply '{sid}'")
