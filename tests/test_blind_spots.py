"""Deterministic tests for places where a plausible bug once passed the whole suite.

Each test names the bug it guards against (a mutant that survived a mutation run) and
checks an expectation from outside the code: OPSIN or RDKit's CIP labeller for
structures, published or textbook values for chemistry, counting for the solver.
"""

from __future__ import annotations

import math

import pytest
from projects import project
from rdkit import Chem
from rdkit.Chem import rdCIPLabeler

from workbench.chem.chain import Chain
from workbench.chem.parse import resolve
from workbench.chem.predictions import predict as predict_record
from workbench.chem.smiles import to_smiles
from workbench.conformers import fit_mutarotation
from workbench.evidence import solve
from workbench.evidence.network import Binary, supported_domains

OPSIN_NAMES = [
    "3-O-methyl-D-glucose",
    "2-O-methyl-D-glucose",
    "4-O-methyl-D-glucose",
    "2-O-methyl-L-arabinose",
    "D-glucaric acid",
    "L-glucaric acid",
    "galactaric acid",
    "D-glucitol",
    "L-glucitol",
]

# Fischer patterns written by hand from the parent sugar (D-glucose: r, l, r, r from C-2;
# L-arabinose, the mirror image of D-arabinose (l, r, r): r, l, l), the named OH replaced by OMe.
O_METHYL_PATTERNS = {
    "3-O-methyl-D-glucose": "CHO-CHOH(r)-CHOMe(l)-CHOH(r)-CHOH(r)-CH2OH",
    "2-O-methyl-D-glucose": "CHO-CHOMe(r)-CHOH(l)-CHOH(r)-CHOH(r)-CH2OH",
    "4-O-methyl-D-glucose": "CHO-CHOH(r)-CHOH(l)-CHOMe(r)-CHOH(r)-CH2OH",
    "2-O-methyl-L-arabinose": "CHO-CHOMe(r)-CHOH(l)-CHOH(l)-CH2OH",
}


# --------------------------------------------------- O-methyl stereocentres
@pytest.mark.parametrize("name", sorted(O_METHYL_PATTERNS))
def test_o_methyl_sugar_matches_opsin(opsin, name):
    # Mutant killed: a CHOMe stereocentre written on the wrong side of the SMILES.
    # Expected structure: OPSIN's parse of the IUPAC name (open chain, as the name reads).
    assert to_smiles(Chain.from_pattern(O_METHYL_PATTERNS[name])) == opsin(name)


def _chain_carbons(mol: Chem.Mol) -> list[int]:
    """Atom indices C-1 ... C-n along the carbon chain, from the aldehyde carbon."""

    def chain_neighbours(idx: int) -> list[int]:
        return [n.GetIdx() for n in mol.GetAtomWithIdx(idx).GetNeighbors() if n.GetSymbol() == "C"]

    c1 = next(
        a.GetIdx()
        for a in mol.GetAtoms()
        if a.GetSymbol() == "C"
        and any(b.GetBondTypeAsDouble() == 2.0 and b.GetOtherAtom(a).GetSymbol() == "O" for b in a.GetBonds())
    )
    order = [c1]
    while True:
        nxt = [i for i in chain_neighbours(order[-1]) if i not in order]
        if not nxt:
            return order
        order.append(nxt[0])


def test_3_o_methyl_glucose_cip_labels():
    # Open-chain D-glucose is (2R,3S,4R,5R) (Bentley, Biochem. Educ. 26, 205, 1998). Methylating O-3
    # changes no priority order (hand CIP analysis): O stays first at C-3; at C-2 the C-1 branch
    # (O,O,H) still beats C-3 (O,C,H); at C-4 the C-3 branch wins as before (O-3 now leads to C
    # rather than H, which only widens the lead); C-5 is untouched. So (2R,3S,4R,5R) again.
    # Mutant killed: CHOMe written with the inverted chirality tag.
    mol = Chem.MolFromSmiles(to_smiles(Chain.from_pattern(O_METHYL_PATTERNS["3-O-methyl-D-glucose"])))
    rdCIPLabeler.AssignCIPLabels(mol)
    carbons = _chain_carbons(mol)
    labels = {k + 1: mol.GetAtomWithIdx(i).GetProp("_CIPCode") for k, i in enumerate(carbons) if k in (1, 2, 3, 4)}
    assert labels == {2: "R", 3: "S", 4: "R", 5: "R"}
    assert len(carbons) == 6  # the methyl ether carbon is not part of the chain


