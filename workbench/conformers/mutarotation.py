"""Fitting a mutarotation time course: first-order approach to equilibrium.

A freshly dissolved anomer relaxes to the anomeric equilibrium; for two
interconverting forms the rotation follows

    [alpha](t) = [alpha]eq + ([alpha]0 - [alpha]eq) exp(-k t)

with k = k(alpha->beta) + k(beta->alpha), the observed rate constant
(per minute here; half-life ln 2 / k). The fit is an ordinary least-squares
fit with :func:`scipy.optimize.curve_fit`, started from the best point of a
log-spaced grid in k (the model is linear in the two rotations for fixed k),
so it needs no user guesses. With the pure anomers' rotations, the
equilibrium beta fraction follows from the two-state model (Bruice's
glucose rotations give 64 % beta).
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from workbench.conformers.polarimetry import two_state_beta_fraction
from workbench.errors import FitError

__all__ = [
    "MutarotationFit",
    "fit_mutarotation",
    "first_order_curve",
]

_MIN_POINTS = 4
_MIN_SPAN_MIN = 1e-6  # a course shorter than this (minutes) cannot show a relaxation
_MAX_RELATIVE_K_ERROR = 0.5  # a rate constant less certain than +/-50 % is no fit
_MAX_RMSE_SHARE = 0.25  # residuals above a quarter of the change fitted mean no first-order curve


def first_order_curve(t: np.ndarray | Sequence[float], initial: float, equilibrium: float, k: float) -> np.ndarray:
    """Rotation (deg mL g-1 dm-1) at times ``t`` (min) for rate constant ``k`` (per min)."""
    tt = np.asarray(t, dtype=float)
    with np.errstate(over="ignore", under="ignore"):
        return equilibrium + (initial - equilibrium) * np.exp(-k * tt)


FRACTION_SLACK = 0.02  # a mole fraction this far outside 0-1 is read as the bound (fit scatter)


def _bounded(fraction: float) -> float:
    """``fraction`` with values within :data:`FRACTION_SLACK` outside 0-1 put on the bound (-0.001 -> 0.0)."""
    if -FRACTION_SLACK <= fraction < 0.0:
        return 0.0
    if 1.0 < fraction <= 1.0 + FRACTION_SLACK:
        return 1.0
    return fraction


@dataclass(frozen=True)
class MutarotationFit:
    """Result of a mutarotation fit. Rotations in deg mL g-1 dm-1, times in minutes.

    ``beta_fraction`` (equilibrium) and ``initial_beta_fraction`` (at t = 0)
    are given only when the pure anomers' rotations were supplied; they come
    from the two-state model. A value just outside 0-1 (by at most
    :data:`FRACTION_SLACK`, the scatter of a fitted end point) is the bound
    itself and is given as 0 or 1; one further outside is kept as computed, a
    sign that the data and the anomer rotations disagree.
    """

    rate_constant_per_min: float
    rate_constant_stderr: float | None
    initial_rotation: float
    equilibrium_rotation: float
    equilibrium_stderr: float | None
    rmse: float
    points: int
    alpha_rotation: float | None = None
    beta_rotation: float | None = None

    def __post_init__(self) -> None:
        if not self.rate_constant_per_min > 0:
            raise FitError(f"rate constant must be positive, got {self.rate_constant_per_min}")

    @property
    def half_life_min(self) -> float:
        """ln 2 / k, minutes."""
        return math.log(2.0) / self.rate_constant_per_min

    @property
    def beta_fraction(self) -> float | None:
        """Equilibrium beta fraction (two-state model) or None without anomer rotations."""
        if self.alpha_rotation is None or self.beta_rotation is None:
            return None
        return _bounded(two_state_beta_fraction(self.alpha_rotation, self.beta_rotation, self.equilibrium_rotation))

    @property
    def initial_beta_fraction(self) -> float | None:
        """Beta fraction of the sample at t = 0 (two-state model), or None."""
        if self.alpha_rotation is None or self.beta_rotation is None:
            return None
        return _bounded(two_state_beta_fraction(self.alpha_rotation, self.beta_rotation, self.initial_rotation))

    def to_dict(self) -> dict:
        """The keys printed by ``stereosieve mutarotation --json``."""
        return {
            "rate_constant_per_min": self.rate_constant_per_min,
            "half_life_min": self.half_life_min,
            "initial_rotation": self.initial_rotation,
            "equilibrium_rotation": self.equilibrium_rotation,
            "rmse": self.rmse,
            "beta_fraction": self.beta_fraction,
            "alpha_fraction": None if self.beta_fraction is None else 1.0 - self.beta_fraction,
            "initial_beta_fraction": self.initial_beta_fraction,
            "rate_constant_stderr": self.rate_constant_stderr,
            "equilibrium_stderr": self.equilibrium_stderr,
            "points": self.points,
            "alpha_rotation": self.alpha_rotation,
            "beta_rotation": self.beta_rotation,
        }


def _validate(times_min: Sequence[float], rotations: Sequence[float]) -> tuple[np.ndarray, np.ndarray]:
    t = np.asarray(times_min, dtype=float)
    r = np.asarray(rotations, dtype=float)
    if t.ndim != 1 or r.ndim != 1 or len(t) != len(r):
        raise FitError(f"times and rotations must be two lists of equal length, got {t.shape} and {r.shape}")
    if len(t) < _MIN_POINTS:
        raise FitError(f"a mutarotation fit needs at least {_MIN_POINTS} points, got {len(t)}")
    if not (np.all(np.isfinite(t)) and np.all(np.isfinite(r))):
        raise FitError("times and rotations must be finite numbers (no NaN or infinity)")
    if np.any(t < 0):
        raise FitError(f"times must be minutes from dissolution (>= 0); found {float(t.min())}")
    if len(np.unique(t)) < 3:
        raise FitError("at least three distinct times are needed to fit a rate constant")
    if float(t.max() - t.min()) < _MIN_SPAN_MIN:
        raise FitError(f"the times span less than {_MIN_SPAN_MIN:g} min; give minutes from dissolution")
    scale = float(np.max(np.abs(r)))
    if scale > 1e9:
        raise FitError(f"rotations up to {scale:.3g} are not specific rotations (deg mL g-1 dm-1)")
    return t, r


def _grid_start(t: np.ndarray, r: np.ndarray) -> tuple[float, float, float]:
    """Best (initial, equilibrium, k) over a log grid of k; linear least squares for fixed k."""
    span = float(t.max() - t.min())
    positive = np.diff(np.unique(t))
    step = float(positive.min()) if len(positive) else span
    ks = np.logspace(math.log10(0.05 / span), math.log10(20.0 / step), 200)
    best = (math.inf, 0.0, 0.0, 0.0)
    for k in ks:
        e = np.exp(-k * t)
        design = np.column_stack([e, 1.0 - e])
        coef, *_ = np.linalg.lstsq(design, r, rcond=None)
        sse = float(np.sum((design @ coef - r) ** 2))
        if sse < best[0]:
            best = (sse, float(coef[0]), float(coef[1]), float(k))
    return best[1], best[2], best[3]


def _check_quality(
    t: np.ndarray, initial: float, equilibrium: float, k: float, rmse: float, k_error: float | None
) -> None:
    """Refuse a fit that does not describe a first-order relaxation (FitError says which criterion failed).

    Criteria: (1) the relaxation must be resolved by the sampling: k times the
    smallest time step below 5 (else the curve has relaxed between two points
    and k is bounded only by the grid); (2) the covariance must give k a
    standard error under 50 % of k; (3) the rmse must be under a quarter of
    the fitted change |initial - equilibrium|. Pure noise fails (2) or (3).
    """
    steps = np.diff(np.unique(t))
    step = float(steps.min()) if len(steps) else float(t.max() - t.min())
    change = abs(initial - equilibrium)
    if k * step > 5.0:
        raise FitError(
            f"no first-order relaxation resolved: the fitted change is over within one time step "
            f"(k = {k:.3g}/min, step {step:g} min); measure earlier and more often"
        )
    if k_error is None or not math.isfinite(k_error) or k_error > _MAX_RELATIVE_K_ERROR * k:
        shown = "undetermined" if k_error is None or not math.isfinite(k_error) else f"+/- {k_error:.3g}"
        raise FitError(
            f"no first-order relaxation found: the rate constant is {shown} for k = {k:.3g}/min "
            f"(more than {_MAX_RELATIVE_K_ERROR:.0%} uncertain)"
        )
    if not change > 0 or rmse > _MAX_RMSE_SHARE * change:
        raise FitError(
            f"no first-order relaxation found: the scatter (rmse {rmse:.3g}) is large beside the fitted change "
            f"({change:.3g}); the curve looks like noise"
        )


def fit_mutarotation(
    times_min: Sequence[float],
    rotations: Sequence[float],
    alpha: float | None = None,
    beta: float | None = None,
) -> MutarotationFit:
    """Fit a first-order approach to equilibrium to a polarimetry time course.

    ``times_min`` in minutes from dissolution, ``rotations`` specific
    rotations (deg mL g-1 dm-1). ``alpha`` and ``beta`` (the pure anomers'
    rotations), if both given, yield the equilibrium beta fraction.
    Raises :class:`~workbench.errors.FitError` on bad input or when the data
    show no first-order relaxation (criteria in :func:`_check_quality`).
    """
    if (alpha is None) != (beta is None):
        raise FitError("give both the alpha and the beta rotation, or neither")
    for name, value in (("alpha", alpha), ("beta", beta)):
        if value is not None and not (math.isfinite(value) and abs(value) < 1e4):
            raise FitError(f"the {name} anomer's rotation must be a finite number of degrees, got {value}")
    if alpha is not None and alpha == beta:
        raise FitError("the alpha and beta rotations are equal; the two-state model needs them to differ")
    t, r = _validate(times_min, rotations)
    if float(np.ptp(r)) == 0.0:
        raise FitError("the rotation does not change: the curve shows no mutarotation to fit")
    from scipy.optimize import curve_fit  # imported here: scipy.optimize costs 0.3 s to import

    r0, req, k0 = _grid_start(t, r)
    try:
        popt, pcov = curve_fit(
            first_order_curve, t, r, p0=(r0, req, k0), bounds=([-np.inf, -np.inf, 0.0], [np.inf, np.inf, np.inf])
        )
    except (RuntimeError, ValueError) as err:
        raise FitError(f"the first-order fit did not converge: {err}") from err
    initial, equilibrium, k = (float(x) for x in popt)
    if not k > 0 or not math.isfinite(k):
        raise FitError("the fitted rate constant is not positive; the data show no approach to equilibrium")
    span = float(t.max() - t.min())
    if k * span < 0.1:
        raise FitError(
            f"the curve changes too little over {span:g} min (k = {k:.3g}/min) to locate the equilibrium; "
            "measure for longer"
        )
    residual = first_order_curve(t, initial, equilibrium, k) - r
    rmse = float(np.sqrt(np.mean(residual**2)))
    errors = np.sqrt(np.diag(pcov)) if np.all(np.isfinite(pcov)) else None
    _check_quality(t, initial, equilibrium, k, rmse, None if errors is None else float(errors[2]))
    return MutarotationFit(
        rate_constant_per_min=k,
        rate_constant_stderr=None if errors is None else float(errors[2]),
        initial_rotation=initial,
        equilibrium_rotation=equilibrium,
        equilibrium_stderr=None if errors is None else float(errors[1]),
        rmse=rmse,
        points=len(t),
        alpha_rotation=alpha,
        beta_rotation=beta,
    )
