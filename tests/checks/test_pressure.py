"""Pressure checks at their pass / warn / fail boundaries: pressure_margin, supply_pressure,
peak_pressure, continuous_pressure, outlet_pressure (per duty point and in series), case_pressure.

The fixture is helpers.minimal(): relief 250 bar, return 5 bar, a 100 cm^3 motor with eta_v 0.95,
eta_hm 0.9, eta_start 0.85, rated 280 bar continuous and 350 bar peak. Every expected number is a
hand calculation from the positive-displacement motor relations of fluid-power textbooks
(dp = 2*pi*T/(Vg*eta_hm), p_in = dp + p_out; overrunning: dp = 2*pi*T*eta_hm/Vg) and the
series-circuit relations (one flow, differentials add), shown beside it.
Default warn margin for pressure: 10 % (specgen/intake/defaults.py).
"""

import pytest

from helpers import minimal, spec_check, spec_checks


def with_torque(torque: str, **motor_rating) -> dict:
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = torque
    d["drives"]["hoist"]["motor"]["rating"].update(motor_rating)
    return d


def margin_check(d):
    return spec_check(d, "pressure_margin", drive="hoist", duty="lift")


# ---------------------------------------------------------------- pressure_margin

@pytest.mark.parametrize("torque, margin, status", [
    # dp = 2*pi*T/(Vg*eta_hm), p_in = dp + 5 bar, margin = (250 - p_in)/250
    # (motor relation, fluid-power textbook; hand calculation)
    ("286.5 N*m", 0.179941, "pass"),   # dp = 2*pi*286.5/(100e-6*0.9) = 200.015 bar; (250-205.015)/250 = 17.99 %
    ("314.77 N*m", 0.100996, "pass"),  # dp = 2*pi*314.77/9e-5 = 219.751 bar; (250-224.751)/250 = 10.10 %
    ("315.49 N*m", 0.098986, "warn"),  # dp = 2*pi*315.49/9e-5 = 220.254 bar; (250-225.254)/250 = 9.90 %
    ("350.58 N*m", 0.000996, "warn"),  # dp = 2*pi*350.58/9e-5 = 244.751 bar; (250-249.751)/250 = 0.10 %
    ("351.29 N*m", -0.000987, "fail"),  # dp = 2*pi*351.29/9e-5 = 245.247 bar; (250-250.247)/250 = -0.10 %
    ("500 N*m", -0.416264, "fail"),    # dp = 2*pi*500/9e-5 = 349.066 bar; (250-354.066)/250 = -41.626 %
])
def test_pressure_margin_boundaries(torque, margin, status):
    c = margin_check(with_torque(torque))
    assert c.status == status
    assert c.value == pytest.approx(margin, abs=2e-6)
    assert c.limit == pytest.approx(0.10)  # default warn margin, specgen/intake/defaults.py


def test_pressure_margin_exactly_at_the_relief_setting_fails():
    # no torque, back pressure 250 bar: p_in = 0 + 250 bar = the relief setting exactly; margin 0 fails
    d = with_torque("0 N*m")
    d["drives"]["hoist"]["back_pressure"] = "250 bar"
    c = margin_check(d)
    assert c.status == "fail" and c.value == 0.0


def test_pressure_margin_reads_the_compensator_setting_and_the_spec_threshold():
    d = minimal()
    d["supplies"]["main"]["pump"].update({"control": "pressure_compensated", "compensator_setting": "227 bar"})
    # p_in = 205.015 bar (above); margin = (227 - 205.015)/227 = 9.685 %: warn (against relief 250 bar it would pass)
    c = margin_check(d)
    assert (c.status, c.value) == ("warn", pytest.approx(0.096851, abs=2e-6))
    d = minimal()
    d["thresholds"] = {"pressure_margin_warn": 0.2}
    # margin 17.99 % (above) is under the spec's 20 % warn margin
    c = margin_check(d)
    assert (c.status, c.limit) == ("warn", pytest.approx(0.2))


# ---------------------------------------------------------------- supply_pressure (series)

def series(hoist_torque: str) -> dict:
    """hoist then feed in series on one supply; feed (100 cm^3, eta_hm 0.9) at 150 N*m."""
    d = with_torque(hoist_torque)
    d["supplies"]["main"]["circuit"] = "series"
    d["drives"]["feed"] = {"supply": "main", "motor": {
        "kind": "axial_piston", "displacement": "100 cm^3",
        "efficiency": {"volumetric": 0.95, "hydromechanical": 0.9, "starting": 0.85},
        "rating": {"continuous_pressure": "280 bar", "peak_pressure": "350 bar", "max_speed": "3000 rpm"}},
        "duty_points": {"run": {"torque": "150 N*m", "speed": "500 rpm"}}}
    d["modes"]["work"]["drives"]["feed"] = "run"
    return d