def test_o_methyl_sugar_of_the_catalogue_is_the_named_one(opsin):
    # The catalogue's omethyl:3 D-aldohexose with glucose configuration is OPSIN's 3-O-methyl-D-glucose.
    from workbench.chem.catalogue import Scope, catalogue

    scope = Scope(carbons=(6,), carbonyl=("aldose",), series=("D",), modifications=("omethyl:3",))
    found = [c for c in catalogue(scope) if to_smiles(c) == opsin("3-O-methyl-D-glucose")]
    assert len(found) == 1
    assert found[0].groups[2] == "CHOMe"


# --------------------------------------------------- mirror images by their names
@pytest.mark.parametrize(
    ("sugar", "acid", "active"),
    [
        ("D-glucose", "D-glucaric acid", True),
        ("L-glucose", "L-glucaric acid", True),
        ("D-galactose", "galactaric acid", False),  # mucic acid, meso (REFERENCE_VALUES.md)
        ("L-galactose", "galactaric acid", False),
    ],
)
def test_aldaric_acids_of_enantiomers_by_name(opsin, sugar, acid, active):
    # Enantiomeric sugars give the enantiomeric (named) diacids, or one meso diacid; OPSIN writes
    # the named acids, so the mirror relation is not derived from the code's own mirror helper.
    record = predict_record(resolve(sugar))
    assert record.aldaric_acid == opsin(acid)
    assert record.aldaric_acid_active is active


@pytest.mark.parametrize(("sugar", "alditol"), [("D-glucose", "D-glucitol"), ("L-glucose", "L-glucitol")])
def test_alditols_of_enantiomers_by_name(opsin, sugar, alditol):
    assert predict_record(resolve(sugar)).alditols == (opsin(alditol),)


# --------------------------------------------------- 'different' with 3+ members
def test_different_with_three_members_constrains_every_pair():
    # Three pairwise-distinct D-aldotetroses cannot exist: there are only two (D-erythrose,
    # D-threose; counting). Mutant killed: only neighbouring members constrained (X!=Y, Y!=Z
    # lets X = Z), which finds a solution.
    tetrose = {"carbons": [4], "carbonyl": ["aldose"], "series": ["D"]}
    p = project(
        [{"id": u, "scope": tetrose} for u in ("X", "Y", "Z")],
        [{"id": "D1", "kind": "different", "members": ["X", "Y", "Z"]}],
    )
    assert solve(p).contradictory


def test_different_with_a_known_last_member():
    # X differs from D-erythrose and from D-threose: no D-aldotetrose is left (counting).
    tetrose = {"carbons": [4], "carbonyl": ["aldose"], "series": ["D"]}
    p = project(
        [{"id": "X", "scope": tetrose}],
        [{"id": "D1", "kind": "different", "members": ["X", "D-erythrose", "D-threose"]}],
    )
    sol = solve(p)
    assert sol.contradictory
    assert not sol.survivors["X"]


