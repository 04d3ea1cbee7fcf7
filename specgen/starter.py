"""The starter spec `specgen init` writes: one supply, one drive, one mode, every key explained.

Its first line points an editor's YAML support (yaml-language-server) at the JSON Schema by a path
relative to the spec, ``SCHEMA_NAME``; `specgen init` writes that schema file beside the spec, so
validation as you type works offline. The starter passes every check (a test runs it).
"""

SCHEMA_NAME = "machine-spec.schema.json"

STARTER = f"# yaml-language-server: $schema={SCHEMA_NAME}\n" + """\
# Starter spec written by `specgen init`. Replace every value with your machine's data.
# Every quantity is a number with its unit: "250 bar" or "3625 psi", "160 cm^3" or "9.8 in^3",
# "45 L/min" or "12 gpm", "1.8 kN*m" or "1200 lbf*in", "12 rpm". Ratios: 0.92 or "92 %".
format: 1

machine:
  id: my-machine
  title: My machine
  revision: A
  display_units: SI          # SI or US

fluid:
  iso_vg: 46                 # ISO 3448 viscosity grade
  temperature: 50 degC

supplies:
  main:
    pump:
      displacement: 28 cm^3
      shaft_speed: 1800 rpm
      volumetric_efficiency: 0.92
      overall_efficiency: 0.85
    relief_setting: 210 bar
    return_pressure: 5 bar
    prime_mover_power: 15 kW

drives:
  drive_1:
    supply: main
    motor:
      kind: orbital          # external_gear, vane, orbital, axial_piston, radial_piston
      displacement: 160 cm^3
      rating:
        continuous_pressure: 175 bar
        peak_pressure: 225 bar
        max_speed: 400 rpm
    duty_points:
      normal: {torque: 300 N*m, speed: 200 rpm}

modes:
  run:
    drives: {drive_1: normal}
"""
