"""Reading a polarimetry time course: CSV text and tables through one set of checks with clear messages.

No chemistry is checked here (common practice for input handling: every fault names the file, the line or
row, the column and what is wrong).
"""

from __future__ import annotations

import pandas as pd
import pytest

from workbench.conformers import Curve, parse_curve
from workbench.conformers.curve_file import curve_from_frame
from workbench.errors import CurveFileError

HEADER = "time_min,specific_rotation\n"


def _error(text: str) -> str:
    with pytest.raises(CurveFileError) as err:
        parse_curve(text, "run.csv")
    return str(err.value)


@pytest.mark.parametrize(
    ("body", "expected"),
    [
        ("0,112\n5,abc\n", "run.csv, line 3: specific_rotation 'abc' is not a number"),
        ("0,112\n-5,100\n", "run.csv, line 3: time_min -5 is negative"),
        ("0,112\n5,inf\n", "run.csv, line 3: specific_rotation 'inf' is not a finite number"),
        ("0,112\nnan,100\n", "run.csv, line 3: time_min 'nan' is not a finite number"),
        ("0,112\n5,\n", "run.csv, line 3: specific_rotation is empty"),
        ("0,112\n5\n", "run.csv, line 3: expected 2 columns, found 1"),
        ("", "run.csv, line 1: the header is followed by no measurements"),
    ],
)
def test_csv_faults_name_the_line_and_the_column(body, expected):
    assert expected in _error(HEADER + body)


def test_comment_and_blank_lines_keep_the_line_numbers():
    assert "run.csv, line 5: specific_rotation 'x'" in _error("# invented\n\n" + HEADER + "1,2\n2,x\n")


def test_time_is_checked_before_rotation_on_the_same_line():
    assert "time_min 'a'" in _error(HEADER + "a,b\n")


def test_csv_reads_extra_columns_quotes_and_spaces():
    curve = parse_curve('Time_min , Specific_Rotation,operator\n 0 , "112.5",A\n10,90,"B, C"\n', "run.csv")
    assert curve == Curve("run.csv", (0.0, 10.0), (112.5, 90.0))


def test_a_table_goes_through_the_same_checks():
    frame = pd.DataFrame({" TIME_MIN": [0, 5, 10], "specific_rotation": [112.0, 80.0, 60.0], "cell": ["a", "b", "c"]})
    assert curve_from_frame(frame, "sheet") == Curve("sheet", (0.0, 5.0, 10.0), (112.0, 80.0, 60.0))
    frame.loc[1, "specific_rotation"] = float("nan")
    with pytest.raises(CurveFileError, match=r"^sheet: row 2: specific_rotation is empty$"):
        curve_from_frame(frame, "sheet")
    text_frame = pd.DataFrame({"time_min": ["0", "x"], "specific_rotation": ["1", "2"]})
    with pytest.raises(CurveFileError, match=r"row 2: time_min 'x' is not a number"):
        curve_from_frame(text_frame)


def test_a_table_without_the_columns_or_rows_is_refused():
    with pytest.raises(CurveFileError, match="lacks column"):
        curve_from_frame(pd.DataFrame({"t": [1.0], "specific_rotation": [2.0]}))
    with pytest.raises(CurveFileError, match="no measurements"):
        curve_from_frame(pd.DataFrame({"time_min": [], "specific_rotation": []}))
    with pytest.raises(CurveFileError, match="appears twice"):
        curve_from_frame(pd.DataFrame([[1.0, 2.0, 3.0]], columns=["time_min", "TIME_MIN", "specific_rotation"]))


def test_a_curve_survives_the_round_trip_through_its_frame():
    curve = parse_curve(HEADER + "0,112.2\n5,100.1\n10,90.4\n", "run.csv")
    again = curve_from_frame(curve.to_frame(), "run.csv")
    assert again == curve
