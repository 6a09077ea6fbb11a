"""Timing and agreement of the conformer layer.

Run: ``python benchmarks/bench_conformers.py`` (add ``--quick`` to embed only
the D-aldohexoses and D-aldopentoses). Prints

1. 3D conformers (ETKDG + MMFF94, both chairs) per candidate, cold and cached,
   over the default scope;
2. the fast path (Angyal fractions and chairs + HLA couplings on ideal
   chairs) per candidate, cold and cached, over the default scope and over
   3-9 carbons with every modification;
3. the agreement table: predicted vs published anomer fractions and
   couplings, with sources (REFERENCE_VALUES.md);
4. Angyal vs MMFF94 chair and anomer preferences where they disagree (MMFF94 in
   the gas phase and with water's dielectric constant).
"""

from __future__ import annotations

import argparse
import statistics
import sys
import time

from workbench.chem import DEFAULT_SCOPE, Scope, catalogue, resolve
from workbench.chem.names import display_name
from workbench.chem.smiles import RingForm, ring_forms
from workbench.conformers import (
    ConformerSettings,
    anomer_comparison,
    anomer_fractions,
    chair_comparison,
    chair_preferences,
    conformer,
    coupling,
    published_rotation,
    ring_conformers,
    ring_couplings,
    ring_couplings_3d,
)
from workbench.conformers.summary import clear_fast_caches


def _fast(chains) -> float:
    start = time.perf_counter()
    for chain in chains:
        anomer_fractions(chain)
        chair_preferences(chain)
        ring_couplings(chain)
    return (time.perf_counter() - start) / len(chains)


def bench_fast() -> None:
    print("\n== fast path: Angyal fractions + chairs + HLA couplings (ms per candidate) ==")
    for label, scope in (
        ("default scope", DEFAULT_SCOPE),
        ("3-9 C, any modification", Scope(carbons=(3, 4, 5, 6, 7, 8, 9), modifications=("any",))),
    ):
        chains = catalogue(scope)
        clear_fast_caches()
        cold = _fast(chains)
        cached = _fast(chains)
        print(f"{label:<26} {len(chains):>5} candidates   cold {cold * 1e3:7.3f} ms   cached {cached * 1e3:7.4f} ms")


def bench_3d(quick: bool) -> None:
    if quick:
        chains = [c for c in catalogue(Scope(carbons=(5, 6), carbonyl=("aldose",), series=("D",)))]
    else:
        chains = list(catalogue(DEFAULT_SCOPE))
    print(f"\n== 3D conformers, ETKDG + MMFF94, both chairs ({len(chains)} candidates) ==")
    conformer._compute.cache_clear()
    per_candidate, per_form = [], []
    for chain in chains:
        forms = ring_forms(chain)
        if not forms:
            continue
        start = time.perf_counter()
        for form in forms:
            t0 = time.perf_counter()
            ring_conformers(chain, form)
            per_form.append(time.perf_counter() - t0)
        per_candidate.append(time.perf_counter() - start)
    start = time.perf_counter()
    for chain in chains:
        for form in ring_forms(chain):
            ring_conformers(chain, form)
    cached = (time.perf_counter() - start) / max(1, len(per_candidate))
    print(f"candidates with ring forms: {len(per_candidate)}; ring forms: {len(per_form)}")
    print(
        f"cold: {statistics.mean(per_candidate):.3f} s per candidate (median {statistics.median(per_candidate):.3f},"
        f" max {max(per_candidate):.3f}); {statistics.mean(per_form):.3f} s per ring form"
    )
    print(f"cached: {cached * 1e6:.1f} us per candidate")


# Angyal 1969/1984 [memory, +/- 0.05]; Barclay et al. 2012 for fructose.
COMPOSITION = {
    "D-glucose": (0.38, 0.62, "Angyal 1969/1984 [memory]"),
    "D-mannose": (0.655, 0.345, "Angyal 1969/1984 [memory]"),
    "D-galactose": (0.30, 0.64, "Angyal 1969/1984 [memory]"),
    "D-xylose": (0.365, 0.63, "Angyal 1969/1984 [memory]"),
    "D-lyxose": (0.70, 0.28, "Angyal 1969/1984 [memory]"),
    "D-arabinose": (0.60, 0.355, "Angyal 1969/1984 [memory]"),
    "D-fructose": (0.027, 0.682, "Barclay et al. 2012"),
}
QUALITATIVE = {
    "beta": ["D-glucose", "D-galactose", "D-allose", "D-gulose", "D-ribose", "D-xylose"],
    "alpha": ["D-mannose", "D-arabinose", "D-lyxose", "D-talose"],
}
# Textbook ranges [memory] (REFERENCE_VALUES.md), Hz.
J12 = {
    ("D-glucose", "alpha"): "3.7-3.8",
    ("D-glucose", "beta"): "7.9-8.0",
    ("D-galactose", "alpha"): "3.8-4.0",
    ("D-galactose", "beta"): "7.8-8.0",
    ("D-mannose", "alpha"): "1.7-1.9",
    ("D-mannose", "beta"): "<1",
}


