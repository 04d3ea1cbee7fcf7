import pytest

from helpers import EXAMPLE
from page_html import FIXED
from specgen.pipeline import run_file
from specgen.present import report


@pytest.fixture(scope="module")
def example():
    """The demo machine's outcome and its report page."""
    o = run_file(EXAMPLE)
    return o, report.render(o, fp=FIXED)
