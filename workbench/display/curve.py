"""A measured time series with its fitted curve, as a small SVG (used for polarimetry).

Points are drawn as dots, the fit (any function of time) as a line, optional
horizontal reference lines (e.g. the pure anomers' rotations) dashed and
labelled. Units are whatever the caller states in the axis titles; for
mutarotation: minutes and deg mL g-1 dm-1.
"""

from __future__ import annotations

from collections.abc import Callable, Mapping, Sequence

from workbench.display.palette import ACCENT, FONT, INK, MUTED, RULE, SERIES_COLOURS, esc

__all__ = ["curve_svg"]


def _ticks(lo: float, hi: float, count: int = 5) -> list[float]:
    span = hi - lo or 1.0
    raw = span / count
    step = min((10**k * m for k in range(-3, 6) for m in (1, 2, 5) if 10**k * m >= raw), default=raw)
    start = (lo // step) * step
    out = []
    v = start
    while v <= hi + 1e-9:
        if v >= lo - 1e-9:
            out.append(round(v, 10))
        v += step
    return out


def curve_svg(
    times: Sequence[float],
    values: Sequence[float],
    fit: Callable[[float], float] | None = None,
    references: Mapping[str, float] | None = None,
    x_title: str = "time / min",
    y_title: str = "[alpha]D / deg mL g-1 dm-1",
    width: float = 440.0,
    height: float = 240.0,
) -> str:
    """SVG of ``values`` against ``times``, with the fitted ``fit(t)`` and labelled ``references``."""
    if len(times) != len(values) or not times:
        raise ValueError("give as many values as times, at least one")
    refs = dict(references or {})
    left, right, top, bottom = 58.0, 16.0, 14.0, height - 40.0
    t_lo, t_hi = min(0.0, min(times)), max(times)
    ys = list(values) + list(refs.values())
    if fit is not None:
        ys += [fit(t_lo + (t_hi - t_lo) * i / 60) for i in range(61)]
    y_lo, y_hi = min(ys), max(ys)
    pad = 0.06 * ((y_hi - y_lo) or 1.0)
    y_lo, y_hi = y_lo - pad, y_hi + pad

    def px(t: float) -> float:
        return left + (t - t_lo) / ((t_hi - t_lo) or 1.0) * (width - left - right)

    def py(v: float) -> float:
        return bottom - (v - y_lo) / (y_hi - y_lo) * (bottom - top)

    parts = [
        f'<svg xmlns="http://www.w3.org/2000/svg" class="ss-curve" width="{width:.0f}" height="{height:.0f}" '
        f'viewBox="0 0 {width:.0f} {height:.0f}" font-family="{esc(FONT)}" font-size="10" role="img" '
        f'aria-label="{esc(y_title)} against {esc(x_title)}">'
    ]
    for v in _ticks(y_lo, y_hi):
        parts.append(f'<path d="M{left:.1f} {py(v):.1f}H{width - right:.1f}" stroke="{RULE}" stroke-width="0.7"/>')
        parts.append(f'<text x="{left - 4:.1f}" y="{py(v) + 3:.1f}" text-anchor="end" fill="{MUTED}">{v:g}</text>')
    for t in _ticks(t_lo, t_hi):
        parts.append(f'<text x="{px(t):.1f}" y="{bottom + 14:.1f}" text-anchor="middle" fill="{MUTED}">{t:g}</text>')
    parts.append(f'<path d="M{left:.1f} {top:.1f}V{bottom:.1f}H{width - right:.1f}" stroke="{INK}" fill="none"/>')
    parts.append(
        f'<text x="{(left + width - right) / 2:.1f}" y="{height - 6:.1f}" text-anchor="middle" fill="{INK}">'
        f"{esc(x_title)}</text>"
    )
    parts.append(
        f'<text x="12" y="{(top + bottom) / 2:.1f}" text-anchor="middle" fill="{INK}" '
        f'transform="rotate(-90 12 {(top + bottom) / 2:.1f})">{esc(y_title)}</text>'
    )
    for k, (label, v) in enumerate(refs.items()):
        colour = SERIES_COLOURS[(k + 1) % len(SERIES_COLOURS)]
        parts.append(
            f'<path d="M{left:.1f} {py(v):.1f}H{width - right:.1f}" stroke="{colour}" stroke-dasharray="4 3"/>'
        )
        parts.append(
            f'<text x="{width - right - 2:.1f}" y="{py(v) - 3:.1f}" text-anchor="end" fill="{colour}">'
            f"{esc(label)} {v:g}</text>"
        )
    if fit is not None:
        pts = [(px(t), py(fit(t))) for t in (t_lo + (t_hi - t_lo) * i / 80 for i in range(81))]
        d = "M" + "L".join(f"{x:.1f} {y:.1f}" for x, y in pts)
        parts.append(f'<path class="ss-fit" d="{d}" stroke="{ACCENT}" stroke-width="1.8" fill="none"/>')
    for t, v in zip(times, values, strict=True):
        parts.append(f'<circle cx="{px(t):.1f}" cy="{py(v):.1f}" r="2.8" fill="{INK}"/>')
    parts.append("</svg>")
    return "".join(parts)
