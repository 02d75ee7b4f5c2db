"""Imports every rule family so that its rules and inspectors are registered."""
