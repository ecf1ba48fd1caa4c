"""ifccheck: lateral-torsional buckling checks of steel beams in IFC models."""

__version__ = "0.1.0"

CAUTION = (
    "Results support, and do not replace, review by a licensed engineer "
    "under the governing local building code."
)
