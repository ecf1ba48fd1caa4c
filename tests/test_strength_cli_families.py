"""`ifccheck strength` for every shape family: table designations, dimension specs,
catalogue names from whatever ``lookup`` returns, and one-line errors. Expected values
are the engine's own (checked by hand in the design tests) on the same section."""

from __future__ import annotations

import inspect
import json

import pytest
from click.testing import CliRunner, Result

import ifccheck.cli.strength as strength_module
from ifccheck.cli import main as cli
from ifccheck.design.aisc360 import flexure, shear
from ifccheck.model import Section
from ifccheck.sections import channel_from_dimensions, lookup, steel_from_name
from ifccheck.sections.shapes import (
    angle_from_dimensions,
    double_angle_from_dimensions,
    rect_hollow_from_dimensions,
    round_hollow_from_dimensions,
    singly_symmetric_i_from_dimensions,
    tee_from_dimensions,
)

FT = 0.3048


def run(*args: str) -> Result:
    return CliRunner().invoke(cli, ["strength", *args])


def _json(*args: str) -> dict:  # type: ignore[type-arg]
    res = run(*args, "--json")
    assert res.exit_code == 0, res.output
    return json.loads(res.output)


@pytest.mark.parametrize(
    ("shape", "family", "grade", "clause"),
    [
        ("C12X20.7", "C", "A36", "G2.1(b)"),
        ("HSS10X6X3/8", "HSS", "A500 Gr C", "G4"),
        ("PIPE6STD", "PIPE", "A53 Gr B", "G5"),
        ("WT8X25", "T", "A992", "G3"),
        ("L4X4X1/2", "L", "A36", "G3"),
        ("2L4X4X1/2X3/8", "L", "A36", "G3"),
        ("MC18X58", "C", "A36", "G2.1(b)"),
    ],
)
def test_table_designations_of_every_family(
    shape: str, family: str, grade: str, clause: str
) -> None:
    data = _json(shape, "--lb", "10 ft")
    section = lookup(shape)
    assert section is not None
    assert (data["family"], data["grade"]) == (family, grade)  # preferred grade per family
    steel = steel_from_name(grade)
    assert steel is not None
    assert data["fy"] == pytest.approx(steel.fy)
    expected = flexure(section, steel, [10 * FT], compression_top=True).design_strength[0]
    assert data["design_strength"] == pytest.approx(expected, rel=1e-12)
    assert data["shear"]["clause"] == f"AISC 360-16 {clause}"
    assert data["design_strength"] <= data["mp"]


def test_round_hss_default_is_a500_gr_c_round() -> None:
    # A500 Gr C round HSS: Fy = 46 ksi (AISC Manual Table 2-4, from memory).
    data = _json("HSS6.625X0.280", "--lb", "1 m")
    assert data["grade"] == "A500 Gr C"
    assert data["fy"] == pytest.approx(46 * 6.894757293168361e6)


@pytest.mark.parametrize(
    ("spec", "section"),
    [
        ("IS:900x300x20x200x16x10mm",
         singly_symmetric_i_from_dimensions("IS", 0.9, 0.3, 0.02, 0.2, 0.016, 0.01)),
        ("IS d=900mm bft=300mm tft=20mm bfb=200mm tfb=16mm tw=10mm",
         singly_symmetric_i_from_dimensions("IS", 0.9, 0.3, 0.02, 0.2, 0.016, 0.01)),
        ("T:200x180x9x14x10mm", tee_from_dimensions("T", 0.2, 0.18, 0.009, 0.014, 0.01)),
        ("T d=200mm bf=180mm tw=9mm tf=14mm", tee_from_dimensions("T", 0.2, 0.18, 0.009, 0.014)),
        ("L:100x100x10mm", angle_from_dimensions("L", 0.1, 0.1, 0.01)),
        ("L d=4in b=4in t=0.5in r=0.375in",
         angle_from_dimensions("L", 0.1016, 0.1016, 0.0127, 0.009525)),
        ("2L:100x100x10x10mm", double_angle_from_dimensions("2L", 0.1, 0.1, 0.01, 0.01)),
        ("RHS:200x100x8mm", rect_hollow_from_dimensions("RHS", 0.2, 0.1, 0.008)),
        ("RHS:200x100x8x12mm", rect_hollow_from_dimensions("RHS", 0.2, 0.1, 0.008, 0.012)),
        ("rhs d=200mm b=100mm t=8mm", rect_hollow_from_dimensions("RHS", 0.2, 0.1, 0.008)),
        ("CHS:168.3x7.1mm", round_hollow_from_dimensions("CHS", 0.1683, 0.0071)),
        ("CHS od=6.625in t=0.26in", round_hollow_from_dimensions("CHS", 0.168275, 0.006604)),
        ("C:200x80x6x11x13mm", channel_from_dimensions("C", 0.2, 0.08, 0.006, 0.011, 0.013)),
    ],
)  # fmt: skip
def test_dimension_specs_of_every_family(spec: str, section: Section) -> None:
    data = _json(spec, "--lb", "2 m", "--grade", "S355")
    assert data["section_source"] == "computed from dimensions"
    steel = steel_from_name("S355", max(section.tf, section.tw))
    assert steel is not None
    expected = flexure(section, steel, [2.0], compression_top=True).design_strength[0]
    assert data["design_strength"] == pytest.approx(expected, rel=1e-9)
    assert data["shape"] == " ".join(spec.split())


