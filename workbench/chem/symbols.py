"""IUPAC three-letter symbols of monosaccharides, both ways (name -> structure, structure -> symbol).

Symbols follow IUPAC-IUBMB, *Nomenclature of Carbohydrates* (Recommendations
1996), Pure Appl. Chem. 68, 1919, 2-Carb-38 (Glc, Gal, Man, ..., GlcA,
GlcN, GlcNAc, Fuc, Rha, Qui, dRib, Abe, Col, Tyv, Par; heptoses written
with abbreviated configurational prefixes, ``L-gro-D-manHep``) [from memory].
The compact heptose forms ``LDmanHep``/``DDmanHep`` and ``L,D-Hep`` are those
of the Symbol Nomenclature for Glycans (Varki et al., Glycobiology 25, 1323,
2015) and of the lipopolysaccharide literature [from memory].

Series: a symbol may carry its D-/L- (``L-Rha``). Written bare, as in
condensed glycan formulas, it means the series conventional for that symbol:
L for Ara, Fuc, Rha and IdoA (the SNFG defaults [from memory]) and for the
names that are L by definition (Col), D for every other symbol. The
structure returned states the series, so nothing is assumed silently.
Ring and anomer (``Glcp``, ``alpha-D-Glcp``) belong to residues; a trailing
``p``/``f`` is read and dropped here.
"""

from __future__ import annotations

import re
from functools import cache

from workbench.chem.chain import Chain
from workbench.chem.names import configurational_prefix, from_name, systematic_name
from workbench.errors import NameNotRecognisedError

__all__ = ["SYMBOLS", "ULOSONIC", "from_symbol", "symbol", "known_symbols"]

# symbol -> trivial name ({s} marks where the series goes; names without {s}
# take the series in front). IUPAC-IUBMB 1996, 2-Carb-38 [from memory].
SYMBOLS: dict[str, str] = {
    "Rib": "{s}-ribose",
    "Ara": "{s}-arabinose",
    "Xyl": "{s}-xylose",
    "Lyx": "{s}-lyxose",
    "All": "{s}-allose",
    "Alt": "{s}-altrose",
    "Glc": "{s}-glucose",
    "Man": "{s}-mannose",
    "Gul": "{s}-gulose",
    "Ido": "{s}-idose",
    "Gal": "{s}-galactose",
    "Tal": "{s}-talose",
    "Fru": "{s}-fructose",
    "Psi": "{s}-psicose",
    "Sor": "{s}-sorbose",
    "Tag": "{s}-tagatose",
    "Rha": "{s}-rhamnose",
    "Fuc": "{s}-fucose",
    "Qui": "{s}-quinovose",
    "dRib": "2-deoxy-{s}-ribose",
    "Dig": "{s}-digitoxose",
    "Oli": "{s}-olivose",
    "Abe": "abequose",
    "Tyv": "tyvelose",
    "Par": "paratose",
    "Col": "colitose",
    "GlcN": "{s}-glucosamine",
    "GalN": "{s}-galactosamine",
    "ManN": "{s}-mannosamine",
    "FucN": "{s}-fucosamine",
    "QuiN": "{s}-quinovosamine",
    "GlcNAc": "N-acetyl-{s}-glucosamine",
    "GalNAc": "N-acetyl-{s}-galactosamine",
    "ManNAc": "N-acetyl-{s}-mannosamine",
    "FucNAc": "N-acetyl-{s}-fucosamine",
    "QuiNAc": "N-acetyl-{s}-quinovosamine",
    "GlcA": "{s}-glucuronic acid",
    "GalA": "{s}-galacturonic acid",
    "ManA": "{s}-mannuronic acid",
    "GulA": "{s}-guluronic acid",
    "IdoA": "{s}-iduronic acid",
}
# Series of a bare symbol (SNFG defaults [from memory]); every other symbol is D.
_DEFAULT_L = frozenset({"Ara", "Fuc", "Rha", "IdoA"})
# Names that fix their own series (abequose D, colitose L ...): written without D-/L-.
_FIXED = frozenset(sym for sym, name in SYMBOLS.items() if "{s}" not in name)

# Abbreviated configurational prefixes (2-Carb-38 [from memory]).
_SHORT_PREFIX = {
    "glycero": "gro",
    "erythro": "ery",
    "threo": "thr",
    "ribo": "rib",
    "arabino": "ara",
    "xylo": "xyl",
    "lyxo": "lyx",
    "allo": "all",
    "altro": "alt",
    "gluco": "glc",
    "manno": "man",
    "gulo": "gul",
    "ido": "ido",
    "galacto": "gal",
    "talo": "tal",
}
_LONG_PREFIX = {v: k for k, v in _SHORT_PREFIX.items()}
# 3-Deoxy-2-ulosonic acids: C-1 is a carboxyl on a 2-ketose, which the ketose rules of this
# model (reducing test, osazone, Seliwanoff test, Angyal's scheme) do not cover.
ULOSONIC = {
    "Kdo": "3-deoxy-D-manno-oct-2-ulosonic acid",
    "Kdn": "3-deoxy-D-glycero-D-galacto-non-2-ulosonic acid",
    "Neu5Ac": "5-acetamido-3,5-dideoxy-D-glycero-D-galacto-non-2-ulosonic acid",
    "Neu5Gc": "3,5-dideoxy-5-glycolamido-D-glycero-D-galacto-non-2-ulosonic acid",
}
ULOSONIC_REASON = (
    "3-deoxy-2-ulosonic acids (Kdo, Kdn, Neu5Ac) are not modelled: their C-1 is a carboxyl on a 2-ketose, "
    "and the ketose rules here (reducing test, osazone, Seliwanoff test, Angyal's anomer scheme) assume a "
    "CH2OH at C-1"
)
_HEPTOSE = re.compile(r"^(?P<outer>[DL])-?gro-(?P<inner>[DL])-?(?P<cfg>[a-z]{3})Hep$")
_COMPACT_HEPTOSE = re.compile(r"^(?P<outer>[DL])(?P<inner>[DL])(?P<cfg>[a-z]{3})Hep$")
_PAIR_HEPTOSE = re.compile(r"^(?P<outer>[DL]),(?P<inner>[DL])-Hep$")  # L,D-Hep = L-glycero-D-manno-heptose


