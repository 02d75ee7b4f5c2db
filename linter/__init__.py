"""Weir: checks the tabular files partners submit against the contract agreed with them."""

__version__ = "0.1.0"
