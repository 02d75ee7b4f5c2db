"""Fuzz target: any lines under a lab header are judged by the row scanner no more leniently than
by the numpy screen, with the same rows and the same shared keys (or both refuse the file)."""

from __future__ import annotations

import sys

import atheris

with atheris.instrument_imports(include=["linter"]):
    import numpy as np
    import pyarrow as pa

    from linter.contract.load import contract_from_tree
    from linter.contract.yaml_tree import parse_yaml
    from linter.scale import row_scan
    from linter.scale.stream import screen_stream

from verdicts import scratch_file

CONTRACT = """\
contract: lab-results
version: 1
title: Vell Basin Water Network laboratory results (invented, for fuzzing)
observational_unit: one analyte measured in one water sample
keys: [sample_id, analyte, result]
variables:
  sample_id: {type: string, pattern: '^S\\\\d{3}$'}
  sampled_on: {type: date, min: 2020-01-01}
  analyte: {type: category, values: [NITRATE, PHOSPHATE]}
  result: {type: number, min: 0, max: 500, censored_prefix: "<"}
  replicate: {type: integer, min: 1, max: 3, missing: ["-"]}
  wet: {type: boolean}
missing: ["", "NA"]
"""
HEADER = b"sample_id,sampled_on,analyte,result,replicate,wet\n"
TABLE = contract_from_tree(parse_yaml(CONTRACT, "fuzz.yaml"), "fuzz.yaml").tables[0]
SCANNER = row_scan._rowscan


def screened(path: str, scanner: object):
    row_scan._rowscan = scanner
    try:
        return screen_stream(path, TABLE, ",", 6, 3)
    except pa.ArrowInvalid:
        return None  # the file takes the ordinary reader
    finally:
        row_scan._rowscan = SCANNER


def six_cells(data: bytes) -> bytes:
    """Most inputs made lines of six cells, so the mutations land in the cells the scanner judges
    (an input starting with '!' is kept as it is, ragged lines and all)."""
    if data.startswith(b"!"):
        return data[1:]
    lines = [(line.split(b",") + [b""] * 6)[:6] for line in data.split(b"\n")]
    return b"\n".join(b",".join(cells) for cells in lines)


def test_one_input(data: bytes) -> None:
    path = scratch_file("results.csv", HEADER + six_cells(data))
    scanned, numpy = screened(path, SCANNER), screened(path, None)
    if scanned is None or numpy is None:
        return  # refusing is never wrong: the ordinary reader then judges the file
    assert scanned.rows == numpy.rows
    assert np.array_equal(scanned.shared, numpy.shared)
    assert set(numpy.positions.tolist()) <= set(scanned.positions.tolist())
    for name, cells in numpy.cells.items():
        assert np.isin(cells, scanned.cells[name]).all(), name


if __name__ == "__main__":
    if SCANNER is None:
        print("the row scanner is not built: nothing to fuzz")
        sys.exit(0)
    atheris.Setup(sys.argv, test_one_input)
    atheris.Fuzz()
