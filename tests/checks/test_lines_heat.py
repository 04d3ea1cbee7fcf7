"""Line velocity and heat load checks at their boundaries.

Line velocity v = q / A, A = pi*d^2/4 (continuity). Rule-of-thumb upper limits
(common practice, no source): pressure 6 m/s, return 3 m/s, suction 1.2 m/s; warn above
the limit, pressure and return lines fail above 1.5 times it (9 and 4.5 m/s), suction never fails.
Fixture helpers.minimal(): motor flow q = Vg * n / eta_v = 100e-6 * (500/60) / 0.95 = 8.7719e-4 m^3/s
(52.63 L/min); the pump draws its geometric flow Vp * n = 40e-6 * 25 = 1.0e-3 m^3/s (60 L/min).
Heat load: energy balance, heat = pump input - useful shaft power (energy balance, first law); default warn
margin 10 % (specgen/intake/defaults.py).
"""

import pytest

from helpers import minimal, spec_check, spec_checks

FLUID = {"iso_vg": 46, "temperature": "50 degC", "density": "870 kg/m^3"}


def with_line(kind: str, bore: str) -> dict:
    d = minimal()
    d["fluid"] = dict(FLUID)
    d["drives"]["hoist"]["lines"] = {kind: {"inner_diameter": bore, "length": "2 m"}}
    return d


def velocity_check(kind: str, bore: str):
    d = with_line(kind, bore)
    return next(c for c in spec_checks(d, "line_velocity", drive="hoist", duty="lift")
                if c.title.lower().startswith(kind))


@pytest.mark.parametrize("kind, bore, v, limit, status", [
    # v = 8.7719e-4 / (pi * d^2 / 4)  (hand calculation)
    ("pressure", "20 mm", 2.7922, 6.0, "pass"),     # A = 3.1416e-4 m^2
    ("pressure", "13.67 mm", 5.9768, 6.0, "pass"),  # A = 1.46767e-4 m^2: just under 6
    ("pressure", "13.62 mm", 6.0208, 6.0, "warn"),  # A = 1.45695e-4 m^2: just over 6
    ("pressure", "11.15 mm", 8.9837, 6.0, "warn"),  # A = 9.7643e-5 m^2: under 1.5 * 6 = 9
    ("pressure", "11.13 mm", 9.0160, 6.0, "fail"),  # A = 9.7293e-5 m^2: over 9
    ("return", "19.33 mm", 2.9891, 3.0, "pass"),    # A = 2.9346e-4 m^2
    ("return", "19.26 mm", 3.0109, 3.0, "warn"),    # A = 2.9134e-4 m^2
    ("return", "15.77 mm", 4.4910, 3.0, "warn"),    # A = 1.95324e-4 m^2: under 1.5 * 3 = 4.5
    ("return", "15.74 mm", 4.5081, 3.0, "fail"),    # A = 1.94581e-4 m^2: over 4.5
])
def test_drive_line_velocity_boundaries(kind, bore, v, limit, status):
    c = velocity_check(kind, bore)
    assert c.status == status
    assert c.value == pytest.approx(v, abs=1e-4) and c.limit == pytest.approx(limit)


@pytest.mark.parametrize("bore, v, status", [
    # v = 1.0e-3 / (pi * d^2 / 4): the pump draws its geometric flow (hand calculation)
    ("32.8 mm", 1.1835, "pass"),  # A = 8.4496e-4 m^2: under 1.2
    ("32.4 mm", 1.2129, "warn"),  # A = 8.2448e-4 m^2: over 1.2
    ("10 mm", 12.7324, "warn"),   # ten times the limit: a suction line only warns
])
def test_suction_line_velocity_boundaries(bore, v, status):
    d = minimal()
    d["fluid"] = dict(FLUID)
    d["supplies"]["main"]["suction_line"] = {"inner_diameter": bore, "length": "1 m"}
    c = spec_check(d, "line_velocity", supply="main")
    assert c.status == status
    assert c.value == pytest.approx(v, abs=1e-4) and c.limit == pytest.approx(1.2)


def test_no_lines_no_velocity_check():
    assert spec_checks(minimal(), "line_velocity") == []


# ---------------------------------------------------------------- heat_load

@pytest.mark.parametrize("capacity, status", [
    # P_in = 57 L/min * 205.015 bar / 600 / 0.85 = 22.9134 kW (fixed pump, surplus at the working pressure);
    # P_shaft = 2*pi*(500/60)*286.5 = 15.0011 kW; heat = 7.9123 kW; margin = (cap - 7.9123)/cap (hand calc)
    ("12 kW", "pass"),      # 34.06 %
    ("8.81 kW", "pass"),    # 0.8977/8.81 = 10.19 %
    ("8.78 kW", "warn"),    # 0.8677/8.78 = 9.88 %
    ("7.92 kW", "warn"),    # 0.10 %
    ("7.91 kW", "fail"),    # -0.03 %: run continuously the oil overheats
])
def test_heat_load_boundaries(capacity, status):
    d = minimal()
    d["cooler"] = {"capacity": capacity}
    c = spec_check(d, "heat_load", mode="work")
    assert c.status == status
    assert c.value == pytest.approx(7912.3, abs=0.1)
    assert c.limit == pytest.approx(float(capacity.split()[0]) * 1e3)


def test_no_cooler_no_heat_check():
    assert spec_checks(minimal(), "heat_load") == []


# Oil temperature against its limit: margin (T_max - T) / (T_max - T_amb), warning band 5 K in the same
# fraction (checks/lines_heat.py, a choice: common practice, no source). Limit 80 degC, ambient 30 degC:
# reference 50 K, band 5 / 50 = 0.10 (hand calculation).
@pytest.mark.parametrize("oil_c, status", [
    (74.99, "pass"),  # 5.01 K below the limit
    (75.0, "pass"),   # exactly 5 K below: margin 0.10 is not inside the band
    (75.01, "warn"),  # 4.99 K below
    (79.99, "warn"),
    (80.0, "fail"),   # at the limit
    (85.0, "fail"),
])
def test_oil_temperature_boundaries(oil_c, status):
    from specgen.checks.lines_heat import oil_margin
    from specgen.checks.status import status as rule

    margin, band = oil_margin(273.15 + oil_c, 353.15, 303.15)
    assert band == pytest.approx(0.10)
    assert margin == pytest.approx((80.0 - oil_c) / 50.0)
    assert rule(margin, band) == status


def test_oil_temperature_ambient_at_the_limit_fails():
    from specgen.checks.lines_heat import oil_margin

    margin, _ = oil_margin(313.15, 313.15, 313.15)
    assert margin <= 0
