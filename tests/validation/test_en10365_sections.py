"""Source: EN 10365:2017, *Hot rolled steel channels, I and H sections — Dimensions and
masses*, CEN, Brussels, 2017; dimensions as carried by the ``structuralcodes`` package.

European sections by name: the catalogue (dimensions from structuralcodes), the
spellings authoring tools write, and the shapes names carry.

Expected properties are EN 10365 / European section-table values quoted from
memory (labelled "from memory"); the dimensions themselves come from the
catalogue package, and the properties are computed from them by
ifccheck.sections.compute.
"""

from __future__ import annotations

import math

import pytest

from ifccheck.model import ShapeFamily
from ifccheck.reasons import NotChecked
from ifccheck.sections import euro, lookup
from ifccheck.sections.names import find_shape

CM2, CM3, CM4 = 1e-4, 1e-6, 1e-8

# EN 10365 tables, from memory: A (cm²), Iy (cm⁴, major axis), Wpl,y (cm³), Iz (cm⁴).
# None where the value is not remembered with confidence.
PARALLEL_FLANGE = {
    "IPE200": (28.48, 1943, 220.6, 142.4),
    "IPE300": (53.81, 8356, 628.4, 603.8),
    "IPE500": (115.5, 48200, 2194, 2142),
    "HEA200": (53.83, 3692, 429.5, 1336),
    "HEA300": (112.5, 18260, 1383, 6310),
    "HEA500": (197.5, 86970, 3949, 10370),
    "HEB200": (78.08, 5696, 642.5, 2003),
    "HEB300": (149.1, 25170, 1869, 8563),
    "HEB400": (197.8, 57680, 3232, 10820),
    "HEM200": (131.3, 10640, 1135, 3651),
    "HEM300": (303.1, 59200, None, 19400),
    "HEM400": (325.8, 104100, None, 19340),
    "UPE100": (12.5, 207, 48.0, 38.3),
    "UPE200": (29.0, 1910, 220, 187),
    "UPE300": (56.6, 7820, None, 538),
}

# Taper-flange series, EN 10365 from memory. The computed values run above the
# tables by up to 3 % (A, Iy, Wpl,y) and 5 % (Iz): the flanges are drawn with
# the mean thickness on a straight slope, without the toe radii.
TAPER_FLANGE = {
    "IPN200": (33.4, 2140, 250, 117),
    "IPN300": (69.0, 9800, 762, 451),
    "IPN400": (118, 29210, 1714, 1160),
    "UPN100": (13.5, 206, 49.0, 29.3),
    "UPN200": (32.2, 1910, 228, 148),
    "UPN300": (58.8, 8030, 632, 495),
}


def _check(name: str, expected: tuple, rel: float, rel_minor: float) -> None:
    s = lookup(name)
    assert s is not None, name
    a, iy, wpl, iz = expected
    assert s.A == pytest.approx(a * CM2, rel=rel)
    assert s.Ix == pytest.approx(iy * CM4, rel=rel)
    if wpl is not None:
        assert s.Zx == pytest.approx(wpl * CM3, rel=rel)
    assert s.Iy == pytest.approx(iz * CM4, rel=rel_minor)
    assert "EN 10365" in s.source


@pytest.mark.parametrize("name", sorted(PARALLEL_FLANGE))
def test_parallel_flange_sections_against_en10365(name: str) -> None:
    # within 0.5 %: the tables round to four significant figures
    _check(name, PARALLEL_FLANGE[name], 0.005, 0.005)


@pytest.mark.parametrize("name", sorted(TAPER_FLANGE))
def test_taper_flange_sections_against_en10365(name: str) -> None:
    _check(name, TAPER_FLANGE[name], 0.03, 0.05)


@pytest.mark.parametrize(
    ("text", "canonical"),
    [
        ("IPE300", "IPE300"),
        ("IPE 300", "IPE300"),
        ("IPE-300", "IPE300"),
        ("HE300A", "HEA300"),
        ("HEA300", "HEA300"),
        ("HE 300 A", "HEA300"),
        ("HEB 200", "HEB200"),
        ("HE 200 B", "HEB200"),
        ("UPE200", "UPE200"),
        ("UPN 200", "UPN200"),
        ("INP 200", "IPN200"),
        ("HEM300", "HEM300"),
    ],
)
def test_spellings(text: str, canonical: str) -> None:
    s = lookup(text)
    assert s is not None and s.name == canonical


def test_hea300_dimensions_from_the_catalogue() -> None:
    # EN 10365, from memory: HE 300 A h 290, b 300, tw 8.5, tf 14, r 27 mm
    shape = euro.shape("HE 300 A")
    assert shape is not None
    assert (shape.d, shape.bf, shape.tw, shape.tf, shape.r) == pytest.approx(
        (0.290, 0.300, 0.0085, 0.014, 0.027)
    )
    assert shape.family is ShapeFamily.I_SHAPE and shape.fabrication == "rolled"


def test_taper_flange_slopes() -> None:
    # DIN 1025-1 (IPN) 14 %, DIN 1026-1 (UPN) 8 % to 300 mm deep and 5 % above, from memory
    assert euro.shape("IPN 300").flange_slope == pytest.approx(math.atan(0.14))
    assert euro.shape("UPN 300").flange_slope == pytest.approx(math.atan(0.08))
    assert euro.shape("UPN 400").flange_slope == pytest.approx(math.atan(0.05))


