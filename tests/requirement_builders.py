"""Small models for the information requirements, written with the entity API
(ifccheck.ifc.author): one element per requirement the model fails on purpose."""

from __future__ import annotations

from pathlib import Path

from ifccheck.ifc.author import IProfile, ModelAuthor

__all__ = ["FAILS", "IProfile", "ModelAuthor", "audit_model", "ifc2x3_members"]

IN = 1.0 / 12.0  # feet per inch
# W16X26 nominal dimensions, AISC Shapes Database v16.0 (d, bf, tw, tf, k1-free fillet), in ft
W16 = IProfile("W16X26", 15.7 * IN, 5.50 * IN, 0.250 * IN, 0.345 * IN, 0.3 * IN)
W12 = IProfile("W12X65", 12.1 * IN, 12.0 * IN, 0.390 * IN, 0.605 * IN, 0.5 * IN)
ANGLE_LIKE = IProfile("C6X8.2", 6.0 * IN, 1.92 * IN, 0.200 * IN, 0.343 * IN, 0.2 * IN, kind="U")
CUSTOM = IProfile("BUILT-UP 1", 15.7 * IN, 5.50 * IN, 0.250 * IN, 0.345 * IN, kind="outline")

# requirement key → name of the element that fails it (and no other element does)
FAILS = {
    "beam_grade": "B-NOGRADE",
    "member_grade": "K-NOGRADE",
    "member_type": "M-UNTYPED",
    "storey": "B-NOSTOREY",
    "profile": "B-OUTLINE",
    "axis": "B-NOAXIS",
    "floor_deck": "R-NODECK",
    "hardware": "Plate P1",
}


def audit_model(path: Path) -> Path:
    """An IFC4 model in feet: a Level 2 bay with its slab, where each beam or member fails
    one requirement, and a roof beam on two columns with no deck."""
    a = ModelAuthor("IFC4", "foot", project="Requirement audit", seed="requirements")
    a.storey("Level 2", 14.0)
    a.storey("Roof", 28.0)
    for x in (0.0, 20.0):
        for y in (0.0, 30.0):
            a.column("Level 2", (x, y, -14.0), 14.0, W12, key=f"c:{x}:{y}", name=f"C-{x:g}-{y:g}")
        a.column("Roof", (x, 0.0, -14.0), 14.0, W12, key=f"rc:{x}", name=f"RC-{x:g}")
    # girders on the column lines, then one infill beam per failing requirement
    for x in (0.0, 20.0):
        a.beam("Level 2", (x, 0.0, 0.0), (x, 30.0, 0.0), W16, key=f"g:{x}", name=f"G-{x:g}",
               cardinal_point=8)  # fmt: skip
    a.beam("Level 2", (0.0, 5.0, 0.0), (20.0, 5.0, 0.0), W16, key="ok", name="B-OK",
           cardinal_point=8)  # fmt: skip
    a.beam("Level 2", (0.0, 10.0, 0.0), (20.0, 10.0, 0.0), W16, key="nograde", name="B-NOGRADE",
           cardinal_point=8, material=None)  # fmt: skip
    nostorey = a.beam("Level 2", (0.0, 15.0, 0.0), (20.0, 15.0, 0.0), W16, key="nostorey",
                      name="B-NOSTOREY", cardinal_point=8)  # fmt: skip
    a.beam("Level 2", (0.0, 20.0, 0.0), (20.0, 20.0, 0.0), CUSTOM, key="outline", name="B-OUTLINE",
           cardinal_point=8)  # fmt: skip
    a.beam("Level 2", (0.0, 25.0, 0.0), (20.0, 25.0, 0.0), W16, key="noaxis", name="B-NOAXIS",
           cardinal_point=8, axis=False)  # fmt: skip
    a.beam("Level 2", (5.0, 5.0, 0.0), (5.0, 10.0, 0.0), W16, key="plate", name="Plate P1",
           cardinal_point=8)  # fmt: skip
    a.member("Level 2", (10.0, 5.0, -1.0), (10.0, 10.0, -0.2), ANGLE_LIKE, predefined="BRACE",
             key="kicker", name="K-NOGRADE", material=None)  # fmt: skip
    a.member("Level 2", (15.0, 5.0, -0.7), (15.0, 10.0, -0.7), ANGLE_LIKE, predefined=None,
             key="untyped", name="M-UNTYPED")  # fmt: skip
    a.slab("Level 2", [(-0.5, -0.5), (20.5, -0.5), (20.5, 30.5), (-0.5, 30.5)], 5.5 * IN,
           5.5 * IN, name="L2 slab", key="slab")  # fmt: skip
    a.beam("Roof", (0.0, 0.0, 0.0), (20.0, 0.0, 0.0), W16, key="nodeck", name="R-NODECK",
           cardinal_point=8)  # fmt: skip
    a.finish()
    for rel in a.f.by_type("IfcRelContainedInSpatialStructure"):
        if nostorey in rel.RelatedElements:
            rel.RelatedElements = [e for e in rel.RelatedElements if e != nostorey]
    return a.write(path)


def ifc2x3_members(path: Path) -> Path:
    """An IFC2X3 model in millimetres: a typed brace (IfcMemberType BRACE) and an untyped
    member, between two beams."""
    a = ModelAuthor("IFC2X3", "millimetre", project="Member types", seed="member-types")
    a.storey("Level 1", 3000.0)
    ipe = IProfile("IPE300", 300.0, 150.0, 7.1, 10.7, 15.0)
    for y in (0.0, 3000.0):
        a.beam("Level 1", (0.0, y, 0.0), (6000.0, y, 0.0), ipe, material="S355", key=f"b:{y}",
               name=f"B{y:g}", cardinal_point=8)  # fmt: skip
    upn = IProfile("UPN100", 100.0, 50.0, 6.0, 8.5, 8.5, kind="U")
    typed = a.member("Level 1", (2000.0, 0.0, -150.0), (2000.0, 3000.0, -150.0), upn,
                     predefined="BRACE", material="S355", key="typed", name="M-TYPED",
                     via_type=True)  # fmt: skip
    typed.ObjectType = None  # its kind is on its IfcMemberType alone
    a.member("Level 1", (4000.0, 0.0, -150.0), (4000.0, 3000.0, -150.0), upn, predefined=None,
             material="S355", key="untyped", name="M-UNTYPED")  # fmt: skip
    return a.write(path)
