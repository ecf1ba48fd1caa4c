"""Loads stage: tributary widths, load cases, load path, combinations and beam statics.

``compute_demand(model, framing, settings)`` is the entry point (``stage=
"construction"`` for the construction stage); the parts (``statics``,
``combinations``, ``cases``, ``reduction``, ``tributary``) are usable alone.
"""

from ifccheck.loads.cases import CONSTRUCTION, IN_SERVICE, LineLoadItem, PointLoadItem
from ifccheck.loads.combinations import (
    ASD,
    CASES,
    LRFD,
    SERVICE,
    Combination,
    governing,
    reduce_to,
    strength_combinations,
)
from ifccheck.loads.demand import (
    BeamDemand,
    DemandFileError,
    DemandResult,
    SupportReaction,
    compute_demand,
    load_demand_csv,
)
from ifccheck.loads.reduction import LiveReduction, reduction_factor
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
    "CASES",
    "CONSTRUCTION",
    "IN_SERVICE",
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
    "LiveReduction",
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
    "reduce_to",
    "reduction_factor",
    "solve_beam",
    "strength_combinations",
]
