"""The travel block read from a spec: each refused value or contradiction is one located line, and a
track_turn load gets its vehicle from the block."""

import pytest

from specgen.errors import SpecError
from specgen.intake.model import TrackTurnLoad
from specgen.intake.read import Source
from specgen.pipeline import evaluate
from vehicles import MASS_80KN, carrier, straight


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def refused(data) -> str:
    with pytest.raises(SpecError) as err:
        outcome(data)
    return str(err.value)


def test_track_turn_load_carries_the_vehicle():
    m = outcome(carrier()).machine
    load = m.drive("track_left").duty("pivot").load
    assert isinstance(load, TrackTurnLoad) and load.pivot
    assert (load.vehicle_mass, load.tread, load.contact_length, load.lateral_resistance, load.sprocket_radius,
            load.rolling_resistance) == (pytest.approx(MASS_80KN), 1.6, 2.0, 0.6, 0.25, 0.08)
    assert m.travel.drives == ("track_left", "track_right") and m.travel.driven_mass == pytest.approx(MASS_80KN)


def test_adhesion_left_out_is_assumed_low():
    # the low end of the typical range (from memory): tyres 0.3, tracks 0.7
    tracks = outcome(carrier(adhesion=None)).machine.travel.adhesion
    assert (tracks.value, tracks.assumed) == (0.7, True)
    d = carrier(straight("1 kN*m", "10 rpm"), adhesion=None, running_gear="wheels", tread=None, track_length=None,
                lateral_resistance=None)
    wheels = outcome(d).machine.travel.adhesion
    assert (wheels.value, wheels.assumed) == (0.3, True) and "tyres" in wheels.basis


@pytest.mark.parametrize("change, where, words", [
    ({"drives": ["track_left", "track_middle"]}, "travel.drives.1", "drive 'track_middle', which is not defined"),
    ({"tread": None}, "travel.running_gear", "tracks need tread"),
    ({"driven_mass": "9 t"}, "travel.driven_mass", "more than the vehicle mass"),
    ({"mode": "nowhere"}, "travel.mode", "mode 'nowhere', which is not defined"),
    ({"adhesion": 2.5}, "travel.adhesion", "must lie above 0"),
    ({"lateral_resistance": 0}, "travel.lateral_resistance", "lateral resistance of zero"),
])
def test_refused_travel_values_are_located(change, where, words):
    message = refused(carrier(**change))
    assert where in message and words in message


def test_track_turn_needs_a_tracked_vehicle():
    d = carrier()
    del d["travel"]
    assert "needs a travel block with running_gear: tracks" in refused(d)


def test_track_turn_drive_must_be_a_travel_drive():
    d = carrier(drives=["track_left"])
    message = refused(d)
    assert "drives.track_right.duty_points.pivot.load.track_turn" in message and "not one of travel.drives" in message


def test_turn_radius_under_half_the_tread_is_refused():
    d = carrier({"turn": {"load": {"track_turn": {"track": "outer", "turn_radius": "0.7 m", "speed": "0.5 m/s"}}}})
    assert "under half the tread (0.8 m)" in refused(d)
