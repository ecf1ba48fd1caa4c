"""The committed demo models are what the generator writes today."""

from __future__ import annotations

from pathlib import Path

import pytest

from ifccheck.ifc.reader import read_model
from ifccheck.samples import SAMPLES, write_requirements, write_samples

COMMITTED = Path(__file__).parents[1] / "sample_models"


def data_section(path: Path) -> str:
    text = path.read_text()
    return text[text.index("DATA;") :]


def test_committed_samples_are_fresh(tmp_path):
    for path in write_samples(tmp_path):
        committed = COMMITTED / path.name
        assert committed.exists(), f"{path.name} missing: run python -m ifccheck.samples"
        assert data_section(committed) == data_section(path), (
            f"{path.name} is stale: run python -m ifccheck.samples"
        )
    assert {p.name for p in COMMITTED.glob("*.ifc")} == set(SAMPLES)


def test_revision_b_changes_what_the_scenario_says():
    a = read_model(COMMITTED / "quillfeather-rev-a.ifc")
    b = read_model(COMMITTED / "quillfeather-rev-b.ifc")
    names_a = {m.name for m in a.members}
    names_b = {m.name for m in b.members}
    assert names_a - names_b == {"R-B3-15"}  # roof infill deleted for a duct
    pulled = b.member(a.members[[m.name for m in a.members].index("L2-B1-50")].guid)
    assert pulled.length == pytest.approx(29 * 0.3048)  # 1 ft short of its girder
    slab_a = next(s for s in a.slabs if s.name == "L2 composite slab")
    slab_b = next(s for s in b.slabs if s.name == "L2 composite slab")
    assert len(slab_b.openings) == len(slab_a.openings) + 1


def test_committed_ids_is_what_ifccheck_requirements_writes(tmp_path):
    fresh = write_requirements(tmp_path)
    committed = COMMITTED / fresh.name
    assert committed.exists(), f"{fresh.name} missing: run python -m ifccheck.samples"
    assert committed.read_text() == fresh.read_text(), (
        f"{fresh.name} is stale: run python -m ifccheck.samples"
    )


def test_revision_b_fails_one_requirement_on_purpose():
    """Revision B's roof strut is exported without a material: the one requirement the
    demo fails, so that the report shows its model information section."""
    from ifccheck.check import run_check
    from ifccheck.config import load_settings

    settings = load_settings(COMMITTED / "quillfeather.toml")
    names = {}
    for revision in ("a", "b"):
        result, _, _ = run_check(COMMITTED / f"quillfeather-rev-{revision}.ifc", settings,
                                 requirements=True)  # fmt: skip
        names[revision] = [(r.identifier, [e.name for e in r.failing])
                           for r in result.requirements if not r.met]  # fmt: skip
    assert names == {"a": [], "b": [("member_grade", ["R-S15"])]}
