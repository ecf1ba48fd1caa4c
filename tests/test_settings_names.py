"""Settings keys that name something in the model must match it (a typo never drops a load)."""

from __future__ import annotations

from pathlib import Path

from click.testing import CliRunner

from ifccheck.cli import main

SAMPLES = Path(__file__).parents[1] / "sample_models"
REV_A, REV_B = SAMPLES / "quillfeather-rev-a.ifc", SAMPLES / "quillfeather-rev-b.ifc"


def _run(tmp_path: Path, toml: str, *args: str):
    cfg = tmp_path / "s.toml"
    cfg.write_text(toml)
    return CliRunner().invoke(main, [*args, "--config", str(cfg), "--out", str(tmp_path / "o")])


def test_a_storey_typo_is_exit_2_naming_the_key_and_the_nearest_level(tmp_path):
    res = _run(tmp_path, '[loads.storeys."Levle 2"]\nlive = "250 psf"\n', "check", str(REV_B))
    assert res.exit_code == 2
    (line,) = [ln for ln in res.output.splitlines() if ln.strip()]
    assert line.startswith("ifccheck: error: settings: loads.storeys.'Levle 2' names nothing")
    assert "nearest levels: Level 2" in line


def test_a_slab_guid_and_a_deck_that_match_nothing_are_refused(tmp_path):
    res = _run(tmp_path, '[loads.slabs."0NoSuchSlabGuid0000000"]\nlive = "5 kPa"\n',
               "check", str(REV_B))  # fmt: skip
    assert res.exit_code == 2 and "loads.slabs.'0NoSuchSlabGuid0000000'" in res.output
    res = _run(tmp_path, '[decks."Mezzanine"]\nweight = "2 psf"\n', "check", str(REV_B))
    assert res.exit_code == 2 and "decks.'Mezzanine'" in res.output


def test_levels_match_by_elevation_too(tmp_path):
    # the roof of the demo is at 28 ft and its canopy at 11 ft: their elevations name them
    # as well as their storeys do
    decks = ('[decks."+28 ft"]\nweight = "0 psf"\nbraces_top_flange = false\n'
             '[decks."+11 ft"]\nweight = "0 psf"\n')  # fmt: skip
    res = _run(tmp_path, decks, "check", str(REV_A))
    assert res.exit_code in (0, 1), res.output  # default loads: some beams fail
    assert "0 not checked" in res.output  # the roof beams got their floor load


def test_a_material_mapping_that_names_no_material_is_refused(tmp_path):
    res = _run(tmp_path, '[steel.materials]\n"Stell S355" = "S355"\n', "check", str(REV_B))
    assert res.exit_code == 2
    assert "steel.materials.'Stell S355' names nothing" in res.output


def test_line_and_point_loads_that_name_no_beam_are_refused(tmp_path):
    # a GUID, a name or an edge level that is not in the model: exit 2 naming the entry
    cases = [
        (
            '[[loads.lines]]\nguid = "0NoSuchBeamGuid00000000"\ncase = "D"\nintensity = "1 klf"\n',
            "loads.lines[1].guid '0NoSuchBeamGuid00000000' names nothing",
        ),
        (
            '[[loads.lines]]\nname = "L2-E1-0"\ncase = "D"\nintensity = "1 klf"\n'
            '[[loads.lines]]\nname = "L2-E9-0"\ncase = "D"\nintensity = "1 klf"\n',
            "loads.lines[2].name 'L2-E9-0' names nothing",
        ),
        (
            '[[loads.lines]]\nedge = "Level 3"\ncase = "D"\nintensity = "400 plf"\n',
            "loads.lines[1].edge 'Level 3' names nothing",
        ),
        (
            '[[loads.points]]\nname = "R-B9-7.5"\nstation = "15 ft"\ncase = "D"\nforce = "2 kip"\n',
            "loads.points[1].name 'R-B9-7.5' names nothing",
        ),
    ]
    for toml, message in cases:
        res = _run(tmp_path, toml, "check", str(REV_B))
        assert res.exit_code == 2, res.output
        (line,) = [ln for ln in res.output.splitlines() if ln.strip()]
        assert message in line and "Traceback" not in res.output


def test_a_station_off_the_beam_is_refused(tmp_path):
    # R-B1-7.5 is 30 ft long (the scenario's bay): a point at 40 ft is off it
    toml = '[[loads.points]]\nname = "R-B1-7.5"\nstation = "40 ft"\ncase = "D"\nforce = "2 kip"\n'
    res = _run(tmp_path, toml, "check", str(REV_B))
    assert res.exit_code == 2
    assert "loads.points[1].station: 12.192 m lies beyond beam R-B1-7.5" in res.output
