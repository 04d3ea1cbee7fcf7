"""specgen: declarative hydraulic rotary drive specs, checked and reported for engineering review."""

__version__ = "0.1.0"
