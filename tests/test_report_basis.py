"""The design basis: loads per level and case, combinations, settings with defaults marked.

Loads of the demo come from sample_models/quillfeather.toml (invented loads);
the defaults from ifccheck/config.py (60 psf dead, 100 psf live, L/360 and
L/240, common practice). 1 psf = 47.880259 Pa (NIST SP 811); g = 9.80665 m/s².
"""

from __future__ import annotations

from pathlib import Path

import pytest
import result_fixtures as rf

from ifccheck.check import run_check
from ifccheck.config import load_settings
from ifccheck.ifc.reader import read_model
from ifccheck.report.basis import (
    assumed_grade,
    assumptions,
    basis_document,
    defaults_line,
    level_loads,
    settings_list,
)
from ifccheck.report.display import DisplayUnits

SAMPLES = Path(__file__).parents[1] / "sample_models"
PSF = 47.880259  # Pa
G = 9.80665


@pytest.fixture(scope="module")
def demo():
    settings = load_settings(SAMPLES / "quillfeather.toml")
    result, model, _ = run_check(SAMPLES / "quillfeather-rev-b.ifc", settings)
    return result, model


def test_loads_per_level_and_case(demo):
    result, _ = demo
    loads = {(x.level, x.what): x for x in level_loads(result)}
    assert loads[("Level 2", "superimposed dead")].pressure == pytest.approx(20 * PSF, rel=1e-6)
    assert loads[("Level 2", "live")].pressure == pytest.approx(80 * PSF, rel=1e-6)
    assert loads[("Roof", "superimposed dead")].pressure == pytest.approx(25 * PSF, rel=1e-6)
    # a roof carries roof live load (and the demo's snow and uplift), no floor live load
    assert ("Roof", "live") not in loads
    assert loads[("Roof", "roof live")].source == 'loads.storeys."Roof".roof_live'
    assert loads[("Roof", "roof live")].pressure == pytest.approx(20 * PSF, rel=1e-6)
    assert not loads[("Roof", "roof live")].default and not loads[("Level 2", "live")].default
    assert loads[("Level 2", "live")].source == "loads.live"  # the [loads] value, given
    # slab self-weight: the modelled thickness × 2400 kg/m³ (normal-weight concrete) × g
    slab = next(s for s in read_model(SAMPLES / "quillfeather-rev-b.ifc").slabs)
    weight = loads[("Level 2", "slab self-weight")]
    assert weight.pressure == pytest.approx(slab.thickness * 2400 * G, rel=1e-6)
    assert weight.default  # the density is the default
    assert ("Roof", "slab self-weight") not in loads  # no roof deck modelled
    du = DisplayUnits("imperial")
    assert du.trade(weight.pressure, "pressure") == f"{slab.thickness * 2400 * G / PSF:.0f} psf"


def test_every_setting_with_defaults_marked(demo):
    result, _ = demo
    settings = {x.key: x for x in settings_list(result.settings)}
    assert not settings["loads.dead"].default and settings["framing.gap"].default
    assert settings['loads.storeys."Roof".dead'].value == pytest.approx(25 * PSF, rel=1e-6)
    assert settings["deflection.live"].value == 360


def test_combinations_and_assumptions(demo):
    result, _ = demo
    doc = basis_document(result)
    sources = {c["name"]: c["source"] for c in doc["combinations"]}
    # the in-service stage's combinations, ASCE 7-16 §2.3.1 by number
    assert sources["1.2D+1.6L+0.5S"] == "ASCE 7-16 §2.3.1 (2)" and sources["1.4D"].endswith("(1)")
    assert sources["0.9D+1.0W"] == "ASCE 7-16 §2.3.1 (6)"
    assert {"L", "D+L"} <= set(sources)  # the deflection combinations
    codes = {c for c, _ in assumptions(result)}
    assert {"slab_braces_top_flange", "composite_ignored", "ends_restrained"} <= codes
    # the scenario's roof has no modelled deck: its braces are assumed anchored
    text = dict(assumptions(result))["no_diaphragm"]
    assert "Roof" in text and "Level 2" not in text
    assert doc["settings_file"].endswith("quillfeather.toml")
    assert doc["deflection_limits"]["live"] == 360 and doc["deflection_limits"]["total"] == 240


def test_defaults_are_named_on_one_line():
    result, _, _ = run_check(SAMPLES / "quillfeather-rev-b.ifc", load_settings(None))
    line = defaults_line(result, DisplayUnits("imperial"))
    assert line is not None and "\n" not in line
    assert "superimposed dead 60 psf" in line and "live 100 psf" in line  # config.py
    # no grade is assumed unless the settings say so (issue 11): the line says that too
    assert "no default grade" in line and "roof" in line
    configured, _, _ = run_check(
        SAMPLES / "brambleford.ifc", load_settings(SAMPLES / "brambleford.toml")
    )
    assert defaults_line(configured, DisplayUnits("si")) is None


def test_assumed_grade_is_counted():
    result = rf.check_result()
    assert assumed_grade(result) is None
    result.assumptions = {"default_grade": 2}
    result.settings = {"steel": {"default_grade": "A992"}}
    assert assumed_grade(result) == {"grade": "A992", "count": 2}
