"""Outputs stay valid whatever the model holds (issue 13, item 5): strict JSON from
``check`` and ``inspect --json``, names escaped in the HTML report, a beam the reader
could not place listed but not drawn. The model is the corpus's valid bay
(tests/bad_inputs.py) with names and placements changed."""

from __future__ import annotations

import json
import re
from pathlib import Path

import ifcopenshell
import ifcopenshell.guid
import pytest
from bad_inputs import SETTINGS, valid_model
from click.testing import CliRunner

from ifccheck.cli import main

HOSTILE = '<script>alert("B10")</script>&<b>'


def _refuse(name: str):
    raise ValueError(f"{name} is not JSON")


@pytest.fixture(scope="module")
def hostile(tmp_path_factory) -> tuple[Path, Path]:
    """The valid bay with a hostile name on B10 and B20 placed relative to itself."""
    tmp = tmp_path_factory.mktemp("hostile")
    f = ifcopenshell.open(str(valid_model(tmp / "valid.ifc")))
    beams = {e.Name: e for e in f.by_type("IfcBeam")}
    beams["B10"].Name = HOSTILE
    f.by_type("IfcBuildingStorey")[0].Name = "Level <2>"
    beams["B20"].ObjectPlacement.PlacementRelTo = beams["B20"].ObjectPlacement
    path = tmp / "hostile.ifc"
    f.write(str(path))
    settings = tmp / "settings.toml"
    settings.write_text(SETTINGS.replace("[loads]", '[loads.storeys."Level <2>"]'))
    return path, settings


@pytest.fixture(scope="module")
def checked(hostile, tmp_path_factory) -> Path:
    path, settings = hostile
    out = tmp_path_factory.mktemp("out")
    res = CliRunner().invoke(main, ["check", str(path), "--config", str(settings), "--out",
                                    str(out)])  # fmt: skip
    assert res.exit_code == 1, res.output  # B20 cannot be read: not checked
    return out


def test_results_json_is_strict_and_lists_the_unplaced_beam(checked: Path):
    doc = json.loads((checked / "hostile.results.json").read_text(), parse_constant=_refuse)
    b20 = next(b for b in doc["beams"] if b["name"] == "B20")
    assert b20["outcome"] == "not_checked" and b20["reason_code"] == "bad_element"
    assert "refers to itself" in b20["reason"]
    assert b20["start"] == [None, None, None] and b20["length"] is None
    assert any(b["name"] == HOSTILE for b in doc["beams"])


def test_html_escapes_every_name_and_draws_no_unplaced_beam(checked: Path):
    html = (checked / "hostile.report.html").read_text(encoding="utf-8")
    assert HOSTILE not in html
    assert '<script>alert("B10")' not in html
    assert "&lt;script&gt;" in html
    assert "Level <2>" not in html and "Level &lt;2&gt;" in html
    assert not re.search(r'="-?(nan|inf)"', html, re.IGNORECASE)


def test_inspect_json_is_strict(hostile):
    path, settings = hostile
    res = CliRunner().invoke(main, ["inspect", str(path), "--json", "--config", str(settings)])
    assert res.exit_code == 0, res.output
    doc = json.loads(res.stdout, parse_constant=_refuse)
    unreadable = {m["name"]: m for m in doc["unreadable"]}
    assert unreadable["B20"]["start"] == [None, None, None]
    assert unreadable["B20"]["unresolved_code"] == "bad_element"
    assert doc["summary"]["unreadable"] == 1


def test_inspect_json_turns_every_non_finite_number_into_null():
    from ifccheck.report.inspect import finite_only

    doc = {"a": float("nan"), "b": [1.0, float("inf"), (float("-inf"), 2)], "c": "nan"}
    assert finite_only(doc) == {"a": None, "b": [1.0, None, [None, 2]], "c": "nan"}
    json.dumps(finite_only(doc), allow_nan=False)


def _bcf_texts(path: Path) -> dict[str, str]:
    import zipfile

    with zipfile.ZipFile(path) as z:
        return {n: z.read(n).decode("utf-8") for n in z.namelist()}


