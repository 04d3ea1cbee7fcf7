"""The efficiencies a duty point is computed with: the motor's constant ones, or its maker's table read at
the duty point's pressure differential and speed (solved together, calc/efficiency_table.py).

Outside the table nothing is extrapolated: the constant efficiencies are used and a value records
where the duty point left the grid, which the efficiency_table check fails.
"""

from __future__ import annotations

from specgen.calc import efficiency_table as table
from specgen.intake.model import Drive, DutyPoint, Ratio, Supply
from specgen.resolve.limits import governing_setting, pressure_limit
from specgen.resolve.record import Record
from specgen.trace import Input, Value

SRC_TABLE = "maker's efficiency table, bilinear between grid points (scipy RegularGridInterpolator, linear)"


def _at(dp: float, n: float) -> str:
    return f"{dp / 1e5:.4g} bar, {n * 60:.4g} rpm"


def duty_efficiencies(rec: Record, drive: Drive, duty: DutyPoint, sup: Supply, torque: float, speed: float,
                      displacement: float, back_pressure: float) -> tuple[Ratio, Ratio, Ratio]:
    """(eta_v, eta_hm, eta_start) for this duty point; from the table where it covers the point.

    The pressure differential and the hydro-mechanical efficiency are solved together by fixed-point
    iteration; the starting efficiency is read at the drive's pressure limit (resolve/limits.py: the
    lowest of relief, compensator and port relief settings) less the back pressure, the breakaway
    torque's differential, before any return-line loss (no flow at standstill).
    Example: relief 250 bar, compensator 210 bar, return 5 bar: the starting row is read at 205 bar.
    """
    m = drive.motor
    consts = (m.volumetric_efficiency, m.hydromechanical_efficiency, m.starting_efficiency)
    t = m.efficiency_table
    if t is None:
        return consts
    overrun = duty.direction == "overrunning"
    grids = (t.pressures, t.speeds, t.volumetric, t.hydromechanical)
    solved = table.solve_differential(*grids, torque, displacement, speed, overrun)
    p = solved.point
    inputs = (Input("dp", "pressure differential", p.dp, "pressure"), Input("n", "motor speed", speed, "speed"))
    eta_v, eta_hm = consts[0], consts[1]
    if p.inside:
        note = f"from table at {_at(p.dp, speed)}" + ("" if solved.converged else
                                                       f"; not converged after {solved.iterations} iterations")
        for key, label, symbol, value in (("table_volumetric_efficiency", "Volumetric efficiency from the table",
                                           "eta_v", p.volumetric),
                                          ("table_hydromechanical_efficiency",
                                           "Hydro-mechanical efficiency from the table", "eta_hm", p.hydromechanical)):
            rec.put(Value(key, label, symbol, value, "ratio", f"{symbol} = table(dp, n)",
                          "read from the maker's table at the duty point; dp and eta_hm solved together"
                          f" ({solved.iterations} iterations)", inputs, SRC_TABLE, note=note))
        eta_v, eta_hm = Ratio(p.volumetric), Ratio(p.hydromechanical)
        if not solved.converged:
            rec.put(Value("table_not_converged", "Iterations without settling", "k", solved.iterations, "number",
                          "", "dp = 2*pi*T / (Vg * eta_hm(dp, n)) did not settle", inputs, SRC_TABLE, note=note))
    else:
        rec.put(Value("table_outside_at", "Pressure differential outside the maker's table", "dp", p.dp, "pressure",
                      "", "the duty point lies outside the table's grid: the constant efficiencies are used",
                      inputs, SRC_TABLE, note=f"outside the maker's table at {_at(p.dp, speed)}"))
    eta_st = consts[2]
    if t.starting is not None:
        limit = pressure_limit(drive, sup)
        dp_start = limit.value - back_pressure
        value = table.starting(t.pressures, t.starting, dp_start)
        start_in = (Input("dp_limit", f"pressure limit ({governing_setting(limit)}) less back pressure", dp_start,
                          "pressure"),)
        if value is None:
            rec.put(Value("table_starting_outside_at", "Breakaway differential outside the table's starting row",
                          "dp_limit", dp_start, "pressure", "", "the starting efficiency at this differential is not "
                          "in the table: the constant starting efficiency is used", start_in, SRC_TABLE,
                          note=f"outside the maker's starting row at {dp_start / 1e5:.4g} bar"))
        else:
            eta_st = Ratio(rec.put(Value("table_starting_efficiency", "Starting efficiency from the table",
                                         "eta_start", value, "ratio", "eta_start = table_start(dp_limit)",
                                         "the table's zero-speed row, linear between its pressures", start_in,
                                         SRC_TABLE, note=f"from table at {dp_start / 1e5:.4g} bar, 0 rpm")))
    return eta_v, eta_hm, eta_st