def _name_for(sym: str, series: str) -> str:
    template = SYMBOLS[sym]
    return template.format(s=series) if "{s}" in template else template


def _heptose(outer: str, inner: str, cfg: str, text: str) -> Chain:
    long = _LONG_PREFIX.get(cfg)
    if long is None or long in ("glycero", "erythro", "threo", "ribo", "arabino", "xylo", "lyxo"):
        raise NameNotRecognisedError(text, f"{cfg!r} is not a hexose prefix abbreviation (glc, man, gal ...)")
    return from_name(f"{outer}-glycero-{inner}-{long}-heptose")


def from_symbol(text: str) -> Chain:
    """The structure of an IUPAC symbol such as ``L-Rha``, ``GlcNAc``, ``D-GlcpA`` or ``LDmanHep``.

    Raises :class:`NameNotRecognisedError` (with the symbols it knows) otherwise.
    """
    # the anomer of a free sugar does not change its chain (alpha-D-Glcp, β-L-Fucp); the ring letter may
    # stand before a suffix, as 2-Carb-38 writes it (D-GlcpNAc, D-GlcpA)
    t = re.sub(r"^(?:alpha|beta|α|β)-", "", text.strip())
    t = re.sub(r"(?<=[a-z])[pf](?=NAc$|NGc$|N$|A$)", "", t)
    for pattern in (_HEPTOSE, _COMPACT_HEPTOSE):
        m = pattern.match(t)
        if m:
            return _heptose(m["outer"], m["inner"], m["cfg"], text)
    m = _PAIR_HEPTOSE.match(t)
    if m:  # the lipopolysaccharide shorthand: L,D-Hep and D,D-Hep are manno-heptoses
        return _heptose(m["outer"], m["inner"], "man", text)
    bare = re.sub(r"^[DL]-|[pf]$", "", t)
    if bare in ULOSONIC:
        raise NameNotRecognisedError(text, f"{bare} is {ULOSONIC[bare]}; {ULOSONIC_REASON}")
    m = re.match(r"^(?:(?P<series>[DL])-)?(?P<sym>[A-Za-z]+?)(?P<ring>[pf])?$", t)
    if m is None or m["sym"] not in SYMBOLS:
        raise NameNotRecognisedError(text, "not an IUPAC monosaccharide symbol", ())
    sym, series = m["sym"], m["series"]
    if sym in _FIXED:
        chain = from_name(SYMBOLS[sym])
        if series is not None and series != chain.series:
            raise NameNotRecognisedError(
                text, f"{sym} ({SYMBOLS[sym]}) is {chain.series} by definition", (symbol(chain.mirror()) or "",)
            )
        return chain
    if series is None:
        series = "L" if sym in _DEFAULT_L else "D"
    return from_name(_name_for(sym, series))


@cache
def _by_structure() -> dict[Chain, str]:
    out: dict[Chain, str] = {}
    for sym in SYMBOLS:
        if sym in _FIXED:
            out.setdefault(from_name(SYMBOLS[sym]), sym)
            continue
        for series in ("D", "L"):
            out.setdefault(from_name(_name_for(sym, series)), f"{series}-{sym}")
    return out


def symbol(chain: Chain) -> str | None:
    """The IUPAC symbol of ``chain`` with its series (``L-Rha``, ``D-GlcNAc``, ``L-gro-D-manHep``), or None.

    Two-prefix heptoses are written with abbreviated prefixes (2-Carb-38);
    sugars without a symbol give None (use the systematic name).
    """
    found = _by_structure().get(chain)
    if found is not None:
        return found
    if chain.carbonyl == "aldose" and chain.carbons == 7 and len(chain.stereocentres) == 5 and not chain.is_uronic:
        prefix = configurational_prefix([chain.sides[k - 1] or "right" for k in chain.stereocentres])
        outer, outer_word, inner, inner_word = prefix.split("-")
        if systematic_name(chain) == f"{prefix}-heptose":  # a parent heptose, no substituent
            return f"{outer}-{_SHORT_PREFIX[outer_word]}-{inner}-{_SHORT_PREFIX[inner_word]}Hep"
    return None


def symbol_in_capitals(text: str) -> str | None:
    """The symbol written in capitals or small letters (``GLCNAC`` -> ``GlcNAc``, ``kdo`` -> ``Kdo``), or None.

    Only a whole, unambiguous match counts; series prefixes are kept (``D-GLCNAC`` -> ``D-GlcNAc``).
    """
    m = re.match(r"^(?P<series>[DLdl]-)?(?P<sym>[A-Za-z0-9]+)$", text.strip())
    if m is None:
        return None
    matches = [k for k in (*SYMBOLS, *ULOSONIC) if k.lower() == m["sym"].lower()]
    if len(matches) != 1 or matches[0] == m["sym"]:
        return None
    return (m["series"] or "").upper() + matches[0]


def known_symbols() -> list[str]:
    """Every symbol accepted, without series."""
    return sorted(SYMBOLS) + ["LDmanHep", "DDmanHep", "L,D-Hep", "D,D-Hep"]
