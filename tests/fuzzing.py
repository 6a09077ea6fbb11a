"""Seeded malformed project files for the fuzz test (tests/test_fuzz.py) and the fuzz benchmark.

Each case starts from one of the sample projects (sample_projects/*.json) and
applies one mutation of a named category; :func:`run_case` writes it to a
file and runs one command in-process through :func:`workbench.cli.main`,
recording the exit code, whether a traceback escaped and the wall time.
Everything is decided by the seed, so a failing case can be replayed.
"""

from __future__ import annotations

import contextlib
import io
import json
import random
import signal
import time
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from workbench.cli import main

ROOT = Path(__file__).resolve().parent.parent
SAMPLES = sorted((ROOT / "sample_projects").glob("*.json"))
HOSTILE = (
    '<img src=x onerror="alert(1)">',
    "\x1b]0;owned\x07",
    "\x1b[2J\x1b[H",
    "\x9b31m",
    "\u202eevil",
    "a\x00b",
    "'; DROP TABLE x; --",
    "../../etc/passwd",
    "\u0000\u0085\u2028",
    " ",
    "",
    '=HYPERLINK("http://x","y")',  # spreadsheet formulae (CSV export) and the solver's own names
    "@SUM(1)",
    "+1",
    "|form=alpha",
)
CATEGORIES = (
    "valid",
    "deep_nesting",
    "huge_number",
    "wrong_type",
    "surrogate",
    "hostile_string",
    "huge_size",
    "unknown_kind",
    "many_unknowns",
    "broken_bytes",
)
COMMANDS = ("solve", "validate", "plan", "report")


@dataclass(frozen=True)
class Case:
    """One generated file: its category, the command run on it and the file's bytes."""

    number: int
    category: str
    command: str
    data: bytes


@dataclass(frozen=True)
class Outcome:
    """What one run did: the exit code (``"traceback"`` or ``"hang"`` when main did not return)."""

    case: Case
    code: int | str
    seconds: float
    detail: str = ""


def _samples() -> list[dict[str, Any]]:
    return [json.loads(p.read_text(encoding="utf-8")) for p in SAMPLES]


_SAMPLES: list[dict[str, Any]] = []


def _paths(data: Any, prefix: tuple = ()) -> list[tuple]:
    """Every path (tuple of keys/indices) into ``data``."""
    out = [prefix]
    if isinstance(data, dict):
        for k, v in data.items():
            out += _paths(v, prefix + (k,))
    elif isinstance(data, list):
        for i, v in enumerate(data):
            out += _paths(v, prefix + (i,))
    return out


def _set(data: Any, path: tuple, value: Any) -> Any:
    if not path:
        return value
    parent = data
    for p in path[:-1]:
        parent = parent[p]
    parent[path[-1]] = value
    return data


def _wrong_value(rng: random.Random) -> Any:
    return rng.choice(
        [None, True, False, 0, -1, 7.5, 1e308, -1e308, "", "x", "D", [], ["series"], [6], {}, {"a": 1}, [[["deep"]]]]
    )


def _dump(data: Any) -> bytes:
    return json.dumps(data, ensure_ascii=False).encode("utf-8", "surrogatepass")


