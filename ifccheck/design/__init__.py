"""Design standards behind one interface; AISC 360-16 is registered on import."""

from ifccheck.design import aisc360
from ifccheck.design.base import (
    DesignStandard,
    FlexureResult,
    ShearResult,
    StrengthCurve,
    allowable_deflection,
    available_standards,
    check_method,
    deflection_limits,
    deflection_ratio,
    get_standard,
    register_standard,
)
from ifccheck.errors import OutOfScope

__all__ = [
    "DesignStandard",
    "FlexureResult",
    "OutOfScope",
    "ShearResult",
    "StrengthCurve",
    "aisc360",
    "allowable_deflection",
    "available_standards",
    "check_method",
    "deflection_limits",
    "deflection_ratio",
    "get_standard",
    "register_standard",
]
