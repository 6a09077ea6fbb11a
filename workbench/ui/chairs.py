"""Chairs in 3D: survivors side by side in a chosen ring form and chair, axial and equatorial groups marked.

Geometry, chair energies, couplings and anomer fractions all come from
:mod:`workbench.conformers` (RDKit ETKDG + MMFF94, Angyal's scheme, the
Haasnoot-de Leeuw-Altona equation). The 3D view is 3Dmol.js, shipped with the package and inlined in the page
once per kernel session by :func:`viewer_loader` (no network; :mod:`workbench.display.molview`); axial groups
carry an orange sphere and label, equatorial ones a green one. Beside it, the
same chair drawn flat (SVG) and the predictions, which are also what the
notebook keeps as its static copy.
"""

from __future__ import annotations

import itertools
import uuid
from collections.abc import Sequence
from dataclasses import dataclass

import ipywidgets as w
from IPython import get_ipython
from IPython.display import display
from rdkit import Chem

from workbench.chem.chain import Chain
from workbench.chem.names import display_name
from workbench.chem.order import in_configurational_order
from workbench.chem.smiles import RingForm, ring_forms
from workbench.conformers import conformer_mol, ring_conformers, ring_layout
from workbench.data import viewer_library
from workbench.display.chairs import AXIAL_COLOUR, EQUATORIAL_COLOUR, chair_svg, ring_predictions_html
from workbench.display.molview import Mark, Scene, loader_html, viewer_html
from workbench.display.palette import FONT, INK, MUTED, RULE, esc
from workbench.glossary import conformation_html, conformation_text, term
from workbench.ui.base import Panel, heading

__all__ = ["ChairPanel", "ChairView", "chair_views", "view_3d", "viewer_loader"]

_FORMS = ("alpha_pyranose", "beta_pyranose", "alpha_furanose", "beta_furanose")
_CHAIRS = (
    ("lower energy", ""),
    (conformation_text("4C1 (5C2 for 2-ketoses)"), "A"),
    (conformation_text("1C4 (2C5)"), "B"),
)
_VIEW_IDS = (f"{uuid.uuid4().hex[:8]}-{n}" for n in itertools.count(1))
MAX_SIDE_BY_SIDE = 4


@dataclass(frozen=True)
class ChairView:
    """One survivor in one ring form and chair, ready to draw: molecule, marks and texts."""

    name: str
    chain: Chain
    form: RingForm
    chair: str | None  # "A", "B" or None (furanose, or lowest energy)
    shape: str
    molblock: str
    axial: tuple[tuple[str, int], ...]  # (label, atom index)
    equatorial: tuple[tuple[str, int], ...]
    coords: dict[int, tuple[float, float, float]]


def _form(key: str) -> RingForm:
    anomer, ring = key.split("_")
    return RingForm(ring, anomer)


def _substituent_atoms(found, mol: Chem.Mol) -> dict[str, int]:
    """Atom index of each heavy ring substituent, named as the conformer layer names it (O1, C6, N2)."""
    ring = list(found.ring_atoms)
    closing = found.carbons[-1]
    out: dict[str, int] = {}
    for p, idx in enumerate(ring[1:], start=1):
        carbon = found.carbons[p - 1]
        for nb in mol.GetAtomWithIdx(idx).GetNeighbors():
            if nb.GetIdx() in ring or nb.GetSymbol() == "H":
                continue
            if nb.GetSymbol() == "C":
                label = f"C{carbon + 1}" if carbon == closing else f"C{carbon - 1}"
            else:
                label = f"{nb.GetSymbol()}{carbon}"
            out[label] = nb.GetIdx()
    return out


def chair_views(chains: Sequence, form_key: str, chair: str | None) -> tuple[list[ChairView], list[str]]:
    """Views of ``chains`` in ring form ``form_key`` and ``chair``; plus a note for each chain left out."""
    form = _form(form_key)
    views: list[ChairView] = []
    notes: list[str] = []
    for chain in chains:
        name = display_name(chain)
        if form not in ring_forms(chain):
            notes.append(f"{name} has no {term(form_key)} form")
            continue
        wanted = chair if form.ring == "pyranose" else None
        found = ring_conformers(chain, form)
        conf = found.best(wanted or None)
        mol = conformer_mol(chain, form, wanted or None)
        atoms = _substituent_atoms(found, mol)
        pos = mol.GetConformer().GetPositions()
        coords = {i: (float(x), float(y), float(z)) for i, (x, y, z) in enumerate(pos)}
        views.append(
            ChairView(
                name=name,
                chain=chain,
                form=form,
                chair=conf.chair,
                shape=conf.shape,
                molblock=Chem.MolToMolBlock(mol),
                axial=tuple((lab, atoms[lab]) for lab in conf.axial if lab in atoms),
                equatorial=tuple((lab, atoms[lab]) for lab in conf.equatorial if lab in atoms),
                coords=coords,
            )
        )
    return views, notes


