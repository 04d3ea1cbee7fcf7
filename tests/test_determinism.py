"""Same input, same bytes out: locale, time zone, working directory and hash seed change nothing.

Each run is a fresh interpreter writing the JSON check, the text check and the HTML report of the
demo spec into its own folder; every file must match the first run byte for byte.
"""

from __future__ import annotations

import os
import subprocess
import sys
from pathlib import Path

import pytest

from helpers import EXAMPLE, ROOT

CHILD = """
import sys
from specgen.cli import main
spec, out = sys.argv[1], sys.argv[2]
codes = [main(["check", "--format", "json", "-o", out + "/check.json", spec]),
         main(["check", "-o", out + "/check.txt", spec]),
         main(["report", "-o", out + "/report", spec])]
sys.exit(max(codes))
"""


def other_locale() -> str:
    """An installed locale unlike C, preferring one that writes decimals with a comma."""
    try:
        names = subprocess.run(["locale", "-a"], capture_output=True, text=True, timeout=10).stdout.split()
    except (OSError, subprocess.SubprocessError):
        names = []
    for prefix in ("de_DE", "fr_FR", "nl_NL", "ru_RU", "tr_TR", "en_US", "en_GB"):
        for name in names:
            if name.startswith(prefix) and name.lower().endswith(("utf8", "utf-8")):
                return name
    return "POSIX"


def run(spec: Path, out: Path, cwd: Path, **env) -> dict[str, bytes]:
    full = {k: v for k, v in os.environ.items() if not k.startswith(("LC_", "SOURCE_DATE_EPOCH"))}
    full.update(PYTHONPATH=str(ROOT), **env)
    out.mkdir(parents=True)
    done = subprocess.run([sys.executable, "-c", CHILD, str(spec), str(out)], capture_output=True,
                          text=True, env=full, cwd=cwd, timeout=300)
    assert done.returncode in (0, 1) and "Traceback" not in done.stderr, done.stderr
    return {str(p.relative_to(out)): p.read_bytes() for p in sorted(out.rglob("*")) if p.is_file()}


@pytest.fixture(scope="module")
def spec(tmp_path_factory) -> Path:
    """A copy of the demo outside the checkout: the same bytes for every run, whatever else changes."""
    path = tmp_path_factory.mktemp("spec") / "machine.yaml"
    path.write_bytes(EXAMPLE.read_bytes())
    return path


@pytest.fixture(scope="module")
def baseline(tmp_path_factory, spec):
    base = tmp_path_factory.mktemp("base")
    return run(spec, base / "out", ROOT, LC_ALL="C.UTF-8", LANG="C.UTF-8", TZ="UTC", PYTHONHASHSEED="0")


@pytest.mark.parametrize("env", [
    {"LC_ALL": other_locale(), "LANG": other_locale(), "TZ": "NZST-12NZDT", "PYTHONHASHSEED": "12345"},
    {"LC_ALL": "POSIX", "LANG": "", "TZ": "HST10", "PYTHONHASHSEED": "random"},
], ids=["locale-tz-seed-cwd", "posix-tz-random-seed-cwd"])
def test_outputs_are_byte_identical_under_another_environment(spec, baseline, tmp_path, env):
    elsewhere = tmp_path / "somewhere" / "else"
    elsewhere.mkdir(parents=True)
    files = run(spec, tmp_path / "out", elsewhere, **env)
    assert {"check.json", "check.txt"} <= files.keys() and any(k.startswith("report") for k in files)
    assert files.keys() == baseline.keys()
    for name, data in baseline.items():
        assert files[name] == data, f"{name} differs under {env}: {first_difference(data, files[name])}"


def first_difference(a: bytes, b: bytes) -> str:
    i = next((k for k in range(min(len(a), len(b))) if a[k] != b[k]), min(len(a), len(b)))
    return f"at byte {i}: {a[max(0, i - 120):i + 40]!r} became {b[max(0, i - 120):i + 40]!r}"
