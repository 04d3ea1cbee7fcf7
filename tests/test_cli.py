"""End to end through the command line on the bundled example and small specs."""

import json
import subprocess
import sys

import jsonschema
import pytest

from helpers import EXAMPLE, ROOT, minimal, run_cli, write_spec
from specgen import __version__, units


def test_check_example_text():
    code, out, err = run_cli("check", EXAMPLE)
    assert code == 0, err  # warnings only
    assert "WARN" in out.splitlines()[0]
    # climb duty (hand calc): 8 t on an 18 % grade, c_rr 0.08: F = 8000*9.80665*(0.08*cos(10.20 deg)
    # + sin(10.20 deg)) = 20075 N; per track T = 20075*0.3/2 = 3011 N*m;
    # 2*pi*3011/(820e-6*0.94) + 8 bar = 253.5 bar
    assert "253.5 bar" in out and "153.5 L/min" in out
    assert "Design aid only" in out


def test_strict_turns_warnings_into_failure():
    assert run_cli("check", "--strict", EXAMPLE)[0] == 1


def test_failing_spec_exits_1_and_quiet_still_shows_failures(tmp_path):
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"
    code, out, _ = run_cli("check", "--quiet", write_spec(tmp_path, d))
    assert code == 1
    assert "FAIL  pressure_margin" in out and "Design aid only" in out
    assert "PASS" not in out


def test_json_output_carries_units_and_locations():
    code, out, _ = run_cli("check", "--format", "json", EXAMPLE)
    assert code == 0
    doc = json.loads(out)
    assert doc["machine"]["id"] == "reed-harvester-rh4" and doc["verdict"] == "warn"
    climb = next(d for d in doc["duty_points"] if d["drive"] == "track_left" and d["duty"] == "climb")
    p_in = climb["values"]["inlet_pressure"]
    assert p_in["unit"] == "bar" and p_in["value"] == pytest.approx(253.46, abs=0.01)
    assert p_in["si_unit"] == "Pa" and p_in["si_value"] == pytest.approx(253.46e5, rel=1e-4)
    for d in doc["duty_points"]:
        for v in d["values"].values():
            # plain numbers (Reynolds number, friction factor) have no unit by nature
            assert (v["unit"] or v["si_unit"] == "dimensionless") and isinstance(v["value"], float)
    check = next(c for c in doc["checks"] if c["status"] == "warn" and c["id"] == "pressure_margin")
    assert check["where"] == {"drive": "track_left", "duty": "climb", "supply": None, "mode": None}
    assert set(check) >= {"id", "status", "value", "limit", "message", "where"}
    flow = next(c for c in doc["checks"] if c["id"] == "pump_flow")
    assert flow["where"]["supply"] and flow["where"]["mode"] and flow["value"]["unit"] == "L/min"
    assert len(doc["cautions"]) == 4


def test_us_display_units(tmp_path):
    d = minimal()
    d["machine"]["display_units"] = "US"
    code, out, _ = run_cli("check", "--format", "json", write_spec(tmp_path, d))
    doc = json.loads(out)
    p = doc["duty_points"][0]["values"]["inlet_pressure"]
    assert p["unit"] == "psi"
    # 205.02 bar in psi (source: pint)
    assert p["value"] == pytest.approx(units.registry().Quantity(p["si_value"], "Pa").to("psi").magnitude)


def test_several_specs_and_folder(tmp_path):
    write_spec(tmp_path, minimal(), "a.yaml")
    write_spec(tmp_path, minimal(), "b.yaml")
    code, out, _ = run_cli("check", "--quiet", tmp_path)
    assert code == 0 and out.count(": PASS  Test rig rev A") == 2


def test_output_file_and_determinism(tmp_path):
    a, b = tmp_path / "a.json", tmp_path / "b.json"
    run_cli("check", "--format", "json", "-o", a, EXAMPLE)
    run_cli("check", "--format", "json", "-o", b, EXAMPLE)
    assert a.read_bytes() == b.read_bytes()


def test_schema_command_prints_valid_schema():
    code, out, _ = run_cli("schema")
    schema = json.loads(out)
    jsonschema.Draft202012Validator.check_schema(schema)
    assert schema["$schema"].endswith("2020-12/schema")


def test_init_writes_a_spec_that_checks(tmp_path):
    target = tmp_path / "new.yaml"
    assert run_cli("init", target)[0] == 0
    code, out, _ = run_cli("check", "--format", "json", target)
    assert code == 0 and json.loads(out)["verdict"] == "pass"  # the starter machine is sized to pass
    code, _, err = run_cli("init", target)
    assert code == 2 and "already exists" in err


def test_version_and_module_entry():
    p = subprocess.run([sys.executable, "-m", "specgen", "--version"], capture_output=True, text=True, cwd=ROOT)
    assert p.stdout.strip() == f"specgen {__version__}"


def test_check_does_not_import_plotting_or_templates():
    code = ("import sys; from specgen.cli import main; main(['check', '-q', %r]); "
            "print('matplotlib' in sys.modules, 'jinja2' in sys.modules)" % str(EXAMPLE))
    p = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT)
    assert p.stdout.strip().splitlines()[-1] == "False False"
