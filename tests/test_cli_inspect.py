"""`ifccheck inspect` and bad input: one line on stderr, exit code 2, no traceback."""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest
from click.testing import CliRunner

from ifccheck.cli import main
from ifccheck.ifc.author import IProfile, ModelAuthor

SAMPLES = Path(__file__).parents[1] / "sample_models"


def run(*args: str) -> subprocess.CompletedProcess:
    """Run the real console entry point in a subprocess (as a user would)."""
    return subprocess.run(
        [sys.executable, "-m", "ifccheck.cli", *args], capture_output=True, text=True, check=False
    )


def assert_one_line_error(proc: subprocess.CompletedProcess, fragment: str) -> None:
    assert proc.returncode == 2, proc.stderr
    lines = proc.stderr.strip().splitlines()
    assert len(lines) == 1, proc.stderr
    assert fragment in lines[0]
    assert "Traceback" not in proc.stderr


def test_missing_file(tmp_path):
    assert_one_line_error(run("inspect", str(tmp_path / "nope.ifc")), "no such file")


def test_not_an_ifc_file(tmp_path):
    p = tmp_path / "notes.ifc"
    p.write_text("hello, this is not a model\n")
    assert_one_line_error(run("inspect", str(p)), "not an IFC file")


def test_truncated_file(tmp_path):
    text = (SAMPLES / "brambleford.ifc").read_text()
    p = tmp_path / "cut.ifc"
    p.write_text(text[: len(text) // 2])
    assert_one_line_error(run("inspect", str(p)), "truncated")


def test_model_with_no_beams(tmp_path):
    a = ModelAuthor("IFC4", "metre")
    a.storey("L", 0.0)
    a.column("L", (0, 0, 0), 3.0, IProfile("W14X90", 0.356, 0.369, 0.0112, 0.018))
    p = a.write(tmp_path / "cols.ifc")
    assert_one_line_error(run("inspect", str(p)), "no beams")


def test_garbage_inside_valid_envelope(tmp_path):
    p = tmp_path / "bad.ifc"
    p.write_text("ISO-10303-21;\nHEADER;\nthis is broken\nEND-ISO-10303-21;\n")
    proc = run("inspect", str(p))
    assert_one_line_error(proc, "bad.ifc")


def test_unknown_option_is_usage_error():
    proc = run("inspect", "--frobnicate", str(SAMPLES / "brambleford.ifc"))
    assert proc.returncode == 2
    assert "Traceback" not in proc.stderr


@pytest.mark.parametrize("name", ["quillfeather-rev-a.ifc", "quillfeather-rev-b.ifc"])
def test_inspect_demo_model_text(name):
    result = CliRunner().invoke(main, ["inspect", str(SAMPLES / name)])
    assert result.exit_code == 0, result.output
    assert "== Level 2" in result.output and "== Roof" in result.output
    assert "0 fell back to body geometry" in result.output
    assert "licensed engineer" in result.output


def test_inspect_json_schema_keys():
    result = CliRunner().invoke(main, ["inspect", "--json", str(SAMPLES / "brambleford.ifc")])
    assert result.exit_code == 0, result.output
    doc = json.loads(result.output)
    assert doc["schema"] == "IFC2X3"
    assert doc["length_unit"] == "millimetre"
    beams = [m for m in doc["members"] if m["role"] == "beam"]
    assert len(beams) == 7
    b = next(m for m in beams if m["name"] == "B2500")
    for key in ("guid", "ifc_class", "name", "storey", "profile", "grade", "fy", "start", "end",
                "length", "top_of_steel", "section", "axis_source", "notes"):  # fmt: skip
        assert key in b
    assert b["fy"] == pytest.approx(355e6)  # S355, EN 10025-2, t <= 16 mm
    assert b["length"] == pytest.approx(6.0)
    assert b["top_of_steel"] == pytest.approx(3.5)  # cardinal point 8 at the storey datum
    for key in ("A", "Ix", "Iy", "Sx", "Zx", "ry", "J", "Cw", "ho", "rts"):
        assert b["section"][key] > 0
    lintel = next(m for m in beams if m["name"] == "L1")
    # given by name only: HEB160 from the European catalogue (EN 10365 via structuralcodes)
    assert lintel["unresolved"] is None
    assert lintel["section"]["name"] == "HEB160" and "EN 10365" in lintel["section"]["source"]
    (slab,) = doc["slabs"]
    assert slab["thickness"] == pytest.approx(0.2)
    assert slab["area"] == pytest.approx(6.2 * 7.7 - 1.5 * 1.5)
    assert len(slab["openings"]) == 1


def test_inspect_json_has_framing_and_demand():
    # stations by construction of the demo scenario (ifccheck/samples/scenario.py)
    ft = 0.3048
    model = str(SAMPLES / "quillfeather-rev-b.ifc")
    config = str(SAMPLES / "quillfeather.toml")
    result = CliRunner().invoke(main, ["inspect", "--json", "--config", config, model])
    assert result.exit_code == 0, result.output
    doc = json.loads(result.output)
    by_name = {m["name"]: m for m in doc["members"]}
    girder = by_name["R-G90-0"]  # roof infill at 15 ft deleted in revision B
    stations = sorted(b["station"] / ft for b in girder["brace_points"] if b["kind"] != "support")
    assert stations == pytest.approx([7.5, 22.5])
    assert [s["station"] / ft for s in girder["supports"]] == pytest.approx([0.0, 30.0])
    assert girder["continuous_bracing"] == []  # no roof deck modelled
    shaft = by_name["L2-B2-20"]  # duct shaft from 6 ft to 21 ft along it
    covered = [v / ft for ab in shaft["continuous_bracing"] for v in ab]
    assert covered == pytest.approx([0.0, 6.0, 21.0, 30.0], abs=0.05)
    assert shaft["demand"]["moment_combination"] == "1.2D+1.6L"
    # loads are named as in results.json: intensity, force, source
    assert all(set(x) == {"case", "intensity", "start", "end", "source"}
               for x in shaft["demand"]["line_loads"])  # fmt: skip
    assert shaft["demand"]["line_loads"] and shaft["free_ends"] == []
    delivered = by_name["L2-G30-30"]["demand"]["point_loads"]  # a girder carrying infill
    assert delivered and all(set(p) == {"case", "force", "station", "source"} for p in delivered)
    pulled = by_name["L2-B1-50"]
    assert pulled["free_ends"] == ["end"]
    strut = by_name["R-S15"]
    assert any(w["guid"] == strut["guid"] for w in doc["warnings"])
    tied = by_name["R-B1-37.5"]
    assert [b["counts"] for b in tied["brace_points"] if b["kind"] == "brace"] == [False]
    assert "reason" in next(b for b in tied["brace_points"] if b["kind"] == "brace")
