"""Settings for the gatekeepers: maps, bundles, limits and the inbox layout, with clear errors."""

from __future__ import annotations

from pathlib import Path

import pytest

from linter.config import bundle_members, bundle_of, contract_paths, find_settings, mapped_contract
from linter.errors import WeirError
from linter.findings import Severity

FULL = """
contracts = ["contracts/*.yaml"]
fail_on = "warning"
report_dir = "weir-reports"

[[map]]
files = "volunteers/*.csv"
contract = "contracts/stream-chemistry.yaml"

[[bundle]]
name = "field-visit"
files = ["visits/sites*.csv", "visits/chemistry*.csv"]

[limits]
max_rows = 200000
max_cell_chars = 4000

[inbox]
accepted = "filed/accepted"
returned = "filed/returned"
settle_seconds = 5
providers = { "shared/ridge-*" = "ridge-volunteers" }
"""


def write(folder: Path, name: str, text: str) -> Path:
    path = folder / name
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(text, encoding="utf-8")
    return path


def test_every_table_is_parsed_and_found_from_a_subfolder(tmp_path: Path) -> None:
    write(tmp_path, "weir.toml", FULL)
    write(tmp_path, "contracts/stream-chemistry.yaml", "contract: stream-chemistry\n")
    write(tmp_path, "contracts/sites.yaml", "contract: sites\n")
    write(tmp_path, "visits/sites-2026.csv", "site_id\n")
    write(tmp_path, "visits/chemistry-2026-01.csv", "site_id\n")
    (tmp_path / "deep/er").mkdir(parents=True)
    settings = find_settings(tmp_path / "deep/er")
    assert settings is not None and settings.root == tmp_path.resolve()
    assert settings.fail_on is Severity.WARNING and settings.report_dir == "weir-reports"
    assert settings.limits == {"max_rows": 200000, "max_cell_chars": 4000}
    assert settings.inbox.accepted == "filed/accepted" and settings.inbox.settle_seconds == 5.0
    assert settings.inbox.providers == {"shared/ridge-*": "ridge-volunteers"}
    assert [p.name for p in contract_paths(settings)] == ["sites.yaml", "stream-chemistry.yaml"]
    assert mapped_contract(settings, "volunteers/ridge.csv") == (tmp_path / "contracts/stream-chemistry.yaml")
    assert mapped_contract(settings, "chemistry-2026-01.csv") is None
    bundle = bundle_of(settings, "visits/chemistry-2026-01.csv")
    assert bundle is not None and bundle.name == "field-visit"
    assert [p.name for p in bundle_members(settings, bundle)] == ["chemistry-2026-01.csv", "sites-2026.csv"]


def test_settings_in_pyproject_are_read_from_tool_weir(tmp_path: Path) -> None:
    write(tmp_path, "pyproject.toml", '[project]\nname = "x"\n\n[tool.weir]\nfail_on = "note"\n')
    settings = find_settings(tmp_path)
    assert settings is not None and settings.fail_on is Severity.NOTE


@pytest.mark.parametrize(
    ("text", "message"),
    [
        ('fail_onn = "error"\n', "unknown setting 'fail_onn'; did you mean 'fail_on'?"),
        ('[[map]]\nfiles = "*.csv"\ncontrat = "c.yaml"\n', "did you mean 'contract'?"),
        ("[inbox]\nacepted = 'a'\n", "did you mean 'accepted'?"),
        ('[[bundle]]\nname = "b"\nfile = ["*.csv"]\n', "did you mean 'files'?"),
        ('fail_on = "fatal"\n', "'fail_on' must be one of error, warning, note"),
        ('[[map]]\nfiles = "*.csv"\n', "[[map]] 'contract' must be a non-empty text"),
        ("[inbox]\nsettle_seconds = -1\n", "'settle_seconds' must be a number of seconds >= 0"),
        ("[limits]\nmax_rows = [1, 2]\n", "[limits] must be a table of plain values"),
        ("fail_on = \n", "not valid TOML"),
        ('colour = "red"\n', "unknown setting 'colour' (known: contracts"),
        ('[inbox]\naccepted = "../filed"\n', "inbox 'accepted' must be a path inside the inbox"),
        ('[inbox]\nledger = "/var/ledger.sqlite"\n', "inbox 'ledger' must be a path inside the inbox"),
    ],
)
def test_bad_settings_say_which_key_failed(tmp_path: Path, text: str, message: str) -> None:
    write(tmp_path, "weir.toml", text)
    with pytest.raises(WeirError) as raised:
        find_settings(tmp_path)
    assert message in str(raised.value)


def test_a_contract_named_but_absent_is_an_error(tmp_path: Path) -> None:
    write(tmp_path, "weir.toml", '[[map]]\nfiles = "*.csv"\ncontract = "contracts/none.yaml"\n')
    settings = find_settings(tmp_path)
    assert settings is not None
    with pytest.raises(WeirError, match=r"does not exist: contracts/none\.yaml"):
        contract_paths(settings)
