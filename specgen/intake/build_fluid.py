"""Build the fluid, the hydraulic lines and the oil cooler from a schema-valid spec.

Quantities become SI floats (temperature K, density kg/m^3, viscosity m^2/s, lengths m,
cooler capacity W); every refused value is a problem in the builder, located at its field.
"""

from __future__ import annotations

import math

from specgen.intake import defaults
from specgen.intake.model import Cooler, Fluid, Line, Lines, Ratio, Reservoir
from specgen.intake.quantities import Builder
from specgen.iso_vg import ISO_VG_MIDPOINT_MM2S, WALTHER_CONSTANT_MM2S


NEEDS_FLUID = ("lines need the fluid's viscosity and density: give the fluid block (iso_vg and temperature; "
               "for ISO VG 2, 3 and 5 also viscosity_100c)")


def midpoint_40c(iso_vg: int) -> float:
    """ISO 3448 mid-point kinematic viscosity at 40 degC (m^2/s) of a grade: VG 46 -> 4.6e-05."""
    return ISO_VG_MIDPOINT_MM2S[iso_vg] * 1e-6


def build_fluid(b: Builder, f: dict | None) -> Fluid | None:
    if f is None:
        return None
    path = ("fluid",)
    temperature = b.quantity(f, "temperature", path, "temperature", sign="any")
    if "density" in f:
        density = Ratio(b.quantity(f, "density", path, "density"))
    else:
        density = Ratio(defaults.OIL_DENSITY, assumed=True, basis=defaults.OIL_BASIS)
    nu100 = b.quantity(f, "viscosity_100c", path, "viscosity")
    if nu100 is not None and math.isfinite(nu100):
        nu40 = midpoint_40c(f["iso_vg"])
        if nu100 >= nu40:
            b.fail(path + ("viscosity_100c",),
                   f"'{f['viscosity_100c']}' is not below the grade's 40 degC viscosity ({nu40 * 1e6:g} mm^2/s); "
                   "oil thins as it warms")
            nu100 = None
        elif nu100 * 1e6 + WALTHER_CONSTANT_MM2S <= 1.0:  # log10(log10(nu + 0.7)) needs nu + 0.7 > 1
            b.fail(path + ("viscosity_100c",), f"'{f['viscosity_100c']}' is too thin for the ASTM D341 relation "
                                               "(needs more than 0.3 mm^2/s)")
            nu100 = None
    return Fluid(iso_vg=f["iso_vg"], temperature=temperature, density=density, viscosity_100c=nu100)


def viscosity_known(fluid: Fluid | None) -> bool:
    return fluid is not None and fluid.viscosity_known


def build_line(b: Builder, raw: dict | None, path: tuple) -> Line | None:
    if raw is None:
        return None
    return Line(
        inner_diameter=b.quantity(raw, "inner_diameter", path, "length"),
        length=b.quantity(raw, "length", path, "length", sign="nonnegative"),
        equivalent_length=b.quantity(raw, "equivalent_length", path, "length", sign="nonnegative", default=0.0),
        roughness=b.quantity(raw, "roughness", path, "length", sign="nonnegative", default=0.0),
    )


def build_lines(b: Builder, raw: dict, path: tuple, fluid: Fluid | None) -> Lines:
    """A drive's pressure and return lines; their losses need the fluid's viscosity."""
    lines = Lines(pressure=build_line(b, raw.get("pressure"), path + ("pressure",)),
                  ret=build_line(b, raw.get("return"), path + ("return",)))
    if not viscosity_known(fluid):
        b.fail(path, NEEDS_FLUID)
    return lines


def build_cooler(b: Builder, raw: dict | None) -> Cooler | None:
    if raw is None:
        return None
    return Cooler(capacity=b.quantity(raw, "capacity", ("cooler",), "power"),
                  entering_temperature_difference=b.quantity(raw, "entering_temperature_difference", ("cooler",),
                                                             "temperature_difference"))


H_BASIS = "still air, 10-15 W/(m^2*K) (from memory)"


def build_reservoir(b: Builder, raw: dict | None, fluid: Fluid | None) -> Reservoir | None:
    """The reservoir; an oil volume becomes a mass with the fluid's density (or the assumed oil density)."""
    if raw is None:
        return None
    path = ("reservoir",)
    if "oil_mass" in raw:
        oil_mass = b.quantity(raw, "oil_mass", path, "mass")
    else:
        density = fluid.density.value if fluid is not None else defaults.OIL_DENSITY
        oil_mass = b.quantity(raw, "oil_volume", path, "volume") * density
    if "heat_transfer_coefficient" in raw:
        h = Ratio(b.quantity(raw, "heat_transfer_coefficient", path, "heat_transfer_coefficient"))
    else:
        h = Ratio(defaults.HEAT_TRANSFER_STILL_AIR, assumed=True, basis=H_BASIS)
    return Reservoir(surface_area=b.quantity(raw, "surface_area", path, "area", sign="nonnegative", default=0.0),
                     oil_mass=oil_mass,
                     steel_mass=b.quantity(raw, "steel_mass", path, "mass", sign="nonnegative", default=0.0),
                     heat_transfer_coefficient=h)