@pytest.mark.parametrize("torque, margin, status", [
    # series: p_s = p_return + dp_hoist + dp_feed (series circuit: differentials add);
    # dp_feed = 2*pi*150/(100e-6*0.9) = 104.720 bar
    # margin = (250 - p_s)/250 (hand calculation)
    ("150 N*m", 0.142240, "pass"),     # p_s = 5 + 104.720 + 104.720 = 214.440 bar; (250-214.440)/250 = 14.22 %
    ("164.77 N*m", 0.100996, "pass"),  # dp_h = 2*pi*164.77/9e-5 = 115.031 bar; p_s = 224.751 bar; 10.10 %
    ("165.49 N*m", 0.098986, "warn"),  # dp_h = 115.534 bar; p_s = 225.254 bar; 9.90 %
    ("200.58 N*m", 0.000996, "warn"),  # dp_h = 140.031 bar; p_s = 249.751 bar; 0.10 %
    ("201.29 N*m", -0.000987, "fail"),  # dp_h = 140.527 bar; p_s = 250.247 bar; -0.10 %
])
def test_supply_pressure_in_series_boundaries(torque, margin, status):
    c = spec_check(series(torque), "supply_pressure", supply="main", mode="work")
    assert c.status == status
    assert c.value == pytest.approx(margin, abs=2e-6)
    assert c.limit == pytest.approx(0.10)


def test_supply_pressure_is_only_for_series_or_lines():
    # parallel without lines: pressure_margin per duty point says it all
    d = series("150 N*m")
    d["supplies"]["main"]["circuit"] = "parallel"
    assert spec_checks(d, "supply_pressure") == []


# ---------------------------------------------------------------- peak_pressure

@pytest.mark.parametrize("peak, status", [
    ("350 bar", "pass"),    # relief 250 bar well within 350 bar
    ("250.1 bar", "pass"),  # 250 < 250.1
    ("249.9 bar", "fail"),  # 250 > 249.9: the relief lets a spike past the rating
    ("200 bar", "fail"),
])
def test_peak_pressure_boundaries(peak, status):
    c = spec_check(with_torque("286.5 N*m", peak_pressure=peak), "peak_pressure", drive="hoist")
    assert c.status == status
    assert c.value == pytest.approx(250e5) and c.limit == pytest.approx(float(peak.split()[0]) * 1e5)


def test_peak_pressure_equal_to_relief_fails():
    assert spec_check(with_torque("286.5 N*m", peak_pressure="250 bar"), "peak_pressure").status == "fail"


def test_peak_pressure_without_rating_warns():
    d = minimal()
    del d["drives"]["hoist"]["motor"]["rating"]["peak_pressure"]
    c = spec_check(d, "peak_pressure", drive="hoist")
    assert (c.status, c.value, c.limit) == ("warn", None, None)


# ---------------------------------------------------------------- continuous_pressure

@pytest.mark.parametrize("rating, status", [
    # p_in = 2*pi*286.5/(100e-6*0.9) + 5 bar = 200.015 + 5 = 205.015 bar
    # (motor relation, fluid-power textbook; hand calculation)
    ("280 bar", "pass"),
    ("205.05 bar", "pass"),  # 205.015 < 205.05
    ("204.98 bar", "fail"),  # 205.015 > 204.98
    ("150 bar", "fail"),
])
def test_continuous_pressure_driving_boundaries(rating, status):
    c = spec_check(with_torque("286.5 N*m", continuous_pressure=rating), "continuous_pressure",
                   drive="hoist", duty="lift")
    assert c.status == status
    assert c.value / 1e5 == pytest.approx(205.0147, abs=1e-3)


@pytest.mark.parametrize("rating, status", [
    # overrunning: braking dp = 2*pi*T*eta_hm/Vg = 2*pi*286.5*0.9/100e-6 = 162.012 bar; held at the outlet
    # p_hold = 162.012 + 5 = 167.012 bar (motor acting as a pump, fluid-power textbook; hand calculation)
    ("167.05 bar", "pass"),
    ("166.97 bar", "fail"),
])
def test_continuous_pressure_overrunning_uses_the_held_pressure(rating, status):
    d = with_torque("286.5 N*m", continuous_pressure=rating)
    d["drives"]["hoist"]["duty_points"]["lift"]["direction"] = "overrunning"
    d["drives"]["hoist"]["load_holding"] = "counterbalance_valve"
    c = spec_check(d, "continuous_pressure", drive="hoist", duty="lift")
    assert c.status == status
    assert c.value / 1e5 == pytest.approx(167.0119, abs=1e-3)


def test_continuous_pressure_exactly_at_rating_fails():
    # no torque, back pressure 205 bar: p_in = 205 bar exactly, the rating
    d = with_torque("0 N*m", continuous_pressure="205 bar")
    d["drives"]["hoist"]["back_pressure"] = "205 bar"
    assert spec_check(d, "continuous_pressure", drive="hoist", duty="lift").status == "fail"


# ---------------------------------------------------------------- outlet_pressure

