"""Display helpers shared by the outputs: unit conversion and number formatting."""

from __future__ import annotations

from specgen.units import convert, format_si, significant

__all__ = ["convert", "format_si", "significant"]

