"""Loads stage: tributary widths, load path, combinations and beam statics.

``compute_demand(model, framing, settings)`` is the entry point; the parts
(``statics``, ``combinations``, ``tributary``) are usable alone.
"""

from ifccheck.loads.combinations import (
    ASD,
    LRFD,
    SERVICE,
    Combination,
    governing,
    strength_combinations,
)
from ifccheck.loads.demand import (
    BeamDemand,
    DemandFileError,
    DemandResult,
    LineLoadItem,
    PointLoadItem,
    SupportReaction,
    compute_demand,
    load_demand_csv,
)
from ifccheck.loads.statics import (
    BeamAnalysis,
    BeamProblem,
    CaseLoads,
    Diagram,
    LineLoad,
    PointLoad,
    UnstableBeamError,
    analyse_beam,
    analyse_beams,
    solve_beam,
)
from ifccheck.loads.tributary import DeckSpan, Tributary, TributaryResult, compute_tributary

__all__ = [
    "ASD",
    "LRFD",
    "SERVICE",
    "BeamAnalysis",
    "BeamDemand",
    "BeamProblem",
    "CaseLoads",
    "Combination",
    "DeckSpan",
    "DemandFileError",
    "DemandResult",
    "Diagram",
    "LineLoad",
    "LineLoadItem",
    "PointLoad",
    "PointLoadItem",
    "SupportReaction",
    "Tributary",
    "TributaryResult",
    "UnstableBeamError",
    "analyse_beam",
    "analyse_beams",
    "compute_demand",
    "compute_tributary",
    "governing",
    "load_demand_csv",
    "solve_beam",
    "strength_combinations",
]
