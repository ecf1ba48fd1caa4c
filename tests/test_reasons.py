"""Coded reasons: every code has a statement and advice; advice is looked up by code."""

from __future__ import annotations

import re

import pytest

from ifccheck.reasons import NotChecked, Reason, reason_code, reason_text, statement_template
from ifccheck.report.wording import ADVICE, advice


@pytest.mark.parametrize("code", list(NotChecked))
def test_every_code_has_a_statement_and_advice(code: NotChecked):
    template = statement_template(code)
    assert template
    params = {name: "X" for name in re.findall(r"{(\w+)", template)}
    text = Reason.of(code, **params).text
    assert text and "{" not in text
    assert ADVICE[code]
    assert advice(Reason.of(code, **params)).endswith(".")


def test_a_load_path_cycle_is_advised_about_the_cycle_not_the_loads():
    # the keyword search this replaces matched "load" in "load-path cycle" first
    r = Reason.of(NotChecked.LOAD_PATH_CYCLE, path="B1 → B2 → B1")
    assert r.text == "load-path cycle B1 → B2 → B1: members bear on each other"
    assert "loop in the load path" in advice(r)
    assert "Provide the loads" not in advice(r)


def test_a_concrete_member_gets_its_own_advice():
    r = Reason.of(NotChecked.NOT_STEEL, category="concrete", material="C30/37")
    assert r.text == "out of scope: concrete member (C30/37)"
    assert "only steel members are checked" in advice(r)


def test_reasons_are_values():
    a = Reason.of(NotChecked.BRACE_UNANCHORED, kind="strut", members=["S1", "S2"])
    b = Reason.of(NotChecked.BRACE_UNANCHORED, members=("S1", "S2"), kind="strut")
    assert a == b and hash(a) == hash(b)
    assert "strut line S1, S2 reaches no anchor" in a.text
    assert reason_code(a) == "brace_unanchored" and reason_code(None) is None
    assert reason_text(None) == ""


def test_the_outputs_document_lists_every_code():
    from pathlib import Path

    doc = (Path(__file__).parents[1] / "docs" / "outputs.md").read_text(encoding="utf-8")
    for code in NotChecked:
        assert f"| `{code.value}` |" in doc, code