def view_3d(
    views: Sequence[ChairView], width: int = 300, height: int = 300, uid: str | None = None, inline: bool = True
) -> str:
    """HTML of a 3D viewer row, one cell per view, axial/equatorial groups marked (no network).

    ``inline`` puts the library's text in the fragment (a page of its own);
    ``False`` leaves it to the session's :func:`viewer_loader`.
    """
    scenes = []
    for v in views:
        marks = []
        for group, colour, word in ((v.axial, AXIAL_COLOUR, "ax"), (v.equatorial, EQUATORIAL_COLOUR, "eq")):
            for label, idx in group:
                x, y, z = v.coords[idx]
                marks.append(Mark(f"{label} {word}", x, y, z, colour))
        caption = f"{v.name}, {term(v.form.key)}" + (f", {conformation_text(v.shape)}" if v.shape else "")
        scenes.append(Scene(caption, v.molblock, tuple(marks)))
    return viewer_html(scenes, viewer_library() if inline else None, uid or next(_VIEW_IDS), width, height)


_LOADER: list[w.Output] = []


def viewer_loader(load: bool = False) -> w.Output:
    """The kernel's one output that carries the viewer library to the page; ``load`` fills it (once).

    Every chairs panel shows this same widget, so the notebook (and its saved
    widget state) holds the library's text once however many views are drawn.
    """
    if not _LOADER:
        _LOADER.append(w.Output(layout=w.Layout(height="0px", overflow="hidden")))
    out = _LOADER[0]
    if load and not out.outputs:  # set as state (not captured output), so it works from any callback
        data = {"text/html": loader_html(viewer_library()), "text/plain": "3D viewer library"}
        out.outputs = ({"output_type": "display_data", "data": data, "metadata": {}},)
    return out


def views_html(views: Sequence[ChairView], notes: Sequence[str] = (), medium: str = "svg") -> str:
    """Static rendition: per view the flat chair (pyranoses), the groups axial/equatorial, the predictions.

    ``medium="plain"`` leaves the chair drawing out (it is SVG, which sanitisers strip) and keeps the words.
    """
    from workbench.conformers.chair import chair_label

    cards = []
    for v in views:
        flat = ""
        if v.form.ring == "pyranose" and v.chair and medium == "svg":
            flat = chair_svg(ring_layout(v.chain, v.form), v.chair)
        anomeric = 1 if v.chain.carbonyl == "aldose" else 2
        shape = chair_label(v.chair, anomeric) if v.chair else v.shape
        ax = ", ".join(lab for lab, _ in v.axial) or "none"
        eq = ", ".join(lab for lab, _ in v.equatorial) or "none"
        marks = (
            f'<div style="font-size:12px"><span style="color:{AXIAL_COLOUR}">axial: {esc(ax)}</span> · '
            f'<span style="color:{EQUATORIAL_COLOUR}">equatorial: {esc(eq)}</span></div>'
            if v.form.ring == "pyranose"
            else ""
        )
        cards.append(
            f'<div class="ss-chair-card" data-name="{esc(v.name)}" style="display:inline-block;vertical-align:top;'
            f"margin:4px;padding:5px 8px;border:1px solid {RULE};border-radius:6px;max-width:360px;"
            f'font-family:{FONT};color:{INK}"><div style="font-weight:600">{esc(v.name)}</div>'
            f'<div style="font-size:12px;color:{MUTED}">{esc(term(v.form.key))}, {conformation_html(shape)} '
            f"(MMFF94 geometry)</div>{flat}{marks}{ring_predictions_html(v.chain, v.form)}</div>"
        )
    note = "".join(f'<div style="font-size:12px;color:{MUTED}">{esc(n)}.</div>' for n in notes)
    return f'<div class="ss-chairs">{"".join(cards)}{note}</div>'


