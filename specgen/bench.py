"""Benchmark `specgen check` and `specgen report` against the cost of the libraries they stand on.

Run from a checkout (or wherever specgen is importable):

    python -m specgen.bench            # 7 timed runs of every case
    python -m specgen.bench --quick    # 3 timed runs: a quick look, noisier

Every case runs as a fresh interpreter, as an engineer's editor, pre-commit hook or CI job would
start it, so imports, the unit registry and the schema validator are paid each time. Cases run
round-robin (one run of each, then the next round) so a machine that slows down mid-run slows
every case alike; the figure kept is the median. Ratios are taken against baselines measured in
the same run, so they hold on any machine of the class, while seconds do not:

    check on the demo spec              <= 1.5 x  python -c "import yaml, jsonschema, pint"
    check on the demo with 5 corners    <= 1.3 x  check on the demo with none
    check on the demo with 5 variants   <= 1.5 x  check on the demo with none
    check --sensitivity on the demo     <= 2 x    check on the demo (its full sensitivity table)
    report on the demo spec             <= 2.5 x  python -c "import matplotlib.pyplot" + one SVG saved
    check on 1,000 drives and 50 modes  <  10 x   check on the demo spec
    check on 1,000 drives               <= 12 x   check on 100 drives (linear, not quadratic)
    check on 50 specs in one call       <  5 x    check on one spec
    peak resident memory of check on 1,000 drives < 300 MB
    check imports neither matplotlib nor jinja2
    report on 1,000 drives              <= 10 x   report on the demo spec (timed once)
    its page                            <  10 MB, and its peak memory < 300 MB

Operating corners: each corner resolves and checks the moved machine again (about 10 ms on the demo,
against some 600 ms for a fresh ``check``). Measured on 2 CPUs, Python 3.11.7, load average 1.6-2.0:
``--repeats 5 --no-report``: check demo, 5 corners 1.281 s (cpu 0.618 s) against no corners 1.099 s
(cpu 0.547 s), ratio 1.17; ``--quick``: 0.777 s against 0.882 s (cpu 0.765 s against 0.716 s).

Design variants and sensitivity, 7 round-robin runs at a load average of about 4 on 2 CPUs (other
work on the machine): check demo with 5 variants 0.99 s (cpu 0.66 s) against the plain demo 0.95 s
(cpu 0.67 s), ratio 1.04; check --sensitivity on the demo 1.86 s (cpu 1.32 s) against check demo
0.94 s (cpu 0.80 s), ratio 1.99 (1.59 between the fastest runs). Before the sensitivity reused the
results of the drives and supply modes an input does not reach, the same ratio was 2.9 (cpu 2.6).

The large specs are generated into a temporary folder from the demo's own drives: group after
group of its six drives on up to 50 copies of its two supplies, and 50 modes that each run the
drives of one demo mode in a tenth of the groups. They are valid specs, so check does its whole
work on them. Exit status: 0 every target met, 1 a target missed, 2 a case could not run.

Chart drawing in worker processes (present/chart_batch.py) is kept because it measured clearly
faster. ``--charts`` adds the report on the demo and on the smaller generated spec with every
chart drawn serially in the one process. On 2 CPUs, Python 3.11.7, load average 0.9 before:

    python -m specgen.bench --repeats 3 --sizes 100,200 --copies 2 --charts
      report demo                  1.787 s    charts serial   2.699 s   workers save 34 %
      report 100 drives           12.467 s    charts serial  24.711 s   workers save 50 %

The early helper (chart_batch.start_workers: matplotlib imported on the other core while the specs
are checked) was also weighed against a plain pool forked for each page once matplotlib is
imported here, in 7 round-robin fresh runs of ``specgen report`` on the demo, load average 1.4-1.8:
helper and workers 2.21 s, per-page pool 2.65 s, serial 3.08 s; a bench run at load 2.0 gave the
per-page pool no gain at all over serial (3.60 s against 3.46 s). The helper stays. Other busy
processes on the machine eat the gain: under a load average of 7, both drew the demo in about 8.3 s
against 14.3 s serially.
"""

from __future__ import annotations

import argparse
import copy
import math
import os
import statistics
import subprocess
import sys
import tempfile
import time
from dataclasses import dataclass, field
from importlib import resources
from pathlib import Path

