"""Walks the validated model through the relations of calc/ and returns Results."""
