"""Coded reasons: why a beam is not checked, or why a brace point does not count.

Each reason is decided once, where the decision is made (the reader, the
framing graph, the demand stage, the design standard), as a :class:`Reason`:
a :class:`NotChecked` code and its parameters. The code is the stable,
machine-readable part (``reason_code`` in the JSON); its one-line statement
of fact is formatted here from the parameters so that every stage and every
output words it the same way. What the modelling team should do about it
(the advice) lives in ``ifccheck.report.wording``, looked up by code.
"""

from __future__ import annotations

from collections.abc import Iterable
from dataclasses import dataclass
from enum import StrEnum
from typing import Any


class NotChecked(StrEnum):
    """Every reason a beam is not checked or a brace point does not count."""

    # reading the model
    NO_PROFILE = "no_profile"
    PROFILE_NOT_IN_TABLE = "profile_not_in_table"
    PROFILE_WITHOUT_DIMENSIONS = "profile_without_dimensions"
    OUTLINE_NOT_RECOGNISED = "outline_not_recognised"
    SHAPE_WITHOUT_PROPERTIES = "shape_without_properties"
    NOT_STEEL = "not_steel"
    NO_GRADE = "no_grade"
    BAD_ELEMENT = "bad_element"
    # the design standard
    SECTION_OUT_OF_SCOPE = "section_out_of_scope"
    # framing
    NOT_IN_FRAMING = "not_in_framing"
    UNSUPPORTED = "unsupported"
    UNSTABLE = "unstable"
    # demand
    LOAD_PATH_CYCLE = "load_path_cycle"
    STATICS_FAILED = "statics_failed"
    NO_DEMAND = "no_demand"
    NO_FLOOR_LOAD = "no_floor_load"
    NO_DECK_DIRECTION = "no_deck_direction"
    # brace points that do not count
    BRACE_UNANCHORED = "brace_unanchored"
    BRACE_NOT_STRUCTURAL = "brace_not_structural"
    BRACE_INADEQUATE = "brace_inadequate"


BRACE_CODES = frozenset(
    {NotChecked.BRACE_UNANCHORED, NotChecked.BRACE_NOT_STRUCTURAL, NotChecked.BRACE_INADEQUATE}
)

# code → one-line statement of fact, formatted from the reason's parameters
_STATEMENTS: dict[NotChecked, str] = {
    NotChecked.NO_PROFILE: "profile not found: no profile set, swept area or designation",
    NotChecked.PROFILE_NOT_IN_TABLE: "profile {name!r} not found in {table}",
    NotChecked.PROFILE_WITHOUT_DIMENSIONS: "profile dimensions missing: {detail}",
    NotChecked.OUTLINE_NOT_RECOGNISED: "profile outline not recognised as a steel shape: {detail}",
    NotChecked.SHAPE_WITHOUT_PROPERTIES: "section properties not computed: {detail}",
    NotChecked.NOT_STEEL: "out of scope: {category} member ({material})",
    NotChecked.NO_GRADE: "no steel grade in the model: {detail}",
    NotChecked.BAD_ELEMENT: "cannot be read: {detail}",
    NotChecked.SECTION_OUT_OF_SCOPE: "out of scope: {detail}",
    NotChecked.NOT_IN_FRAMING: "not in the framing analysis: supports unknown",
    NotChecked.UNSUPPORTED: "unsupported: neither end bears on a column, girder or wall",
    NotChecked.UNSTABLE: "unstable: {detail}",
    NotChecked.LOAD_PATH_CYCLE: "load-path cycle {path}: members bear on each other",
    NotChecked.STATICS_FAILED: "statics failed: {detail}",
    NotChecked.NO_DEMAND: "no demand computed",
    NotChecked.NO_FLOOR_LOAD: "no floor load reached this beam: {detail}",
    NotChecked.NO_DECK_DIRECTION: "deck span direction on {level} cannot be told from the framing",
    NotChecked.BRACE_UNANCHORED: "{kind} line {members} reaches no anchor "
    "(column, wall, slab or braced bay)",
    NotChecked.BRACE_NOT_STRUCTURAL: "{member} is not a structural member ({detail})",
    NotChecked.BRACE_INADEQUATE: "{detail}",
}


# the parameter naming the model information requirements a reason's element does not meet
REQUIREMENT_PARAM = "requirement"


@dataclass(frozen=True)
class Reason:
    """A coded reason with its parameters (hashable, comparable)."""

    code: NotChecked
    params: tuple[tuple[str, Any], ...] = ()

    @classmethod
    def of(cls, code: NotChecked, **params: Any) -> Reason:
        return cls(code, tuple(sorted((k, _frozen(v)) for k, v in params.items())))

    def get(self, key: str, default: Any = None) -> Any:
        return dict(self.params).get(key, default)

    def naming(self, requirements: Iterable[str]) -> Reason:
        """The same reason, also naming the model information requirements (by name) the
        element does not meet and that its check needs."""
        names = tuple(dict.fromkeys([*self.get(REQUIREMENT_PARAM, ()), *requirements]))
        params = {k: v for k, v in self.params if k != REQUIREMENT_PARAM}
        return Reason.of(self.code, **params, **({REQUIREMENT_PARAM: names} if names else {}))

    @property
    def requirements(self) -> tuple[str, ...]:
        """The requirements this reason names (see :meth:`naming`)."""
        return tuple(self.get(REQUIREMENT_PARAM, ()))

    @property
    def text(self) -> str:
        """The one-line statement of fact."""
        values = {k: _words(v) for k, v in self.params}
        try:
            text = _STATEMENTS[self.code].format(**values)
        except (KeyError, IndexError):  # a parameter missing: still say what the code is
            text = self.code.value.replace("_", " ")
        names = self.requirements
        if names:
            quoted = "; ".join(f"'{n}'" for n in names)
            text += f" (model information requirement not met: {quoted})"
        return text

    def __str__(self) -> str:
        return self.text


def statement_template(code: NotChecked) -> str:
    """The statement template of a code (for tests and documentation)."""
    return _STATEMENTS[code]


def _frozen(value: Any) -> Any:
    if isinstance(value, list | tuple | set | frozenset):
        return tuple(value)
    return value


def _words(value: Any) -> Any:
    if isinstance(value, tuple):
        return ", ".join(str(v) for v in value)
    return value


def reason_text(reason: Reason | None) -> str:
    """The statement of a reason, '' for none."""
    return reason.text if reason is not None else ""


def reason_code(reason: Reason | None) -> str | None:
    """The code of a reason, None for none."""
    return reason.code.value if reason is not None else None


def codes(reasons: Iterable[Reason | None]) -> list[str]:
    """The code values of the given reasons, skipping None."""
    return [r.code.value for r in reasons if r is not None]
