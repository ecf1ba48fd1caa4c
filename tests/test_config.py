"""Settings loader: quantities with units, defaults, and rejected files.

Unit conversions are checked against the exact definitions of the inch-pound
units (NIST SP 811, Appendix B): 1 ft = 0.3048 m, 1 in = 0.0254 m,
1 lb = 0.45359237 kg, 1 lbf = 4.4482216152605 N.
"""

from __future__ import annotations

import json
import math
from pathlib import Path

import pytest

from ifccheck.config import (
    Settings,
    SettingsError,
    deck_span_degrees,
    load_settings,
    settings_from_dict,
    settings_to_dict,
)
from ifccheck.units import (
    QuantityError,
    format_force,
    format_length,
    format_moment,
    format_pressure,
    format_stress,
    parse_quantity,
)

FT = 0.3048
IN = 0.0254
LB = 0.45359237
LBF = 4.4482216152605
PSF = LBF / FT**2  # 47.880259 Pa
PCF = LB / FT**3  # 16.018463 kg/m³

FULL = """
[design]
standard = "AISC 360-16"
method = "ASD"

[steel]
default_grade = "A572 Gr 50"

[loads]
dead = "60 psf"
live = "2.4 kPa"
concrete_density = "145 pcf"
steel_density = "7850 kg/m^3"

[loads.storeys."Level 2"]
live = "125 psf"
deck_span = "x"

[loads.storeys.Roof]
dead = "0.5 kN/m^2"
deck_span = "30 deg"

[loads.slabs."2O2Fr$t4X7Zf8NOew3FLOH"]
deck_span = "Y"
live = "0 psf"

[bracing]
slab = false

[framing]
gap = "2 in"
elevation_tolerance = "50 mm"
slab_bearing_tolerance = "0.1 ft"

[deflection]
live = 480
total = "L/240"
"""


def write(tmp_path: Path, text: str) -> Path:
    p = tmp_path / "settings.toml"
    p.write_text(text, encoding="utf-8")
    return p


def test_defaults_without_file() -> None:
    s = load_settings(None)
    assert s == Settings()
    assert s.design.method == "LRFD"
    # 60 psf and 100 psf, common practice office loads (ASCE 7-16 Table 4.3-1: 50 psf
    # office live plus partitions)
    assert s.loads.dead == pytest.approx(60 * PSF, rel=1e-4)
    assert s.loads.live == pytest.approx(100 * PSF, rel=1e-4)
    assert s.deflection.live == 360 and s.deflection.total == 240  # common practice


def test_every_key_parsed_in_si(tmp_path: Path) -> None:
    s = load_settings(write(tmp_path, FULL))
    assert s.design.standard == "AISC 360-16"
    assert s.design.method == "ASD"
    assert s.steel.default_grade == "A572 Gr 50"
    assert s.loads.dead == pytest.approx(60 * PSF)  # 2872.8 Pa
    assert s.loads.live == pytest.approx(2400.0)
    assert s.loads.concrete_density == pytest.approx(145 * PCF)  # 2322.7 kg/m³
    assert s.loads.steel_density == pytest.approx(7850.0)
    lvl2 = s.loads.storeys["Level 2"]
    assert lvl2.live == pytest.approx(125 * PSF) and lvl2.dead is None
    assert lvl2.deck_span == "x"
    roof = s.loads.storeys["Roof"]
    assert roof.dead == pytest.approx(500.0) and roof.live is None
    assert roof.deck_span == "30"
    sl = s.loads.slabs["2O2Fr$t4X7Zf8NOew3FLOH"]
    assert sl.deck_span == "y" and sl.live == 0.0
    assert s.bracing.slab is False
    assert s.framing.gap == pytest.approx(2 * IN)
    assert s.framing.elevation_tolerance == pytest.approx(0.05)
    assert s.framing.slab_bearing_tolerance == pytest.approx(0.1 * FT)
    assert s.deflection.live == 480.0 and s.deflection.total == 240.0


def test_partial_file_keeps_other_defaults(tmp_path: Path) -> None:
    s = load_settings(write(tmp_path, '[loads]\nlive = "50 psf"\n'))
    assert s.loads.live == pytest.approx(50 * PSF)
    assert s.loads.dead == Settings().loads.dead
    assert s.framing == Settings().framing


