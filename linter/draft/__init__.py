"""Drafting contracts from sample files, proposing additions to them, and comparing their versions."""