def test_different_osazones_with_three_members():
    # Osazone pairs (REFERENCE_VALUES.md; Fischer): Glc/Man, Gal/Tal, All/Alt, Gul/Ido. An
    # osazone different from both D-glucose's and D-galactose's leaves allose, altrose, gulose
    # and idose. Mutant killed: the X - D-galactose pair (not neighbours) left unconstrained.
    hexose = {"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]}
    p = project(
        [{"id": "X", "scope": hexose}],
        [
            {
                "id": "S1",
                "kind": "same_product",
                "reaction": "osazone",
                "relation": "different",
                "members": ["X", "D-glucose", "D-galactose"],
            }
        ],
    )
    got = set(solve(p).survivors["X"])
    assert got == {resolve(f"D-{n}") for n in ("allose", "altrose", "gulose", "idose")}


# --------------------------------------------------- periodate: formaldehyde counts
@pytest.mark.parametrize(
    ("substrate", "right", "wrong"),
    [
        # open-chain aldohexose 5 IO4-, 5 HCOOH, 1 HCHO; hexitol 5, 4, 2 (REFERENCE_VALUES.md, common practice)
        ("free", (5, 5, 1), (5, 5, 0)),
        ("alditol", (5, 4, 2), (5, 4, 1)),
    ],
)
def test_periodate_comparison_uses_formaldehyde(substrate, right, wrong):
    # Mutant killed: the engine compares IO4- and HCOOH but not HCHO.
    hexose = {"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]}
    glucose = resolve("D-glucose")

    def survivors(counts):
        io4, hcooh, hcho = counts
        obs = {
            "id": "P1",
            "kind": "periodate",
            "unknown": "X",
            "substrate": substrate,
            "periodate": io4,
            "formic_acid": hcooh,
            "formaldehyde": hcho,
        }
        return solve(project([{"id": "X", "scope": hexose}], [obs])).survivors["X"]

    assert glucose in survivors(right)
    assert glucose not in survivors(wrong)


# --------------------------------------------------- mutarotation rate constant
# alpha-D-glucose in water near 20 C: second-order rate constant for the water-catalysed reaction
# 4.6e-6 dm3 mol-1 s-1 at 293 K (a study of electrolyte catalysis of alpha-D-glucose mutarotation),
# times 55.5 mol dm-3 water = 2.55e-4 s-1 = 0.0153 min-1 (half-life about 45 min); the classic
# value k1 + k2 = 0.0066 (decimal logarithms, min-1) at 20 C (Isbell and Pigman [from memory]) is
# the same 0.0152 min-1. Rotations +112.2 (alpha) and +52.7 (equilibrium) from REFERENCE_VALUES.md.
GLUCOSE_K_PER_MIN = 4.6e-6 * 55.5 * 60.0
ALPHA_GLC, EQ_GLC, BETA_GLC = 112.2, 52.7, 18.7


def test_mutarotation_rate_of_glucose_from_the_published_constant():
    # The curve is written here from the published parameters (not by the code's generator).
    # Mutant killed: a rate constant off by a factor of two (or in decimal logarithms, 2.303).
    times = [0.0, 5, 10, 15, 20, 30, 40, 50, 60, 75, 90, 120, 150, 180, 240]
    rot = [EQ_GLC + (ALPHA_GLC - EQ_GLC) * math.exp(-GLUCOSE_K_PER_MIN * t) for t in times]
    fit = fit_mutarotation(times, rot, alpha=ALPHA_GLC, beta=BETA_GLC)
    assert fit.rate_constant_per_min == pytest.approx(GLUCOSE_K_PER_MIN, rel=0.02)
    assert 40.0 <= fit.half_life_min <= 50.0  # about 45 min at 20 C [from memory, wide]
    assert fit.equilibrium_rotation == pytest.approx(EQ_GLC, abs=0.5)
    assert fit.beta_fraction == pytest.approx(0.64, abs=0.01)  # two-state model, REFERENCE_VALUES.md


def test_mutarotation_rate_from_a_half_life_read_off_by_hand():
    # Points read at whole half-lives: the excess over equilibrium halves every 45.3 min, so the
    # fitted k must be ln 2 / 45.3 min (first-order kinetics, common practice).
    half = math.log(2.0) / GLUCOSE_K_PER_MIN
    excess = ALPHA_GLC - EQ_GLC
    times = [0.0, half / 2, half, 1.5 * half, 2 * half, 3 * half, 4 * half, 6 * half]
    rot = [EQ_GLC + excess * 0.5 ** (t / half) for t in times]
    fit = fit_mutarotation(times, rot)
    assert fit.half_life_min == pytest.approx(half, rel=0.02)


# --------------------------------------------------- parallel constraints merged
A, B, C = (resolve(n) for n in ("D-erythrose", "D-threose", "L-erythrose"))


def _allowed(pairs):
    table = set(pairs)
    return lambda x, y: (x, y) in table


@pytest.mark.parametrize("reverse_second", [False, True])
def test_two_parallel_constraints_both_hold(reverse_second):
    # X and Y over {A, B, C}. First constraint allows (A,B) and (B,C): alone X in {A,B}, Y in {B,C}.
    # Second allows (A,B) and (C,A): alone X in {A,C}, Y in {A,B}. Both: only X=A, Y=B (counting).
    # Mutant killed: the merged constraint keeping only one of its parts (or any instead of all).
    domains = {"X": [A, B, C], "Y": [A, B, C]}
    first = Binary("X", "Y", _allowed([(A, B), (B, C)]), "E1")
    if reverse_second:
        second = Binary("Y", "X", _allowed([(B, A), (A, C)]), "E2")  # the same relation, ends swapped
    else:
        second = Binary("X", "Y", _allowed([(A, B), (C, A)]), "E2")
    assert supported_domains(domains, [first]) == {"X": [A, B], "Y": [B, C]}
    assert supported_domains(domains, [second]) == {"X": [A, C], "Y": [A, B]}
    assert supported_domains(domains, [first, second]) == {"X": [A], "Y": [B]}
    assert supported_domains(domains, [second, first]) == {"X": [A], "Y": [B]}


def test_parallel_constraints_without_common_solution():
    # The same two constraints plus a third that allows only (B,C): no assignment satisfies all three.
    domains = {"X": [A, B, C], "Y": [A, B, C]}
    cons = [
        Binary("X", "Y", _allowed([(A, B), (B, C)]), "E1"),
        Binary("X", "Y", _allowed([(A, B), (C, A)]), "E2"),
        Binary("X", "Y", _allowed([(B, C)]), "E3"),
    ]
    assert supported_domains(domains, cons) is None


def test_three_observations_on_one_pair_of_unknowns():
    # X, Y D-aldohexoses. Same osazone: C-2 epimers or the same sugar (Glc/Man, Gal/Tal, All/Alt,
    # Gul/Ido). Same aldaric acid within the D series: the same sugar, or D-altrose/D-talose
    # (D-altraric = D-talaric acid). 'different': X != Y. Each alone or in pairs has solutions;
    # all three together have none, since D-altrose and D-talose are not C-2 epimers
    # (REFERENCE_VALUES.md). Mutant killed: one part of the merged constraint dropped.
    hexose = {"carbons": [6], "carbonyl": ["aldose"], "series": ["D"]}
    unknowns = [{"id": "X", "scope": hexose}, {"id": "Y", "scope": hexose}]
    osazone = {
        "id": "S1",
        "kind": "same_product",
        "reaction": "osazone",
        "relation": "identical",
        "members": ["X", "Y"],
    }
    aldaric = {**osazone, "id": "S2", "reaction": "aldaric_acid"}
    differ = {"id": "D1", "kind": "different", "members": ["X", "Y"]}
    names = lambda obs: {c.pattern for c in solve(project(unknowns, obs)).survivors["X"]}  # noqa: E731
    alt_tal = {resolve("D-altrose").pattern, resolve("D-talose").pattern}
    assert len(names([osazone, differ])) == 8
    assert names([aldaric, differ]) == alt_tal
    assert len(names([osazone, aldaric])) == 8
    assert solve(project(unknowns, [osazone, aldaric, differ])).contradictory


# --------------------------------------------------- a named deoxy alditol stands for itself
@pytest.mark.parametrize(("alditol", "sugar"), [("L-rhamnitol", "L-rhamnose"), ("L-fucitol", "L-fucose")])
def test_named_deoxy_alditol_compares_with_the_reduced_sugar(alditol, sugar):
    # Borohydride reduces L-rhamnose (6-deoxy-L-mannose) to L-rhamnitol and L-fucose to L-fucitol
    # [common practice]; an alditol is not reduced further, so a named deoxy alditol is its own
    # "alditol". Found by the mutation run (chain.is_alditol, USub -> Not): before, the comparison
    # with L-rhamnitol was reported as a contradiction.
    scope = {"carbons": [6], "carbonyl": ["aldose"], "series": ["L"], "modifications": ["deoxy:6"]}
    obs = {
        "id": "S1",
        "kind": "same_product",
        "reaction": "alditol",
        "relation": "identical",
        "members": ["X", alditol],
    }
    sol = solve(project([{"id": "X", "scope": scope}], [obs]))
    assert list(sol.survivors["X"]) == [resolve(sugar)]
