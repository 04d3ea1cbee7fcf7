"""One hydraulic line at one flow, traced: velocity, Reynolds number, friction factor, pressure drop.

Pure: SI floats in (flow m^3/s, lengths m, viscosity m^2/s, density kg/m^3), traced Values out.
"""

from __future__ import annotations

from specgen.calc import lines
from specgen.intake.model import Line
from specgen.trace import Input, Value

SRC_CONTINUITY = "continuity: mean velocity = flow / bore area"
SRC_REYNOLDS = "Reynolds number of pipe flow on the bore diameter"
SRC_FRICTION = "Darcy friction factor: 64/Re laminar (Hagen-Poiseuille), Colebrook (1939) from Re 2300"
SRC_DW = "Darcy-Weisbach"

KIND_WORDS = {"pressure": "Pressure line", "return": "Return line", "suction": "Suction line"}


def line_values(kind: str, line: Line, flow: float, viscosity: float, density: float) -> list[Value]:
    """``kind`` is 'pressure', 'return' or 'suction'; keys are '<kind>_line_velocity' and so on."""
    name = KIND_WORDS[kind]
    key = f"{kind}_line"
    r = lines.line_pressure_drop(flow, line.inner_diameter, line.length, density, viscosity,
                                 line.equivalent_length, line.roughness)
    q_in = Input("q", "flow in the line", flow, "flow")
    d_in = Input("d", "inner diameter", line.inner_diameter, "length")
    v_in = Input("v", "velocity", r.velocity, "velocity")
    re_in = Input("Re", "Reynolds number", r.reynolds, "number")
    f_in = Input("f", "friction factor", r.friction_factor, "number")
    regime = {"laminar": "laminar", "transitional": "transitional band (Re 2300 to 4000): the turbulent formula "
              "is used, which gives the higher loss", "turbulent": "turbulent", "none": "no flow"}[r.regime]
    limits = lines.line_velocity_limits(kind)
    out = [
        Value(f"{key}_velocity", f"{name} velocity", "v", r.velocity, "velocity", "v = q / (pi*d^2/4)",
              "flow over the bore area", (q_in, d_in), SRC_CONTINUITY,
              note=f"rule of thumb for {kind} lines {limits.low:g} to {limits.high:g} m/s (common practice, no source)"),
        Value(f"{key}_reynolds", f"{name} Reynolds number", "Re", r.reynolds, "number", "Re = v*d/nu",
              "velocity times bore over kinematic viscosity",
              (v_in, d_in, Input("nu", "kinematic viscosity", viscosity, "viscosity")), SRC_REYNOLDS, note=regime),
        Value(f"{key}_friction_factor", f"{name} friction factor", "f", r.friction_factor, "number",
              "f = 64/Re" if r.regime == "laminar" else "1/sqrt(f) = -2*log10(eps/(3.7*d) + 2.51/(Re*sqrt(f)))",
              "Darcy friction factor, " + regime,
              (re_in,) + ((Input("eps", "wall roughness", line.roughness, "length"), d_in) if r.regime != "laminar" else ()),
              SRC_FRICTION),
        Value(f"{key}_loss", f"{name} pressure drop", "dp_line", r.pressure_drop, "pressure",
              "dp_line = f * ((L + L_eq)/d) * rho * v^2 / 2",
              "friction factor times length over bore times the velocity head",
              (f_in, Input("L", "length", line.length, "length"),
               Input("L_eq", "fittings as equivalent length", line.equivalent_length, "length"), d_in,
               Input("rho", "density", density, "density"), v_in), SRC_DW),
    ]
    return out