def _mutate(rng: random.Random, category: str, base: dict[str, Any], scale: int) -> bytes:
    data = json.loads(json.dumps(base))
    if category == "valid":
        obs = data.get("observations", [])
        if obs:
            keep = rng.randint(0, len(obs))
            data["observations"] = obs[:keep]
        return _dump(data)
    if category == "deep_nesting":
        depth = rng.choice([20, 200, 990, 5000, 100_000 if scale > 1 else 20_000])
        target = rng.choice(_paths(data)[1:])
        text = _dump(_set(data, target, "@@DEEP@@")).decode("utf-8")
        opener = rng.choice(["[", '{"a":'])
        closer = "]" if opener == "[" else "}"
        return text.replace('"@@DEEP@@"', opener * depth + "1" + closer * depth, 1).encode()
    if category == "huge_number":
        token = rng.choice(["9" * 401, "9" * 5000, "-" + "9" * 4301, "1e999", "-1e999", "NaN", "Infinity", "1" * 19])
        target = rng.choice([p for p in _paths(data)[1:] if not isinstance(p[-1], int)] or [("title",)])
        text = _dump(_set(data, target, "@@NUM@@")).decode("utf-8")
        return text.replace('"@@NUM@@"', token, 1).encode()
    if category == "wrong_type":
        for _ in range(rng.randint(1, 3)):
            target = rng.choice(_paths(data))
            data = _set(data, target, _wrong_value(rng))
        return _dump(data)
    if category == "surrogate":
        strings = [p for p in _paths(data)[1:] if isinstance(_get(data, p), str)]
        target = rng.choice(strings) if strings else ("title",)
        data = _set(data, target, str(_get(data, target) or "") + rng.choice(["\ud800", "\udfff", "\udbff\udbff"]))
        return _dump(data)
    if category == "hostile_string":
        word = rng.choice(HOSTILE)
        if rng.random() < 0.5 and data.get("unknowns"):
            old = data["unknowns"][0]["id"]  # rename an unknown everywhere: references stay consistent
            new = "U" + word if rng.random() < 0.5 else word + "U"  # the word also leads the id
            text = _dump(data).decode("utf-8").replace(f'"{old}"', json.dumps(new))
            return text.encode("utf-8", "surrogatepass")
        strings = [p for p in _paths(data)[1:] if isinstance(_get(data, p), str)]
        for target in rng.sample(strings, min(len(strings), rng.randint(1, 4))):
            data = _set(data, target, word + str(_get(data, target)))
        return _dump(data)
    if category == "huge_size":
        kind = rng.choice(["note", "observations", "padding"])
        if kind == "note" and data.get("observations"):
            data["observations"][0]["note"] = "x" * rng.choice([9_999, 10_001, 200_000])
        elif kind == "observations" and data.get("observations"):
            first = data["observations"][0]
            n = rng.choice([2_000, 10_001]) if scale > 1 else rng.choice([300, 10_001])
            data["observations"] = [dict(first, id=f"Z{i}") for i in range(n)]
        else:
            data["title"] = "t" * rng.choice([1_000, 50_000])
        return _dump(data)
    if category == "unknown_kind":
        obs = data.get("observations") or [{"id": "E1"}]
        o = rng.choice(obs)
        o["kind"] = rng.choice(
            ["", "Series", "series ", "osazone", "same-product", "carbon_count", "different", "x" * 80]
        )
        return _dump(data)
    if category == "many_unknowns":
        n = rng.randint(4, 16 if scale == 1 else 40)
        unknowns = [
            {"id": f"U{i}", "scope": {"carbons": rng.choice([[5], [6], [5, 6], [4, 5, 6, 7]])}} for i in range(n)
        ]
        obs: list[dict[str, Any]] = []
        for i in range(rng.randint(n, 2 * n)):
            a, b = rng.sample(range(n), 2)
            kind = rng.choice(["same_product", "different", "series", "chain_extension", "aldaric_acid"])
            if kind == "same_product":
                obs.append(
                    {
                        "id": f"R{i}",
                        "kind": kind,
                        "reaction": rng.choice(["osazone", "alditol", "aldaric_acid", "aldonic_acid"]),
                        "members": [f"U{a}", f"U{b}"],
                        "relation": rng.choice(["identical", "identical", "enantiomeric", "different"]),
                    }
                )
            elif kind == "different":
                obs.append({"id": f"R{i}", "kind": kind, "members": [f"U{a}", f"U{b}"]})
            elif kind == "chain_extension":
                obs.append(
                    {
                        "id": f"R{i}",
                        "kind": kind,
                        "method": "kiliani_fischer",
                        "substrate": f"U{a}",
                        "products": [f"U{b}"],
                    }
                )
            elif kind == "series":
                obs.append({"id": f"R{i}", "kind": kind, "unknown": f"U{a}", "value": rng.choice("DL")})
            else:
                obs.append({"id": f"R{i}", "kind": kind, "unknown": f"U{a}", "optically_active": rng.random() < 0.7})
        data = {
            "format": "stereosieve-project",
            "version": 1,
            "title": "invented",
            "unknowns": unknowns,
            "observations": obs,
        }
        return _dump(data)
    if category == "broken_bytes":
        raw = bytearray(_dump(data))
        how = rng.choice(["truncate", "flip", "bom", "latin1", "empty", "nul"])
        if how == "truncate":
            return bytes(raw[: rng.randint(0, len(raw))])
        if how == "flip":
            for _ in range(rng.randint(1, 5)):
                i = rng.randrange(len(raw))
                raw[i] = rng.randrange(256)
            return bytes(raw)
        if how == "bom":
            return b"\xef\xbb\xbf" + bytes(raw)
        if how == "latin1":
            return bytes(raw).replace(b'"title": "', b'"title": "\xe9', 1)
        if how == "nul":
            return bytes(raw) + b"\x00" * rng.randint(1, 64)
        return b""
    raise ValueError(category)


def _get(data: Any, path: tuple) -> Any:
    for p in path:
        data = data[p]
    return data


def cases(seed: int, count: int, scale: int = 1) -> list[Case]:
    """``count`` cases, categories and commands taken in turn; ``scale`` > 1 allows the larger sizes."""
    if not _SAMPLES:
        _SAMPLES.extend(_samples())
    rng = random.Random(seed)
    out = []
    for n in range(count):
        category = CATEGORIES[n % len(CATEGORIES)]
        command = COMMANDS[(n // len(CATEGORIES)) % len(COMMANDS)]
        base = rng.choice(_SAMPLES)
        out.append(Case(n, category, command, _mutate(rng, category, base, scale)))
    return out


class _Hang(Exception):
    pass


def _alarm(signum: int, frame: Any) -> None:
    raise _Hang()


def run_case(case: Case, folder: Path, timeout_s: int = 60) -> Outcome:
    """Write the case to ``folder`` and run its command in-process; never raises."""
    path = folder / f"case{case.number}.json"
    path.write_bytes(case.data)
    argv = [case.command, str(path)]
    if case.command == "report":
        argv += ["-o", str(folder / f"case{case.number}.html")]
    out, err = io.StringIO(), io.StringIO()
    previous: Callable | int | None = None
    if hasattr(signal, "SIGALRM"):
        previous = signal.signal(signal.SIGALRM, _alarm)
        signal.alarm(timeout_s)
    start = time.perf_counter()
    code: int | str
    detail = ""
    try:
        with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
            code = main(argv)
    except _Hang:
        code, detail = "hang", f"over {timeout_s} s"
    except BaseException as exc:  # noqa: BLE001 - the point is to see every escape
        code, detail = "traceback", f"{type(exc).__name__}: {str(exc)[:200]}"
    finally:
        if hasattr(signal, "SIGALRM"):
            signal.alarm(0)
            signal.signal(signal.SIGALRM, previous)
    seconds = time.perf_counter() - start
    if code != "traceback" and "Traceback" in err.getvalue():
        code, detail = "traceback", err.getvalue()[-300:]
    path.unlink()
    report = folder / f"case{case.number}.html"
    if report.exists():
        report.unlink()
    return Outcome(case, code, seconds, detail)
