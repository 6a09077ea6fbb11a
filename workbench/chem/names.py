"""Names of sugars: IUPAC-IUBMB systematic names and the trivial names in use.

Systematic names follow *Nomenclature of Carbohydrates* (IUPAC-IUBMB 1996,
Pure Appl. Chem. 68, 1919): configurational prefixes (2-Carb-8.2), groups of
four centres counted from C-1 with the group farthest from C-1 cited first
(2-Carb-8.3), ketoses as ``-2-uloses``, deoxy and amino-deoxy sugars
(2-Carb-10, -11) and uronic acids (2-Carb-20).

:func:`systematic_name` and :func:`trivial_name` go from structure to name;
:func:`from_name` goes back and accepts either.
"""

from __future__ import annotations

import difflib
import re
from functools import lru_cache

from workbench.chem.chain import LEFT, RIGHT, STEREO_GROUPS, Chain
from workbench.chem.smiles import RingForm, ring_forms
from workbench.errors import NameNotRecognisedError

__all__ = [
    "PREFIXES",
    "TRIVIAL",
    "configurational_prefix",
    "systematic_name",
    "trivial_name",
    "display_name",
    "from_name",
    "known_names",
    "ring_name",
    "is_alditol",
    "alditol_names",
]

# D-prefixes: sides of the centres from the lowest- to the highest-numbered
# ("r" right, "l" left), IUPAC-IUBMB 2-Carb-8.2.
PREFIXES: dict[str, str] = {
    "r": "glycero",
    "rr": "erythro",
    "lr": "threo",
    "rrr": "ribo",
    "lrr": "arabino",
    "rlr": "xylo",
    "llr": "lyxo",
    "rrrr": "allo",
    "lrrr": "altro",
    "rlrr": "gluco",
    "llrr": "manno",
    "rrlr": "gulo",
    "lrlr": "ido",
    "rllr": "galacto",
    "lllr": "talo",
}
_PATTERN_OF = {v: k for k, v in PREFIXES.items()}

_STEMS = {3: "tri", 4: "tetr", 5: "pent", 6: "hex", 7: "hept", 8: "oct", 9: "non"}
_STEM_CARBONS = {v: k for k, v in _STEMS.items()}
_MULTIPLIERS = {1: "", 2: "di", 3: "tri", 4: "tetra"}
# Alditols (IUPAC-IUBMB 2-Carb-19): old names in use for one alditol, read but never written.
_ALDITOL_SYNONYMS = {"sorbitol": "D-glucitol", "dulcitol": "galactitol", "adonitol": "ribitol"}

