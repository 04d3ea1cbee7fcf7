"""Spec stage: load (YAML with positions) -> validate (schema, units, references) -> model."""
