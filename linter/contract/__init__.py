"""Contracts: the agreement with a provider, written once in YAML and read into dataclasses."""
