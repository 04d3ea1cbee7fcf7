import pytest
from hypothesis import given
from hypothesis import strategies as st

from specgen.calc import fluid


def test_iso_vg_grade_list():
    # ISO 3448: 18 grades from VG 2 to VG 1500.
    assert fluid.ISO_VG_GRADES == (2, 3, 5, 7, 10, 15, 22, 32, 46, 68, 100, 150, 220, 320, 460, 680, 1000, 1500)


@pytest.mark.parametrize(
    ("grade", "midpoint_mm2s"),
    # ISO 3448 table: mid-point viscosities; the low grades are not the grade number.
    [(2, 2.2), (3, 3.2), (5, 4.6), (7, 6.8), (10, 10.0), (46, 46.0), (1500, 1500.0)],
)
def test_iso_vg_midpoints(grade, midpoint_mm2s):
    assert fluid.iso_vg_midpoint_m2s(grade) == pytest.approx(midpoint_mm2s * 1e-6)


@pytest.mark.parametrize(
    ("grade", "low_mm2s", "high_mm2s"),
    # ISO 3448 table: limits of VG 2, VG 32 and VG 680.
    [(2, 1.98, 2.42), (32, 28.8, 35.2), (680, 612.0, 748.0)],
)
def test_iso_vg_limits(grade, low_mm2s, high_mm2s):
    low, high = fluid.iso_vg_limits_m2s(grade)
    assert low == pytest.approx(low_mm2s * 1e-6)
    assert high == pytest.approx(high_mm2s * 1e-6)


def test_unknown_grade_rejected():
    with pytest.raises(ValueError, match="not an ISO 3448 grade"):
        fluid.iso_vg_midpoint_m2s(40)


# ISO 2909 / ASTM D2270 table, H column (40 degC viscosity of the VI-100
# reference oil, mm^2/s) at the two rows around each 100 degC value.
_H_ROWS = {
    15: ((3.4, 14.93), (3.5, 15.66)),
    32: ((5.3, 31.40), (5.4, 32.37)),
    46: ((6.7, 45.33), (6.8, 46.44)),
    68: ((8.7, 67.64), (8.8, 68.79)),
    100: ((11.3, 98.97), (11.4, 100.2)),
}


@pytest.mark.parametrize("grade", sorted(_H_ROWS))
def test_typical_100c_value_gives_viscosity_index_100(grade):
    # ISO 2909: VI = 100*(L - U)/(L - H) equals 100 exactly when U = H(nu_100).
    # Interpolating the standard's H rows at our 100 degC value must return the
    # grade's 40 degC mid-point U (within the 0.01 mm^2/s rounding of the table value).
    nu100 = fluid.typical_viscosity_100c_m2s(grade) * 1e6
    (y0, h0), (y1, h1) = _H_ROWS[grade]
    assert y0 <= nu100 <= y1
    h = h0 + (h1 - h0) * (nu100 - y0) / (y1 - y0)
    assert h == pytest.approx(fluid.iso_vg_midpoint_m2s(grade) * 1e6, rel=2e-3)


@pytest.mark.parametrize("grade", [2, 3, 5])
def test_no_typical_100c_value_below_two_mm2s(grade):
    # ISO 2909 defines no viscosity index for nu_100 below 2 mm^2/s.
    with pytest.raises(ValueError, match="no typical 100 degC viscosity"):
        fluid.typical_viscosity_100c_m2s(grade)


def test_walther_fit_constants_and_interpolation():
    # Hand calculation, ASTM D341 through 46 mm^2/s at 313.15 K and 6.76 at 373.15 K:
    # W1 = log10(log10(46.7)) = 0.222539, W2 = log10(log10(7.46)) = -0.059116,
    # B = (W1 - W2)/(log10 373.15 - log10 313.15) = 0.281655/0.076131 = 3.69960,
    # A = W1 + B*2.495752 = 9.45583; at 333.15 K: 10**10**(A - B*2.522640) - 0.7 = 20.56 mm^2/s.
    fit = fluid.walther_fit(46e-6, 313.15, 6.76e-6, 373.15)
    assert fit.b == pytest.approx(3.69960, rel=1e-5)
    assert fit.a == pytest.approx(9.45583, rel=1e-5)
    assert fit.kinematic_viscosity_m2s(333.15) == pytest.approx(20.56e-6, rel=1e-3)


def test_walther_reproduces_its_two_points():
    # ASTM D341: the fitted line passes through both defining points.
    fit = fluid.walther_fit(68e-6, 313.15, 8.73e-6, 373.15)
    assert fit.kinematic_viscosity_m2s(313.15) == pytest.approx(68e-6, rel=1e-9)
    assert fit.kinematic_viscosity_m2s(373.15) == pytest.approx(8.73e-6, rel=1e-9)


def test_iso_vg_46_at_60c_is_about_20_mm2s():
    # From memory: a VI-100 ISO VG 46 mineral oil runs at roughly 20 mm^2/s at 60 degC.
    assert fluid.iso_vg_viscosity_m2s(46, fluid.celsius_to_kelvin(60.0)) == pytest.approx(20e-6, rel=0.05)


@given(t_low=st.floats(min_value=263.15, max_value=400.0), dt=st.floats(min_value=0.5, max_value=40.0))
def test_viscosity_falls_with_temperature(t_low, dt):
    # Physics of mineral oils (ASTM D341 slope B > 0): hotter oil is thinner.
    hot = fluid.iso_vg_viscosity_m2s(32, t_low + dt)
    cold = fluid.iso_vg_viscosity_m2s(32, t_low)
    assert hot < cold


def test_walther_rejects_equal_temperatures_and_rising_viscosity():
    with pytest.raises(ValueError, match="different temperatures"):
        fluid.walther_fit(46e-6, 313.15, 6.8e-6, 313.15)
    with pytest.raises(ValueError, match="fall as temperature rises"):
        fluid.walther_fit(6.8e-6, 313.15, 46e-6, 373.15)


@pytest.mark.parametrize("bad", [0.0, -10.0])
def test_rejects_non_absolute_temperature(bad):
    with pytest.raises(ValueError, match="kelvin"):
        fluid.walther_viscosity_m2s(46e-6, 313.15, 6.8e-6, 373.15, bad)


def test_celsius_to_kelvin():
    # ISO 80000-5: T = t + 273.15.
    assert fluid.celsius_to_kelvin(40.0) == pytest.approx(313.15)


def test_density_with_temperature():
    # Hand calculation: 870 / (1 + 6.5e-4*35) = 870 / 1.02275 = 850.648 kg/m^3.
    assert fluid.density_at_temperature(870.0, 288.15, 323.15) == pytest.approx(850.648, rel=1e-6)
    # Hand calculation: no expansion, no change.
    assert fluid.density_at_temperature(870.0, 288.15, 353.15, 0.0) == 870.0


def test_density_rejects_negative_expansion():
    with pytest.raises(ValueError, match="expansion coefficient"):
        fluid.density_at_temperature(870.0, 288.15, 323.15, -1e-4)
