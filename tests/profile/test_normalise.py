"""Worked normalisation examples re-typed from database textbooks, checked against the split."""

from __future__ import annotations

import pandas as pd
import pytest

from linter.profile.dependencies import functional_dependencies
from linter.profile.normalise import FD, canonical_cover, closure, propose_split


def fds(*pairs: tuple[str, str]) -> list[FD]:
    """'A B' -> 'C D' written as text, one FD per dependent column."""
    return [(frozenset(lhs.split()), rhs) for lhs, rhss in pairs for rhs in rhss.split()]


def test_instructor_department_splits_into_bcnf() -> None:
    # From memory of Silberschatz, Korth & Sudarshan, "Database System Concepts", relational design
    # chapter: in_dep(ID, name, salary, dept_name, building, budget) with dept_name -> building, budget
    # decomposes into instructor(ID, name, salary, dept_name) and department(dept_name, building, budget).
    columns = ["ID", "name", "salary", "dept_name", "building", "budget"]
    dependencies = fds(("ID", "name salary dept_name"), ("dept_name", "building budget"))
    split = propose_split(columns, ["ID"], dependencies, name="instructor")
    assert split.normal_form == "BCNF"
    assert [(t.name, t.key, t.columns) for t in split.tables] == [
        ("instructor", ("ID",), ("ID", "name", "salary", "dept_name")),
        ("dept_names", ("dept_name",), ("dept_name", "building", "budget")),
    ]
    assert split.tables[0].references == ((("dept_name",), "dept_names"),)


def test_dept_advisor_stays_in_3nf_because_bcnf_loses_a_dependency() -> None:
    # From memory of Silberschatz, Korth & Sudarshan (same chapter): dept_advisor(s_ID, i_ID, dept_name)
    # with i_ID -> dept_name and s_ID, dept_name -> i_ID is in 3NF but not BCNF, and no BCNF split
    # preserves s_ID, dept_name -> i_ID; 3NF synthesis keeps the one table.
    dependencies = fds(("i_ID", "dept_name"), ("s_ID dept_name", "i_ID"))
    split = propose_split(["s_ID", "i_ID", "dept_name"], ["s_ID", "dept_name"], dependencies, "advisors")
    assert split.normal_form == "3NF"
    assert split.lost_by_bcnf == ((frozenset({"s_ID", "dept_name"}), "i_ID"),)
    assert [(t.key, t.columns) for t in split.tables] == [
        (("s_ID", "dept_name"), ("s_ID", "i_ID", "dept_name"))
    ]


def test_hourly_emps_rating_determines_wages() -> None:
    # From memory of Ramakrishnan & Gehrke, "Database Management Systems", schema refinement chapter:
    # Hourly_Emps(ssn, name, lot, rating, hourly_wages, hours_worked) with rating -> hourly_wages
    # decomposes into (ssn, name, lot, rating, hours_worked) and Wages(rating, hourly_wages).
    columns = ["ssn", "name", "lot", "rating", "hourly_wages", "hours_worked"]
    dependencies = fds(("ssn", "name lot rating hourly_wages hours_worked"), ("rating", "hourly_wages"))
    split = propose_split(columns, ["ssn"], dependencies, name="hourly_emps")
    assert [set(t.columns) for t in split.tables] == [
        {"ssn", "name", "lot", "rating", "hours_worked"},
        {"rating", "hourly_wages"},
    ]
    assert split.tables[1].key == ("rating",)


def test_closure_and_canonical_cover_worked_example() -> None:
    # From memory of Silberschatz et al., attribute-closure example: R(A, B, C, G, H, I) with
    # A -> B, A -> C, CG -> H, CG -> I, B -> H gives (AG)+ = ABCGHI.
    dependencies = fds(("A", "B C"), ("C G", "H I"), ("B", "H"))
    assert closure({"A", "G"}, dependencies) == frozenset("ABCGHI")
    # Same book, canonical-cover example: A -> BC, B -> C, A -> B, AB -> C has cover A -> B, B -> C.
    cover = canonical_cover(fds(("A", "B C"), ("B", "C"), ("A", "B"), ("A B", "C")))
    assert sorted((sorted(d[0]), d[1]) for d in cover) == [(["A"], "B"), (["B"], "C")]


def test_split_found_from_data_of_the_university_example() -> None:
    # Rows re-typed from memory of the sample university database of Silberschatz et al.
    instructors = [
        ("10101", "Srinivasan", "Comp. Sci.", "65000"),
        ("12121", "Wu", "Finance", "90000"),
        ("15151", "Mozart", "Music", "40000"),
        ("22222", "Einstein", "Physics", "95000"),
        ("32343", "El Said", "History", "60000"),
        ("33456", "Gold", "Physics", "87000"),
        ("45565", "Katz", "Comp. Sci.", "75000"),
        ("58583", "Califieri", "History", "62000"),
        ("76543", "Singh", "Finance", "80000"),
        ("76766", "Crick", "Biology", "72000"),
        ("83821", "Brandt", "Comp. Sci.", "92000"),
        ("98345", "Kim", "Elec. Eng.", "80000"),
    ]
    departments = {
        "Biology": ("Watson", "90000"),
        "Comp. Sci.": ("Taylor", "100000"),
        "Elec. Eng.": ("Taylor", "85000"),
        "Finance": ("Painter", "120000"),
        "History": ("Painter", "50000"),
        "Music": ("Packard", "80000"),
        "Physics": ("Watson", "70000"),
    }
    rows = [(i, n, d, s, *departments[d]) for i, n, d, s in instructors]
    frame = pd.DataFrame(
        rows, columns=["ID", "name", "dept_name", "salary", "building", "budget"], dtype=object
    )
    found = functional_dependencies(frame, max_lhs=1)
    # Keep the dependencies whose determinant repeats (a unit of its own), as units.mixed does.
    repeated = [
        (frozenset(d.determinant), d.dependent)
        for d in found
        if frame[list(d.determinant)].duplicated().any()
    ]
    assert (frozenset({"dept_name"}), "building") in repeated
    split = propose_split(list(frame.columns), ["ID"], repeated, name="instructor")
    assert [(t.key, t.columns) for t in split.tables] == [
        (("ID",), ("ID", "name", "dept_name", "salary")),
        (("dept_name",), ("dept_name", "building", "budget")),
    ]


@pytest.mark.parametrize(
    ("singular", "plural"),
    [
        ("site", "sites"),
        ("county", "counties"),
        ("survey", "surveys"),
        ("batch", "batches"),
        ("box", "boxes"),
        ("sites", "sites"),
    ],
)
def test_unit_names_are_regular_english_plurals(singular: str, plural: str) -> None:
    # Common practice (no source): regular English plural spelling.
    from linter.profile.normalise import plural_noun

    assert plural_noun(singular) == plural
