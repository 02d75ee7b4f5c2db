"""Reshaping a table by a recipe of declarative steps, with provenance and a value-conservation audit."""