# Trivial names of the D-enantiomer (the L form is named by mirror image).
# Sources: IUPAC-IUBMB 1996 (2-Carb-8, -10, -11, -20); Collins and Ferrier,
# *Monosaccharides* (1995) for the deoxy and amino sugars [from memory].
TRIVIAL: dict[str, str] = {
    "glyceraldehyde": "D-glycero-triose",
    "erythrose": "D-erythro-tetrose",
    "threose": "D-threo-tetrose",
    "ribose": "D-ribo-pentose",
    "arabinose": "D-arabino-pentose",
    "xylose": "D-xylo-pentose",
    "lyxose": "D-lyxo-pentose",
    "allose": "D-allo-hexose",
    "altrose": "D-altro-hexose",
    "glucose": "D-gluco-hexose",
    "mannose": "D-manno-hexose",
    "gulose": "D-gulo-hexose",
    "idose": "D-ido-hexose",
    "galactose": "D-galacto-hexose",
    "talose": "D-talo-hexose",
    "erythrulose": "D-glycero-tetrulose",
    "ribulose": "D-erythro-pent-2-ulose",
    "xylulose": "D-threo-pent-2-ulose",
    "psicose": "D-ribo-hex-2-ulose",
    "fructose": "D-arabino-hex-2-ulose",
    "sorbose": "D-xylo-hex-2-ulose",
    "tagatose": "D-lyxo-hex-2-ulose",
    "sedoheptulose": "D-altro-hept-2-ulose",
    "mannoheptulose": "D-manno-hept-2-ulose",
    "2-deoxy-{s}-ribose": "2-deoxy-D-erythro-pentose",
    "2-deoxy-{s}-glucose": "2-deoxy-D-arabino-hexose",
    "2-deoxy-{s}-galactose": "2-deoxy-D-lyxo-hexose",
    "rhamnose": "6-deoxy-D-manno-hexose",
    "fucose": "6-deoxy-D-galacto-hexose",
    "quinovose": "6-deoxy-D-gluco-hexose",
    "digitoxose": "2,6-dideoxy-D-ribo-hexose",
    "olivose": "2,6-dideoxy-D-arabino-hexose",
    "glucosamine": "2-amino-2-deoxy-D-gluco-hexose",
    "galactosamine": "2-amino-2-deoxy-D-galacto-hexose",
    "mannosamine": "2-amino-2-deoxy-D-manno-hexose",
    "fucosamine": "2-amino-2,6-dideoxy-D-galacto-hexose",
    "quinovosamine": "2-amino-2,6-dideoxy-D-gluco-hexose",
    "glucuronic acid": "D-gluco-hexuronic acid",
    "galacturonic acid": "D-galacto-hexuronic acid",
    "mannuronic acid": "D-manno-hexuronic acid",
    "guluronic acid": "D-gulo-hexuronic acid",
    "iduronic acid": "D-ido-hexuronic acid",
}
# N-acetyl amino sugars (2-Carb-11: 2-acetamido-2-deoxy-D-glucose = N-acetyl-D-glucosamine).
TRIVIAL.update(
    {
        f"N-acetyl-{{s}}-{name}": systematic.replace("2-amino-2-deoxy-", "2-acetamido-2-deoxy-").replace(
            "2-amino-2,6-dideoxy-", "2-acetamido-2,6-dideoxy-"
        )
        for name, systematic in list(TRIVIAL.items())
        if name.endswith("osamine")
    }
)


def _with_series(trivial: str, series: str) -> str:
    """``D-glucose`` or, for names with a placeholder, ``2-deoxy-D-ribose``."""
    return trivial.format(s=series) if "{s}" in trivial else f"{series}-{trivial}"


# Names whose definition includes the configuration (IUPAC-IUBMB 1996, 2-Carb-10
# list of trivial names of deoxy sugars [from memory]): the bare name means that
# enantiomer; the same series written out is accepted (``L-colitose``); the other
# series is refused with the mirror image's own name (``L-abequose`` -> colitose).
_ONE_SERIES = {
    "abequose": "3,6-dideoxy-D-xylo-hexose",
    "tyvelose": "3,6-dideoxy-D-arabino-hexose",
    "paratose": "3,6-dideoxy-D-ribo-hexose",
    "colitose": "3,6-dideoxy-L-xylo-hexose",
    "ascarylose": "3,6-dideoxy-L-arabino-hexose",
}
# Trivial names whose natural series is so conventional that chemists omit it
# (2-deoxyribose of DNA; the digitoxose and olivose of cardiac glycosides and
# antibiotics): the bare name is read as that series, and the result states it
# (``D-digitoxose``). Other bare names (glucose, fucose) need their D- or L-.
_NATURAL_SERIES = {
    "2-deoxyribose": ("2-deoxy-{s}-ribose", "D"),
    "digitoxose": ("digitoxose", "D"),
    "olivose": ("olivose", "D"),
}
# Old names of one enantiomer, read but never written.
_SYNONYMS = {"dextrose": "D-gluco-hexose", "levulose": "D-arabino-hex-2-ulose"}
# Other names in use for a sugar already in TRIVIAL (accepted when reading, never written).
_ALIASES = {"allulose": "psicose"}
_ACHIRAL = {"dihydroxyacetone": "1,3-dihydroxypropan-2-one", "glycerone": "1,3-dihydroxypropan-2-one"}


