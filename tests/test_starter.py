"""First steps: the starter spec `specgen init` writes, its schema comment, the quiet caution line
and the README's tour spec."""

import json
import re

from helpers import ROOT, run_cli
from specgen.intake.schema import schema
from specgen.starter import SCHEMA_NAME, STARTER


def test_init_writes_a_spec_that_passes_and_a_schema_its_comment_finds(tmp_path):
    spec = tmp_path / "rig" / "machine.yaml"
    code, out, _ = run_cli("init", spec)
    assert code == 0 and spec.read_text(encoding="utf-8") == STARTER
    first = spec.read_text(encoding="utf-8").splitlines()[0]
    target = re.fullmatch(r"# yaml-language-server: \$schema=(\S+)", first).group(1)
    assert not re.match(r"[a-z]+://", target)  # a path, read offline
    assert json.loads((spec.parent / target).read_text(encoding="utf-8")) == schema()
    code, out, _ = run_cli("check", spec)
    assert code == 0 and "PASS" in out.splitlines()[0] and "0 warn, 0 fail" in out.splitlines()[0]


def test_init_keeps_a_changed_schema_file_unless_forced(tmp_path):
    (tmp_path / SCHEMA_NAME).write_text("{}\n", encoding="utf-8")
    code, out, _ = run_cli("init", tmp_path / "a.yaml")
    assert code == 0 and f"kept {tmp_path / SCHEMA_NAME}" in out
    assert (tmp_path / SCHEMA_NAME).read_text(encoding="utf-8") == "{}\n"
    code, _, err = run_cli("init", tmp_path / "a.yaml")
    assert code == 2 and "already exists" in err
    code, _, _ = run_cli("init", tmp_path / "a.yaml", "--force")
    assert code == 0 and json.loads((tmp_path / SCHEMA_NAME).read_text(encoding="utf-8")) == schema()


def test_quiet_check_still_prints_the_caution_line(tmp_path):
    spec = tmp_path / "machine.yaml"
    run_cli("init", spec)
    code, out, _ = run_cli("check", "-q", spec)  # every check passes: nothing else to list
    assert code == 0 and out.rstrip().splitlines()[-1].startswith("Design aid only")


def test_readme_tour_spec_passes(tmp_path):
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    tour = re.search(r"## A short tour.*?```yaml\n(.*?)```", text, re.S).group(1)
    spec = tmp_path / "tour.yaml"
    spec.write_text(tour, encoding="utf-8")
    code, out, err = run_cli("check", spec)
    assert code == 0 and err == "", out + err
    assert ", 0 warn, 0 fail)" in out.splitlines()[0]
