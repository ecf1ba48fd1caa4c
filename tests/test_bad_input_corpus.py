"""Bad input never crashes a run and never passes silently (issue 13).

Every case of the generated corpus (tests/bad_inputs.py) runs through the command line
in-process and must end with its exit code and message: exit 2 with one line
``ifccheck: error: …`` on stderr for input that cannot be used; for one bad element,
that element listed as not checked (reason ``bad_element``) or skipped with one warning
naming it, while the other beams keep their results. Never a traceback or an internal
error, never a numpy warning, never a modified input, and every output strict JSON and
well-formed CSV.
"""

from __future__ import annotations

import csv
import hashlib
import json
import time
import warnings
from pathlib import Path

import pytest
from bad_inputs import BEAMS, CASES, Case, valid_model, write_model
from click.testing import CliRunner

from ifccheck.cli import main

_TIMES: list[float] = []


@pytest.fixture(scope="module")
def valid(tmp_path_factory) -> Path:
    return valid_model(tmp_path_factory.mktemp("valid") / "valid.ifc")


def _strict(text: str):
    def refuse(name: str):
        raise ValueError(f"{name} in JSON")

    return json.loads(text, parse_constant=refuse)


def _run(args: list[str]) -> tuple[int, str, str, list[warnings.WarningMessage]]:
    runner = CliRunner()
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        res = runner.invoke(main, args)
    return res.exit_code, res.stdout, res.stderr, list(caught)


def _args(case: Case, tmp: Path, valid: Path) -> tuple[list[str], Path | None]:
    if case.command == "strength":
        return ["strength", *case.args], None
    model = write_model(case, tmp, valid)
    guid = {}
    if case.demands is not None and "{B10}" in case.demands:
        import ifcopenshell

        f = ifcopenshell.open(str(valid))
        guid = {"B10": next(e.GlobalId for e in f.by_type("IfcBeam") if e.Name == "B10")}
    args = [case.command, str(model)]
    if case.settings is not None:
        path = tmp / "settings.toml"
        data = case.settings.encode("utf-8", "surrogateescape")
        path.write_bytes(data)
        args += ["--config", str(path)]
    if case.demands is not None:
        path = tmp / "demands.csv"
        path.write_text(case.demands.format(**guid))
        args += ["--demands", str(path)]
    extra = [a.format(tmp=tmp) for a in case.args]
    if case.command == "check":
        if "--out" not in extra:
            args += ["--out", str(tmp / "out")]
    elif case.exit == 0:
        args.append("--json")
    return args + extra, model


def _sha(path: Path | None) -> str:
    return hashlib.sha256(path.read_bytes()).hexdigest() if path and path.exists() else ""


def test_the_corpus_is_large_and_covers_every_command():
    assert len(CASES) >= 60
    assert len({c.name for c in CASES}) == len(CASES)
    assert {c.command for c in CASES} == {"check", "inspect", "strength"}
    assert {c.exit for c in CASES} == {0, 1, 2}


@pytest.mark.parametrize("case", CASES, ids=lambda c: c.name)
def test_bad_input(case: Case, tmp_path: Path, valid: Path):
    args, model = _args(case, tmp_path, valid)
    before = _sha(model)
    t0 = time.perf_counter()
    code, out, err, caught = _run(args)
    _TIMES.append(time.perf_counter() - t0)

    assert "Traceback" not in out + err and "internal error" not in err, err
    numeric = [w for w in caught if issubclass(w.category, RuntimeWarning)]
    assert not numeric, [str(w.message) for w in numeric]
    assert _sha(model) == before, "the input model was modified"
    assert code == case.exit, (code, out[-600:], err[-600:])
    lines = [ln for ln in err.splitlines() if ln.strip()]
    if case.exit == 2:
        assert len(lines) == 1, err
        assert lines[0].startswith("ifccheck: error: "), err
        assert case.message in lines[0], lines[0]
        assert len(lines[0]) < 400
        return
    for fragment in case.warnings:
        assert any(fragment in ln for ln in lines), (fragment, lines)
    if case.command == "strength":
        assert case.message in out
        return
    if case.command == "inspect":
        _inspected(case, out)
        return
    _checked(case, tmp_path, lines)


