"""A machine with one diesel engine driving two pumps, small enough to check by hand.

Engine: 75 kW rated at 2200 rpm, 40 kW at 1000 rpm (idle), power curve linear between.
Pump A (supply ``front``): 45 cm^3 on drive ratio 1.0, eta_v 1.0, eta_t 0.825, surplus over a 190 bar relief.
Pump B (supply ``rear``): 28 cm^3 on drive ratio 1.2, eta_v 1.0, eta_t 0.77, surplus over a 187.5 bar relief.
Each feeds one small motor that takes less than the pump delivers, so the pump outlet sits at the relief
setting and its input power is P_in = Vp * n_p * p_relief / eta_t (fluid-power textbook; hand calculation):
  rated, A: 45 cm^3 * 2200/60 rev/s = 1650 cm^3/s; 1650e-6 * 19.0e6 / 0.825 = 38 000 W
  rated, B: 28 cm^3 * 2640/60 rev/s = 1232 cm^3/s; 1232e-6 * 18.75e6 / 0.77 = 30 000 W
  sum 68 kW against 75 kW: margin (75 - 68) / 75 = 9.33 %
Mode ``dig`` runs at the default (rated) speed, mode ``travel_idle`` names the idle speed.
"""

from __future__ import annotations

import copy


def _motor_drive(supply: str) -> dict:
    return {"supply": supply, "motor": {
        "kind": "axial_piston", "displacement": "20 cm^3",
        "efficiency": {"volumetric": 0.95, "hydromechanical": 0.9, "starting": 0.85},
        "rating": {"continuous_pressure": "280 bar", "peak_pressure": "350 bar", "max_speed": "3000 rpm"}},
        "duty_points": {"run": {"torque": "20 N*m", "speed": "500 rpm"}}}


def shared_engine() -> dict:
    return copy.deepcopy({
        "format": 1,
        "machine": {"id": "shared-engine-rig", "title": "Two pumps on one engine (test)", "revision": "A"},
        "supplies": {
            "front": {"pump": {"displacement": "45 cm^3", "volumetric_efficiency": 1.0, "overall_efficiency": 0.825},
                      "relief_setting": "190 bar", "surplus_to": "relief", "prime_mover": "diesel"},
            "rear": {"pump": {"displacement": "28 cm^3", "volumetric_efficiency": 1.0, "overall_efficiency": 0.77},
                     "relief_setting": "187.5 bar", "surplus_to": "relief", "prime_mover": "diesel",
                     "drive_ratio": 1.2},
        },
        "prime_movers": {"diesel": {
            "title": "Diesel engine", "kind": "engine", "power": "75 kW",
            "speeds": {"idle": "1000 rpm", "rated": "2200 rpm"},
            "power_curve": [{"speed": "1000 rpm", "power": "40 kW"}, {"speed": "2200 rpm", "power": "75 kW"}],
        }},
        "drives": {"swing": _motor_drive("front"), "fan": _motor_drive("rear")},
        "modes": {"dig": {"drives": {"swing": "run", "fan": "run"}},
                  "travel_idle": {"drives": {"swing": "run", "fan": "run"}, "prime_mover_speeds": {"diesel": "idle"}}},
    })
