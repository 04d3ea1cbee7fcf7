"""What belongs to a drive as a whole: the displacement it is computed at (given, or proposed from a
target pressure), and for a variable motor its available flow, top speed at the minimum stop and
torque/speed envelope at the drive's pressure limit (resolve/limits.py).

Pure: the model's SI floats in, traced Values out.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from specgen.calc import sizing as sizing_calc
from specgen.calc import variable
from specgen.resolve import limits
from specgen.resolve.record import Record, motor_eff
from specgen.results import DriveResult
from specgen.intake.model import Drive, Sizing, Supply
from specgen.trace import Input, Value, given, indexed

SRC_SIZING = "minimum displacement from the motor torque relation T = Vg*dp*eta_hm/(2*pi)"
SRC_SERIES = "ISO 3 (preferred numbers)"
SRC_STOCK = "parts file of stocked sizes"
SRC_FLOW = "motor speed-flow relation n = q*eta_v/Vg"
ENVELOPE_POINTS = 11


@dataclass(frozen=True)
class DriveSetup:
    """The displacement range duty points are computed with, and the drive's own values."""

    result: DriveResult
    vg_min: float
    vg_max: float
    proposed: bool  # True: the spec gave no displacement; vg_min == vg_max == the proposed size
    available_flow: float | None  # m^3/s, variable motors only
    minimum_by_duty: dict = field(default_factory=dict)  # duty id -> Value "minimum_displacement"


def setup_drive(drive: Drive, sup: Supply, motor_torques: dict[str, tuple[float, str]], p_out: float,
                q_pump: float, sizing: Sizing, starts: dict[str, float] | None = None) -> DriveSetup:
    """``motor_torques``: duty id -> (motor torque N*m, direction); ``p_out``: back pressure without line losses;
    ``starts``: duty id -> torque the motor must give from rest (N*m)."""
    m = drive.motor
    rec = Record()
    p_limit = rec.put(limits.pressure_limit(drive, sup))
    per_duty = {}
    proposed_size = proposed_from = None
    if m.target_pressure is not None:
        per_duty, proposed_size = _size(drive, rec, motor_torques, p_out, sizing, starts or {}, p_limit)
        if proposed_size is not None:
            proposed_from = "stocked" if sizing.stock is not None else sizing.series
    if m.displacement_given:
        lo, hi, proposed = m.displacement_min, m.displacement_max, False
    else:
        lo = hi = proposed_size if proposed_size is not None else rec.get("minimum_displacement")
        proposed = True
    q_avail = None
    envelope = ()
    if lo != hi:
        q_avail = _variable(drive, sup, rec, lo, q_pump)
    if lo != hi and p_limit > p_out:
        envelope = variable.torque_speed_envelope(
            lo, hi, q_avail, m.volumetric_efficiency.value, m.hydromechanical_efficiency.value, p_limit,
            p_out, m.rating.max_speed, points=ENVELOPE_POINTS)
    return DriveSetup(DriveResult(drive.id, rec.values, envelope, proposed_from), lo, hi, proposed, q_avail, per_duty)


