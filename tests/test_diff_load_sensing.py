"""The revision diff picks up the load-sensing values generically: a smaller pump moves each drive's
reached flow, speed and throttling loss, and the reached-speed check's status."""

import yaml

from resolve.test_load_sensing import L_MIN, rig
from specgen.diff import compare
from specgen.intake.read import load_text
from specgen.pipeline import evaluate


def outcome(data: dict):
    return evaluate(load_text(yaml.safe_dump(data, sort_keys=False).encode(), "spec.yaml"))


def test_smaller_pump_shows_in_the_diff():
    d = compare(outcome(rig()), outcome(rig(q_max="75 L/min")))
    moved = {(v.owner.scope, v.owner.ids, v.key): v for v in d.values}
    hoist = moved[("supply_mode_drive", ("main", "work", "hoist"), "reached_flow")]
    # 60 L/min before, 60 * 75/90 = 50 L/min after (flow sharing; hand calculation)
    assert abs(hoist.old / L_MIN - 60.0) < 1e-6
    assert abs(hoist.new / L_MIN - 50.0) < 1e-6
    assert ("supply_mode_drive", ("main", "work", "slew"), "throttling_loss") in moved
    assert ("supply_mode", ("main", "work"), "pump_delivered_flow") in moved
    changed = {(c.id, c.where.get("drive"), c.where.get("mode")): c for c in d.checks}
    assert changed[("reached_speed", "hoist", "work")].new_status == "fail"
    assert any(i.path[-1] == "delivery" for i in d.inputs)
