"""Argument guards shared by the relations: a non-physical input is a ValueError with a sentence."""

from __future__ import annotations

import math


def finite(name: str, value: float) -> float:
    value = float(value)
    if not math.isfinite(value):
        raise ValueError(f"{name} must be a finite number, got {value}.")
    return value


def positive(name: str, value: float) -> float:
    value = float(value)
    if not math.isfinite(value) or value <= 0.0:
        raise ValueError(f"{name} must be greater than zero, got {value}.")
    return value


def non_negative(name: str, value: float) -> float:
    value = float(value)
    if not math.isfinite(value) or value < 0.0:
        raise ValueError(f"{name} must not be negative, got {value}.")
    return value


def efficiency(name: str, value: float) -> float:
    value = positive(name, value)
    if value > 1.0:
        raise ValueError(f"{name} must not exceed 1, got {value}.")
    return value
