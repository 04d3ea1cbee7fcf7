"""Validation and the model's build stand apart from the trade's relations and from resolution."""

import subprocess
import sys

from helpers import ROOT


def test_the_input_package_imports_no_relation_and_no_resolution():
    code = ("import sys, specgen.intake.validate, specgen.intake.content, specgen.intake.schema; "
            "print(sorted(m for m in sys.modules if m.startswith(('specgen.calc', 'specgen.resolve'))))")
    out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True,
                         env={"PYTHONPATH": str(ROOT)})
    assert out.stdout.strip() == "[]"