def _pattern(sides: list[str]) -> str:
    return "".join("r" if s == RIGHT else "l" for s in sides)


def configurational_prefix(sides: list[str]) -> str:
    """Prefix for stereocentres with these Fischer ``sides`` (lowest C first).

    Groups of four from the centre nearest C-1; the group farthest from C-1
    is cited first, each with its own D/L (IUPAC-IUBMB 2-Carb-8.3), e.g.
    ``D-glycero-D-gluco``.
    """
    if not sides:
        return ""
    chunks = [sides[i : i + 4] for i in range(0, len(sides), 4)]
    words = []
    for chunk in reversed(chunks):
        pat = _pattern(chunk)
        if pat[-1] == "r":
            words.append("D-" + PREFIXES[pat])
        else:
            mirrored = "".join("r" if c == "l" else "l" for c in pat)
            words.append("L-" + PREFIXES[mirrored])
    return "-".join(words)


def _modifier_words(chain: Chain) -> str:
    """``2-amino-2,6-dideoxy-3-O-methyl-`` style substituent prefixes."""
    amino = list(chain.amino_positions)
    acetamido = list(chain.acetamido_positions)
    deoxy = sorted(set(chain.deoxy_positions) | set(amino) | set(acetamido))
    methyl = list(chain.methoxy_positions)
    words = []  # substituent prefixes in alphabetical order (2-Carb-11: 2-acetamido-2-deoxy-)
    if acetamido:
        words.append(f"{','.join(map(str, acetamido))}-{_MULTIPLIERS[len(acetamido)]}acetamido")
    if amino:
        words.append(f"{','.join(map(str, amino))}-{_MULTIPLIERS[len(amino)]}amino")
    if deoxy:
        words.append(f"{','.join(map(str, deoxy))}-{_MULTIPLIERS[len(deoxy)]}deoxy")
    if methyl:
        words.append(f"{','.join(map(str, methyl))}-{_MULTIPLIERS[len(methyl)]}O-methyl")
    return "".join(w + "-" for w in words)


def _stem(chain: Chain) -> str:
    n = chain.carbons
    if n not in _STEMS:
        raise NameNotRecognisedError(chain.pattern, f"no name stem for {n} carbons (3-9 supported)")
    if chain.carbonyl == "aldose":
        if chain.is_uronic:
            return f"{_STEMS[n]}uronic acid"
        return f"{_STEMS[n]}ose"
    if n == 4:
        return "tetrulose"
    return f"{_STEMS[n]}-2-ulose"


@lru_cache(maxsize=65536)
def systematic_name(chain: Chain) -> str:
    """IUPAC-IUBMB systematic name of a sugar, e.g. ``6-deoxy-L-manno-hexose`` (a glycan residue: its sugar's)."""
    if not isinstance(chain, Chain):  # a chem.residue.Residue
        return systematic_name(chain.chain)
    if is_alditol(chain):
        return alditol_names(chain)[1]
    if not chain.is_sugar:
        raise NameNotRecognisedError(chain.pattern, "only aldoses, 2-ketoses and parent alditols are named here")
    if chain.carbons == 3 and chain.carbonyl == "ketose" and not chain.deoxy_positions:
        return "1,3-dihydroxypropan-2-one"
    sides = [chain.sides[k - 1] or RIGHT for k in chain.stereocentres]
    prefix = configurational_prefix(sides)
    return _modifier_words(chain) + (prefix + "-" if prefix else "") + _stem(chain)


@lru_cache(maxsize=1)
def _trivial_by_systematic() -> dict[str, str]:
    out = {}
    for trivial, systematic in TRIVIAL.items():
        out[systematic] = _with_series(trivial, "D")
        mirrored = from_systematic(systematic).mirror()
        out[systematic_name(mirrored)] = _with_series(trivial, "L")
    for trivial, systematic in _ONE_SERIES.items():
        out[systematic] = trivial
    out["1,3-dihydroxypropan-2-one"] = "dihydroxyacetone"
    return out


