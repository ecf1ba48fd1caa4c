"""The `strength` command, run through click's CliRunner."""

from __future__ import annotations

import json

import click
import pytest
from click.testing import CliRunner

from ifccheck import CAUTION
from ifccheck.cli import main as cli

FT = 0.3048
KIP_FT = 4448.2216152605 * FT  # N·m
KSI = 6.894757293168361e6


def run(*args: str) -> click.testing.Result:
    return CliRunner().invoke(cli, ["strength", *args])


def test_human_output_imperial() -> None:
    # W24X84, A992, Lb = 10 ft: Eq. F2-2 between Lp = 6.89 ft and Lr = 20.3 ft
    # (AISC Manual Table 3-2, from memory: φMp 840, φMr 515 kip-ft).
    res = run("W24X84", "--lb", "10 ft")
    assert res.exit_code == 0, res.output
    out = res.output
    assert "Lp  = 6.89 ft" in out
    assert "Lr  = 20.31 ft" in out
    assert "φMn = 764.5 kip-ft  governed by inelastic lateral-torsional buckling" in out
    assert out.rstrip().endswith(CAUTION)


def test_human_output_si_and_asd() -> None:
    res = run("W610x125", "--lb", "3.05 m", "--method", "asd")
    assert res.exit_code == 0, res.output
    assert "W24X84" in res.output
    assert "kN·m" in res.output and " m\n" in res.output
    assert "Mn/Ω" in res.output and "Ωb = 1.67" in res.output


def test_json_si_base_units() -> None:
    res = run("W24X84", "--lb", "10 ft", "--json")
    assert res.exit_code == 0, res.output
    data = json.loads(res.output)
    for key in ("shape", "fy", "lb", "cb", "mp", "mn", "design_strength", "limit_state"):
        assert key in data
    assert data["shape"] == "W24X84"
    assert data["method"] == "LRFD"
    assert data["lb"] == pytest.approx(10 * FT)
    assert data["fy"] == pytest.approx(50 * KSI)
    assert data["cb"] == 1.0
    assert data["limit_state"] == "inelastic_ltb"
    assert data["mp"] * 0.9 / KIP_FT == pytest.approx(840, abs=0.5)  # Table 3-2, from memory
    assert data["lp"] / FT == pytest.approx(6.89, abs=0.005)
    assert data["lr"] / FT == pytest.approx(20.3, abs=0.05)
    assert data["design_strength"] == pytest.approx(0.9 * data["mn"])
    assert data["shear"]["clause"] == "AISC 360-16 G2.1(a)"
    assert "curve" not in data


def test_json_curve() -> None:
    res = run("W24X84", "--lb", "10 ft", "--json", "--curve", "--points", "30")
    data = json.loads(res.output)
    curve = data["curve"]
    assert len(curve) == 30
    assert curve[0]["lb"] == 0.0 and curve[0]["limit_state"] == "yielding"
    assert curve[-1]["lb"] == pytest.approx(1.5 * data["lr"])
    strengths = [p["design_strength"] for p in curve]
    assert strengths == sorted(strengths, reverse=True)


def test_human_curve_table() -> None:
    res = run("W24X84", "--lb", "10 ft", "--curve", "--points", "5")
    assert res.exit_code == 0
    assert "strength curve" in res.output
    assert res.output.count("elastic lateral-torsional buckling") >= 1


def test_cb_and_grade_and_fy() -> None:
    base = json.loads(run("W24X84", "--lb", "15 ft", "--json").output)
    more = json.loads(run("W24X84", "--lb", "15 ft", "--cb", "1.14", "--json").output)
    assert more["design_strength"] == pytest.approx(1.14 * base["design_strength"])
    a36 = json.loads(run("W24X84", "--lb", "0 ft", "--grade", "A36", "--json").output)
    assert a36["fy"] == pytest.approx(36 * KSI)
    fy = json.loads(run("W24X84", "--lb", "0 ft", "--fy", "345 MPa", "--json").output)
    assert fy["fy"] == pytest.approx(345e6)
    assert fy["mp"] == pytest.approx(345e6 * 224 * 0.0254**3)  # Fy·Zx, Zx from the database


@pytest.mark.parametrize(
    "shape",
    [
        "I:300x150x7.1x10.7x15mm",
        "I d=300mm bf=150mm tw=7.1mm tf=10.7mm r=15mm",
        "I:11.811x5.906x0.2795x0.4213x0.5906in",
    ],
)
def test_dimension_shapes(shape: str) -> None:
    # IPE300 dimensions (EN 10365, from memory) in mm and in inches: same section.
    res = run(shape, "--lb", "4 m", "--grade", "S355", "--json")
    assert res.exit_code == 0, res.output
    data = json.loads(res.output)
    assert data["section_source"] == "computed from dimensions"
    # Zx of IPE300 = 628 cm³ (EN 10365 tables, from memory): Mp = 355 MPa × Zx
    assert data["mp"] == pytest.approx(355e6 * 628e-6, rel=0.01)


def test_channel_dimension_shape() -> None:
    res = run("C:200x80x6x11x13mm", "--lb", "2 m", "--json")
    assert res.exit_code == 0, res.output
    assert json.loads(res.output)["shape"] == "C:200x80x6x11x13mm"


@pytest.mark.parametrize(
    ("args", "message"),
    [
        (["W24X85", "--lb", "10 ft"], "unknown shape"),
        (["W24X84", "--lb", "10"], "has no units"),
        (["W24X84", "--lb", "ten feet"], "--lb"),
        (["W24X84", "--lb", "10 kg"], "not a length"),
        (["W24X84", "--lb", "10 ft", "--fy", "50"], "has no units"),
        (["W24X84", "--lb", "10 ft", "--fy", "50 ft"], "is not a stress"),
        (["W24X84", "--lb", "10 ft", "--grade", "A992", "--fy", "50 ksi"], "not both"),
        (["W24X84", "--lb", "10 ft", "--grade", "X70"], "unknown grade"),
        (["W24X84", "--lb", "10 ft", "--method", "LSD"], "LRFD or ASD"),
        (["W24X84", "--lb", "10 ft", "--cb", "0"], "--cb"),
        (["W24X84", "--lb=-3 ft"], "negative"),
        (["L6X4X1/2", "--lb", "10 ft"], "F10"),
        (["WT8X25", "--lb", "10 ft", "--axis", "minor"], "F12"),
        (["I d=300mm bf=150mm", "--lb", "1 m"], "missing tw, tf"),
        (["I:300x150x7.1x10.7x15", "--lb", "1 m"], "unknown shape"),
    ],
)
def test_errors_are_one_line_exit_2(args: list[str], message: str) -> None:
    res = CliRunner().invoke(cli, ["strength", *args])
    assert res.exit_code == 2
    assert res.exception is None or isinstance(res.exception, SystemExit)
    lines = [line for line in res.output.splitlines() if line.strip()]
    assert len(lines) == 1, res.output
    assert lines[0].startswith("ifccheck: error: ")
    assert message in lines[0]
    assert "Traceback" not in res.output