def test_bcf_has_no_nan_camera_for_a_beam_with_no_position(checked: Path):
    texts = _bcf_texts(checked / "hostile.issues.bcf")
    assert not any(re.search(r">-?(nan|inf)<", t, re.IGNORECASE) for t in texts.values())
    # B20 (not checked, no position) still has its topic, with its element selected
    visinfo = [t for n, t in texts.items() if n.endswith(".bcfv")]
    b20 = _guid_of(checked, "B20")
    assert any(f'IfcGuid="{b20}"' in t for t in visinfo)


def _guid_of(out: Path, name: str) -> str:
    doc = json.loads(next(out.glob("*.results.json")).read_text())
    return next(b["guid"] for b in doc["beams"] if b["name"] == name)


def test_bcf_selects_a_shared_global_id_by_the_global_id_itself(tmp_path: Path):
    # under the default loads (60 psf superimposed dead, 100 psf live, the 5.5 in slab)
    # an infill W18X35 at 10 ft over 30 ft takes 1.2D + 1.6L ≈ 3.2 kip/ft, Mu ≈ 360 kip-ft,
    # above φMp = 249 kip-ft (AISC Manual Table 3-2, from memory): B20, keyed GUID:2, fails
    # and gets a topic
    f = ifcopenshell.open(str(valid_model(tmp_path / "valid.ifc")))
    beams = {e.Name: e for e in f.by_type("IfcBeam")}
    beams["B20"].GlobalId = beams["B10"].GlobalId
    path = tmp_path / "shared.ifc"
    f.write(str(path))
    res = CliRunner().invoke(main, ["check", str(path), "--out", str(tmp_path / "out")])
    assert res.exit_code == 1, res.output
    doc = json.loads((tmp_path / "out" / "shared.results.json").read_text())
    b20 = next(b for b in doc["beams"] if b["name"] == "B20")
    assert b20["guid"] == beams["B10"].GlobalId + ":2" and b20["outcome"] == "fail"
    ids = set(re.findall(r'IfcGuid="([^"]*)"', "".join(_bcf_texts(
        tmp_path / "out" / "shared.issues.bcf").values())))  # fmt: skip
    assert ids and all(len(i) == 22 and ":" not in i for i in ids)
    assert beams["B10"].GlobalId in ids
    # the checked copy carries the result of each of the two beams on its own element
    copy = ifcopenshell.open(str(tmp_path / "out" / "shared.checked.ifc"))
    import ifcopenshell.util.element as uelement

    for e in copy.by_type("IfcBeam"):
        if e.Name in ("B10", "B20"):
            assert any(k.startswith("ifccheck") for k in uelement.get_psets(e)), e.Name


def test_diff_with_an_unreadable_beam_in_either_revision(tmp_path: Path):
    # revision A valid; revision B: B10 placed relative to itself, with its own GlobalId
    # (matched) or a new one (matched neither by GlobalId nor by position)
    import warnings

    old = valid_model(tmp_path / "a.ifc")
    f = ifcopenshell.open(str(old))
    b10 = next(e for e in f.by_type("IfcBeam") if e.Name == "B10")
    b10.ObjectPlacement.PlacementRelTo = b10.ObjectPlacement
    same = tmp_path / "same.ifc"  # B10 keeps its GlobalId: matched, and weakened
    f.write(str(same))
    b10.GlobalId = ifcopenshell.guid.new()
    new = tmp_path / "b.ifc"
    f.write(str(new))
    settings = tmp_path / "s.toml"
    settings.write_text(SETTINGS)
    for a, b in ((old, new), (new, old), (old, same), (same, old)):
        with warnings.catch_warnings(record=True) as caught:
            warnings.simplefilter("always")
            res = CliRunner().invoke(main, ["diff", str(a), str(b), "--config", str(settings),
                                            "--out", str(tmp_path / f"out-{a.stem}")])  # fmt: skip
        assert res.exit_code in (0, 1), res.output
        assert "internal error" not in res.output
        assert not [w for w in caught if issubclass(w.category, RuntimeWarning)], [
            str(w.message) for w in caught
        ]
        doc = json.loads((tmp_path / f"out-{a.stem}" / "diff.json").read_text(),
                         parse_constant=_refuse)  # fmt: skip
        if b == same:  # B10 passed in A and is not checked in B: weakened
            assert res.exit_code == 1
            changes = doc["beams"].values()
            assert any(c["name"] == "B10" and c["change"] == "weakened" for c in changes)