import yaml

DEMO_NAME = "reed_harvester.yaml"
MODE_SETS = 10  # each generated mode runs the drives of every tenth group


def demo_spec() -> Path:
    """The demo spec: the copy the wheel carries (specgen/_data/demo/), else the checkout's example_specs/."""
    packaged = resources.files("specgen") / "_data" / "demo" / DEMO_NAME
    if packaged.is_file():
        return Path(str(packaged))
    return Path(__file__).resolve().parent.parent / "example_specs" / DEMO_NAME


def _demo_data(demo: Path) -> dict:
    return yaml.safe_load(demo.read_text(encoding="utf-8"))


def generate(demo: dict, n_drives: int, n_modes: int, max_supplies: int = 50) -> dict:
    """A valid spec of ``n_drives`` drives and ``n_modes`` modes, built from the demo's drives.

    Group g copies the demo's drives (ids suffixed _g). Mode m runs the drives of demo mode
    (m mod 4) in the groups g with g = m (mod 10), so the work per mode grows with the machine:
    linear in ``n_drives``. Supplies are the demo's, copied at most ``max_supplies`` in all (the
    spec's own limit); where several groups share a copy in one mode, its pump displacement and
    prime mover power are scaled by that count, and the cooler by the supply capacity one mode
    can run, so every part stays sized for its load and no check ends worse than on the demo.
    """
    kinds = list(demo["drives"].items())
    templates = list(demo["modes"].values())
    n_groups = -(-n_drives // len(kinds))
    sets = min(n_groups, max(1, max_supplies // len(demo["supplies"])))
    share = -(-n_groups // _lcm(sets, MODE_SETS))  # most groups on one supply copy in one mode
    # the demo's corners, duty cycles and variants name its own modes and drives: the generated machine has none
    data = {k: copy.deepcopy(v) for k, v in demo.items()
            if k not in ("supplies", "drives", "modes", "corners", "duty_cycles", "variants")}
    data["machine"]["id"] = f"{demo['machine']['id']}-x{n_drives}"
    data["machine"]["title"] = f"Generated benchmark machine: {n_drives} drives, {n_modes} modes (demo data)"
    data["supplies"], data["drives"], data["modes"] = {}, {}, {}
    if "capacity" in data.get("cooler", {}):  # one cooler takes the heat of every supply copy in a mode
        copies = max(len({g % sets for g in range(n_groups) if g % MODE_SETS == r}) for r in range(min(n_groups, MODE_SETS)))
        data["cooler"]["capacity"] = _scaled(data["cooler"]["capacity"], share * copies)
    for j in range(sets):
        for sid, sup in demo["supplies"].items():
            new = copy.deepcopy(sup)
            new["title"] = f"{sup.get('title', sid)} [{j}]"
            for key, holder in (("displacement", new["pump"]), ("prime_mover_power", new)):
                if key in holder:
                    holder[key] = _scaled(holder[key], share)
            data["supplies"][f"{sid}_{j:03d}"] = new
    for g in range(n_groups):
        for did, dr in kinds[: n_drives - g * len(kinds)]:
            new = copy.deepcopy(dr)
            new["title"], new["supply"] = f"{dr.get('title', did)} [{g}]", f"{dr['supply']}_{g % sets:03d}"
            data["drives"][f"{did}_{g:04d}"] = new
    fed = {dr["supply"] for dr in data["drives"].values()}
    for sid, sup in data["supplies"].items():  # a last, partial group may leave a copy without drives
        if sid not in fed:
            sup["feeds"] = "no drive of this generated machine"
    for m in range(n_modes):
        template = templates[m % len(templates)]
        groups = [g for g in range(n_groups) if g % MODE_SETS == m % MODE_SETS] or [m % n_groups]
        running = {f"{did}_{g:04d}": duty for g in groups for did, duty in template["drives"].items()
                   if f"{did}_{g:04d}" in data["drives"]}
        if not running:  # a last, partial group may lack this mode's drives
            first = next(iter(data["drives"].items()))
            running = {first[0]: next(iter(first[1]["duty_points"]))}
        data["modes"][f"mode_{m:03d}"] = {"title": f"{template.get('title', 'Mode')} [set {m}]", "drives": running}
    # The demo's duty cycles run on the first generated mode made from each of their modes' templates.
    first = {mid: f"mode_{i:03d}" for i, mid in enumerate(demo["modes"]) if i < n_modes}
    cycles = {cid: {**c, "steps": [{**s, "mode": first[s["mode"]]} for s in c["steps"]]}
              for cid, c in demo.get("duty_cycles", {}).items() if all(s["mode"] in first for s in c["steps"])}
    if cycles:
        data["duty_cycles"] = copy.deepcopy(cycles)
    return data


def _lcm(a: int, b: int) -> int:
    return a * b // math.gcd(a, b)


def _scaled(text: str, factor: int) -> str:
    """'71 cm^3' scaled by 3 -> '213 cm^3' (the demo writes every quantity as number and unit)."""
    number, unit = str(text).split(" ", 1)
    return f"{float(number) * factor:g} {unit}"


def write_spec(path: Path, data: dict) -> Path:
    path.write_text(yaml.safe_dump(data, sort_keys=False, allow_unicode=True, width=100), encoding="utf-8")
    return path


@dataclass
class Case:
    name: str
    argv: list[str]
    seconds: list[float] = field(default_factory=list)
    cpu: list[float] = field(default_factory=list)  # user + system seconds of the child
    peak_kb: list[int] = field(default_factory=list)
    once: bool = False  # timed once, after the others (a long case with no target)

    @property
    def median(self) -> float:
        return statistics.median(self.seconds)


class CaseFailed(Exception):
    pass


def _env(work: Path) -> dict:
    """The children's environment: this same specgen, and bytecode cached as an installed one is.

    pip compiles a wheel's modules at install; a checkout run with PYTHONDONTWRITEBYTECODE set
    would compile every module on every run instead. The cache goes to the temporary folder.
    """
    env = dict(os.environ)
    here = str(Path(__file__).resolve().parent.parent)
    env["PYTHONPATH"] = here + (os.pathsep + env["PYTHONPATH"] if env.get("PYTHONPATH") else "")
    env.pop("PYTHONDONTWRITEBYTECODE", None)
    env["PYTHONPYCACHEPREFIX"] = str(work / "pycache")
    return env


def run_once(case: Case, env: dict, ok_codes=(0, 1)) -> None:
    """Time one fresh-interpreter run and read its own peak resident memory (wait4 rusage)."""
    with tempfile.TemporaryFile() as err:
        start = time.perf_counter()
        p = subprocess.Popen(case.argv, stdout=subprocess.DEVNULL, stderr=err, env=env)
        _, status, usage = os.wait4(p.pid, 0)
        elapsed = time.perf_counter() - start
        p.returncode = os.waitstatus_to_exitcode(status)
        if p.returncode not in ok_codes:
            err.seek(0)
            tail = err.read().decode("utf-8", "replace").strip().splitlines()[-3:]
            raise CaseFailed(f"{case.name}: exit {p.returncode}: {' | '.join(tail)}")
    case.seconds.append(elapsed)
    case.cpu.append(usage.ru_utime + usage.ru_stime)
    # kilobytes on Linux; an upper bound, since it starts from this small parent's high-water mark
    case.peak_kb.append(usage.ru_maxrss)


def _help(command: str, env: dict) -> str | None:
    """``specgen COMMAND --help`` text, or None when this version has no such command."""
    p = subprocess.run([sys.executable, "-m", "specgen", command, "--help"], capture_output=True, text=True, env=env)
    return p.stdout if p.returncode == 0 else None


def _imports_plotting(demo: Path, env: dict) -> str:
    """The plotting and template modules that ``check`` on the demo leaves loaded ("" if none)."""
    code = ("import sys; from specgen.cli import main; main(['check', '-q', sys.argv[1]]); "
            "print('loaded:', *[m for m in ('matplotlib', 'jinja2') if m in sys.modules])")
    p = subprocess.run([sys.executable, "-c", code, str(demo)], capture_output=True, text=True, env=env)
    found = [line for line in p.stdout.splitlines() if line.startswith("loaded:")]
    if not found:
        raise CaseFailed(f"check on {demo} did not finish: {p.stderr.strip()[-200:]}")
    return found[-1].removeprefix("loaded:").strip()


BASE_CHECK = "import yaml, jsonschema, pint"
# The demo with no operating corners, and with five: the typical set (cold start, hot oil, worn,
# relief high) and the engine at idle. Every check runs six times in the second.
PLAIN = "check demo, no corners"
CORNERS = "check demo, 5 corners"
# Design variants and sensitivity: the plain demo with five variants (each a group set to another
# value, so any demo given with --demo takes them), and the demo's full sensitivity table.
VARIANTS = "check demo, 5 variants"
FIVE_VARIANTS = {"wear": {"motors.volumetric_efficiency": 0.93}, "friction": {"motors.hydromechanical_efficiency": 0.9},
                 "pump_losses": {"pumps.overall_efficiency": 0.84}, "pump_wear": {"pumps.volumetric_efficiency": 0.92},
                 "relief": {"supplies.relief_setting": "290 bar"}}
SENSITIVITY = "check demo --sensitivity"
IDLE_SPEED = "900 rpm"
BASE_REPORT = "matplotlib.pyplot + 1 SVG"
# specgen report with every chart drawn in this one process (chart_batch finds no fork to use)
_SERIAL_CHARTS = ("import sys; from specgen.present import chart_batch; chart_batch.can_fork = lambda: False; "
                  "from specgen.cli import main; sys.exit(main(sys.argv[1:]))")
SERIAL = ", charts serial"
_FIGURE = ("import sys, matplotlib.pyplot as plt; fig, ax = plt.subplots(); ax.plot([0, 1, 2], [0, 1, 4]); "
           "fig.savefig(sys.argv[1], format='svg')")


def build_cases(work: Path, demo: Path, sizes: tuple[int, int], n_modes: int, copies: int,
                env: dict, with_report: bool = True, charts: bool = False) -> tuple[dict[str, Case], list[str]]:
    """Write the specs into ``work`` and return the cases by name, and notes on any left out."""
    py, notes = sys.executable, []
    data = _demo_data(demo)
    small = write_spec(work / f"drives_{sizes[0]}.yaml", generate(data, sizes[0], n_modes))
    large = write_spec(work / f"drives_{sizes[1]}.yaml", generate(data, sizes[1], n_modes))
    many = work / "many"
    many.mkdir()
    # the copies leave the demo's design variants out: the case measures what one call saves per spec
    # (each variant is a whole check of its own, timed by the variants case)
    one = demo.read_bytes() if "variants" not in data else yaml.safe_dump(
        {k: v for k, v in data.items() if k != "variants"}, sort_keys=False, allow_unicode=True).encode("utf-8")
    for i in range(copies):
        (many / f"spec_{i:03d}.yaml").write_bytes(one)
    plain = {k: v for k, v in data.items() if k not in ("corners", "typical_corners", "variants")}
    cornered = write_spec(work / "demo_corners.yaml", dict(plain, typical_corners={"idle_speed": IDLE_SPEED}))
    varied = write_spec(work / "demo_variants.yaml", dict(plain, variants={
        vid: {"title": f"Bench variant {vid}", "set": moves} for vid, moves in FIVE_VARIANTS.items()}))
    plain = write_spec(work / "demo_plain.yaml", plain)
    check = [py, "-m", "specgen", "check"]
    cases = [
        Case(BASE_CHECK, [py, "-c", BASE_CHECK]),
        Case("check demo", check + [str(demo)]),
        Case(PLAIN, check + [str(plain)]),
        Case(CORNERS, check + [str(cornered)]),
        Case(VARIANTS, check + [str(varied)]),
        Case(SENSITIVITY, check + ["--sensitivity", str(demo)]),
        Case(f"check {sizes[0]} drives", check + [str(small)]),
        Case(f"check {sizes[1]} drives", check + [str(large)]),
        Case(f"check {copies} specs", check + [str(many)]),
    ]
    report_help = _help("report", env) if with_report else None
    if not with_report:
        notes.append("report cases left out (--no-report)")
    elif report_help is None:
        notes.append("report cases skipped: this version of specgen has no report command")
    else:
        report = [py, "-m", "specgen", "report"]
        cases += [Case(BASE_REPORT, [py, "-c", _FIGURE, str(work / "baseline.svg")]),
                  Case("report demo", report + [str(demo), "-o", str(work / "report_1")])]
        if charts:  # the chart workers against drawing every chart in the one process
            serial = [py, "-c", _SERIAL_CHARTS, "report"]
            cases += [Case("report demo" + SERIAL, serial + [str(demo), "-o", str(work / "report_1s")]),
                      Case(f"report {sizes[0]} drives", report + [str(small), "-o", str(work / "report_n")]),
                      Case(f"report {sizes[0]} drives" + SERIAL, serial + [str(small), "-o", str(work / "report_ns")])]
        cases.append(report_scale_case(report, large, work, sizes))
        if "SPEC [SPEC" not in report_help:
            notes.append(f"report on {copies} specs skipped: report takes one spec in this version")
        else:
            jobs = ["--jobs", str(os.cpu_count() or 1)] if "--jobs" in report_help else []
            # No target: timed once, after the others, to show what CI pays for a folder of specs.
            cases.append(Case(f"report {copies} specs", report + [str(many), "-o", str(work / "report_many")] + jobs,
                              once=True))
    return {c.name: c for c in cases}, notes


REPORT_SCALE_RATIO = 10.0  # the report of the large generated spec against the demo's report, in wall time
REPORT_SCALE_MB = 10.0  # and the size of its page


def _large_report(sizes: tuple[int, int]) -> str:
    return f"report {sizes[1]} drives"


def report_scale_case(report: list[str], large: Path, work: Path, sizes: tuple[int, int]) -> Case:
    """The report of the large generated spec: timed once, after the others (it is long)."""
    return Case(_large_report(sizes), report + [str(large), "-o", str(work / "report_large")], once=True)


def report_scale_targets(cases: dict[str, Case], work: Path,
                         sizes: tuple[int, int]) -> list[tuple[str, float, str, float]]:
    """Time against the demo's report, size of the page and peak memory of the large report; read
    while the page is still on disk (inside the benchmark's temporary folder)."""
    name = _large_report(sizes)
    page = work / "report_large" / "index.html"
    if name not in cases or "report demo" not in cases or not cases[name].seconds or not page.is_file():
        return []
    case = cases[name]
    return [(f"{name} / report demo", case.median / cases["report demo"].median, "<=", REPORT_SCALE_RATIO),
            (f"{name}: page size, MB", page.stat().st_size / 1e6, "<", REPORT_SCALE_MB),
            (f"peak memory of {name}, MB", max(case.peak_kb) / 1024, "<", 300.0)]


def targets(cases: dict[str, Case], sizes: tuple[int, int], copies: int) -> list[tuple[str, float, str, float]]:
    """(what, measured, comparison, limit) for every target whose cases ran."""
    m = {k: c.median for k, c in cases.items()}
    big, small, many = f"check {sizes[1]} drives", f"check {sizes[0]} drives", f"check {copies} specs"
    out = [(f"check demo / {BASE_CHECK}", m["check demo"] / m[BASE_CHECK], "<=", 1.5)]
    if CORNERS in m and PLAIN in m:
        out.append((f"{CORNERS} / {PLAIN}", m[CORNERS] / m[PLAIN], "<=", 1.3))
    if VARIANTS in m and PLAIN in m:
        out.append((f"{VARIANTS} / {PLAIN}", m[VARIANTS] / m[PLAIN], "<=", 1.5))
    if SENSITIVITY in m:
        out.append((f"{SENSITIVITY} / check demo", m[SENSITIVITY] / m["check demo"], "<=", 2.0))
    if "report demo" in m:
        out.append((f"report demo / {BASE_REPORT}", m["report demo"] / m[BASE_REPORT], "<=", 2.5))
    out += [
        (f"{big} / check demo", m[big] / m["check demo"], "<", 10.0),
        (f"{big} / {small}", m[big] / m[small], "<=", 12.0),
        (f"{many} / check demo", m[many] / m["check demo"], "<", 5.0),
        (f"peak memory of {big}, MB", max(cases[big].peak_kb) / 1024, "<", 300.0),
    ]
    return out


def met(value: float, op: str, limit: float) -> bool:
    return value <= limit if op == "<=" else value < limit


def measure(cases: dict[str, Case], repeats: int, env: dict) -> None:
    """One untimed run of each case (disk cache, bytecode, pint's unit cache), then rounds."""
    timed = [c for c in cases.values() if not c.once]
    for case in timed:
        run_once(case, env)
        case.seconds.clear(), case.cpu.clear(), case.peak_kb.clear()
    for _ in range(repeats):
        for case in timed:
            run_once(case, env)
    for case in cases.values():
        if case.once:
            run_once(case, env)


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(prog="python -m specgen.bench", description=__doc__.split("\n\n")[0])
    ap.add_argument("--quick", action="store_true", help="3 timed runs a case instead of 7")
    ap.add_argument("--repeats", type=int, help="timed runs a case (overrides --quick)")
    ap.add_argument("--sizes", default="100,1000", help="drive counts of the two generated specs [100,1000]")
    ap.add_argument("--modes", type=int, default=50, help="modes in the generated specs [50]")
    ap.add_argument("--copies", type=int, default=50, help="copies of the demo spec checked in one call [50]")
    ap.add_argument("--demo", type=Path, help="the spec the copies and generated specs are made from [the packaged demo]")
    ap.add_argument("--no-report", action="store_true", help="leave out the report cases (the slowest)")
    ap.add_argument("--charts", action="store_true",
                    help="also time report with every chart drawn serially, on the demo and the smaller generated spec")
    args = ap.parse_args(argv)
    args.demo = args.demo or demo_spec()
    repeats = args.repeats or (3 if args.quick else 7)
    sizes = tuple(int(s) for s in args.sizes.split(","))
    if len(sizes) != 2 or not 0 < sizes[0] < sizes[1] or repeats < 1 or args.modes < 1 or args.copies < 1:
        ap.error("--sizes takes two increasing drive counts (e.g. 100,1000); counts and repeats are at least 1")
    load_before = os.getloadavg()[0]
    with tempfile.TemporaryDirectory(prefix="specgen-bench-") as tmp:
        env = _env(Path(tmp))
        cases, notes = build_cases(Path(tmp), args.demo, sizes, args.modes, args.copies, env, not args.no_report,
                                   args.charts)
        try:
            measure(cases, repeats, env)
            plotting = _imports_plotting(args.demo, env)
            scale = report_scale_targets(cases, Path(tmp), sizes)
        except CaseFailed as exc:
            print(f"error: {exc}", file=sys.stderr)
            return 2
    print(f"specgen benchmark: median wall time of {repeats} fresh-interpreter runs; {os.cpu_count()} CPU(s), "
          f"Python {sys.version.split()[0]}, load average {load_before:.1f} before, {os.getloadavg()[0]:.1f} after")
    width = max(len(k) for k in cases)
    for name, case in cases.items():
        print(f"  {name:<{width}}  {case.median:7.3f} s  (min {min(case.seconds):.3f}, max {max(case.seconds):.3f})"
              f"  cpu {statistics.median(case.cpu):6.3f} s  peak {max(case.peak_kb) / 1024:6.1f} MB")
    for note in notes:
        print(f"  note: {note}")
    print("targets:")
    missed = 0
    for what, value, op, limit in targets(cases, sizes, args.copies) + scale:
        ok = met(value, op, limit)
        missed += not ok
        print(f"  {'ok  ' if ok else 'MISS'}  {what}: {value:.2f} (target {op} {limit:g})")
    missed += bool(plotting)
    print(f"  {'MISS' if plotting else 'ok  '}  modules check loads for plotting or templates: "
          f"{plotting or 'none'} (target none)")
    for name, case in cases.items():
        if name.endswith(SERIAL):
            parallel = cases[name.removesuffix(SERIAL)].median
            print(f"  info  {name.removesuffix(SERIAL)}: workers save {1 - parallel / case.median:.0%} of the serial "
                  f"time ({parallel:.2f} s against {case.median:.2f} s; no target)")
        if case.once and "report demo" in cases and name != _large_report(sizes):
            print(f"  info  {name} / report demo: {case.median / cases['report demo'].median:.2f} (no target)")
    print("all targets met" if not missed else f"{missed} target(s) missed")
    return 1 if missed else 0


if __name__ == "__main__":
    sys.exit(main())