@lru_cache(maxsize=65536)
def trivial_name(chain: Chain) -> str | None:
    """Trivial name in common use (``L-rhamnose``, ``D-glucitol``), or None where there is none."""
    if is_alditol(chain):
        return alditol_names(chain)[0]
    if not chain.is_sugar:
        return None
    return _trivial_by_systematic().get(systematic_name(chain))


@lru_cache(maxsize=65536)
def display_name(chain: Chain) -> str:
    """The trivial name where there is one, else the systematic name (a glycan residue: its condensed name)."""
    if not isinstance(chain, Chain):  # a chem.residue.Residue
        return chain.name
    return trivial_name(chain) or systematic_name(chain)


_SYSTEMATIC = re.compile(
    r"^(?P<mods>(?:[0-9,]+-(?:di|tri|tetra)?(?:acetamido|amino|deoxy|O-methyl)-)*)"
    r"(?P<prefixes>(?:[DL]-[a-z]+-)*)"
    r"(?P<stem>tri|tetr|pent|hex|hept|oct|non)"
    r"(?P<end>ose|ulose|-2-ulose|uronic acid)$"
)
_MOD = re.compile(r"([0-9,]+)-(?:di|tri|tetra)?(acetamido|amino|deoxy|O-methyl)-")


def _read_modifiers(text: str) -> dict[str, set[int]]:
    """Locants of each substituent prefix in ``2-acetamido-2,6-dideoxy-`` style text."""
    mods: dict[str, set[int]] = {"acetamido": set(), "amino": set(), "deoxy": set(), "O-methyl": set()}
    for locants, word in _MOD.findall(text):
        mods[word].update(int(x) for x in locants.split(",") if x)
    return mods


def from_systematic(name: str) -> Chain:
    """Parse a systematic name such as ``2-amino-2-deoxy-D-gluco-hexose``."""
    text = name.strip()
    if text in _ACHIRAL.values():
        return Chain(("CH2OH", "CO", "CH2OH"), (None, None, None))
    m = _SYSTEMATIC.match(text)
    if not m:
        raise NameNotRecognisedError(name, "not a systematic sugar name")
    n = _STEM_CARBONS[m["stem"]]
    end = m["end"]
    ketose = "ulose" in end
    uronic = end == "uronic acid"
    mods = _read_modifiers(m["mods"])
    groups = ["CHOH"] * n
    groups[0] = "CH2OH" if ketose else "CHO"
    groups[-1] = "COOH" if uronic else "CH2OH"
    if ketose:
        groups[1] = "CO"
    for k in mods["deoxy"] - mods["amino"] - mods["acetamido"]:
        if not 1 <= k <= n or groups[k - 1] in ("CHO", "CO"):
            raise NameNotRecognisedError(name, f"no deoxy position {k} in a {n}-carbon chain")
        groups[k - 1] = "CH3" if k in (1, n) else "CH2"
    for word, code in (("amino", "CHNH2"), ("acetamido", "CHNHAc")):
        for k in mods[word]:
            if k not in mods["deoxy"] or not 1 <= k <= n or groups[k - 1] != "CHOH":
                raise NameNotRecognisedError(name, f"{word} sugars are named '{k}-{word}-{k}-deoxy' at a CH(OH)")
            groups[k - 1] = code
    for k in mods["O-methyl"]:
        if not 1 <= k <= n or groups[k - 1] != "CHOH":
            raise NameNotRecognisedError(name, f"O-methyl at C-{k} needs a secondary hydroxyl")
        groups[k - 1] = "CHOMe"
    stereo = [i for i, g in enumerate(groups) if g in STEREO_GROUPS]
    words = [w for w in m["prefixes"].split("-") if w]
    chunks = [(words[i], words[i + 1]) for i in range(0, len(words), 2)]
    patterns = []
    for series, word in reversed(chunks):  # cited farthest-first; rebuild from C-1
        if word not in _PATTERN_OF:
            close = difflib.get_close_matches(word, list(_PATTERN_OF), n=3)
            raise NameNotRecognisedError(name, f"unknown configurational prefix {word!r}", tuple(close))
        pat = _PATTERN_OF[word]
        if series == "L":
            pat = "".join("r" if c == "l" else "l" for c in pat)
        patterns.append(pat)
    full = "".join(patterns)
    if len(full) != len(stereo):
        raise NameNotRecognisedError(name, f"the prefixes describe {len(full)} centres but the chain has {len(stereo)}")
    for c in patterns[:-1]:
        if len(c) != 4:
            raise NameNotRecognisedError(name, "only the prefix farthest from C-1 may cover fewer than 4 centres")
    sides: list[str | None] = [None] * n
    for i, c in zip(stereo, full, strict=True):
        sides[i] = RIGHT if c == "r" else LEFT
    return Chain(tuple(groups), tuple(sides))


