"""The corpus of bad inputs (tests/bad_inputs.py) through the service (issue 13, item 7).

A bad model, settings or demand file is refused at upload (422, one line) or ends the
submission ``errored`` with one line saying what the command line says; a valid model
with one bad element ends ``finished`` with that element not checked and the others
checked. The service never ends a submission with an internal error.
"""

from __future__ import annotations

import json
from pathlib import Path

import pytest
from bad_inputs import BEAMS, CASES, Case, valid_model, write_model

from ifccheck.service.client import ServerProcess, ServiceClient, make_token

# the command-line-only cases: --out is not a field of the service
SERVICE_CASES = [c for c in CASES if c.command == "check" and "--out" not in c.args]


@pytest.fixture(scope="module")
def client(tmp_path_factory):
    data = tmp_path_factory.mktemp("service-bad") / "data"
    token = make_token(data, "corpus")
    with ServerProcess(data, "--workers", "2") as proc, ServiceClient(proc.url, token) as c:
        yield c


@pytest.fixture(scope="module")
def submitted(client, tmp_path_factory):
    """Every case uploaded at once (the workers take them in turn): case name → the
    upload's response, and its final status where it was received."""
    valid = valid_model(tmp_path_factory.mktemp("valid") / "valid.ifc")
    out: dict[str, tuple[int, dict]] = {}
    for case in SERVICE_CASES:
        tmp = tmp_path_factory.mktemp(case.name)
        model = write_model(case, tmp, valid)
        settings = demands = None
        if case.settings is not None:
            settings = tmp / "settings.toml"
            settings.write_bytes(case.settings.encode("utf-8", "surrogateescape"))
        if case.demands is not None:
            demands = tmp / "demands.csv"
            demands.write_text(case.demands.format(B10=_guid(valid, "B10")))
        fields = dict(zip(case.args[::2], case.args[1::2], strict=True))
        form = {"length_unit": fields["--length-unit"]} if "--length-unit" in fields else {}
        r = client.submit(model, settings, demands, model_key=case.name, **form)
        out[case.name] = (r.status_code, r.json())
    final = {}
    for name, (code, body) in out.items():
        final[name] = (code, client.wait(body["id"]) if code == 202 else body)
    return final


def _guid(path: Path, name: str) -> str:
    import ifcopenshell

    f = ifcopenshell.open(str(path))
    return next(e.GlobalId for e in f.by_type("IfcBeam") if e.Name == name)


@pytest.mark.parametrize("case", SERVICE_CASES, ids=lambda c: c.name)
def test_bad_input_through_the_service(case: Case, submitted, client):
    code, doc = submitted[case.name]
    if code == 422:  # refused at upload: only input the command line refuses too
        assert case.exit == 2, doc
        (line,) = doc["detail"].splitlines()
        assert case.message in line, line
        return
    assert code == 202, doc
    if case.exit == 2:
        assert doc["status"] == "errored", doc
        (line,) = doc["error"].splitlines()
        assert case.message in line, line
        assert not line.startswith("internal error"), line
        assert "/input/" not in line  # no server paths
        return
    assert doc["status"] == "finished", doc.get("error")
    results = json.loads(client.file(doc["id"], "results.json"))
    beams = {b["name"]: b for b in results["beams"]}
    assert set(BEAMS) <= set(beams)
    for name in case.not_checked:
        assert beams[name]["outcome"] == "not_checked", (name, beams[name]["outcome"])
        assert beams[name]["reason_code"] == case.reason_code
    if case.others_checked:
        others = [n for n in BEAMS if n not in case.not_checked]
        assert all(beams[n]["outcome"] in ("pass", "fail") for n in others), {
            n: beams[n]["outcome"] for n in others
        }
