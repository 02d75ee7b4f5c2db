"""Profiling a table's structure: candidate keys, functional dependencies and normal-form splits."""
