"""reached_speed at its pass / warn / fail boundaries, and pump_flow against a power-limited pump.

Rig: tests/resolve/test_load_sensing.py (hoist 60 L/min at 210 bar, slew 30 L/min at 90 bar, dp_LS
20 bar, pump 230 bar). Margin (checks/status.py): (flow offered - flow needed) / flow needed; warning
band thresholds.speed_margin_warn, 5 % by default. Flow sharing offers each drive q_i * q_avail / 90.
"""

import pytest

from helpers import spec_check
from resolve.test_load_sensing import L_MIN, rig


@pytest.mark.parametrize("q_max, margin, status", [
    # margin = q_max / 90 - 1 (hand calculation)
    ("95 L/min", 95 / 90 - 1, "pass"),    # 5.56 %
    ("94.6 L/min", 94.6 / 90 - 1, "pass"),  # 5.11 %
    ("94.4 L/min", 94.4 / 90 - 1, "warn"),  # 4.89 %
    ("90.1 L/min", 90.1 / 90 - 1, "warn"),  # 0.11 %
    ("90 L/min", 0.0, "fail"),            # at the limit: nothing in hand
    ("75 L/min", 75 / 90 - 1, "fail"),    # -16.7 %: 500 rpm of 600
])
def test_reached_speed_boundaries_flow_sharing(q_max, margin, status):
    c = spec_check(rig(q_max=q_max), "reached_speed", drive="hoist", mode="work")
    assert c.status == status
    assert c.margin == pytest.approx(margin, abs=1e-6)
    assert c.limit * 60 == pytest.approx(600.0)
    assert c.value * 60 == pytest.approx(min(600.0, 600.0 * (1 + margin)), rel=1e-6)


def test_reached_speed_pre_compensated_fails_only_the_highest():
    d = rig(q_max="75 L/min", valves="pre_compensated")
    slew = spec_check(d, "reached_speed", drive="slew", mode="work")
    hoist = spec_check(d, "reached_speed", drive="hoist", mode="work")
    # slew offered 75 for its 30: (75 - 30)/30 = 1.5, pass; hoist offered 45 of 60: -0.25, fail at 450 rpm
    assert (slew.status, slew.margin) == ("pass", pytest.approx(1.5))
    assert (hoist.status, hoist.margin) == ("fail", pytest.approx(-0.25))
    assert hoist.value * 60 == pytest.approx(450.0)
    assert "runs slow" in hoist.message


def test_reached_speed_not_on_other_supplies():
    from helpers import minimal, spec_checks
    assert spec_checks(minimal(), "reached_speed") == []


@pytest.mark.parametrize("limit, status", [
    # q_avail = P * 0.85 / 230e5; margin (q_avail - 90 L/min) / q_avail (pump_flow, hand calculation)
    ("50 kW", "pass"),   # 110.9 L/min -> full stroke 100: (100 - 90)/100 = 10 %
    ("42 kW", "warn"),   # 93.13 L/min: 3.1/93.13 = 3.4 %
    ("40 kW", "fail"),   # 88.70 L/min: -1.5 %
])
def test_pump_flow_against_the_power_limited_flow(limit, status):
    c = spec_check(rig(input_power_limit=limit), "pump_flow", supply="main", mode="work")
    assert c.status == status
    expected = min(100.0, float(limit.split()[0]) * 1e3 * 0.85 / 230e5 / L_MIN)
    assert c.limit / L_MIN == pytest.approx(expected, rel=1e-5)