def _normalise(text: str) -> str:
    t = text.strip().replace("\u2013", "-").replace("\u03b1", "alpha").replace("\u03b2", "beta")
    t = re.sub(r"\s+", " ", t)
    if len(t) > 2 and t[1] == "-" and t[0] in "dlDL":
        t = t[0].upper() + t[1:]
    return t


@lru_cache(maxsize=1)
def _trivial_lookup() -> dict[str, str]:
    """lower-case trivial name (with D-/L-) -> systematic name."""
    out = {}
    for trivial, systematic in TRIVIAL.items():
        out[_with_series(trivial, "D").lower()] = systematic
        out[_with_series(trivial, "L").lower()] = systematic_name(from_systematic(systematic).mirror())
    for trivial, systematic in _ONE_SERIES.items():
        out[trivial] = systematic
    out.update(_SYNONYMS)
    for alias, trivial in _ALIASES.items():
        out[f"d-{alias}"] = out[f"d-{trivial}"]
        out[f"l-{alias}"] = out[f"l-{trivial}"]
    for trivial, systematic in _ACHIRAL.items():
        out[trivial] = systematic
    return out


def _pretty(key: str) -> str:
    key = re.sub(r"^n-acetyl", "N-acetyl", key)
    return re.sub(r"(^|-)([dl])-", lambda m: m[1] + m[2].upper() + "-", key)


def known_names() -> list[str]:
    """Every trivial name the parser accepts, D and L forms."""
    return sorted(_pretty(k) for k in _trivial_lookup())


_RING_NAME = re.compile(
    r"^(?P<methyl>methyl )?(?:(?P<anomer>alpha|beta)-)?(?P<series>[DL])-(?P<root>[a-z]+?)"
    r"(?P<ring>pyranose|furanose|pyranoside|furanoside)$"
)


def ring_name(text: str) -> tuple[Chain, str, str | None, bool] | None:
    """Parse ``alpha-D-glucopyranose``, ``D-fructofuranose`` or ``methyl beta-D-fructofuranoside``.

    Returns (parent chain, ring, anomer or None when the name gives none,
    methyl glycoside?) or None when the text is not such a name. The root is
    the trivial name less its final "se" (gluco-, fructo-, rhamno-), as in
    IUPAC-IUBMB 2-Carb-6 and 2-Carb-33. A glycoside needs its anomer.
    """
    m = _RING_NAME.match(_normalise(text))
    if not m:
        return None
    glycoside = m["ring"].endswith("side")
    if glycoside != bool(m["methyl"]) or (glycoside and not m["anomer"]):
        return None
    lookup = _trivial_lookup()
    for trivial in TRIVIAL:
        if "{s}" in trivial or " " in trivial or not trivial.endswith("se") or trivial[:-2] != m["root"]:
            continue
        chain = from_systematic(lookup[_with_series(trivial, m["series"]).lower()])
        ring = "pyranose" if m["ring"].startswith("pyranos") else "furanose"
        if RingForm(ring, m["anomer"] or "alpha") not in ring_forms(chain):
            raise NameNotRecognisedError(text, f"{display_name(chain)} cannot close a {ring} ring")
        return chain, ring, m["anomer"], glycoside
    return None


