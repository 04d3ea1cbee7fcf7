"""How the garbage collector runs while a spec is loaded, validated, computed and checked.

Those stages build a few hundred thousand objects that live on (the spec with the position of
every key, the model, the results with their traces) and make almost no cyclic garbage: about
1,700 unreachable objects after checking a 1,000-drive spec. Python's full
collections rescan every live object each time the heap grows by a quarter; on that spec they
took a third of `specgen check`'s time and found next to nothing. Young objects are still
collected as usual; only the full sweeps wait (until 1,000 middle-generation sweeps, which a
spec does not reach). Rendering is left alone: matplotlib figures are cyclic garbage that only
full sweeps free, and a report of 50 specs would keep hundreds of them. Measured with
`python -m specgen.bench`.
"""

from __future__ import annotations

import gc
from contextlib import contextmanager

FULL_SWEEP_AFTER = 1000  # middle-generation collections before a full one (Python's default: 10)


@contextmanager
def few_full_collections():
    """Make full collections rare for the block; the previous setting comes back after it."""
    before = gc.get_threshold()
    gc.set_threshold(before[0], before[1], max(before[2], FULL_SWEEP_AFTER))
    try:
        yield
    finally:
        gc.set_threshold(*before)