def _size(drive: Drive, rec: Record, motor_torques: dict, p_out: float, sizing: Sizing, starts: dict,
          p_limit: float):
    m = drive.motor
    eta_hm = m.hydromechanical_efficiency
    p_t = Input("p_target", "target inlet pressure", m.target_pressure, "pressure")
    p_o = Input("p_out", "back pressure (before line losses)", p_out, "pressure")
    per_duty = {}
    for duty_id, (torque, direction) in motor_torques.items():
        if direction == "overrunning" or torque <= 0:
            continue  # braking needs less pressure than driving the same torque: it does not govern
        per_duty[duty_id] = Value(
            "minimum_displacement", "Smallest displacement for the target pressure", "Vg_min",
            sizing_calc.minimum_displacement(torque, m.target_pressure, p_out, eta_hm.value), "displacement",
            "Vg_min = 2*pi*T / ((p_target - p_out) * eta_hm)",
            "the displacement that gives this torque at the target pressure",
            (Input("T", "motor torque", torque, "torque"), p_t, p_o, motor_eff(drive.id, "hydromechanical", eta_hm)),
            SRC_SIZING)
        start = starts.get(duty_id)
        if start is not None and p_limit > p_out:
            eta_st = m.starting_efficiency
            at_start = sizing_calc.minimum_displacement(start, p_limit, p_out, eta_st.value)
            if at_start > per_duty[duty_id].value:
                per_duty[duty_id] = Value(
                    "minimum_displacement", "Smallest displacement to start the load from rest", "Vg_min",
                    at_start, "displacement", "Vg_min = 2*pi*T_need / ((p_limit - p_out) * eta_start)",
                    "the displacement that starts the load at the pressure limit (more than the target pressure "
                    "needs while running)",
                    (Input("T_need", "starting torque needed at motor", start, "torque"),
                     Input("p_limit", "pressure limit", p_limit, "pressure"), p_o,
                     motor_eff(drive.id, "starting", eta_st)), SRC_SIZING)
    if not per_duty:
        return per_duty, None
    governing = max(per_duty, key=lambda k: per_duty[k].value)
    vg = rec.put(Value("minimum_displacement", "Smallest displacement for every duty point", "Vg_min",
                       per_duty[governing].value, "displacement", "Vg_min = max(Vg_min,i)",
                       "the largest of the duty points' minimum displacements",
                       tuple(Input(indexed("Vg_min", k), f"at {k}", v.value, "displacement")
                             for k, v in per_duty.items()),
                       SRC_SIZING, note=f"governing duty point: {governing}"))
    vg_in = Input("Vg_min", "smallest displacement", vg, "displacement")
    if sizing.stock is not None:
        size = sizing_calc.next_stocked_size(vg, sizing.stock[m.kind])
        if size is not None:
            rec.put(Value("proposed_displacement", "Proposed displacement (stocked)", "Vg_prop", size, "displacement",
                          "Vg_prop = smallest stocked size >= Vg_min",
                          f"next {m.kind.replace('_', ' ')} size up in the parts file", (vg_in,), SRC_STOCK,
                          note=f"parts file {sizing.parts_file}"))
        return per_duty, size
    size = sizing_calc.next_size_up(vg, sizing.series)
    rec.put(Value("proposed_displacement", f"Proposed displacement ({sizing.series})", "Vg_prop", size, "displacement",
                  f"Vg_prop = next {sizing.series} number >= Vg_min",
                  f"next size up in the ISO 3 {sizing.series} preferred-number series", (vg_in,), SRC_SERIES))
    return per_duty, size


def _variable(drive: Drive, sup: Supply, rec: Record, vg_min: float, q_pump: float) -> float:
    m = drive.motor
    if drive.available_flow is not None:
        q = rec.put(given("available_flow", "Flow available to the motor", "q_avail", drive.available_flow, "flow"))
    else:
        q = rec.put(Value("available_flow", "Flow available to the motor", "q_avail", q_pump, "flow", "q_avail = q_p",
                          "the supply's whole pump delivery: the spec gives no valve limit for this drive",
                          (Input("q_p", "pump delivery", q_pump, "flow"),), "",
                          note="give available_flow for the drive's valve section if it meters less"))
    rec.put(Value("min_displacement_speed", "Speed at the minimum displacement", "n_max",
                  variable.max_speed_at_min_displacement(vg_min, q, m.volumetric_efficiency.value), "speed",
                  "n_max = q_avail * eta_v / Vg_min",
                  "the available flow through the smallest displacement: the highest speed the motor can reach",
                  (Input("q_avail", "available flow", q, "flow"),
                   motor_eff(drive.id, "volumetric", m.volumetric_efficiency),
                   Input("Vg_min", "minimum displacement", vg_min, "displacement")), SRC_FLOW,
                  note="over-centre: the same either side of zero" if m.over_centre else ""))
    return q