class ChairPanel(Panel):
    """Pick an unknown, some of its survivors, a ring form and a chair; see them in 3D side by side."""

    what = "chairs"

    def __init__(self, session) -> None:
        super().__init__(session)
        self.views: list[ChairView] = []
        self.notes: list[str] = []
        self.viewer: str | None = None
        self.unknown = w.Dropdown(description="unknown", layout=w.Layout(width="200px"))
        self.survivors = w.SelectMultiple(description="survivors", rows=6, layout=w.Layout(width="340px"))
        self.form = w.Dropdown(
            options=[(term(k), k) for k in _FORMS],
            value="beta_pyranose",
            description="ring form",
            layout=w.Layout(width="260px"),
        )
        self.chair = w.ToggleButtons(options=list(_CHAIRS), value="", style={"button_width": "auto"})
        self.show_button = w.Button(description="Show in 3D", icon="cube", button_style="info")
        self.out3d = w.Output(layout=w.Layout(border=f"1px solid {RULE}", min_height="40px"))
        self.facts = w.HTML()
        self.show_button.on_click(self.notices.guard(lambda _b: self.show()))
        self.unknown.observe(self.notices.guard(lambda change: self._fill_survivors()), names="value")
        session.subscribe(self.notices.guard(lambda _s: self._session_changed()))
        legend = w.HTML(
            f'<div style="font-family:{FONT};font-size:12px;color:{MUTED}">Up to {MAX_SIDE_BY_SIDE} side by side. '
            f'<span style="color:{AXIAL_COLOUR}">Orange: axial</span> · '
            f'<span style="color:{EQUATORIAL_COLOUR}">green: equatorial</span>. Geometry: RDKit ETKDG + MMFF94.</div>'
        )
        self.widget = w.VBox(
            [
                heading("Chairs in 3D"),
                w.HBox([self.unknown, self.form]),
                w.HBox([self.survivors, w.VBox([self.chair, self.show_button])]),
                legend,
                viewer_loader(),
                self.out3d,
                self.facts,
                self.notices.widget,
            ]
        )
        self.widget.add_class("ss-chairs-panel")  # a handle for styles and browser tests
        self._session_changed()

    def _session_changed(self) -> None:
        ids = list(self.session.project.unknown_ids)
        if list(self.unknown.options) != ids:
            current = self.unknown.value
            self.unknown.options = ids
            self.unknown.value = current if current in ids else ids[0]
        self._fill_survivors()

    def _fill_survivors(self) -> None:
        uid = self.unknown.value
        if uid is None:
            return
        chains = in_configurational_order(self.session.solution.survivors[uid])
        names = [display_name(c) for c in chains]
        if list(self.survivors.options) != names:
            kept = tuple(n for n in self.survivors.value if n in names) or tuple(names[: min(3, len(names))])
            # options and selection travel to the browser in one message: no moment where the
            # selection points past the end of the new options (a console error in the browser)
            with self.survivors.hold_sync():
                self.survivors.value = ()
                self.survivors.options = names
                self.survivors.value = kept

    def selected_chains(self) -> list:
        """The survivors chosen in the list (at most :data:`MAX_SIDE_BY_SIDE`)."""
        uid = self.unknown.value
        by_name = {display_name(c): c for c in self.session.solution.survivors.get(uid, ())}
        return [by_name[n] for n in self.survivors.value if n in by_name][:MAX_SIDE_BY_SIDE]

    def show(self) -> None:
        """Compute (through the conformer layer) and draw the chosen survivors."""
        chains = self.selected_chains()
        if not chains:
            self.notices.info("Choose one or more survivors first.")
            return
        self.views, self.notes = chair_views(chains, self.form.value, self.chair.value or None)
        self.facts.value = views_html(self.views, self.notes)
        self.out3d.clear_output()
        if self.views:
            self.viewer = view_3d(self.views, inline=False)
            viewer_loader(load=True)
            if get_ipython() is not None:  # outside a kernel (tests, scripts) there is nowhere to draw
                names = ", ".join(v.name for v in self.views)
                with self.out3d:
                    display({"text/html": self.viewer, "text/plain": f"3D chairs of {names}"}, raw=True)
        self.notices.clear()
        self.refresh_snapshot()

    def snapshot_html(self) -> str:
        if not self.views:
            return (
                f'<div style="font-family:{FONT};font-size:12px;color:{MUTED}">No chairs drawn yet '
                f"(choose survivors and press Show in 3D).</div>"
            )
        return views_html(self.views, self.notes, medium="plain")
