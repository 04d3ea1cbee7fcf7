"""intermittent_share: time above the continuous rating over a duty cycle against the motor's allowance.

The minimal rig's lift needs 205 bar at the inlet (hand calculation: dp = 2*pi*286.5 N*m /
(100 cm^3 * 0.9) = 200.0 bar, plus 5 bar return), above a 200 bar continuous rating; the cycle of
100 s runs it for t s, so the share above is t/100 (time average over the cycle, hand calculation).
Margin (s_allowed - s_above)/s_allowed, warning band 0.10 of the allowance (checks/intermittent.py).
"""

import pytest

from helpers import minimal, spec_check, spec_checks


def rig(seconds: float, share: str | None = "20 %") -> dict:
    d = minimal()
    rating = d["drives"]["hoist"]["motor"]["rating"]
    rating.update({"continuous_pressure": "200 bar", "intermittent_pressure": "230 bar"})
    if share is not None:
        rating["intermittent_share"] = share
    d["drives"]["hoist"]["duty_points"]["lift"]["duration"] = "intermittent"
    d["duty_cycles"] = {"lifts": {"period": "100 s", "steps": [{"mode": "work", "duration": f"{seconds} s"}]}}
    return d


@pytest.mark.parametrize("seconds, verdict, margin", [
    (17, "pass", 0.15),    # (0.20 - 0.17)/0.20 = 0.15, outside the 0.10 band
    (18.5, "warn", 0.075),  # (0.20 - 0.185)/0.20 = 0.075, inside the band
    (20, "fail", 0.0),      # at the allowance: the one status rule counts the limit as crossed
    (21, "fail", -0.05),    # (0.20 - 0.21)/0.20 = -0.05
])
def test_share_above_the_continuous_rating_against_the_allowance(seconds, verdict, margin):
    c = spec_check(rig(seconds), "intermittent_share", drive="hoist", cycle="lifts")
    assert c.status == verdict
    assert c.value == pytest.approx(seconds / 100)
    assert c.limit == pytest.approx(0.20)
    assert c.margin == pytest.approx(margin, abs=1e-9)


def test_warning_band_edge_is_a_tenth_of_the_allowance():
    # 17.9 s of 100 s: margin (0.20 - 0.179)/0.20 = 0.105, just outside the band: pass;
    # 18.1 s: (0.20 - 0.181)/0.20 = 0.095, just inside: warn
    assert spec_check(rig(17.9), "intermittent_share", drive="hoist").status == "pass"
    assert spec_check(rig(18.1), "intermittent_share", drive="hoist").status == "warn"


def test_without_an_allowance_no_new_verdict():
    # no intermittent_share: the time above is judged by continuous_pressure alone, as before
    d = rig(50, share=None)
    assert spec_checks(d, "intermittent_share") == []
    c = spec_check(d, "continuous_pressure", drive="hoist")
    assert c.limit == pytest.approx(230e5) and c.status == "pass"


def test_below_the_continuous_rating_the_whole_cycle_passes():
    d = rig(90)
    d["drives"]["hoist"]["motor"]["rating"]["continuous_pressure"] = "210 bar"   # 205 bar stays below
    c = spec_check(d, "intermittent_share", drive="hoist", cycle="lifts")
    assert c.value == 0.0 and c.status == "pass" and c.margin == pytest.approx(1.0)


def test_a_failing_share_is_named_in_the_message():
    c = spec_check(rig(30), "intermittent_share", drive="hoist")
    assert c.status == "fail" and "30.00 %" in c.message and "20.00 %" in c.message
