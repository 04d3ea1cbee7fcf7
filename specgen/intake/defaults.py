"""Values used when a spec leaves them out. Every one is marked "assumed" in all output.

Motor efficiencies are mid-range typical catalogue figures per construction (from memory, not a
published source): a spec should always give the motor maker's data instead.
"""

from __future__ import annotations

# kind: (volumetric, hydro-mechanical, starting)
MOTOR_EFFICIENCY = {
    "external_gear": (0.89, 0.85, 0.78),
    "vane": (0.88, 0.88, 0.80),
    "orbital": (0.90, 0.85, 0.75),
    "axial_piston": (0.95, 0.92, 0.88),
    "radial_piston": (0.96, 0.94, 0.92),
}
MOTOR_BASIS = "typical for {kind} motors (from memory); use the maker's data"

PUMP_VOLUMETRIC = 0.92
PUMP_OVERALL = 0.85
PUMP_BASIS = "typical for a positive-displacement pump (from memory); use the maker's data"

PUMP_MIN_INLET = 0.8e5  # Pa absolute
PUMP_MIN_INLET_BASIS = ("typical minimum absolute inlet pressure of gear and piston pumps, continuous "
                        "(from memory, catalogue practice); use the maker's data")

GEAR_EFFICIENCY = 0.97
GEAR_BASIS = "typical for one spur or planetary gear stage (from memory)"

GEAR_STARTING_BASIS = "running efficiency taken from rest; a gear stage starts with less (maker's data)"

COUNTERBALANCE_FACTOR = 1.3  # setting / highest load-induced pressure (common practice, no source)

OIL_DENSITY = 870.0  # kg/m^3, mineral hydraulic oil at about 15 degC (from memory)
OIL_BASIS = "typical mineral hydraulic oil (from memory)"

THRESHOLDS = {
    "pressure_margin_warn": 0.10,
    "flow_margin_warn": 0.05,
    "power_margin_warn": 0.10,
    "breakaway_margin_warn": 0.10,
    "speed_margin_warn": 0.05,
    "heat_margin_warn": 0.10,
    "traction_margin_warn": 0.10,
}

# Mineral hydraulic oil: the typical density above is at 15 degC; an assumed density is carried to
# the operating temperature with the expansion coefficient in calc/fluid.py.
OIL_REFERENCE_TEMPERATURE = 288.15  # K

SIZING_SERIES = "R10"  # ISO 3 series proposals come from when the spec names none

# Oil temperature (from memory, common practice, no source).
HEAT_TRANSFER_STILL_AIR = 12.0  # W/(m^2*K), reservoir wall in still air (10-15)
MAX_OIL_TEMPERATURE = 353.15  # K (80 degC), mineral oil
MAX_OIL_BASIS = "mineral oil upper limit 80 degC (from memory, common practice)"

# Adhesion coefficient when the travel block leaves it out: the low end of the typical range, so the
# wheel-slip check is never looser than the ground may be (from memory): rubber tyres 0.3-0.8 (wet or
# loose ground to dry concrete), steel tracks on firm soil 0.7-0.9.
ADHESION = {"wheels": 0.3, "tracks": 0.7}
ADHESION_BASIS = ("low end of the typical adhesion coefficient for {gear} (from memory: tyres 0.3-0.8, "
                  "steel tracks on firm soil 0.7-0.9); give the figure for the ground the machine works on")
