"""Section properties: the AISC shape table, the European catalogue, properties
from dimensions, local-buckling classification and steel grades."""

from ifccheck.model import Section
from ifccheck.sections import euro
from ifccheck.sections.classify import FlexureClass, Slenderness, classify_flexure
from ifccheck.sections.compute import channel_from_dimensions, i_section_from_dimensions
from ifccheck.sections.grades import (
    default_steel,
    grade_problem,
    known_grades,
    material_category,
    steel_from_name,
    steel_from_yield,
    yield_in_name,
)
from ifccheck.sections.table import (
    designations,
    metric_designation,
    normalise_designation,
    tabulated,
)
from ifccheck.sections.table import lookup as _aisc_lookup


def lookup(name: str) -> Section | None:
    """Section for a designation: the AISC Shapes Database v16.0 first (tabulated
    properties), then the European catalogue (properties computed from its
    EN 10365 dimensions: IPE, HEA, HEB, HEM, IPN, UPN, UPE, UB, UC, ...)."""
    return _aisc_lookup(name) or euro.section(name)


__all__ = [
    "FlexureClass",
    "Slenderness",
    "channel_from_dimensions",
    "classify_flexure",
    "default_steel",
    "designations",
    "euro",
    "grade_problem",
    "i_section_from_dimensions",
    "known_grades",
    "lookup",
    "material_category",
    "metric_designation",
    "normalise_designation",
    "steel_from_name",
    "steel_from_yield",
    "tabulated",
    "yield_in_name",
]
