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