# ------------------------------------------------------------------ alditols
_ALDITOL_NAME = re.compile(r"^(?:(?P<series>[DL])-)?(?P<root>[a-z]+)itol$")
_SYSTEMATIC_ALDITOL = re.compile(
    r"^(?:(?P<series>[DL])-)?(?P<prefix>[a-z]+(?:-[DL]-[a-z]+)*)-(?P<stem>tetr|pent|hex|hept|oct|non)itol$"
)


def is_alditol(chain: Chain) -> bool:
    """True for a parent alditol: CH2OH, then CH(OH) only, then CH2OH (no carbonyl, no modification)."""
    return chain.is_alditol


def _alditol_readings(chain: Chain) -> list[tuple[tuple[str, ...], str, str, str | None]]:
    """(prefix words without D/L, D/L letters, aldose systematic name, aldose trivial name) per reading."""
    out = []
    for reading in (chain, chain.reversed()):
        aldose = reading.replace(1, "CHO")
        systematic = systematic_name(aldose)
        words = systematic.rsplit("-", 1)[0].split("-")
        prefixes = tuple(w for w in words if w not in ("D", "L"))
        letters = "".join(w for w in words if w in ("D", "L"))
        out.append((prefixes, letters, systematic, trivial_name(aldose)))
    return out


def alditol_names(chain: Chain) -> tuple[str, str]:
    """(trivial, systematic) name of a parent alditol, IUPAC-IUBMB 2-Carb-19.

    An alditol that is the reduction product of two aldoses takes the name
    first in alphabetical order of the configurational prefixes (D-glucitol,
    not L-gulitol; D-arabinitol, not D-lyxitol), then D before L; a meso
    alditol named by one prefix carries no D/L (galactitol, ribitol). The
    three-carbon alditol is glycerol. Without a trivial parent the systematic
    name serves as both (D-glycero-D-gluco-heptitol).
    """
    if not is_alditol(chain):
        raise NameNotRecognisedError(chain.pattern, "not a parent alditol")
    if chain.carbons == 3:
        return "glycerol", "glycerol"
    from workbench.chem.smiles import is_achiral, to_smiles

    _, letters, systematic, trivial = min(_alditol_readings(chain), key=lambda r: (r[0], r[1]))
    prefix, stem = systematic.rsplit("-", 1)
    stem = stem.replace("ose", "itol")
    if is_achiral(to_smiles(chain)) and len(letters) == 1:
        prefix = prefix[2:]  # drop "D-": the name of a meso compound carries no series
        name = f"{prefix}-{stem}"
        return (trivial[2:-3] + "itol" if trivial else name), name
    name = f"{prefix}-{stem}"
    return (f"{trivial[:-3]}itol" if trivial else name), name


def _alditol_from_name(text: str) -> Chain | None:
    """The alditol a name such as ``D-glucitol``, ``sorbitol`` or ``galactitol`` stands for."""
    key = _ALDITOL_SYNONYMS.get(text.lower(), text)
    if key.lower() == "glycerol":
        return Chain(("CH2OH", "CHOH", "CH2OH"), (None, RIGHT, None))
    systematic = _SYSTEMATIC_ALDITOL.match(key)
    if systematic:
        series, prefix, stem = systematic["series"], systematic["prefix"], systematic["stem"]
        aldose = from_systematic(f"{series or 'D'}-{prefix}-{stem}ose").replace(1, "CH2OH")
        from workbench.chem.smiles import is_achiral, to_smiles

        if series is None and not is_achiral(to_smiles(aldose)):
            raise NameNotRecognisedError(text, "this alditol is chiral: give its D- or L-")
        return aldose
    m = _ALDITOL_NAME.match(key)
    if not m:
        return None
    parents = [t for t in TRIVIAL if "{s}" not in t and " " not in t and t.endswith("ose") and t[:-3] == m["root"]]
    if not parents or trivial_name(from_name(f"D-{parents[0]}")) is None:
        return None
    d_form = from_name(f"D-{parents[0]}").replace(1, "CH2OH")
    if m["series"] is None:
        from workbench.chem.smiles import is_achiral, to_smiles

        if not is_achiral(to_smiles(d_form)):
            raise NameNotRecognisedError(
                text, "this alditol is chiral: give its D- or L-", (f"D-{m['root']}itol", f"L-{m['root']}itol")
            )
        return d_form
    return d_form if m["series"] == "D" else d_form.mirror()