def agreement() -> None:
    print("\n== anomer fractions: predicted (pyranose pool) vs published (renormalised to the pool) ==")
    print(f"{'sugar':<14} {'pred a':>7} {'pred b':>7}   {'publ a':>7} {'publ b':>7}   {'|d|':>5}  source")
    for name, (pa, pb, source) in COMPOSITION.items():
        got = anomer_fractions(resolve(name))
        na, nb = pa / (pa + pb), pb / (pa + pb)
        diff = abs(got["alpha_pyranose"] - na)
        print(
            f"{name:<14} {got['alpha_pyranose']:7.3f} {got['beta_pyranose']:7.3f}   {na:7.3f} {nb:7.3f}   "
            f"{diff:5.3f}  {source} (raw {pa:.3f}/{pb:.3f})"
        )
    print("\nrotation two-state (Bruice 8th ed.; mannose alpha/beta [memory]) vs predicted beta:")
    for name in ("D-glucose", "D-galactose", "D-mannose"):
        rec = published_rotation(resolve(name))
        got = anomer_fractions(resolve(name))["beta_pyranose"]
        print(f"  {name:<12} two-state beta {rec.beta_fraction:.3f}   predicted {got:.3f}")
    print("\nqualitative majority (Angyal 1984 [memory]):")
    for expected, names in QUALITATIVE.items():
        for name in names:
            got = anomer_fractions(resolve(name))
            winner = "alpha" if got["alpha_pyranose"] > got["beta_pyranose"] else "beta"
            mark = "ok" if winner == expected else "WRONG"
            print(
                f"  {name:<12} expected {expected:<5} predicted {winner:<5} ({got['beta_pyranose']:.2f} beta)  {mark}"
            )

    print("\n== J(H1,H2), Hz: fast path (ideal chairs) and 3D path (MMFF94) vs textbook [memory] ==")
    for (name, anomer), published in J12.items():
        form = RingForm("pyranose", anomer)
        fast = ring_couplings(resolve(name))[form.key]["H1-H2"]
        three = ring_couplings_3d(resolve(name), form)["H1-H2"]
        print(f"  {anomer}-{name:<12} fast {fast:5.2f}   3D {three:5.2f}   textbook {published}")
    print("beta-D-glucopyranose ring couplings (textbook [memory]: J2,3 J3,4 J4,5 about 9-10 Hz):")
    fast = ring_couplings(resolve("D-glucose"))["beta_pyranose"]
    three = ring_couplings_3d(resolve("D-glucose"), RingForm("pyranose", "beta"))
    for pair in fast:
        print(f"  {pair:<8} fast {fast[pair]:5.2f}   3D {three[pair]:5.2f}")
    print("methyl beta-D-glucopyranoside J1,2 (Faijes et al. 2006: 7.8 Hz):", end=" ")
    print(f"{coupling.pyranose_couplings(resolve('D-glucose'), RingForm('pyranose', 'beta', True))['H1-H2']:.2f}")


def chairs_vs_mmff() -> None:
    chains = catalogue(Scope(carbons=(5, 6), series=("D",)))
    for settings in (ConformerSettings(), ConformerSettings(dielectric=78.4)):
        print(
            f"\n== chair preference: Angyal (water) vs MMFF94 (dielectric {settings.dielectric:g}), "
            "D-aldopentoses/-hexoses and D-hexuloses =="
        )
        rows = agree = 0
        for chain in chains:
            for form in ring_forms(chain):
                if form.ring != "pyranose":
                    continue
                cmp = chair_comparison(chain, form, settings)
                rows += 1
                agree += cmp.agree
                if not cmp.agree:
                    ang = ", ".join(f"{k} {v:.2f}" for k, v in cmp.angyal_kcal.items())
                    mm = ", ".join(f"{k} {v:.2f}" for k, v in cmp.mmff_kcal.items() if v is not None)
                    print(f"  differ: {display_name(chain):<14} {form.key:<15} Angyal [{ang}]  MMFF [{mm}]")
        print(f"agree on {agree} of {rows} pyranose forms")
    print("\n== anomer preference: Angyal G(beta)-G(alpha) vs MMFF94 E(beta)-E(alpha), kcal/mol (gas phase) ==")
    for name in (
        "D-glucose",
        "D-mannose",
        "D-galactose",
        "D-allose",
        "D-talose",
        "D-xylose",
        "D-lyxose",
        "D-arabinose",
    ):
        cmp = anomer_comparison(resolve(name))
        mark = "" if cmp.agree else "  differ"
        print(
            f"  {name:<12} Angyal {cmp.angyal_kcal:+.2f} ({cmp.angyal_preferred:<5})  "
            f"MMFF {cmp.mmff_kcal:+.2f} ({cmp.mmff_preferred:<5}){mark}"
        )


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--quick", action="store_true", help="embed only the D-aldopentoses and D-aldohexoses")
    args = parser.parse_args(argv)
    bench_fast()
    bench_3d(args.quick)
    agreement()
    chairs_vs_mmff()
    return 0


if __name__ == "__main__":
    sys.exit(main())
