"""The input guard: every file a command reads passes here before anything else reads it.

:func:`read_project_json` refuses, with a message naming the file and the
place in it, whatever could hang, exhaust memory or crash a later stage:

- anything that is not a regular file (a folder, a device such as
  ``/dev/zero``, a pipe with no writer, a socket): refused from its file type,
  before it is opened for reading;
- files larger than :data:`MAX_BYTES` (checked from the size on disk and
  again while reading, so a growing file is cut off too);
- text that is not UTF-8 (a UTF-8 byte-order mark is accepted and dropped);
- JSON nested deeper than :data:`MAX_DEPTH` (checked without recursion),
  integers longer than :data:`MAX_INT_DIGITS` digits, numbers that overflow a
  float, ``NaN``/``Infinity``, a key given twice in one object;
- strings that are not valid Unicode (lone surrogates such as ``\\ud800``) or
  longer than :data:`MAX_TEXT` characters;
- more than :data:`MAX_UNKNOWNS` unknowns or :data:`MAX_OBSERVATIONS`
  observations.

Field types, choices and ranges are checked afterwards by
:func:`workbench.evidence.project.project_from_dict` from the field specs.
"""

from __future__ import annotations

import json
import os
import stat
from pathlib import Path
from typing import Any

from workbench.errors import ProjectError

__all__ = [
    "MAX_BYTES",
    "MAX_DEPTH",
    "MAX_INT_DIGITS",
    "MAX_TEXT",
    "MAX_UNKNOWNS",
    "MAX_OBSERVATIONS",
    "read_project_json",
    "read_guarded_text",
    "parse_project_json",
    "check_tree",
    "show",
    "valid_text",
]

MAX_BYTES = 16 * 1024 * 1024  # a project of 10,000 observations with notes is about 3 MB
MAX_DEPTH = 16  # a project file needs 4 levels (project, list, observation, members)
MAX_INT_DIGITS = 18  # fits a 64-bit integer and a float exactly enough for every field
MAX_TEXT = 10_000  # characters in one string (a note of a page)
MAX_UNKNOWNS = 1_000
MAX_OBSERVATIONS = 10_000


class _Refused(Exception):
    """Raised inside the JSON parser's hooks; turned into a ProjectError with the file's name.

    ``token`` is the offending text, used to find its line in the file.
    """

    def __init__(self, problem: str, token: str = "") -> None:
        super().__init__(problem)
        self.token = token


def show(value: Any, limit: int = 60) -> str:
    """A short, safe rendering of a value for a message (never recursive, never longer than ``limit``)."""
    if isinstance(value, str):
        # repr keeps printable letters of any script (β, é, ·) and escapes every control, format (bidi)
        # and separator character and lone surrogates, so the message stays one safe line
        text = repr(value)
    elif isinstance(value, bool) or value is None:
        text = repr(value)
    elif isinstance(value, int):
        digits = len(str(abs(value))) if abs(value) < 10**100 else 101
        text = str(value) if digits <= 30 else f"a {'>100' if digits > 100 else digits}-digit integer"
    elif isinstance(value, float):
        text = repr(value)
    elif isinstance(value, list | tuple):
        text = f"a list of {len(value)} item(s)"
    elif isinstance(value, dict):
        text = f"an object with {len(value)} field(s)"
    else:
        text = type(value).__name__
    return text if len(text) <= limit else text[: limit - 3] + "..."


def read_project_json(path: str | os.PathLike[str]) -> Any:
    """The parsed JSON of a project file, or :class:`ProjectError` naming the file and the fault."""
    source = str(path)
    return parse_project_json(_read_text(Path(path), source), source)


def read_guarded_text(path: str | os.PathLike[str], source: str, what: str = "project files") -> str:
    """UTF-8 text of a regular file of at most :data:`MAX_BYTES`; :class:`ProjectError` otherwise."""
    return _read_text(Path(path), source, what)


def _read_text(path: Path, source: str, what: str = "project files") -> str:
    try:
        info = os.stat(path)
    except FileNotFoundError:
        raise ProjectError(source, ["no such file"]) from None
    except OSError as err:
        raise ProjectError(source, [f"cannot read the file: {err.strerror or err}"]) from None
    if stat.S_ISDIR(info.st_mode):
        raise ProjectError(source, ["is a folder, not a project file"])
    if not stat.S_ISREG(info.st_mode):
        raise ProjectError(source, [f"is not a regular file (a device, pipe or socket); {what} must be files"])
    if info.st_size > MAX_BYTES:
        raise ProjectError(source, [f"is {info.st_size:,} bytes; {what} are limited to {MAX_BYTES:,} bytes"])
    try:
        # O_NONBLOCK: should the file be swapped for a pipe after the check, opening still cannot hang
        fd = os.open(path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0))
    except OSError as err:
        raise ProjectError(source, [f"cannot read the file: {err.strerror or err}"]) from None
    with os.fdopen(fd, "rb") as handle:
        if not stat.S_ISREG(os.fstat(handle.fileno()).st_mode):
            raise ProjectError(source, [f"is not a regular file; {what} must be files"])
        try:
            data = handle.read(MAX_BYTES + 1)
        except OSError as err:
            raise ProjectError(source, [f"cannot read the file: {err.strerror or err}"]) from None
    if len(data) > MAX_BYTES:
        raise ProjectError(source, [f"is larger than the limit of {MAX_BYTES:,} bytes for {what}"])
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as err:
        raise ProjectError(source, [f"not UTF-8 text ({err.reason} at byte {err.start})"]) from None