@pytest.mark.parametrize("rating, status", [
    ("30 bar", "pass"),    # back pressure = return 5 bar
    ("5.1 bar", "pass"),
    ("4.9 bar", "fail"),   # 5 > 4.9
])
def test_outlet_pressure_per_duty_point(rating, status):
    c = spec_check(with_torque("286.5 N*m", max_outlet_pressure=rating), "outlet_pressure", drive="hoist",
                   duty="lift", mode=None)
    assert c.status == status
    assert (c.value, c.limit) == (pytest.approx(5e5), pytest.approx(float(rating.split()[0]) * 1e5))


def test_outlet_pressure_per_duty_point_takes_the_drive_back_pressure():
    d = with_torque("286.5 N*m", max_outlet_pressure="10 bar")
    d["drives"]["hoist"]["back_pressure"] = "12 bar"  # 12 > 10
    c = spec_check(d, "outlet_pressure", drive="hoist", duty="lift", mode=None)
    assert c.status == "fail" and c.value == pytest.approx(12e5)


def test_outlet_pressure_exactly_at_rating_fails():
    c = spec_check(with_torque("286.5 N*m", max_outlet_pressure="5 bar"), "outlet_pressure", drive="hoist",
                   duty="lift", mode=None)
    assert c.status == "fail"


@pytest.mark.parametrize("rating, status", [
    # in series hoist's outlet is feed's inlet: 5 bar + dp_feed = 5 + 2*pi*150/(100e-6*0.9)
    # = 5 + 104.720 = 109.720 bar (series circuit; hand calculation)
    ("109.75 bar", "pass"),
    ("109.69 bar", "fail"),
])
def test_outlet_pressure_in_series(rating, status):
    d = series("150 N*m")
    d["drives"]["hoist"]["motor"]["rating"]["max_outlet_pressure"] = rating
    c = spec_check(d, "outlet_pressure", drive="hoist", supply="main", mode="work")
    assert c.status == status
    assert c.value / 1e5 == pytest.approx(109.7198, abs=1e-3)
    # the per-duty check sees only the return pressure, 5 bar: within either rating
    assert spec_check(d, "outlet_pressure", drive="hoist", mode=None).status == "pass"


# ---------------------------------------------------------------- case_pressure

def case(case_pressure=None, rating=None, drain=True) -> dict:
    d = minimal()
    d["drives"]["hoist"]["motor"]["case_drain"] = drain
    if rating:
        d["drives"]["hoist"]["motor"]["rating"]["max_case_pressure"] = rating
    if case_pressure:
        d["drives"]["hoist"]["case_pressure"] = case_pressure
    return d


@pytest.mark.parametrize("p_case, status", [
    ("1 bar", "pass"),
    ("2.9 bar", "pass"),  # 2.9 < 3
    ("3.1 bar", "fail"),  # 3.1 > 3
])
def test_case_pressure_boundaries(p_case, status):
    c = spec_check(case(p_case, "3 bar"), "case_pressure", drive="hoist")
    assert c.status == status
    assert (c.value, c.limit) == (pytest.approx(float(p_case.split()[0]) * 1e5), pytest.approx(3e5))


def test_case_pressure_exactly_at_rating_fails():
    assert spec_check(case("3 bar", "3 bar"), "case_pressure", drive="hoist").status == "fail"


def test_case_pressure_missing_figures_warn_and_no_drain_no_check():
    assert spec_check(case("1 bar", None), "case_pressure", drive="hoist").status == "warn"
    assert spec_check(case(None, "3 bar"), "case_pressure", drive="hoist").status == "warn"
    assert spec_checks(case("5 bar", "3 bar", drain=False), "case_pressure") == []


# ---------------------------------------------------------------- the pressure-line loss counts

@pytest.mark.parametrize("length, margin, status", [
    # ISO VG 220 at 40 degC: nu = 220 mm^2/s (ISO 3448), rho 870 kg/m^3, mu = 0.19140 Pa*s; q = 8.7719e-4 m^3/s
    # in a 12 mm bore: v = 7.756 m/s, Re = 7.756*0.012/220e-6 = 423, laminar; Hagen-Poiseuille (fluid
    # mechanics textbook) dp = 128*mu*L*q/(pi*d^4) = 128*0.1914*L*8.7719e-4/(pi*2.0736e-8) = 3.2989 bar per m.
    # p_supply = 205.0147 + dp_line; margin = (250 - p_supply)/250 (hand calculation)
    ("6.0 m", 0.100767, "pass"),  # dp_line = 19.794 bar; p_supply = 224.808 bar; 10.08 %
    ("6.1 m", 0.099447, "warn"),  # dp_line = 20.123 bar; p_supply = 225.138 bar; 9.94 % (17.99 % without it)
])
def test_pressure_line_loss_enters_both_margins(length, margin, status):
    d = minimal()
    d["fluid"] = {"iso_vg": 220, "temperature": "40 degC", "density": "870 kg/m^3"}
    d["drives"]["hoist"]["lines"] = {"pressure": {"inner_diameter": "12 mm", "length": length}}
    for c in (margin_check(d), spec_check(d, "supply_pressure", supply="main", mode="work")):
        assert c.status == status
        assert c.value == pytest.approx(margin, abs=2e-6)
