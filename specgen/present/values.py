"""Display helpers shared by the outputs: unit conversion and the list of assumed values."""

from __future__ import annotations

from specgen.units import convert, format_si, significant

__all__ = ["convert", "format_si", "significant", "assumed_inputs"]


def assumed_inputs(machine) -> list[dict]:
    """Every value a default filled in, with where it is and what it rests on."""
    out = []
    for s in machine.supplies:
        for key, r in (("volumetric_efficiency", s.pump.volumetric_efficiency),
                       ("overall_efficiency", s.pump.overall_efficiency)):
            if r.assumed:
                out.append({"where": f"supplies.{s.id}.pump.{key}", "value": r.value, "basis": r.basis})
    for d in machine.drives:
        m = d.motor
        for key, r in (("volumetric", m.volumetric_efficiency), ("hydromechanical", m.hydromechanical_efficiency),
                       ("starting", m.starting_efficiency)):
            if r.assumed:
                out.append({"where": f"drives.{d.id}.motor.efficiency.{key}", "value": r.value, "basis": r.basis})
        if d.gear and d.gear.efficiency.assumed:
            out.append({"where": f"drives.{d.id}.gear_stage.efficiency", "value": d.gear.efficiency.value,
                        "basis": d.gear.efficiency.basis})
    if machine.fluid and machine.fluid.density.assumed:
        out.append({"where": "fluid.density", "value": machine.fluid.density.value, "basis": machine.fluid.density.basis,
                    "unit": "kg/m^3"})
    return out