# ------------------------------------------------------------------ modified trivial names
_MODIFIED_TRIVIAL = re.compile(
    r"^(?P<mods>(?:[0-9,]+-(?:di|tri|tetra)?(?:acetamido|amino|deoxy|O-methyl)-)+)(?P<parent>[DL]-[a-z]+)$"
)


def _modified_trivial(text: str) -> Chain | None:
    """``6-deoxy-L-mannose``, ``2-amino-2-deoxy-D-glucose``: substituent prefixes on a parent's trivial name.

    The parent is an unmodified aldose or ketose named by its trivial name;
    each prefix changes only the carbon it names (IUPAC-IUBMB 2-Carb-10,
    -11, -13), so the other centres keep the parent's configuration.
    """
    m = _MODIFIED_TRIVIAL.match(text)
    if not m:
        return None
    lookup = _trivial_lookup()
    parent_key = m["parent"].lower()
    if parent_key not in lookup:
        close = difflib.get_close_matches(parent_key, [k for k in lookup if _is_parent_key(k)], n=3, cutoff=0.6)
        raise NameNotRecognisedError(
            text,
            f"{m['parent']!r} is not the trivial name of a parent sugar",
            tuple(m["mods"] + _pretty(c) for c in close),
        )
    parent = from_systematic(lookup[parent_key])
    if parent.deoxy_positions or parent.amino_positions or parent.is_uronic:
        raise NameNotRecognisedError(text, f"{m['parent']} is itself a modified sugar; use the systematic name")
    mods = _read_modifiers(m["mods"])
    chain = parent
    n = chain.carbons
    for k in sorted(mods["deoxy"] - mods["amino"] - mods["acetamido"]):
        if not 1 <= k <= n or chain.groups[k - 1] not in ("CHOH", "CH2OH"):
            raise NameNotRecognisedError(text, f"C-{k} of {m['parent']} carries no hydroxyl to remove")
        chain = chain.replace(k, "CH3" if k in (1, n) else "CH2")
    for word, code in (("amino", "CHNH2"), ("acetamido", "CHNHAc")):
        for k in sorted(mods[word]):
            if k not in mods["deoxy"] or not 1 <= k <= n or chain.groups[k - 1] != "CHOH":
                raise NameNotRecognisedError(text, f"{word} sugars are named '{k}-{word}-{k}-deoxy' at a CH(OH)")
            chain = chain.replace(k, code, chain.sides[k - 1])
    for k in sorted(mods["O-methyl"]):
        if not 1 <= k <= n or chain.groups[k - 1] != "CHOH":
            raise NameNotRecognisedError(text, f"O-methyl at C-{k} needs a secondary hydroxyl")
        chain = chain.replace(k, "CHOMe", chain.sides[k - 1])
    return chain


def _is_parent_key(key: str) -> bool:
    return key[:2] in ("d-", "l-") and " " not in key and "deoxy" not in key and "amin" not in key


