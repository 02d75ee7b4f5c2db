"""Open datasets shipped inside packages from the package index, read as text tables (no network)."""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

import pandas as pd


def as_text(frame: pd.DataFrame) -> pd.DataFrame:
    """Every cell as text or None, the way Weir sees a submitted file."""
    text = frame.astype(object).where(frame.notna(), None)
    return text.map(lambda v: None if v is None else str(v))


def penguins(name: str) -> pd.DataFrame:
    # Source: palmerpenguins package (Horst, Hill & Gorman), data/penguins.csv and data/penguins-raw.csv
    import palmerpenguins

    path = Path(palmerpenguins.__file__).parent / "data" / name
    return as_text(pd.read_csv(path, dtype=str, keep_default_na=False, na_values=[""]))


def vega(name: str) -> pd.DataFrame:
    # Source: vega_datasets package, its locally bundled datasets (local_data), no download
    from vega_datasets import local_data

    loader: Callable[[], pd.DataFrame] = getattr(local_data, name.replace("-", "_"))
    return as_text(loader())


DATASETS: dict[str, Callable[[], pd.DataFrame]] = {
    "palmerpenguins penguins.csv": lambda: penguins("penguins.csv"),
    "palmerpenguins penguins-raw.csv": lambda: penguins("penguins-raw.csv"),
    "vega_datasets iris": lambda: vega("iris"),
    "vega_datasets cars": lambda: vega("cars"),
    "vega_datasets barley": lambda: vega("barley"),
    "vega_datasets seattle-weather": lambda: vega("seattle-weather"),
    "vega_datasets stocks": lambda: vega("stocks"),
    "vega_datasets anscombe": lambda: vega("anscombe"),
}
