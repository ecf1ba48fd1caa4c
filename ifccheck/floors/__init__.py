"""Floors stage: the levels of a model and the slab or declared deck on each.

Between the reader and the framing graph: ``infer_roles`` (framing.roles)
settles what each member does, ``assign_levels`` gives every horizontal
framing member and slab a level (storeys where they tell, else elevations),
and ``declared_decks`` adds the decks the settings declare as slabs of the
model, so that framing and loads treat them like modelled ones.
"""

from __future__ import annotations

from ifccheck.config import Settings
from ifccheck.floors.decks import (
    check_keys,
    declared_decks,
    framed_area,
    match_level,
    match_levels,
    unmatched_keys,
)
from ifccheck.floors.levels import assign_levels, elevation_label, is_level_framing
from ifccheck.framing.roles import infer_roles
from ifccheck.model import Model

__all__ = [
    "assign_levels",
    "check_keys",
    "declared_decks",
    "elevation_label",
    "framed_area",
    "is_level_framing",
    "match_level",
    "match_levels",
    "prepare_floors",
    "unmatched_keys",
]


def prepare_floors(model: Model, settings: Settings, strict_keys: bool = True) -> None:
    """Roles from geometry, levels for the framing and slabs, and the declared decks
    added as slabs of the model. ``strict_keys`` makes a settings key that names
    nothing in the model a SettingsError (``diff`` checks them across revisions)."""
    infer_roles(model, settings.framing.slab_bearing_tolerance)
    assign_levels(model, settings.framing.level_tolerance)
    if strict_keys:
        check_keys(model, settings)
    model.slabs.extend(declared_decks(model, settings))
