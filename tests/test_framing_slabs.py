"""Continuous top-flange bracing by slabs bearing on beams.

Covered lengths follow from the plan geometry as constructed; they are exact
up to floating-point rounding, checked to 1e-9 m. Bearing tolerance is
FramingSettings.slab_bearing_tolerance (50 mm default, common practice).
"""

from __future__ import annotations

import pytest
from builders import beam, column, model, slab
from shapely.geometry import box

from ifccheck.config import BracingSettings, FramingSettings
from ifccheck.framing import analyse_framing
from ifccheck.framing.graph import NOTE_NO_SLAB, NOTE_SLAB_OFF

TOP = 4.0
EXACT = 1e-9  # m, floating-point rounding of exact plan geometry


def frame(slabs=(), infill=True):
    ms = [
        column("C1", 0, 0, 0, 8),
        column("C2", 9, 0, 0, 8),
        column("C3", 0, 6, 0, 8),
        column("C4", 9, 6, 0, 8),
        beam("B", (0, 0), (9, 0), "W24X84", TOP),
        beam("B6", (0, 6), (9, 6), "W24X84", TOP),
    ]
    if infill:
        ms.append(beam("I1", (4.5, 0), (4.5, 6), "W18X35", TOP))
    return model(ms, slabs=list(slabs))


def covered(spans):
    return sum(b - a for a, b in spans)


def test_slab_with_an_opening_over_part_of_a_beam():
    opening = box(3.0, -0.5, 4.2, 0.5)  # 1.2 m of the beam's length
    f = analyse_framing(frame([slab("S1", box(-1, -2, 10, 7), TOP, openings=[opening])]))
    spans = f.members["B"].continuous_bracing
    assert spans == [
        (pytest.approx(0.0, abs=EXACT), pytest.approx(3.0, abs=EXACT)),
        (pytest.approx(4.2, abs=EXACT), pytest.approx(9.0, abs=EXACT)),
    ]
    assert covered(spans) == pytest.approx(9.0 - 1.2, abs=EXACT)
    assert covered(f.members["B6"].continuous_bracing) == pytest.approx(9.0, abs=EXACT)
    assert NOTE_NO_SLAB not in f.members["B"].notes


def test_slab_bracing_switched_off_construction_stage():
    f = analyse_framing(
        frame([slab("S1", box(-1, -2, 10, 7), TOP)]), bracing=BracingSettings(slab=False)
    )
    assert all(mf.continuous_bracing == [] for mf in f.members.values())
    # framing braces still count; the assumption is noted
    assert f.members["B"].counting_braces("top") == pytest.approx([0.0, 4.5, 9.0])
    assert NOTE_SLAB_OFF in f.members["B"].notes


def test_slab_must_bear_on_the_top_of_steel():
    near = analyse_framing(frame([slab("S1", box(-1, -2, 10, 7), TOP + 0.03)]))
    assert covered(near.members["B"].continuous_bracing) == pytest.approx(9.0, abs=EXACT)
    high = analyse_framing(frame([slab("S1", box(-1, -2, 10, 7), TOP + 0.2)]))
    assert high.members["B"].continuous_bracing == []
    tight = analyse_framing(
        frame([slab("S1", box(-1, -2, 10, 7), TOP + 0.03)]),
        FramingSettings(slab_bearing_tolerance=0.02),
    )
    assert tight.members["B"].continuous_bracing == []


def test_adjacent_slabs_over_a_beam_merge_into_one_interval():
    f = analyse_framing(
        frame([slab("S1", box(-1, -2, 5, 7), TOP), slab("S2", box(5, -2, 10, 7), TOP)])
    )
    assert f.members["B"].continuous_bracing == [
        (pytest.approx(0.0, abs=EXACT), pytest.approx(9.0, abs=EXACT))
    ]


def test_slab_partly_over_a_beam_and_stations_from_the_start():
    # slab covers x in [2, 7]; the beam runs from x = 9 back to x = 0
    ms = [beam("R", (9, 0), (0, 0), "W24X84", TOP)]
    f = analyse_framing(model(ms, slabs=[slab("S1", box(2, -1, 7, 1), TOP)]))
    assert f.members["R"].continuous_bracing == [
        (pytest.approx(2.0, abs=EXACT), pytest.approx(7.0, abs=EXACT))
    ]


def test_storey_without_slab_gets_the_anchorage_note():
    f = analyse_framing(frame())
    assert NOTE_NO_SLAB in f.members["B"].notes  # B carries framing brace I1
    assert NOTE_NO_SLAB not in f.members["I1"].notes  # no framing brace on I1
    other_storey = slab("S1", box(-1, -2, 10, 7), TOP + 4.0, storey="L3")
    assert NOTE_NO_SLAB in analyse_framing(frame([other_storey])).members["B"].notes
    # a slab bearing on the beam is a diaphragm even if filed under another storey
    misfiled = slab("S1", box(-1, -2, 10, 7), TOP, storey="L3")
    assert NOTE_NO_SLAB not in analyse_framing(frame([misfiled])).members["B"].notes
