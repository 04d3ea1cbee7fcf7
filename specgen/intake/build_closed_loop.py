"""Build the closed-loop part of a supply (``circuit: closed_loop``): the charge pump, the flushing
flow and the high-pressure relief of each side, and refuse the open-circuit keys a loop has no use for.

The low side of a closed loop sits at the charge pressure: it takes the place of the return
pressure on every motor's outlet, so the model sets the supply's ``return_pressure`` to it
(model.Supply) and every step after (back pressure, torque at the limit, breakaway) reads it as it
reads any return pressure.

Quantities become SI floats (Pa, m^3/rev, m^3/s); every refused value is a problem at its field.
Example: ``charge: {displacement: 20 cm^3, pressure: 25 bar}`` -> Charge(pressure=2.5e6,
displacement=2e-5, volumetric 0.90 and overall 0.80 assumed).
"""

from __future__ import annotations

from dataclasses import replace

from specgen.intake.model import Charge, ClosedLoop, Ratio, ReliefSides, Supply
from specgen.intake.quantities import Builder

# Typical charge pump (an external gear pump on the main pump's through drive), from memory.
CHARGE_VOLUMETRIC = 0.90
CHARGE_OVERALL = 0.80
CHARGE_BASIS = "typical for a gear charge pump (from memory); use the maker's data"

# Open-circuit keys that have no meaning in a closed loop, with the reason given to the user.
_OPEN_ONLY = {
    "return_pressure": "the low side of a closed loop sits at closed_loop.charge.pressure; remove return_pressure",
    "surplus_to": "a closed-loop pump strokes to the flow the motors take and has no surplus; remove surplus_to",
    "open_centre_pressure": "a closed loop has no open centre; remove open_centre_pressure",
}
_PUMP_OPEN_ONLY = {
    "control": "a closed-loop pump's stroke follows the motors' flow per duty point; remove pump.control",
    "delivery": "a closed-loop pump needs its maximum displacement (and shaft speed) to set its stroke; "
                "give pump.displacement instead of pump.delivery",
}


def with_closed_loop(b: Builder, s: dict, path: tuple, sup: Supply) -> Supply:
    """``sup`` as built for an open circuit, completed for ``circuit: closed_loop`` (unchanged otherwise)."""
    block = s.get("closed_loop")
    if s.get("circuit") != "closed_loop":
        if block is not None:
            b.fail(path + ("closed_loop",), "closed_loop applies only with circuit: closed_loop")
        return sup
    if block is None:
        b.fail(path + ("circuit",), "circuit: closed_loop needs a closed_loop block with its charge pump "
                                    "(closed_loop: {charge: {displacement, pressure}})")
        return sup
    for key, why in _OPEN_ONLY.items():
        if key in s:
            b.fail(path + (key,), why)
    for key, why in _PUMP_OPEN_ONLY.items():
        if key in s["pump"]:
            b.fail(path + ("pump", key), why)
    pump = sup.pump
    if pump.overall_efficiency.value > pump.volumetric_efficiency.value:
        # the loop's pump hydro-mechanical efficiency is their ratio, and it cannot exceed 1
        b.fail(path + ("pump", "overall_efficiency"), "a closed loop's pump overall efficiency cannot exceed its "
                                                      "volumetric efficiency (their ratio is its hydro-mechanical "
                                                      "efficiency, at most 1)")
    lpath = path + ("closed_loop",)
    charge = _charge(b, block["charge"], lpath + ("charge",))
    reliefs = block.get("high_pressure_reliefs", {})
    rpath = lpath + ("high_pressure_reliefs",)
    loop = ClosedLoop(charge=charge,
                      flushing_flow=b.quantity(block, "flushing_flow", lpath, "flow", sign="nonnegative", default=0.0),
                      high_pressure_reliefs=ReliefSides(b.quantity(reliefs, "side_a", rpath, "pressure"),
                                                        b.quantity(reliefs, "side_b", rpath, "pressure")))
    sup = replace(sup, closed_loop=loop)  # the model sets the return pressure to the charge pressure
    for side, relief in sup.high_pressure_reliefs:
        key = "side_" + side.lower()
        where = rpath + (key,) if key in reliefs else path + ("relief_setting",)
        if relief is not None and charge.pressure is not None and relief <= charge.pressure:
            b.fail(where, f"the high-pressure relief of side {side} must be above the charge pressure")
    return sup


def _charge(b: Builder, c: dict, cpath: tuple) -> Charge:
    volumetric = b.ratio(c, "volumetric_efficiency", cpath, CHARGE_VOLUMETRIC, CHARGE_BASIS)
    if "flow" in c and "volumetric_efficiency" not in c:
        volumetric = Ratio(1.0)  # a delivered flow already includes leakage; nothing is assumed about it
    return Charge(pressure=b.quantity(c, "pressure", cpath, "pressure"),
                  displacement=b.quantity(c, "displacement", cpath, "displacement"),
                  flow=b.quantity(c, "flow", cpath, "flow"),
                  volumetric_efficiency=volumetric,
                  overall_efficiency=b.ratio(c, "overall_efficiency", cpath, CHARGE_OVERALL, CHARGE_BASIS))
