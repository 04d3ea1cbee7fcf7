"""Hostile sizes and shapes are refused within the stated limits, in bounded memory, with one clear line.

Limits (specgen/intake/read.py and validate.py, stated in README "Limits and safety"): file size
MAX_BYTES, values MAX_NODES (as written and after alias expansion), nesting MAX_DEPTH, and counts
of supplies, drives, modes and duty points. Memory is measured (tracemalloc in-process, or the
child's own peak resident size), never the wall clock.
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
import tracemalloc

import pytest

from helpers import ROOT, run_cli
from specgen.intake.read import MAX_BYTES, MAX_DEPTH, MAX_NODES
from specgen.intake.validate import MAX_COUNT

HEAD = ("format: 1\nmachine: {id: big, title: Big, revision: A}\n"
        "supplies:\n  main: {pump: {displacement: 40 cm^3, shaft_speed: 1500 rpm}, relief_setting: 250 bar}\n")
DRIVE = ("{supply: main, motor: {kind: vane, displacement: 16 cm^3}, "
         "duty_points: {run: {torque: 20 N*m, speed: 900 rpm}}}")


def traced(*args) -> tuple[int, str, float]:
    """Run the CLI in-process; return exit status, stderr and the peak of Python allocations in MB."""
    tracemalloc.start()
    try:
        code, _, err = run_cli(*args)
        peak = tracemalloc.get_traced_memory()[1] / 1e6
    finally:
        tracemalloc.stop()
    return code, err, peak


# Peak resident size of the child's own memory. VmHWM belongs to the process image the child
# runs; ru_maxrss would not do: Linux carries the parent's high-water mark across fork and exec,
# so a child of a large pytest process would report pytest's size.
CHILD = ("import resource, sys\nfrom specgen.cli import main\ncode = main(sys.argv[1:])\n"
         "kb = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss\n"
         "try:\n"
         "    kb = next(int(l.split()[1]) for l in open('/proc/self/status') if l.startswith('VmHWM:'))\n"
         "except (OSError, StopIteration):\n"
         "    pass\n"
         "print('MAXRSS', kb, file=sys.stderr)\nsys.exit(code)\n")


def measured(*args) -> tuple[int, str, str, float]:
    """Run the CLI in a fresh interpreter; return exit status, stdout, stderr and its peak resident size in MB."""
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    run = subprocess.run([sys.executable, "-c", CHILD, *map(str, args)], capture_output=True, text=True,
                         env=env, timeout=300)
    *lines, last = run.stderr.rstrip("\n").split("\n")
    assert last.startswith("MAXRSS "), run.stderr
    return run.returncode, run.stdout, "\n".join(lines), int(last.split()[1]) / 1024  # Linux reports kB


def one_error(err: str, path) -> str:
    lines = err.splitlines()
    assert len(lines) == 1 and lines[0].startswith(f"error: {path}") and "Traceback" not in err, err
    return lines[0]


def test_billion_laughs_is_refused_before_expansion(tmp_path):
    # nine levels of nine aliases: 9**9 (387 million) values if expanded
    levels = ["a0: &a0 [lol, lol, lol, lol, lol, lol, lol, lol, lol]"]
    levels += [f"a{i}: &a{i} [" + ", ".join([f"*a{i - 1}"] * 9) + "]" for i in range(1, 10)]
    path = tmp_path / "laughs.yaml"
    path.write_text("format: 1\n" + "\n".join(levels) + "\n")
    code, err, peak = traced("check", path)
    assert code == 2
    assert f"expands to more than {MAX_NODES} values (YAML aliases?)" in one_error(err, path)
    assert peak < 20, f"{peak:.1f} MB"


def test_a_50_mb_spec_is_refused_without_reading_it_whole(tmp_path):
    path = tmp_path / "huge.yaml"
    with path.open("wb") as fh:
        fh.write((ROOT / "example_specs" / "reed_harvester.yaml").read_bytes())
        pad = b"# padding to make the file very large\n" * 1000
        while fh.tell() < 50 * 1024 * 1024:
            fh.write(pad)
    code, err, peak = traced("check", path)
    assert code == 2
    line = one_error(err, path)
    assert f"specs are limited to {MAX_BYTES} bytes" in line and f"file is {path.stat().st_size} bytes" in line
    assert peak < 4 * MAX_BYTES / 1e6, f"{peak:.1f} MB"  # at most a few copies of the first MiB


@pytest.mark.parametrize("opening, closing", [("[", "]"), ("{a: ", "}")])
def test_10000_levels_of_nesting_are_refused_with_a_position(tmp_path, opening, closing):
    path = tmp_path / "deep.yaml"
    path.write_text("format: 1\ndeep: " + opening * 10_000 + "1" + closing * 10_000 + "\n")
    code, err, peak = traced("check", path)
    assert code == 2
    line = one_error(err, path)
    assert f"deep.yaml:2:" in line and f"nesting deeper than {MAX_DEPTH} levels" in line
    assert peak < 20, f"{peak:.1f} MB"


def test_nesting_built_from_a_chain_of_aliases_is_refused(tmp_path):
    """Each anchor nests the one before: shallow as written, 200 levels deep once expanded."""
    chain = ["l0: &l0 [1]"] + [f"l{i}: &l{i} [*l{i - 1}]" for i in range(1, 200)]
    path = tmp_path / "chain.yaml"
    path.write_text("format: 1\n" + "\n".join(chain) + "\n")
    code, err, _ = traced("check", path)
    assert code == 2 and f"nesting deeper than {MAX_DEPTH} levels (YAML aliases?)" in one_error(err, path)


def test_100000_drives_written_out_are_refused_by_size(tmp_path):
    path = tmp_path / "drives.yaml"
    path.write_text(HEAD + "drives:\n" + "".join(f"  d{i}: {DRIVE}\n" for i in range(100_000)))
    code, err, peak = traced("check", path)
    assert code == 2 and "specs are limited to" in one_error(err, path)
    assert peak < 4 * MAX_BYTES / 1e6, f"{peak:.1f} MB"


def test_100000_drives_as_aliases_are_refused_by_value_count(tmp_path):
    """Under a megabyte as written, so the size limit does not catch it: the value count does."""
    path = tmp_path / "aliased.yaml"
    digits = "0123456789abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ"
    ids = [f"d{digits[i // 3844]}{digits[i // 62 % 62]}{digits[i % 62]}" for i in range(100_000)]
    drives = ",".join(f"{d}: *D" for d in ids)
    path.write_text(HEAD + f"spare: &D {DRIVE}\ndrives: {{{drives}}}\n")
    assert path.stat().st_size < MAX_BYTES
    code, _, err, rss = measured("check", path)
    assert code == 2 and f"holds more than {MAX_NODES} values" in one_error(err, path)
    assert rss < 300, f"{rss:.0f} MB"


def test_more_drives_than_the_limit_are_refused_before_the_schema(tmp_path):
    n = MAX_COUNT["drives"] + 1
    path = tmp_path / "many.yaml"
    path.write_text(HEAD + "drives:\n" + "".join(f"  d{i}: 1\n" for i in range(n)) + "modes: {m: {drives: {d0: run}}}\n")
    code, err, _ = traced("check", path)
    assert code == 2
    line = one_error(err, path)
    assert f"many.yaml:5:1: drives: {n} drives given; a spec may hold at most {MAX_COUNT['drives']}" in line


def test_a_spec_at_the_drive_limit_is_checked_in_bounded_memory(tmp_path):
    n = MAX_COUNT["drives"]
    path = tmp_path / "limit.yaml"
    path.write_text(HEAD.replace("40 cm^3", "9000 cm^3") + "drives:\n" + "".join(f"  d{i}: {DRIVE}\n" for i in range(n))
                    + "modes:\n  all:\n    drives: {" + ", ".join(f"d{i}: run" for i in range(n)) + "}\n")
    code, out, err, rss = measured("check", "--format", "json", path)
    assert code in (0, 1) and err == "", err  # computed and checked, whatever the verdict
    assert len(json.loads(out)["duty_points"]) == n
    assert rss < 300, f"{rss:.0f} MB"


@pytest.mark.parametrize("tag", ["!!python/object/apply:os.system", "!!python/object/new:os.system",
                                 "!!python/object/apply:subprocess.call", "!!python/name:os.system",
                                 "!!python/module:os"])
def test_no_yaml_tag_constructs_a_python_object(tmp_path, tag):
    marker = tmp_path / "ran"
    path = tmp_path / "tagged.yaml"
    arg = "" if "name:" in tag or "module:" in tag else f" [touch {marker}]" if "os.system" in tag else f" [[touch, {marker}]]"
    path.write_text(f"format: 1\nmachine:\n  id: x\n  title: {tag}{arg}\n  revision: A\n")
    code, err, _ = traced("check", path)
    assert code == 2 and not marker.exists()
    assert f"tagged.yaml:4:10: the YAML tag '{tag}" in one_error(err, path)


def test_a_fifo_is_refused_instead_of_waiting_forever(tmp_path):
    fifo = tmp_path / "spec.yaml"
    os.mkfifo(fifo)
    code, err, _ = traced("check", fifo)
    assert code == 2 and "is not a regular file" in one_error(err, fifo)


def test_a_device_is_refused():
    code, err, _ = traced("check", "/dev/zero")
    assert code == 2 and "/dev/zero: is not a regular file" in one_error(err, "/dev/zero")


def test_readme_states_the_limits_the_code_enforces():
    from specgen.intake.validate import MAX_DUTY_POINTS

    text = (ROOT / "README.md").read_text(encoding="utf-8")
    section = text[text.index("## Limits and safety"):]
    assert f"{MAX_BYTES:,} bytes" in section and f"{MAX_NODES:,} YAML values" in section
    assert f"deeper than {MAX_DEPTH} levels" in section and f"{MAX_DUTY_POINTS} duty points" in section
    for key, limit in MAX_COUNT.items():
        assert f"{limit:,} {key}" in section