def _constitution_words(text: str) -> tuple[tuple[str, ...], str]:
    """The substituent prefixes and the class ending of a name: what a suggestion must keep."""
    mods = tuple(sorted(re.findall(r"[0-9,]+-(?:di|tri|tetra)?(?:acetamido|amino|deoxy|O-methyl)", text)))
    ending = next((e for e in ("itol", "uronic acid", "ulose", "osamine") if e in text), "")
    return mods, ending


def _keep_constitution(text: str, suggestions: list[str]) -> tuple[str, ...]:
    """Only the suggestions that name the same substituents and class as ``text``."""
    want = _constitution_words(text.lower())
    return tuple(s for s in suggestions if _constitution_words(s.lower()) == want)


def _series_name(text: str, key: str) -> Chain | None:
    """Names of one enantiomer (abequose, colitose) with or without their series."""
    for name, systematic in _ONE_SERIES.items():
        chain = from_systematic(systematic)
        if key == name:
            return chain
        for series in ("d", "l"):
            if key != f"{series}-{name}":
                continue
            if series.upper() == chain.series:
                return chain
            mirror = chain.mirror()
            other = trivial_name(mirror) or systematic_name(mirror)
            raise NameNotRecognisedError(
                text,
                f"{name} is by definition {systematic}; its mirror image has its own name",
                (other,),
            )
    return None


def _strip_rotation_sign(text: str) -> str:
    """``D-(+)-glucose`` -> ``D-glucose``: the sign of rotation is not part of the structure (not checked)."""
    return re.sub(r"^([DL])-?\([+-]\)-", r"\1-", text)


def from_name(text: str) -> Chain:
    """The chain a trivial or systematic name stands for.

    Raises :class:`NameNotRecognisedError` with close suggestions otherwise.
    A trivial name needs its D- or L- (``glucose`` alone is ambiguous),
    except the names of :data:`_ONE_SERIES` and :data:`_NATURAL_SERIES`.
    Alditol names (``D-glucitol``, ``sorbitol``) give the alditol chain, and
    ``6-deoxy-L-mannose``-style names the modified parent. Suggestions never
    change the substituents or the class of compound named.
    """
    t = _strip_rotation_sign(_normalise(text))
    lookup = _trivial_lookup()
    key = t.lower()
    if key in lookup:
        return from_systematic(lookup[key])
    if key in _NATURAL_SERIES:
        trivial, series = _NATURAL_SERIES[key]
        return from_systematic(lookup[_with_series(trivial, series).lower()])
    one = _series_name(text, key)
    if one is not None:
        return one
    bare = {k.replace("{s}-", "").lower(): k for k in TRIVIAL}
    if key in bare:
        raise NameNotRecognisedError(
            text, "a trivial name needs its series", (_with_series(bare[key], "D"), _with_series(bare[key], "L"))
        )
    ring = ring_name(t)
    if ring is not None:
        if ring[3]:
            raise NameNotRecognisedError(
                text, f"a methyl glycoside is not the free sugar {display_name(ring[0])}", (display_name(ring[0]),)
            )
        return ring[0]
    anomer = re.match(r"^(?:alpha|beta)-(?P<rest>[DL]-.+)$", t)
    if anomer and not anomer["rest"].endswith("itol"):
        return from_name(anomer["rest"])  # alpha-D-glucose: the anomer of a free sugar, ring unstated
    modified = _modified_trivial(t)
    if modified is not None:
        return modified
    alditol = _alditol_from_name(t)
    if alditol is not None:
        return alditol
    try:
        return from_systematic(t)
    except NameNotRecognisedError as err:
        if _SYSTEMATIC.match(t):
            raise
        close = difflib.get_close_matches(key, list(lookup), n=6, cutoff=0.6)
        if close:  # a misspelt trivial name: offer only names of the best match's constitution
            groups = from_systematic(lookup[close[0]]).groups
            close = [c for c in close if from_systematic(lookup[c]).groups == groups]
        suggestions = _keep_constitution(t, [_pretty(c) for c in close])[:3]
        raise NameNotRecognisedError(text, "neither a known trivial name nor a systematic name", suggestions) from err
