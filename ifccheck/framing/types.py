"""What the framing stage produces: supports, brace points, slab-braced
intervals, load-path order and anchorage findings, per member.

Stations are distances in metres along a member's centroid line from its
``start`` point.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Literal

import networkx as nx

from ifccheck.reasons import Reason

Flange = Literal["top", "bottom", "both"]
BraceKind = Literal["framing", "brace", "support"]
EndName = Literal["start", "end"]
SupportState = Literal["supported", "cantilever", "unsupported"]


@dataclass(frozen=True)
class Support:
    """An end (or an intermediate point) of a beam bearing on another member."""

    station: float
    by: str  # GUID of the supporting member (column, girder, wall)
    by_class: str  # its IFC class, e.g. "IfcColumn"
    end: EndName | None  # which end of the beam bears, None for intermediate


@dataclass(frozen=True)
class BracePoint:
    """A station where lateral movement / twist of the member is restrained."""

    station: float
    kind: BraceKind
    by: str  # GUID of the bracing member (or the support for kind="support")
    flange: Flange
    counts: bool = True
    reason: Reason | None = None  # why it does not count, when counts is False
    adequacy: BraceAdequacy | None = None  # the Appendix 6 check, where it was made


@dataclass(frozen=True)
class BraceAdequacy:
    """Strength and stiffness a brace point needs and gets (N and N/m; N·m and N·m/rad
    for a torsional brace), from the design standard's bracing provisions."""

    kind: Literal["point", "torsional"]
    required_strength: float
    required_stiffness: float
    provided_strength: float
    provided_stiffness: float
    mr: float  # N·m, the moment the brace must hold (the larger of the segments beside it)
    lbr: float  # m, the larger unbraced length beside it
    cd: float  # Cd, 2.0 next to an inflection point
    path: tuple[str, ...] = ()  # the members from the brace point to its anchor
    notes: tuple[str, ...] = ()

    @property
    def strong_enough(self) -> bool:
        return self.provided_strength >= self.required_strength

    @property
    def stiff_enough(self) -> bool:
        return self.provided_stiffness >= self.required_stiffness

    @property
    def adequate(self) -> bool:
        return self.strong_enough and self.stiff_enough


@dataclass(frozen=True)
class FramingEdge:
    """One directed edge of the framing graph: a member end (or point) meeting a host."""

    by: str  # GUID of the connecting member (the edge's source)
    host: str  # GUID of the member or wall it meets (the edge's target)
    station: float  # along the host
    at: float  # along the connecting member
    kind: BraceKind  # "framing", "brace" or "support" (as the host sees it)
    end: EndName | None  # which end of the connecting member, None for an intermediate point
    flange: Flange  # which flange of the host it restrains
    counts: bool = True  # False where the brace reaches no anchor


@dataclass
class MemberFraming:
    """Framing facts for one beam-like member."""

    guid: str
    supports: list[Support] = field(default_factory=list)
    brace_points: list[BracePoint] = field(default_factory=list)
    # top-flange station intervals [start, end] covered by a slab bearing on it
    continuous_bracing: list[tuple[float, float]] = field(default_factory=list)
    free_ends: list[EndName] = field(default_factory=list)
    state: SupportState = "supported"
    # GUIDs of members framing into this one (their reactions load it)
    carries: list[str] = field(default_factory=list)
    notes: list[str] = field(default_factory=list)

    def counting_braces(self, flange: Literal["top", "bottom"]) -> list[float]:
        """Sorted stations of brace points that restrain the given flange."""
        return sorted(
            {
                round(b.station, 9)
                for b in self.brace_points
                if b.counts and b.flange in (flange, "both")
            }
        )


@dataclass
class Framing:
    """The framing graph and its per-member digest.

    Graph nodes are member (and wall) GUIDs. Directed edges run from the
    connecting member to the host it connects to; each carries its
    :class:`FramingEdge` under the key ``edge``. The load path is worked out
    here once: ``load_levels`` are the generations of the carried → carrier
    order (every member after all it carries; a support cycle is one step),
    ``cycles`` the support cycles found.
    """

    graph: nx.MultiDiGraph
    members: dict[str, MemberFraming]
    load_order: list[str]  # carried before carrier: infill → girder → column
    load_levels: list[list[str]] = field(default_factory=list)
    cycles: list[list[str]] = field(default_factory=list)
    warnings: list[tuple[str, str]] = field(default_factory=list)  # (guid, message)
    # members written as beams, columns or members that brace and support nothing,
    # GUIDs by kind ("fastener", "plate or flat", "member of unknown section", ...)
    excluded: dict[str, list[str]] = field(default_factory=dict)
    # bracing lines: nodes ("member", GUID) for struts and braces, and their anchors
    # ("column", GUID), ("wall", GUID), ("slab",); edges where they meet or continue
    bracing_lines: nx.Graph = field(default_factory=nx.Graph)

    def edges(self, by: str, host: str) -> list[FramingEdge]:
        """The edges from member ``by`` to ``host`` (none when they do not meet)."""
        if not self.graph.has_node(by):
            return []
        data = self.graph.get_edge_data(by, host) or {}
        return [d["edge"] for d in data.values()]

    @property
    def in_cycle(self) -> set[str]:
        return {g for cycle in self.cycles for g in cycle}