def _parse_int(text: str) -> int:
    digits = text.lstrip("-")
    if len(digits) > MAX_INT_DIGITS:
        raise _Refused(f"an integer of {len(digits)} digits; numbers are limited to {MAX_INT_DIGITS} digits", text)
    return int(text)


def _parse_float(text: str) -> float:
    if len(text) > 400:
        raise _Refused(f"a number written with {len(text)} characters; write it shorter", text)
    value = float(text)
    if value in (float("inf"), float("-inf")):
        raise _Refused(f"the number {text[:30]} is too large", text)
    return value


def _parse_constant(text: str) -> Any:
    raise _Refused(f"{text} is not a number JSON allows; give a finite number", text)


def _pairs(pairs: list[tuple[str, Any]]) -> dict[str, Any]:
    out: dict[str, Any] = {}
    for key, value in pairs:
        if key in out:
            raise _Refused(f"the field {show(key)} is given twice in one object")
        out[key] = value
    return out


def parse_project_json(text: str, source: str = "<project>") -> Any:
    """Parse project-file text under the guard's limits; :class:`ProjectError` on any fault."""
    if len(text) > MAX_BYTES:
        raise ProjectError(source, [f"is larger than the limit of {MAX_BYTES:,} bytes for project files"])
    if text.startswith("\ufeff"):
        text = text[1:]
    try:
        data = json.loads(
            text,
            parse_int=_parse_int,
            parse_float=_parse_float,
            parse_constant=_parse_constant,
            object_pairs_hook=_pairs,
        )
    except _Refused as err:
        at = text.find(err.token) if err.token else -1
        where = f"line {text.count(chr(10), 0, at) + 1}: " if at >= 0 else ""
        raise ProjectError(source, [f"{where}{err}"]) from None
    except RecursionError:
        raise ProjectError(
            source, [f"the JSON is nested too deeply (more than {MAX_DEPTH} levels are refused)"]
        ) from None
    except json.JSONDecodeError as err:
        raise ProjectError(source, [f"malformed JSON at line {err.lineno}, column {err.colno}: {err.msg}"]) from None
    except ValueError as err:  # e.g. Python's own limit on integer digits
        raise ProjectError(source, [f"unreadable number: {err}"]) from None
    problems = check_tree(data)
    if problems:
        raise ProjectError(source, problems)
    return data


def _where(path: tuple[Any, ...], root: Any) -> str:
    """``observation E3, field 'note'`` or ``unknowns[2].label`` for a path into the project."""
    if len(path) >= 2 and path[0] == "observations" and isinstance(path[1], int) and isinstance(root, dict):
        items = root.get("observations")
        item = items[path[1]] if isinstance(items, list) and path[1] < len(items) else None
        oid = item.get("id") if isinstance(item, dict) else None
        if isinstance(oid, str) and valid_text(oid) and len(oid) <= 80:
            rest = "".join(f"[{p}]" if isinstance(p, int) else f".{p}" for p in path[3:])
            field = f", field '{path[2]}{rest}'" if len(path) > 2 else ""
            return f"observation {show(oid)[1:-1]}{field}"
    text = ""
    for p in path:
        text += f"[{p}]" if isinstance(p, int) else (f".{p}" if text else str(p))
    return text or "the file"


def valid_text(text: str) -> bool:
    """True when ``text`` is valid Unicode (no lone surrogate, as bytes that are not UTF-8 leave behind)."""
    try:
        text.encode("utf-8")
    except UnicodeEncodeError:
        return False
    return True


def check_tree(data: Any) -> list[str]:
    """Problems of depth, text and size in parsed JSON (an iterative walk: any depth is safe)."""
    problems: list[str] = []
    stack: list[tuple[Any, tuple[Any, ...]]] = [(data, ())]
    while stack and len(problems) < 20:
        value, path = stack.pop()
        if len(path) > MAX_DEPTH:
            problems.append(f"{_where(path[:3], data)}: nested more than {MAX_DEPTH} levels deep")
            continue
        if isinstance(value, str):
            if not valid_text(value):
                problems.append(
                    f"{_where(path, data)}: the text is not valid Unicode (a lone surrogate such as \\ud800)"
                )
            elif len(value) > MAX_TEXT:
                problems.append(f"{_where(path, data)}: the text has {len(value):,} characters (limit {MAX_TEXT:,})")
        elif isinstance(value, dict):
            for key, item in value.items():
                if not valid_text(key):
                    problems.append(f"{_where(path, data)}: a field name is not valid Unicode")
                    continue
                if len(key) > 200:
                    problems.append(f"{_where(path, data)}: a field name has {len(key):,} characters")
                    continue
                stack.append((item, path + (key,)))
        elif isinstance(value, list):
            for i, item in enumerate(value):
                stack.append((item, path + (i,)))
    if isinstance(data, dict):
        for key, limit in (("unknowns", MAX_UNKNOWNS), ("observations", MAX_OBSERVATIONS)):
            items = data.get(key)
            if isinstance(items, list) and len(items) > limit:
                problems.append(f"field '{key}' holds {len(items):,} entries; the limit is {limit:,}")
    return sorted(set(problems), key=problems.index)
