"""Reading a polarimetry time course from CSV (the I/O edge of the mutarotation fit).

The file has a header row naming the columns ``time_min`` and
``specific_rotation`` (other columns are ignored), then one measurement per
line: minutes from dissolution and [alpha]D in deg mL g-1 dm-1. Blank lines
and lines starting with ``#`` are skipped. Every fault raises
:class:`~workbench.errors.CurveFileError` naming the file, the line and what
is wrong. The readings are checked by :func:`curve_from_frame` (pandas),
which also takes a table the user already holds.
"""

from __future__ import annotations

import csv
import io
from collections.abc import Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING

from workbench.errors import CurveFileError, ProjectError
from workbench.inputs import read_guarded_text

if TYPE_CHECKING:
    import pandas as pd

    from workbench.conformers.mutarotation import MutarotationFit

__all__ = ["Curve", "REQUIRED_COLUMNS", "curve_from_frame", "parse_curve", "read_curve"]

REQUIRED_COLUMNS = ("time_min", "specific_rotation")


@dataclass(frozen=True)
class Curve:
    """A time course: times (min) and specific rotations (deg mL g-1 dm-1), with its source."""

    source: str
    times_min: tuple[float, ...]
    rotations: tuple[float, ...]

    def to_frame(self, fit: MutarotationFit | None = None) -> pd.DataFrame:
        """``time_min``, ``specific_rotation`` (and ``fitted``, ``residual`` given a fit) as a DataFrame."""
        from workbench.frames import curve_frame

        return curve_frame(self, fit)


def _checked_column(values: pd.Series, column: str) -> tuple[pd.Series, list[str]]:
    """The cells as numbers, and per row the problem ("" when the cell is a finite number)."""
    import math

    import pandas as pd

    text = values.astype("string").fillna("").str.strip()
    numbers = pd.to_numeric(values if pd.api.types.is_numeric_dtype(values) else text, errors="coerce")
    numbers = numbers.astype("float64")
    problems = []
    for cell, number in zip(text, numbers, strict=True):
        if math.isfinite(number):
            problems.append("")
        elif not cell:
            problems.append(f"{column} is empty")
        elif math.isnan(number) and cell.lower().lstrip("+-") != "nan":
            problems.append(f"{column} {cell!r} is not a number")
        else:
            problems.append(f"{column} {cell!r} is not a finite number")
    return numbers, problems


def curve_from_frame(
    frame: pd.DataFrame, source: str = "<DataFrame>", lines: Sequence[int] | None = None, header_line: int | None = None
) -> Curve:
    """A :class:`Curve` from a table with the columns ``time_min`` and ``specific_rotation``.

    The one place where readings are checked, for CSV files and for tables a
    user already holds (e.g. read from a spreadsheet with pandas). Column names
    are matched without regard to case or surrounding spaces; other columns
    are ignored. ``lines`` gives the file line of each row for the messages
    (otherwise rows are named by position from 1). Every fault raises
    :class:`~workbench.errors.CurveFileError` naming the source, the line or
    row, the column and what is wrong.
    """
    names: dict[str, object] = {}
    for c in frame.columns:
        key = str(c).strip().lower()
        if key in REQUIRED_COLUMNS and key in names:
            raise CurveFileError(source, header_line, f"column {key} appears twice; keep one")
        names[key] = c
    missing = [c for c in REQUIRED_COLUMNS if c not in names]
    if missing:
        found = ",".join(str(c) for c in frame.columns)
        raise CurveFileError(
            source,
            header_line,
            f"header {found!r} lacks column(s) {', '.join(missing)}; expected {','.join(REQUIRED_COLUMNS)}",
        )
    if frame.empty:
        raise CurveFileError(source, header_line, "the header is followed by no measurements")
    times, time_problems = _checked_column(frame[names["time_min"]], "time_min")
    rotations, rotation_problems = _checked_column(frame[names["specific_rotation"]], "specific_rotation")
    for row, (t, t_problem, r_problem) in enumerate(zip(times, time_problems, rotation_problems, strict=True)):
        problem = t_problem or (f"time_min {t:g} is negative; give minutes from dissolution" if t < 0 else r_problem)
        if problem:
            if lines is not None:
                raise CurveFileError(source, lines[row], problem)
            raise CurveFileError(source, None, f"row {row + 1}: {problem}")
    return Curve(source, tuple(float(t) for t in times), tuple(float(r) for r in rotations))


def parse_curve(text: str, source: str = "<text>") -> Curve:
    """A :class:`Curve` from CSV text; ``source`` names it in error messages."""
    import pandas as pd

    if "\x00" in text:
        raise CurveFileError(source, None, "the file holds NUL characters; it is not a CSV text file")
    try:
        rows = [
            (number, row)
            for number, row in enumerate(csv.reader(io.StringIO(text), skipinitialspace=True), start=1)
            if row and any(cell.strip() for cell in row) and not row[0].lstrip().startswith("#")
        ]
    except csv.Error as err:  # e.g. a field over the csv module's 128 KB limit
        raise CurveFileError(source, None, f"not a readable CSV file ({err})") from None
    if not rows:
        raise CurveFileError(source, None, f"the file is empty; expected a header {','.join(REQUIRED_COLUMNS)}")
    header_line, header = rows[0]
    names = [cell.strip().lower() for cell in header]
    missing = [c for c in REQUIRED_COLUMNS if c not in names]
    if missing:
        raise CurveFileError(
            source,
            header_line,
            f"header {','.join(header)!r} lacks column(s) {', '.join(missing)}; expected {','.join(REQUIRED_COLUMNS)}",
        )
    wanted = [names.index(c) for c in REQUIRED_COLUMNS]
    for number, row in rows[1:]:
        if len(row) <= max(wanted):
            raise CurveFileError(source, number, f"expected {len(names)} columns, found {len(row)}")
    frame = pd.DataFrame(
        [[row[i] for i in wanted] for _, row in rows[1:]], columns=list(REQUIRED_COLUMNS), dtype="object"
    )
    return curve_from_frame(frame, source, lines=[number for number, _ in rows[1:]], header_line=header_line)


def read_curve(path: str | Path) -> Curve:
    """Read a time-course CSV file (UTF-8, a byte-order mark allowed; the input guard's file-type and size limits)."""
    p = Path(path)
    try:
        text = read_guarded_text(p, str(p), what="curve files")
    except ProjectError as err:
        raise CurveFileError(str(p), None, "; ".join(err.problems)) from None
    return parse_curve(text, str(p))