def test_density_as_unit_weight_and_method_case() -> None:
    # a unit weight (force per volume) is divided by standard gravity
    s = settings_from_dict(
        {"loads": {"concrete_density": "150 lbf/ft^3"}, "design": {"method": "lrfd"}}
    )
    assert s.loads.concrete_density == pytest.approx(150 * PCF)
    assert s.design.method == "LRFD"


@pytest.mark.parametrize(
    ("text", "degrees"), [("x", 0.0), ("y", 90.0), ("30", 30.0), ("135", 135.0)]
)
def test_deck_span_degrees(text: str, degrees: float) -> None:
    assert deck_span_degrees(text) == degrees


def test_deck_span_angle_normalised_to_half_turn() -> None:
    s = settings_from_dict({"loads": {"storeys": {"L3": {"deck_span": "210 deg"}}}})
    assert s.loads.storeys["L3"].deck_span == "30"
    s = settings_from_dict({"loads": {"storeys": {"L3": {"deck_span": f"{math.pi / 2} rad"}}}})
    assert deck_span_degrees(s.loads.storeys["L3"].deck_span or "") == pytest.approx(90.0)


@pytest.mark.parametrize(
    ("doc", "message"),
    [
        ({"loads": {"live": "100 pounds"}}, "settings: loads.live: '100 pounds' is not a pressure"),
        ({"loads": {"liv": "100 psf"}}, "settings: loads.liv: unknown key"),
        ({"colour": {}}, "settings: colour: unknown key"),
        ({"framing": {"gap": "2 psf"}}, "settings: framing.gap: '2 psf' is not a length"),
        ({"loads": {"dead": "-5 psf"}}, "settings: loads.dead: '-5 psf' must not be negative"),
        (
            {"loads": {"storeys": {"Level 2": {"live": "-1 kPa"}}}},
            "settings: loads.storeys.\"Level 2\".live: '-1 kPa' must not be negative",
        ),
        (
            {"loads": {"storeys": {"Level 2": {"seismic": "1 kPa"}}}},
            'settings: loads.storeys."Level 2".seismic: unknown key',
        ),
        ({"loads": {"dead": 60}}, "settings: loads.dead: 60 is not a pressure with units"),
        ({"loads": {"dead": "60"}}, "settings: loads.dead: '60' has no units"),
        ({"design": {"method": "LFRD"}}, "settings: design.method: 'LFRD' is not 'LRFD' or 'ASD'"),
        ({"design": {"method": 1}}, "settings: design.method: 1 is not a non-empty string"),
        ({"bracing": {"slab": "yes"}}, "settings: bracing.slab: 'yes' is not true or false"),
        ({"deflection": {"live": "L/0"}}, "settings: deflection.live: 'L/0' must be a positive"),
        ({"deflection": {"total": True}}, "settings: deflection.total: True is not a span ratio"),
        ({"loads": {"concrete_density": "0 pcf"}}, "settings: loads.concrete_density: '0 pcf'"),
        (
            {"loads": {"slabs": {"abc": {"deck_span": "north"}}}},
            "settings: loads.slabs.abc.deck_span: 'north' is not 'x', 'y' or an angle",
        ),
        ({"loads": {"storeys": {"L2": "125 psf"}}}, "settings: loads.storeys.L2: '125 psf' is not"),
        ({"loads": "heavy"}, "settings: loads: 'heavy' is not a table"),
    ],
)
def test_bad_values_rejected_naming_the_key(doc: dict, message: str) -> None:
    with pytest.raises(SettingsError) as e:
        settings_from_dict(doc)
    assert str(e.value).startswith(message)
    assert "\n" not in str(e.value)


def test_bad_toml_syntax(tmp_path: Path) -> None:
    p = write(tmp_path, '[loads]\ndead = "60 psf\n')
    with pytest.raises(SettingsError) as e:
        load_settings(p)
    msg = str(e.value)
    assert msg.startswith(f"settings: {p}: invalid TOML") and "line 2" in msg
    assert "\n" not in msg


def test_unknown_key_in_file(tmp_path: Path) -> None:
    with pytest.raises(SettingsError, match=r"settings: deflection\.totl: unknown key"):
        load_settings(write(tmp_path, "[deflection]\ntotl = 240\n"))


