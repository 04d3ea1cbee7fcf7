"""Presentation: read Results and show them; never recompute."""
