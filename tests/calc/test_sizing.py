import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from specgen.calc import sizing


def test_minimum_displacement_hand_and_practical_units():
    # Hand calculation: 2*pi*1500 / (240e5*0.92) = 4.26847e-4 m^3/rev.
    vg = sizing.minimum_displacement(1500.0, 250e5, 10e5, 0.92)
    assert vg == pytest.approx(4.26847e-4, rel=1e-5)
    # Textbook practical form T[N*m] = Vg[cm^3]*dp[bar]*eta_hm/62.83 (62.83 = 20*pi):
    # Vg = 62.83*1500/(240*0.92) = 426.84 cm^3.
    assert vg * 1e6 == pytest.approx(62.83 * 1500 / (240 * 0.92), rel=1e-4)


def test_minimum_displacement_rejects_outlet_at_or_above_target():
    with pytest.raises(ValueError, match="exceed the outlet pressure"):
        sizing.minimum_displacement(100.0, 10e5, 10e5, 0.9)


@pytest.mark.parametrize("eta", [0.0, 1.2, -0.5])
def test_minimum_displacement_rejects_bad_efficiency(eta):
    with pytest.raises(ValueError, match="efficiency"):
        sizing.minimum_displacement(100.0, 200e5, 0.0, eta)


def test_flow_demand_practical_units():
    # Textbook practical form n[rpm] = q[L/min]*1000*eta_v/Vg[cm^3]
    # -> q = 120 rpm * 426.8 cm^3 / (1000*0.95) = 53.912 L/min.
    q = sizing.flow_demand(426.8e-6, 2.0, 0.95)
    assert q * 60_000 == pytest.approx(120 * 426.8 / (1000 * 0.95), rel=1e-9)


def test_displacement_window():
    # Hand calculation: max = 1e-3*0.95/2 = 4.75e-4 m^3/rev above min 4.268e-4 -> feasible.
    window = sizing.displacement_window(1500.0, 2.0, 250e5, 10e5, 0.92, 0.95, available_flow=1e-3)
    assert window.maximum == pytest.approx(4.75e-4)
    assert window.feasible
    # Hand calculation: at 3 rev/s max = 3.1667e-4 < 4.268e-4 -> not feasible.
    tight = sizing.displacement_window(1500.0, 3.0, 250e5, 10e5, 0.92, 0.95, available_flow=1e-3)
    assert not tight.feasible


# ISO 3: rounded values, as published.
def test_series_values():
    assert sizing.R5 == (1.00, 1.60, 2.50, 4.00, 6.30)
    assert sizing.R10 == (1.00, 1.25, 1.60, 2.00, 2.50, 3.15, 4.00, 5.00, 6.30, 8.00)
    assert sizing.R20[1::2] == (1.12, 1.40, 1.80, 2.24, 2.80, 3.55, 4.50, 5.60, 7.10, 9.00)


@pytest.mark.parametrize(("name", "coarser"), [("R10", "R5"), ("R20", "R10"), ("R40", "R20")])
def test_each_series_contains_every_other_term_of_the_next(name, coarser):
    # ISO 3 construction: R(N/2) is every second term of RN.
    assert sizing.PREFERRED_SERIES[name][::2] == sizing.PREFERRED_SERIES[coarser]


@pytest.mark.parametrize("name", ["R5", "R10", "R20", "R40"])
def test_rounded_values_close_to_theoretical(name):
    # ISO 3: term k of RN is 10^(k/N) rounded; the rounded values stay within
    # about +1.3 % / -1.1 % of the theoretical ones (from memory).
    series = sizing.PREFERRED_SERIES[name]
    n = len(series)
    assert n == int(name[1:])
    for k, value in enumerate(series):
        assert abs(value / 10 ** (k / n) - 1.0) < 0.013


@pytest.mark.parametrize(
    ("value", "series", "expected"),
    [
        (426.8e-6, "R10", 500e-6),  # hand: 4.268 -> 5.00 in R10
        (426.8e-6, "R20", 450e-6),  # hand: 4.268 -> 4.50 in R20
        (426.8e-6, "R40", 450e-6),  # hand: 4.268 -> 4.50 (4.25 is smaller)
        (160e-6, "R10", 160e-6),  # hand: equal to a member returns that member
        (8.5e-5, "R10", 1.0e-4),  # hand: past 8.00 spans into the next decade
        (9.6, "R40", 10.0),  # hand: past 9.50 spans into the next decade
        (0.0123, "R5", 0.016),  # hand: 1.23 -> 1.60 in R5
    ],
)
def test_next_size_up_examples(value, series, expected):
    assert sizing.next_size_up(value, series) == pytest.approx(expected, rel=1e-12)


def test_next_size_up_custom_mantissas():
    # Hand calculation: 3.3e-4 among mantissas (1, 2, 5) -> 5e-4.
    assert sizing.next_size_up(3.3e-4, [1.0, 2.0, 5.0]) == pytest.approx(5e-4)
    with pytest.raises(ValueError, match="one decade"):
        sizing.next_size_up(1.0, [0.5, 2.0])
    with pytest.raises(ValueError, match="unknown preferred-number series"):
        sizing.next_size_up(1.0, "R80")


@given(
    value=st.floats(min_value=1e-9, max_value=1e6, allow_nan=False, allow_infinity=False),
    name=st.sampled_from(["R5", "R10", "R20", "R40"]),
)
def test_next_size_up_is_smallest_member_not_below(value, name):
    # ISO 3 series repeat each decade; the answer must be a member, >= value,
    # and the member just below it must be < value.
    result = sizing.next_size_up(value, name)
    series = sizing.PREFERRED_SERIES[name]
    exponent = math.floor(math.log10(result) + 1e-12)
    mantissa = result / 10**exponent
    index = min(range(len(series)), key=lambda i: abs(series[i] - mantissa))
    assert mantissa == pytest.approx(series[index], rel=1e-9)
    assert result >= value * (1 - 1e-9)
    below = series[index - 1] * 10**exponent if index > 0 else series[-1] * 10 ** (exponent - 1)
    assert below < value


def test_next_stocked_size():
    stock = [500e-6, 250e-6, 400e-6]
    # Hand: smallest stocked size at least 426.8 cm^3 is 500 cm^3, in any list order.
    assert sizing.next_stocked_size(426.8e-6, stock) == 500e-6
    # Hand: an exact match is accepted.
    assert sizing.next_stocked_size(400e-6, stock) == 400e-6
    # Documented choice: None when nothing in stock is large enough.
    assert sizing.next_stocked_size(600e-6, stock) is None


def test_next_stocked_size_rejects_bad_lists():
    with pytest.raises(ValueError, match="empty"):
        sizing.next_stocked_size(1.0, [])
    with pytest.raises(ValueError, match="stocked size"):
        sizing.next_stocked_size(1.0, [2.0, -1.0])
