import os
import sys
from pathlib import Path

from hypothesis import HealthCheck, settings

sys.path.insert(0, str(Path(__file__).resolve().parent))

# Hypothesis profiles. CI runs "ci" (bounded, repeatable examples); a longer search:
#     HYPOTHESIS_PROFILE=long python -m pytest tests/test_fuzz.py
_QUIET = [HealthCheck.too_slow, HealthCheck.data_too_large]
settings.register_profile("ci", max_examples=200, deadline=None, derandomize=True, suppress_health_check=_QUIET)
settings.register_profile("long", max_examples=20_000, deadline=None, suppress_health_check=_QUIET)
settings.load_profile(os.environ.get("HYPOTHESIS_PROFILE", "ci"))


def pytest_addoption(parser):
    # Golden files (tests/golden/) hold the demo specs' text and JSON output. After a change
    # that is meant to move a number:  python -m pytest tests/test_golden.py --update-golden
    # and review the changed golden files in the diff like any other change.
    parser.addoption("--update-golden", action="store_true", default=False,
                     help="rewrite tests/golden/ from the current output instead of comparing")