def _checked(case: Case, tmp: Path, lines: list[str]) -> None:
    out = tmp / "out"
    doc = _strict((out / "model.results.json").read_text())
    beams = {b["name"]: b for b in doc["beams"]}
    assert set(BEAMS) <= set(beams), "a beam is missing from the results"
    with (out / "model.beams.csv").open(newline="", encoding="utf-8") as fh:
        rows = list(csv.DictReader(fh))
    assert len(rows) == len(doc["beams"])
    for name in case.not_checked:
        b = beams[name]
        assert b["outcome"] == "not_checked", (name, b["outcome"])
        assert b["reason_code"] == case.reason_code, (name, b["reason"])
    if case.element is None:
        return
    # one warning names the element and says why (other warnings may name it for other
    # facts: a fallback depth the framing used, a demand-file row for it)
    why = [
        ln
        for ln in lines
        if ln.startswith("warning: ")
        and (
            ln.startswith((f"warning: {case.element}:", f"warning: {case.element} ("))
            or f"'{case.element}'" in ln
        )
        and case.message in ln
    ]
    if case.name == "duplicate_guid":
        why = [ln for ln in lines if case.message in ln and "B10" in ln and "B20" in ln]
        keys = [b["guid"] for b in doc["beams"]]
        assert any(k.endswith(":2") for k in keys) and len(set(keys)) == len(keys)
    if case.reason_code == "bad_element":
        assert len(why) == 1, (case.element, lines)
    if case.element in case.not_checked:
        assert case.message in beams[case.element]["reason"]
    for name, b in beams.items():
        if name in case.not_checked:
            continue
        if case.others_checked:
            assert b["outcome"] in ("pass", "fail"), (name, b["reason"])
        else:
            assert b["outcome"] in ("pass", "fail") or b["reason"], name


def _inspected(case: Case, out: str) -> None:
    doc = _strict(out)
    if case.element is None:
        return
    messages = [w["message"] for w in doc["warnings"]]
    members = doc["members"] + doc["unreadable"]
    unresolved = [m["unresolved"] or "" for m in members if m["name"] == case.element]
    assert any(case.message in m for m in messages + unresolved), (messages, unresolved)


def test_the_corpus_runs_in_under_a_minute():
    # runs after the cases (pytest keeps file order): the time spent in the commands
    if len(_TIMES) < len(CASES):
        pytest.skip("run with the whole corpus")
    assert sum(_TIMES) < 60.0, sum(_TIMES)


def test_a_carriage_return_stays_in_its_row(tmp_path: Path, valid: Path):
    import ifcopenshell

    f = ifcopenshell.open(str(valid))
    beam = next(e for e in f.by_type("IfcBeam") if e.Name == "B10")
    beam.Name = 'B10\r\nB10-bis,"quoted"\x07'
    model = tmp_path / "cr.ifc"
    f.write(str(model))
    settings = tmp_path / "s.toml"
    settings.write_text(SETTINGS_TEXT)
    code, _, err, _ = _run(["check", str(model), "--config", str(settings), "--out",
                            str(tmp_path / "out")])  # fmt: skip
    assert code == 0, err
    with (tmp_path / "out" / "cr.beams.csv").open(newline="", encoding="utf-8") as fh:
        rows = list(csv.DictReader(fh))
    assert len(rows) == len(BEAMS)
    assert {r["name"] for r in rows} >= {'B10\r\nB10-bis,"quoted"\x07'}


SETTINGS_TEXT = '[loads]\ndead = "10 psf"\nlive = "20 psf"\n'


def test_a_damaged_file_is_refused_whichever_log_format_the_library_uses(tmp_path, valid):
    import ifcopenshell.ifcopenshell_wrapper as wrapper

    from ifccheck.errors import ModelError
    from ifccheck.ifc.reader import open_ifc, parse_errors

    text = valid.read_text().replace("DATA;\n", "DATA;\n#900000=IFCNOSUCHTHING(1.);\n", 1)
    path = tmp_path / "damaged.ifc"
    path.write_text(text)
    wrapper.set_log_format_json()
    try:
        with pytest.raises(ModelError, match=r"damaged IFC file.*IFCNOSUCHTHING"):
            open_ifc(path)
    finally:
        wrapper.set_log_format_text()
    with pytest.raises(ModelError, match=r"damaged IFC file.*IFCNOSUCHTHING"):
        open_ifc(path)
    assert parse_errors("[warning] [VAL016] [2026-01-01 00:00:00] Expected 9 values") == []
