"""A small seeded fuzz run: malformed project files never give a traceback or a hang.

The full run (10,000 cases, with the exit-code table) is benchmarks/bench_fuzz.py. No chemistry is
checked here; exit codes are those of the command-line contract (0 done, 2 bad input, 3 contradiction).
"""

from __future__ import annotations

import pytest
from fuzzing import CATEGORIES, cases, run_case

SEED = 20_241_202
COUNT = 240


@pytest.fixture(scope="module")
def outcomes(tmp_path_factory):
    folder = tmp_path_factory.mktemp("fuzz")
    return [run_case(case, folder, timeout_s=120) for case in cases(SEED, COUNT)]


def test_every_run_ends_with_a_contract_exit_code(outcomes):
    bad = [
        (o.case.number, o.case.category, o.case.command, o.code, o.detail) for o in outcomes if o.code not in (0, 2, 3)
    ]
    assert not bad, bad


def test_every_category_is_exercised_and_bad_files_are_refused(outcomes):
    seen = {o.case.category for o in outcomes}
    assert seen == set(CATEGORIES)
    refused = {o.case.category for o in outcomes if o.code == 2}
    for category in ("deep_nesting", "huge_number", "surrogate", "broken_bytes", "huge_size"):
        assert category in refused
    assert any(o.code == 0 for o in outcomes if o.case.category == "valid")