def test_missing_file(tmp_path: Path) -> None:
    with pytest.raises(SettingsError, match="no such file"):
        load_settings(tmp_path / "absent.toml")


def test_settings_error_is_a_value_error() -> None:
    assert issubclass(SettingsError, ValueError)


def test_settings_to_dict_is_si_and_json_ready(tmp_path: Path) -> None:
    s = load_settings(write(tmp_path, FULL))
    d = settings_to_dict(s)
    assert d["loads"]["dead"] == pytest.approx(60 * PSF)
    assert d["framing"]["gap"] == pytest.approx(2 * IN)
    assert d["loads"]["storeys"]["Level 2"]["live"] == pytest.approx(125 * PSF)
    assert d["design"]["method"] == "ASD"
    assert json.loads(json.dumps(d)) == d


# -- units -------------------------------------------------------------------------------


@pytest.mark.parametrize(
    ("text", "dimension", "si"),
    [
        ("150 mm", "length", 0.150),
        ("2 in", "length", 2 * IN),
        ("30 ft", "length", 30 * FT),
        ("50 ksi", "stress", 50e3 * LBF / IN**2),  # 344.74 MPa
        ("345 MPa", "stress", 345e6),
        ("100 psf", "pressure", 100 * PSF),
        ("2400 kg/m^3", "density", 2400.0),
        ("2400 kg/m³", "density", 2400.0),
        ("145 pcf", "density", 145 * PCF),
        ("250 kip-ft", "moment", 250e3 * LBF * FT),
        ("250 kip*ft", "moment", 250e3 * LBF * FT),
        ("339 kN·m", "moment", 339e3),
        ("10 kip", "force", 10e3 * LBF),
        ("1 klf", "line load", 1e3 * LBF / FT),
        ("30 deg", "angle", 30.0),
    ],
)
def test_parse_quantity(text: str, dimension: str, si: float) -> None:
    assert parse_quantity(text, dimension) == pytest.approx(si, rel=1e-12)


@pytest.mark.parametrize(
    ("text", "dimension"),
    [("100 pounds", "pressure"), ("m", "length"), ("5", "length"), ("abc", "length"),
     ("2 in +", "length"), ("30", "angle"), ("1 m", "moment")],
)  # fmt: skip
def test_parse_quantity_rejects(text: str, dimension: str) -> None:
    with pytest.raises(QuantityError):
        parse_quantity(text, dimension)


def test_format_si_and_imperial() -> None:
    assert format_length(30 * FT, "imperial") == "30.00 ft"
    assert format_length(9.144) == "9.14 m"
    assert format_moment(250e3 * LBF * FT, "imperial") == "250.0 kip-ft"
    assert format_moment(339e3) == "339.0 kN·m"
    assert format_force(10e3 * LBF, "imperial") == "10.0 kip"
    assert format_force(44.5e3) == "44.5 kN"
    assert format_stress(50e3 * LBF / IN**2, "imperial") == "50.0 ksi"
    assert format_stress(345e6) == "345.0 MPa"
    assert format_pressure(100 * PSF, "imperial") == "100.00 psf"
    assert format_pressure(2400.0) == "2.40 kPa"


LOADS = """
[loads]
live_reduction = true
partitions = "15 psf"

[loads.storeys.Roof]
roof_live = "20 psf"
snow = "1.2 kPa"
wind_uplift = "25 psf"

[loads.storeys."Level 2"]
assembly = true
live_reduction = false

[[loads.lines]]
edge = "Level 2"
case = "D"
intensity = "0.4 klf"
label = "curtain wall"

[[loads.lines]]
guid = "2O2Fr$t4X7Zf8NOew3FLOH"
case = "W"
intensity = "2 kN/m"
start = "1 ft"
end = "10 ft"

[[loads.points]]
name = "B-12"
station = "15 ft"
case = "L"
force = "4 kip"

[construction]
live = "50 psf"
deck_braces = true
"""


