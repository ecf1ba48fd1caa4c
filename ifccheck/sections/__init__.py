"""Section properties: the AISC shape table, properties from dimensions,
local-buckling classification and steel grades."""

from ifccheck.sections.classify import FlexureClass, Slenderness, classify_flexure
from ifccheck.sections.compute import channel_from_dimensions, i_section_from_dimensions
from ifccheck.sections.grades import (
    default_steel,
    known_grades,
    material_category,
    steel_from_name,
    steel_from_yield,
)
from ifccheck.sections.table import (
    designations,
    lookup,
    metric_designation,
    normalise_designation,
    tabulated,
)

__all__ = [
    "FlexureClass",
    "Slenderness",
    "channel_from_dimensions",
    "classify_flexure",
    "default_steel",
    "designations",
    "i_section_from_dimensions",
    "known_grades",
    "lookup",
    "material_category",
    "metric_designation",
    "normalise_designation",
    "steel_from_name",
    "steel_from_yield",
    "tabulated",
]
