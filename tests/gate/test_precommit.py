"""The real pre-commit, from the package index, runs Weir's hooks from a clone of this project."""

from __future__ import annotations

import os
import shutil
import subprocess
import sys
from pathlib import Path

import pytest

HEADER = "site_id,sampled_on,analyte,result,lab_sample_id\n"
GOOD = HEADER + "VB-014,2026-01-12,NITRATE,0.42,VL000123\n"
BAD = HEADER + "VB-014,2026-02-09,NITRATE,-3,VL000125\nVB-015,2026-02-09,nitrate,0.2,VL000126\n"


def git(folder: Path, *args: str, check: bool = True) -> subprocess.CompletedProcess[str]:
    env = {
        **os.environ,
        "GIT_AUTHOR_NAME": "Vell Basin data desk",
        "GIT_AUTHOR_EMAIL": "desk@vell-basin.invalid",
        "GIT_COMMITTER_NAME": "Vell Basin data desk",
        "GIT_COMMITTER_EMAIL": "desk@vell-basin.invalid",
    }
    return subprocess.run(
        ["git", "-C", str(folder), *args], capture_output=True, text=True, env=env, check=check, timeout=900
    )


@pytest.mark.slow
def test_pre_commit_rejects_a_bad_submission_and_lets_a_good_one_through(
    tmp_path: Path, repo: Path, monkeypatch: pytest.MonkeyPatch
) -> None:
    pre_commit = Path(sys.executable).with_name("pre-commit")
    if shutil.which("git") is None or not pre_commit.exists():
        pytest.fail("this test needs git and pre-commit (in the test extras)")
    # Source: the real pre-commit from the package index runs the hooks; nothing of Weir's stands in for it.
    # The hooks come from a clone of this project at its current commit, as a user would pin it.
    source = tmp_path / "weir-source"
    subprocess.run(["git", "clone", "-q", str(repo), str(source)], check=True, timeout=300)
    rev = git(source, "rev-parse", "HEAD").stdout.strip()

    data = tmp_path / "vell-data"
    data.mkdir()
    git(data, "init", "-q")
    shutil.copytree(repo / "contracts", data / "contracts")
    (data / "weir.toml").write_text('contracts = ["contracts/*.yaml"]\n')
    (data / ".pre-commit-config.yaml").write_text(
        f"repos:\n  - repo: {source}\n    rev: {rev}\n"
        "    hooks:\n      - id: weir-check\n      - id: weir-contracts\n"
    )
    monkeypatch.setenv("PRE_COMMIT_HOME", str(tmp_path / "pre-commit-home"))  # never the user's cache
    subprocess.run([str(pre_commit), "install"], cwd=data, check=True, capture_output=True, timeout=60)
    git(data, "add", ".")
    first = git(data, "commit", "-qm", "Agree the contracts", check=False)
    assert first.returncode == 0, first.stdout + first.stderr

    (data / "chemistry-2026-02.csv").write_text(BAD)
    git(data, "add", "chemistry-2026-02.csv")
    rejected = git(data, "commit", "-qm", "February results", check=False)
    output = rejected.stdout + rejected.stderr
    assert rejected.returncode != 0, output
    assert "values.out-of-range" in output and "values.code-variant" in output
    assert (data / "chemistry-2026-02.csv").read_text() == BAD  # the hook never edits a submission
    assert git(data, "log", "--oneline").stdout.count("\n") == 1

    (data / "chemistry-2026-02.csv").write_text(GOOD)
    git(data, "add", "chemistry-2026-02.csv")
    accepted = git(data, "commit", "-qm", "February results, corrected", check=False)
    assert accepted.returncode == 0, accepted.stdout + accepted.stderr
    assert git(data, "log", "--oneline").stdout.count("\n") == 2
