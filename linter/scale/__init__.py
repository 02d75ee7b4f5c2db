"""Checking large submissions fast: Arrow pre-screening, streaming reads, parallel files, Dask."""
