"""A table-driven motor against its constant-efficiency twin (helpers.minimal()).

Bilinear interpolation (numerical-methods textbook); motor relations dp = 2*pi*T/(Vg*eta_hm),
T_start = Vg*(p_limit - p_out)*eta_start/(2*pi) (fluid-power textbook). Hand calculations beside each check.
"""

import subprocess
import sys

import pytest

from helpers import EFFICIENCY_TABLE, ROOT, hoist_lift, minimal, with_efficiency_table



def test_table_efficiencies_at_the_duty_point():
    r = hoist_lift(with_efficiency_table())
    # 500 rpm is (500 - 100) / 900 = 0.4444 across; the 200 bar row: 0.89 + 0.4444 * 0.02 = 0.89889, the
    # 300 bar row 0.90889; dp = 2*pi*286.5 / (1e-4 * eta_hm) = 200.26 bar, 0.26 % of the way up:
    # eta_hm = 0.89889 + 0.0026 * 0.01 = 0.89891 (hand calculation)
    assert r["table_hydromechanical_efficiency"] == pytest.approx(0.89891, abs=2e-5)
    assert r["pressure_differential"] == pytest.approx(2 * 3.141592653589793 * 286.5 / (1e-4 * 0.89891), rel=3e-5)
    # eta_v: 200 bar row 0.92 + 0.4444 * 0.03 = 0.93333; 300 bar row 0.90 + 0.4444 * 0.04 = 0.91778;
    # at 0.26 %: 0.93333 - 0.0026 * 0.01556 = 0.93329; q = 1e-4 * 8.3333 / 0.93329 = 8.929e-4 m^3/s
    assert r["flow_demand"] == pytest.approx(1e-4 * (500 / 60) / 0.93329, rel=5e-5)
    assert "from table at 200.3 bar, 500 rpm" in r.values["table_hydromechanical_efficiency"].note


def test_breakaway_differs_from_the_constant_twin_and_the_trace_says_why():
    twin = hoist_lift(minimal())
    table = hoist_lift(with_efficiency_table())
    # twin: 1e-4 * (250 - 5) bar * 0.85 / (2*pi) = 1e-4 * 245e5 * 0.85 / 6.2832 = 331.44 N*m
    assert twin["breakaway_torque"] == pytest.approx(331.44, abs=0.01)
    # table: starting row at 245 bar: 0.80 + 0.45 * 0.02 = 0.809 -> 1e-4 * 245e5 * 0.809 / 6.2832 = 315.45 N*m
    assert table["table_starting_efficiency"] == pytest.approx(0.809)
    assert table["breakaway_torque"] == pytest.approx(315.45, abs=0.01)
    start_input = next(i for i in table.values["breakaway_torque"].inputs if i.symbol == "eta_start")
    assert start_input.value == pytest.approx(0.809) and not start_input.assumed
    assert table.values["table_starting_efficiency"].note == "from table at 245 bar, 0 rpm"


def test_the_starting_row_is_read_at_the_compensator_not_the_relief():
    d = with_efficiency_table()
    d["supplies"]["main"]["pump"].update({"control": "pressure_compensated", "compensator_setting": "210 bar"})
    r = hoist_lift(d)
    # pressure limit min(250 bar relief, 210 bar compensator) = 210 bar, less 5 bar return: 205 bar.
    # starting row at 205 bar: 0.80 + 0.05 * (0.82 - 0.80) = 0.801 (read at the 250 bar relief it
    # would be 245 bar: 0.809, the wrong row position)
    assert r["table_starting_efficiency"] == pytest.approx(0.801)
    assert r.values["table_starting_efficiency"].note == "from table at 205 bar, 0 rpm"
    assert "compensator setting" in r.values["table_starting_efficiency"].inputs[0].label
    # breakaway 1e-4 m^3 * 205e5 Pa * 0.801 / (2*pi) = 1642.05 / 6.28319 = 261.34 N*m
    # (with the relief's 0.809 it would read 263.95 N*m) -- hand calculation
    assert r["breakaway_torque"] == pytest.approx(261.34, abs=0.01)


def test_a_badly_shaped_table_is_refused(tmp_path):
    from helpers import run_cli, write_spec

    t = dict(EFFICIENCY_TABLE, hydromechanical=[[0.86, 0.88], [0.89, 0.91]])
    code, _, err = run_cli("check", write_spec(tmp_path, with_efficiency_table(t)))
    assert code == 2 and "efficiency_table.hydromechanical" in err and "3 rows" in err
    t = dict(EFFICIENCY_TABLE, speed=["1000 rpm", "100 rpm"])
    code, _, err = run_cli("check", write_spec(tmp_path, with_efficiency_table(t)))
    assert code == 2 and "must rise" in err


def test_specs_without_tables_do_not_import_the_interpolation():
    # (pint may load parts of scipy on its own; the interpolation module is loaded only for a table)
    code = ("import sys; from specgen.cli import main; main(['check', '--quiet', 'example_specs/log_deck.yaml']); "
            "print('scipy.interpolate' in sys.modules, file=sys.stderr)")
    out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True,
                         env={"PYTHONPATH": str(ROOT)})
    assert out.stderr.strip().endswith("False")


def test_a_table_named_from_the_parts_file_gives_the_same_results_as_inline(tmp_path):
    import yaml

    from helpers import run_cli, write_spec
    from specgen.pipeline import run_file

    parts = {"format": 1, "motors": {"axial_piston": ["100 cm^3"]}, "efficiency_tables": {"ap100": EFFICIENCY_TABLE}}
    (tmp_path / "stock.parts.yaml").write_text(yaml.safe_dump(parts, sort_keys=False), encoding="utf-8")
    d = with_efficiency_table("ap100")
    d["sizing"] = {"parts_file": "stock.parts.yaml"}
    named = run_file(write_spec(tmp_path, d)).results.duty("hoist", "lift")
    inline = hoist_lift(with_efficiency_table())
    assert named["pressure_differential"] == inline["pressure_differential"]
    assert named["breakaway_torque"] == inline["breakaway_torque"]
    d["drives"]["hoist"]["motor"]["efficiency_table"] = "ap999"
    code, _, err = run_cli("check", write_spec(tmp_path, d))
    assert code == 2 and "has no efficiency table 'ap999' (it has: ap100)" in err
    del d["sizing"]
    code, _, err = run_cli("check", write_spec(tmp_path, d))
    assert code == 2 and "gives no sizing.parts_file" in err
