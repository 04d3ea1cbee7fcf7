"""Build the travel block (the machine as a vehicle) and give each track-turn load its vehicle.

Quantities become SI floats (kg, m); the adhesion coefficient, when left out, is assumed at the low
end of its typical range (intake/defaults.py), so the wheel-slip check is never looser for it. A
track_turn load takes the vehicle's mass, rolling and lateral resistance, tread, track length and
sprocket radius from here, so one vehicle is entered once.
"""

from __future__ import annotations

from dataclasses import replace

from specgen.intake import defaults
from specgen.intake.model import Drive, Mode, Ratio, TrackTurnLoad, Travel
from specgen.intake.quantities import Builder

HERE = ("travel",)
TRACK_KEYS = ("tread", "track_length", "lateral_resistance")
MAX_ADHESION = 1.5  # above this no tyre or track grips: a typing slip (common practice, no source)


def build_travel(b: Builder, raw: dict | None, drives: tuple[Drive, ...],
                 modes: tuple[Mode, ...]) -> tuple[Travel | None, tuple[Drive, ...]]:
    """The travel block (None when the spec has none) and ``drives`` with every track-turn load filled in."""
    travel = _travel(b, raw, drives, modes) if raw is not None else None
    return travel, tuple(_turns(b, d, travel) for d in drives)


def _travel(b: Builder, t: dict, drives: tuple[Drive, ...], modes: tuple[Mode, ...]) -> Travel:
    known = {d.id for d in drives}
    for k, did in enumerate(t["drives"]):
        if did not in known:
            b.fail(HERE + ("drives", k), f"travel names drive '{did}', which is not defined (drives: {', '.join(known)})")
    gear = t["running_gear"]
    mass = b.quantity(t, "vehicle_mass", HERE, "mass")
    driven = b.quantity(t, "driven_mass", HERE, "mass", default=mass)
    if driven is not None and mass is not None and driven > mass:
        b.fail(HERE + ("driven_mass",), f"'{t['driven_mass']}' is more than the vehicle mass '{t['vehicle_mass']}'")
    if gear == "tracks":
        missing = [k for k in TRACK_KEYS if k not in t]
        if missing:
            b.fail(HERE + ("running_gear",), "tracks need " + ", ".join(missing) + " in the travel block "
                   "(the skid-steer turn and the track thrusts use them)")
    mode = t.get("mode")
    if mode is not None and mode not in {m.id for m in modes}:
        b.fail(HERE + ("mode",), f"travel names mode '{mode}', which is not defined (modes: "
                                 f"{', '.join(m.id for m in modes)})")
    return Travel(
        drives=tuple(t["drives"]), running_gear=gear, vehicle_mass=mass, driven_mass=driven,
        rolling_radius=b.quantity(t, "rolling_radius", HERE, "length"), adhesion=_adhesion(b, t, gear),
        rolling_resistance=b.ratio(t, "rolling_resistance", HERE, 0.0, efficiency=False).value,
        tread=b.quantity(t, "tread", HERE, "length"), contact_length=b.quantity(t, "track_length", HERE, "length"),
        lateral_resistance=_lateral(b, t), mode=mode, title=t.get("title", "Vehicle"))


def _adhesion(b: Builder, t: dict, gear: str) -> Ratio:
    if "adhesion" not in t:
        return Ratio(defaults.ADHESION[gear], assumed=True, basis=defaults.ADHESION_BASIS.format(gear=gear))
    here = HERE + ("adhesion",)
    mu = b.parse(t["adhesion"], "ratio", here)
    if mu is None:
        return Ratio(defaults.ADHESION[gear])
    if not 0 < mu <= MAX_ADHESION:
        b.fail(here, f"{t['adhesion']!r} must lie above 0 and at most {MAX_ADHESION:g}, e.g. 0.6")
    return Ratio(mu)


def _lateral(b: Builder, t: dict) -> float | None:
    if "lateral_resistance" not in t:
        return None
    mu_t = b.ratio(t, "lateral_resistance", HERE, 0.0, efficiency=False).value
    if mu_t == 0:
        b.fail(HERE + ("lateral_resistance",), "a lateral resistance of zero turns the tracks freely; "
                                               "give mu_t, typically 0.5-0.8 on soil")
    return mu_t


def _turns(b: Builder, drive: Drive, travel: Travel | None) -> Drive:
    if not any(isinstance(u.load, TrackTurnLoad) for u in drive.duty_points):
        return drive
    duties = []
    for u in drive.duty_points:
        load = u.load
        if isinstance(load, TrackTurnLoad):
            here = ("drives", drive.id, "duty_points", u.id, "load", "track_turn")
            load = _vehicle(b, load, here, drive.id, travel)
            u = replace(u, load=load)
        duties.append(u)
    return replace(drive, duty_points=tuple(duties))


def _vehicle(b: Builder, load: TrackTurnLoad, here: tuple, drive_id: str, travel: Travel | None) -> TrackTurnLoad:
    """The load with the vehicle's figures, or as it was (and a problem) when there is no tracked vehicle."""
    if travel is None or travel.running_gear != "tracks":
        b.fail(here, "a track_turn load needs a travel block with running_gear: tracks (the vehicle it turns)")
        return load
    if drive_id not in travel.drives:
        b.fail(here, f"drive '{drive_id}' turns a track but is not one of travel.drives ({', '.join(travel.drives)})")
        return load
    if None in (travel.tread, travel.contact_length, travel.lateral_resistance):
        return load  # already reported at travel.running_gear
    if load.turn_radius is not None and travel.tread is not None and load.turn_radius < travel.tread / 2:
        b.fail(here + ("turn_radius",), f"a turn radius under half the tread ({travel.tread / 2:g} m) runs the inner "
                                        "track backwards; leave turn_radius out for a pivot turn")
    return replace(load, vehicle_mass=travel.vehicle_mass, rolling_resistance=travel.rolling_resistance,
                   lateral_resistance=travel.lateral_resistance, contact_length=travel.contact_length,
                   tread=travel.tread, sprocket_radius=travel.rolling_radius)
