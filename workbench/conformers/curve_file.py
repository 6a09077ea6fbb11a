"""Reading a polarimetry time course from CSV (the I/O edge of the mutarotation fit).

The file has a header row naming the columns ``time_min`` and
``specific_rotation`` (other columns are ignored), then one measurement per
line: minutes from dissolution and [alpha]D in deg mL g-1 dm-1. Blank lines
and lines starting with ``#`` are skipped. Every fault raises
:class:`~workbench.errors.CurveFileError` naming the file, the line and what
is wrong.
"""

from __future__ import annotations

import csv
import io
import math
from dataclasses import dataclass
from pathlib import Path
from typing import TYPE_CHECKING

from workbench.errors import CurveFileError

if TYPE_CHECKING:
    import pandas as pd

    from workbench.conformers.mutarotation import MutarotationFit

__all__ = ["Curve", "REQUIRED_COLUMNS", "parse_curve", "read_curve"]

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


def _number(text: str, source: str, line: int, column: str) -> float:
    try:
        value = float(text)
    except ValueError:
        raise CurveFileError(source, line, f"{column} {text.strip()!r} is not a number") from None
    if not math.isfinite(value):
        raise CurveFileError(source, line, f"{column} {text.strip()!r} is not a finite number")
    return value


def parse_curve(text: str, source: str = "<text>") -> Curve:
    """A :class:`Curve` from CSV text; ``source`` names it in error messages."""
    rows = [
        (number, row)
        for number, row in enumerate(csv.reader(io.StringIO(text)), start=1)
        if row and any(cell.strip() for cell in row) and not row[0].lstrip().startswith("#")
    ]
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
    it, ir = names.index("time_min"), names.index("specific_rotation")
    times: list[float] = []
    rotations: list[float] = []
    for number, row in rows[1:]:
        if len(row) <= max(it, ir):
            raise CurveFileError(source, number, f"expected {len(names)} columns, found {len(row)}")
        t = _number(row[it], source, number, "time_min")
        if t < 0:
            raise CurveFileError(source, number, f"time_min {t:g} is negative; give minutes from dissolution")
        times.append(t)
        rotations.append(_number(row[ir], source, number, "specific_rotation"))
    if not times:
        raise CurveFileError(source, header_line, "the header is followed by no measurements")
    return Curve(source, tuple(times), tuple(rotations))


def read_curve(path: str | Path) -> Curve:
    """Read a time-course CSV file (UTF-8)."""
    p = Path(path)
    try:
        text = p.read_text(encoding="utf-8-sig")
    except FileNotFoundError:
        raise CurveFileError(str(p), None, "no such file") from None
    except UnicodeDecodeError as err:
        raise CurveFileError(str(p), None, f"not UTF-8 text ({err.reason})") from None
    return parse_curve(text, str(p))