def test_load_cases_lines_points_and_construction_in_si(tmp_path: Path) -> None:
    path = tmp_path / "loads.toml"
    path.write_text(LOADS)
    s = load_settings(path)
    assert s.loads.live_reduction is True
    assert s.loads.partitions == pytest.approx(15 * PSF)
    roof = s.loads.storeys["Roof"]
    assert (roof.roof_live, roof.snow, roof.wind_uplift) == (
        pytest.approx(20 * PSF), pytest.approx(1200.0), pytest.approx(25 * PSF),
    )  # fmt: skip
    assert roof.roof is None  # a roof because it is given roof loads (see loads/cases.py)
    lv2 = s.loads.storeys["Level 2"]
    assert (lv2.assembly, lv2.live_reduction) == (True, False)
    edge, wind = s.loads.lines
    assert (edge.edge, edge.case, edge.label, edge.index) == ("Level 2", "D", "curtain wall", 1)
    assert edge.intensity == pytest.approx(400 * LBF / FT)
    assert (wind.guid, wind.case, wind.key) == ("2O2Fr$t4X7Zf8NOew3FLOH", "W", "loads.lines[2]")
    assert (wind.intensity, wind.start, wind.end) == (2000.0, pytest.approx(FT),
                                                      pytest.approx(10 * FT))  # fmt: skip
    (point,) = s.loads.points
    assert (point.name, point.case, point.key) == ("B-12", "L", "loads.points[1]")
    assert (point.station, point.force) == (pytest.approx(15 * FT), pytest.approx(4000 * LBF))
    c = s.construction
    assert c is not None and c.deck_braces is True and c.live == pytest.approx(50 * PSF)
    assert c.wet_concrete is None and c.levels is None
    assert not s.is_default("construction.live") and s.is_default("construction.wet_concrete")
    json.dumps(settings_to_dict(s))  # plain data


def test_construction_defaults_and_absence() -> None:
    assert Settings().construction is None  # no construction stage unless asked for
    c = settings_from_dict({"construction": {}}).construction
    assert c is not None
    # 20 psf, the lightest ASCE 37-14 duty class (from memory); deck not attached
    assert c.live == pytest.approx(20 * PSF, rel=1e-4) and c.deck_braces is False


@pytest.mark.parametrize(
    ("doc", "message"),
    [
        ({"loads": {"lines": [{"guid": "a", "name": "b", "case": "D", "intensity": "1 klf"}]}},
         "settings: loads.lines[1]: give exactly one of guid, name, edge"),
        ({"loads": {"lines": [{"case": "D", "intensity": "1 klf"}]}},
         "settings: loads.lines[1]: give exactly one of guid, name, edge"),
        ({"loads": {"lines": [{"guid": "a", "intensity": "1 klf"}]}},
         "settings: loads.lines[1].case: missing"),
        ({"loads": {"lines": [{"guid": "a", "case": "E", "intensity": "1 klf"}]}},
         "settings: loads.lines[1].case: 'E' is not a load case (one of D, L, Lr, S, W)"),
        ({"loads": {"lines": [{"guid": "a", "case": "D", "intensity": "1 kip"}]}},
         "settings: loads.lines[1].intensity: '1 kip' is not a line load"),
        ({"loads": {"lines": [{"guid": "a", "case": "D", "intensity": "1 klf", "start": "5 ft",
                               "end": "2 ft"}]}}, "settings: loads.lines[1]: end must be beyond"),
        ({"loads": {"lines": {"guid": "a"}}},
         "settings: loads.lines: {'guid': 'a'} is not an array"),
        ({"loads": {"points": [{"guid": "a", "case": "D", "force": "1 kip"}]}},
         "settings: loads.points[1].station: missing"),
        ({"loads": {"points": [{"edge": "L2", "station": "1 ft", "case": "D", "force": "1 kip"}]}},
         "settings: loads.points[1].edge: unknown key"),
        ({"construction": {"live": "-5 psf"}}, "settings: construction.live: '-5 psf' must not"),
        ({"construction": {"wet_concrete": "0 psf"}}, "settings: construction.wet_concrete:"),
        ({"construction": {"shoring": True}}, "settings: construction.shoring: unknown key"),
        ({"loads": {"storeys": {"Roof": {"roof": "yes"}}}},
         "settings: loads.storeys.Roof.roof: 'yes' is not true or false"),
    ],
)  # fmt: skip
def test_bad_load_entries_rejected_naming_the_key(doc: dict, message: str) -> None:
    with pytest.raises(SettingsError) as e:
        settings_from_dict(doc)
    assert str(e.value).startswith(message), str(e.value)