def test_axis_side_and_fabrication_options() -> None:
    w = _json("W14X90", "--lb", "10 ft", "--axis", "minor")
    assert w["axis"] == "minor" and w["lr"] == 0.0 and w["shear"]["clause"] == "AISC 360-16 G6"
    stem = _json("WT8X25", "--lb", "10 ft", "--compression", "bottom")
    flange = _json("WT8X25", "--lb", "10 ft")
    assert stem["design_strength"] < flange["design_strength"]  # F9: stem in compression
    welded = _json("W24X84", "--lb", "0 ft", "--fabrication", "welded")
    assert welded["built_up"] and welded["shear"]["clause"] == "AISC 360-16 G2.1(b)"
    text = run("L4X4X1/2", "--lb", "4 ft").output
    assert "principal-axis bending is not covered" in text
    assert "no lateral-torsional buckling" in run("PIPE6STD", "--lb", "4 ft").output


def test_whatever_lookup_returns_is_checked(monkeypatch: pytest.MonkeyPatch) -> None:
    # European names come from a catalogue hooked into lookup; the command takes the
    # Section it returns, whichever family it is (EN 10365 nominal dimensions, from
    # memory: UPE200 200 × 80 × 6 × 11, r 13 mm).
    upe = channel_from_dimensions("UPE200", 0.2, 0.08, 0.006, 0.011, 0.013)
    rhs = rect_hollow_from_dimensions("RHS 200x100x8", 0.2, 0.1, 0.008)
    known = {"UPE200": upe, "RHS 200x100x8": rhs}
    original = strength_module.lookup
    monkeypatch.setattr(strength_module, "lookup", lambda n: known.get(n) or original(n))
    for name, section in known.items():
        data = _json(name, "--lb", "3 m", "--grade", "S355")
        steel = steel_from_name("S355", max(section.tf, section.tw))
        assert steel is not None
        assert data["shape"] == name
        assert data["design_strength"] == pytest.approx(
            flexure(section, steel, [3.0], compression_top=True).design_strength[0], rel=1e-12
        )
        assert data["shear"]["vn"] == pytest.approx(shear(section, steel).vn, rel=1e-12)


@pytest.mark.parametrize(
    ("args", "message"),
    [
        (["L:100x100mm", "--lb", "1 m"], "takes 3 to 4 numbers"),
        (["IS d=900mm bft=300mm", "--lb", "1 m"], "missing tft, bfb, tfb, tw"),
        (["T d=200mm q=3mm", "--lb", "1 m"], "'q' is not one of"),
        (["RHS:100x100x60mm", "--lb", "1 m"], "walls leave no hollow"),
        (["L6X4X1/2", "--lb", "1 m"], "F10.2(1)"),
        (["WT8X25", "--lb", "1 m", "--axis", "minor"], "F12"),
        (["2L4X4X1/2", "--lb", "1 m", "--axis", "minor"], "F12"),
        (["RHS 200", "--lb", "1 m"], "unknown shape"),
    ],
)
def test_errors_stay_one_line(
    args: list[str], message: str, monkeypatch: pytest.MonkeyPatch
) -> None:
    # No catalogue answers for "RHS 200x100x8" here: an unknown name, not a bad spec.
    original = strength_module.lookup
    monkeypatch.setattr(strength_module, "lookup", lambda n: None if "RHS" in n else original(n))
    res = run(*args)
    assert res.exit_code == 2, res.output
    lines = [line for line in res.output.splitlines() if line.strip()]
    assert len(lines) == 1 and lines[0].startswith("ifccheck: error: ")
    assert message in lines[0]


def test_units_come_only_from_the_units_module() -> None:
    # No conversion constants in the command: 0.0254 m/in, 0.3048 m/ft, 4448 N/kip,
    # 6894.76 Pa/psi, 1.3558 N·m/lbf·ft.
    source = inspect.getsource(strength_module)
    for constant in ("0.0254", "0.3048", "4448", "6894", "6.894", "1.3558", "25.4"):
        assert constant not in source


@pytest.mark.parametrize(("name", "spec"), [("RHS 200x100x8", "RHS:200x100x8mm")])
def test_names_as_models_write_them(name: str, spec: str) -> None:
    """A name the reader resolves (sections.names) gives the same strength as its
    dimension spec."""
    by_name = CliRunner().invoke(cli, ["strength", name, "--lb", "10 ft", "--json"])
    by_spec = CliRunner().invoke(cli, ["strength", spec, "--lb", "10 ft", "--json"])
    assert by_name.exit_code == 0 and by_spec.exit_code == 0, by_name.stderr
    a, b = json.loads(by_name.stdout), json.loads(by_spec.stdout)
    assert a["design_strength"] == pytest.approx(b["design_strength"])
    assert a["family"] == b["family"]