def test_angles_keep_the_leg_order_of_the_name() -> None:
    long_first, short_first = euro.shape("L120x80x8"), euro.shape("L80x120x8")
    assert long_first is not None and short_first is not None
    assert (long_first.d, long_first.bf) == pytest.approx((0.120, 0.080))
    assert (short_first.d, short_first.bf) == pytest.approx((0.080, 0.120))


@pytest.mark.parametrize("text", ["IPE A 300", "IPE300 A", "HE 200 AA", "PFC 200x90x30"])
def test_variants_the_catalogue_lacks_are_named_as_such(text: str) -> None:
    found = find_shape(text)
    assert found is not None and found.section is None
    assert found.reason.code is NotChecked.PROFILE_NOT_IN_TABLE
    assert "it has no" in found.reason.text
    assert lookup(text) is None


@pytest.mark.parametrize(
    ("text", "family", "dims_mm", "area_cm2", "rel"),
    [
        # half an IPE300 (EN 10365, from memory: h 300, b 150, tw 7.1, tf 10.7, r 15;
        # A 53.8 cm², so half is 26.9 cm²)
        ("1/2IPE300", ShapeFamily.TEE, {"d": 150, "bf": 150, "tw": 7.1, "tf": 10.7, "r": 15},
         53.81 / 2, 0.005),
        ("½ HEA 200", ShapeFamily.TEE, {"d": 95, "bf": 200, "tw": 6.5, "tf": 10, "r": 18},
         53.83 / 2, 0.005),
        # EN 10210-2, from memory: CHS 168.3 x 6.3 A 32.1 cm²
        ("CHS 168.3x6.3", ShapeFamily.HOLLOW_ROUND, {"od": 168.3, "t": 6.3}, 32.1, 0.005),
        # EN 10056-1, from memory: L 100 x 100 x 10 A 19.2 cm² (toe radii not drawn: +1 %)
        ("L100x100x10", ShapeFamily.ANGLE, {"d": 100, "b": 100, "t": 10, "r": 12}, 19.2, 0.01),
        ("RHS 200x100x8", ShapeFamily.HOLLOW_RECT, {"d": 200, "b": 100, "t": 8}, None, 0.0),
        ("SHS 100x5", ShapeFamily.HOLLOW_RECT, {"d": 100, "b": 100, "t": 5}, None, 0.0),
        ("T 100x100x11", ShapeFamily.TEE, {"d": 100, "bf": 100, "tw": 11, "tf": 11}, None, 0.0),
    ],
)  # fmt: skip
def test_shapes_in_names_keep_their_dimensions(text, family, dims_mm, area_cm2, rel) -> None:
    found = find_shape(text)
    assert found is not None and found.shape is not None
    assert found.family is family
    dims = found.shape.dimensions()
    for key, mm in dims_mm.items():
        assert dims[key] == pytest.approx(mm / 1000.0), key
    assert found.section is not None and found.section.family is family
    if area_cm2 is not None:
        assert found.section.A == pytest.approx(area_cm2 * CM2, rel=rel)


def test_rhs_by_name_against_sectionproperties() -> None:
    # the corner radius is not in the name: the section routine takes ro = 2t
    from sectionproperties.analysis import Section as FeSection
    from sectionproperties.pre.library import rectangular_hollow_section

    found = find_shape("RHS 200x100x8")
    geom = rectangular_hollow_section(d=200.0, b=100.0, t=8.0, r_out=16.0, n_r=32)
    geom.create_mesh(mesh_sizes=[20.0])
    fe = FeSection(geom)
    fe.calculate_geometric_properties()
    assert found.section.A == pytest.approx(fe.get_area() * 1e-6, rel=0.002)
    assert found.section.Ix == pytest.approx(fe.get_ic()[0] * 1e-12, rel=0.002)


@pytest.mark.parametrize(
    "text", ["h=930 b=160 tw=10 tf=20", "PL-I 930x160x10x20", "Girder h=930, b=160, tw=10, tf=20"]
)
def test_welded_sections_from_names(text: str) -> None:
    found = find_shape(text)
    assert found is not None and found.section is not None
    s = found.section
    assert (s.d, s.bf, s.tw, s.tf, s.r) == pytest.approx((0.930, 0.160, 0.010, 0.020, 0.0))
    # plate areas by hand: 2·160·20 + (930 − 40)·10 = 15,300 mm²
    assert s.A == pytest.approx(15300e-6)
    assert found.shape.fabrication == "welded"


def test_us_shapes_keep_their_tables() -> None:
    for text, name in [("Beam:W24X84:1234", "W24X84"), ("WT12X42", "WT12X42"),
                       ("L4X4X1/2", "L4X4X1/2"), ("HSS6X6X1/2", "HSS6X6X1/2")]:  # fmt: skip
        found = find_shape(text)
        assert found is not None and found.section is not None, text
        assert found.section.name == name
        assert found.section.source == "AISC Shapes Database v16.0"


def test_a_grade_in_a_name_is_not_a_shape() -> None:
    assert find_shape("S355J2+N") is None
    assert find_shape("Steel") is None
    found = find_shape("HEA300 S355J0")
    assert found is not None and found.token == "HEA300"
