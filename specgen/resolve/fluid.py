"""Fluid properties at the operating temperature, traced: viscosity (ISO 3448, ASTM D341), density.

Pure: takes the model's Fluid (SI floats), returns a FluidResult of traced Values.
"""

from __future__ import annotations

from specgen.calc import fluid
from specgen.resolve.record import Record
from specgen.intake import defaults
from specgen.intake.model import Fluid
from specgen.results import FluidResult
from specgen.trace import Input, Value, given

SRC_GRADE = "ISO 3448 (viscosity grade mid-point at 40 degC)"
SRC_VI = "ISO 2909 (viscosity index 100 at the grade's mid-point)"
SRC_WALTHER = "ASTM D341 (Walther viscosity-temperature relation)"
BASIS_NU100 = ("viscosity index 100 at the grade's 40 degC mid-point (ISO 2909); "
               "give the oil's 100 degC viscosity from its data sheet")
SRC_DENSITY = "volumetric thermal expansion; coefficient 6.5e-4 /K for mineral oil (common practice, no source)"


def fluid_values(f: Fluid | None) -> FluidResult:
    """Viscosity at 40 and 100 degC and at the operating temperature, and density. Empty without a fluid."""
    if f is None:
        return FluidResult()
    rec = Record()
    t_in = Input("T", "operating temperature", f.temperature, "temperature")
    nu40 = rec.put(Value("viscosity_40c", "Kinematic viscosity at 40 degC", "nu_40", fluid.iso_vg_midpoint_m2s(f.iso_vg),
                         "viscosity", "nu_40 = VG mm^2/s", "the ISO VG grade number is its 40 degC mid-point",
                         (Input("VG", "ISO VG grade", f.iso_vg, "number"),), SRC_GRADE))
    if f.viscosity_100c is not None:
        nu100 = rec.put(given("viscosity_100c", "Kinematic viscosity at 100 degC", "nu_100", f.viscosity_100c,
                              "viscosity"))
    elif f.iso_vg in fluid._TYPICAL_NU100_VI100_MM2S:
        nu100 = rec.put(Value("viscosity_100c", "Kinematic viscosity at 100 degC (typical)", "nu_100",
                              fluid.typical_viscosity_100c_m2s(f.iso_vg), "viscosity", "nu_100 = nu_100(VI 100, VG)",
                              "the 100 degC value that gives a viscosity index of 100 with the grade's 40 degC value",
                              (Input("VG", "ISO VG grade", f.iso_vg, "number", assumed=True),), SRC_VI,
                              note="assumed: give fluid.viscosity_100c from the oil's data sheet"))
    else:
        nu100 = None
    if nu100 is not None:
        rec.put(Value("kinematic_viscosity", "Kinematic viscosity at operating temperature", "nu",
                      fluid.walther_viscosity_m2s(nu40, fluid.T_40C, nu100, fluid.T_100C, f.temperature), "viscosity",
                      "log10(log10(nu + 0.7)) = A - B*log10(T), through (40 degC, nu_40) and (100 degC, nu_100)",
                      "straight line on the ASTM D341 chart through the two known viscosities, read at T",
                      (Input("nu_40", "viscosity at 40 degC", nu40, "viscosity"),
                       _nu100_input(nu100, assumed=f.viscosity_100c is None), t_in), SRC_WALTHER))
    if f.density.assumed:
        rho15 = Input("rho_15", "typical mineral oil density at 15 degC", f.density.value, "density", assumed=True,
                      where=("fluid", "density"), basis=f.density.basis)
        rec.put(Value("density", "Density at operating temperature", "rho",
                      fluid.density_at_temperature(f.density.value, defaults.OIL_REFERENCE_TEMPERATURE, f.temperature),
                      "density", "rho = rho_15 / (1 + beta*(T - 15 degC))",
                      "typical density carried to the operating temperature by thermal expansion",
                      (rho15, Input("beta", "expansion coefficient, per K", fluid.DENSITY_EXPANSION_PER_K, "number"), t_in),
                      SRC_DENSITY))
    else:
        rec.put(given("density", "Density", "rho", f.density.value, "density"))
    return FluidResult(rec.values)


def _nu100_input(nu100: float, assumed: bool) -> Input:
    """The 100 degC viscosity as an input; when typical rather than given it stands for the spec's
    fluid.viscosity_100c (the typical value's own trace marks its grade input assumed, naming no field)."""
    if not assumed:
        return Input("nu_100", "viscosity at 100 degC", nu100, "viscosity")
    return Input("nu_100", "viscosity at 100 degC", nu100, "viscosity", assumed=True,
                 where=("fluid", "viscosity_100c"), basis=BASIS_NU100)
