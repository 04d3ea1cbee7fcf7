"""Closed-loop hydrostatic transmission: pump stroke, pump torque, loop leakage and charge pump.

A variable pump (maximum displacement Vp, shaft speed n_p) feeds one or more motors whose outlets
return straight to its inlet; the low side sits at the charge pressure p_L, the high side at p_H.
Driving, the pump gives flow and takes torque; overrunning (downhill, braking) the motors pump and
the pump, still stroked the same way, turns into a motor that drives its shaft: power flows back
to the prime mover.

Units: displacement m^3/rev, speed rev/s, flow m^3/s, pressure Pa, torque N*m, power W.
Source: the hydrostatic transmission relations of fluid-power textbooks (pump flow
q = x*Vp*n_p*eta_v, torque T = x*Vp*dp/(2*pi*eta_hm)), with each efficiency applied in the direction
the power flows. Charge sizing (leakage plus flushing) is the usual design rule, stated with the
relations in the working primer of this project, section 15.
"""

from __future__ import annotations

import math

from specgen.calc.guards import efficiency as _efficiency, non_negative as _non_negative, positive as _positive

TWO_PI = 2.0 * math.pi


def stroke_driving(flow: float, displacement: float, shaft_speed: float, eta_v: float) -> float:
    """Pump displacement setting that delivers ``flow`` to the motors: ``x = q / (Vp * n_p * eta_v)``.

    Parameters: flow q (m^3/s, >= 0), displacement Vp (maximum, m^3/rev, > 0), shaft_speed n_p
    (rev/s, > 0), eta_v pump volumetric efficiency ((0, 1]). A result above 1 means the pump cannot
    deliver the flow even at full stroke.

    Example (hand calculation): Vp 100 cm^3 at 2000 rpm, eta_v 0.95 gives 190 L/min at full stroke;
    95 L/min -> x = 95 / 190 = 0.5.

    >>> round(stroke_driving(95 / 60000, 100e-6, 2000 / 60, 0.95), 6)
    0.5
    """
    q = _non_negative("flow", flow)
    return q / (_positive("pump displacement", displacement) * _positive("pump shaft speed", shaft_speed)
                * _efficiency("pump volumetric efficiency", eta_v))


def stroke_overrunning(flow: float, displacement: float, shaft_speed: float, eta_v: float) -> float:
    """Pump displacement setting that takes the motors' ``flow`` back while the load overruns (the
    pump works as a motor and leaks on the way in): ``x = q * eta_v / (Vp * n_p)``.

    Example (hand calculation): the motors return 95 L/min to Vp 100 cm^3 at 2000 rpm, eta_v 0.95
    -> x = 95 * 0.95 / 200 = 0.45125.
    """
    q = _non_negative("flow", flow)
    return q * _efficiency("pump volumetric efficiency", eta_v) / (
        _positive("pump displacement", displacement) * _positive("pump shaft speed", shaft_speed))


def pump_torque_driving(stroke: float, displacement: float, dp: float, eta_hm: float) -> float:
    """Torque the pump takes at its shaft: ``T_p = x * Vp * (p_H - p_L) / (2*pi*eta_hm)`` (N*m).

    Example (hand calculation): x 0.5, Vp 100 cm^3, p_H - p_L = 300 - 25 = 275 bar, eta_hm 0.92
    -> 0.5 * 100e-6 * 275e5 / (2*pi*0.92) = 237.87 N*m.

    >>> round(pump_torque_driving(0.5, 100e-6, 275e5, 0.92), 2)
    237.87
    """
    return (_non_negative("stroke", stroke) * _positive("pump displacement", displacement)
            * _non_negative("pressure differential", dp) / (TWO_PI * _efficiency("pump hydro-mechanical efficiency",
                                                                                 eta_hm)))


def pump_torque_overrunning(stroke: float, displacement: float, dp: float, eta_hm: float) -> float:
    """Torque the pump, driven as a motor by the overrunning load, gives back to its shaft (negative:
    it drives the prime mover): ``T_p = -x * Vp * (p_H - p_L) * eta_hm / (2*pi)`` (N*m).

    Example (hand calculation): x 0.45125, Vp 100 cm^3, 275 bar, eta_hm 0.92
    -> -0.45125 * 100e-6 * 275e5 * 0.92 / (2*pi) = -181.70 N*m.
    """
    return -(_non_negative("stroke", stroke) * _positive("pump displacement", displacement)
             * _non_negative("pressure differential", dp) * _efficiency("pump hydro-mechanical efficiency", eta_hm)
             / TWO_PI)


def leakage(displacement: float, speed: float, eta_v: float) -> float:
    """Leakage of a pump or motor that the charge pump must make up: ``q_leak = V * n * (1 - eta_v)``.

    Example (hand calculation): pump 100 cm^3 at 2000 rpm, eta_v 0.95 -> 100*2000*0.05 = 10 L/min;
    motor 160 cm^3 at 1100 rpm, eta_v 0.96 -> 160*1100*0.04 = 7.04 L/min.
    """
    return (_non_negative("displacement", displacement) * _non_negative("speed", speed)
            * (1.0 - _efficiency("volumetric efficiency", eta_v)))


def charge_power(flow: float, pressure: float, eta_t: float) -> float:
    """Power the charge pump takes: ``P_c = q_c * p_c / eta_t`` (W).

    Example (hand calculation): 30 L/min at 25 bar, eta_t 0.80 -> 5e-4 * 25e5 / 0.8 = 1562.5 W.
    """
    return (_non_negative("charge flow", flow) * _non_negative("charge pressure", pressure)
            / _efficiency("charge pump overall efficiency", eta_t))
