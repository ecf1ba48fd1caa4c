"""A small framed bay with a construction stage, for the writer tests of both stages.

Our own scenario, in feet: a 30 ft × 30 ft bay, W24X76 girders on x = 0 and 30 ft on
W12X65 columns, beams along x at y = 0, 10, 20 and 30 ft (W21X44, except B20, a W16X26),
a 5.5 in normal-weight slab on the steel; 20 psf superimposed dead and 50 psf live load in
service; during construction the wet concrete and a 20 psf construction live load, the
deck not attached (no slab bracing). B10 is the demo's L2-B1-10 again (W21X44 at 10 ft
centres spanning 30 ft under a 5.5 in slab): it passes in service and fails during
construction at 2.03 (tests/test_construction_stage.py works that by hand: ASCE 37-14
§2.2 with ASCE 7-16 §2.3.1 (2), 1.2D + 1.6C, wL²/8, AISC 360-16 F1-1 and F2-3/F2-4).
B20 fails in both stages.
"""

from __future__ import annotations

from pathlib import Path

from test_bay_hand_calc import profile

from ifccheck.check import run_check
from ifccheck.config import settings_from_dict
from ifccheck.ifc.author import ModelAuthor
from ifccheck.results import CheckResult

SLAB_IN = 5.5
SETTINGS = {
    "loads": {"dead": "20 psf", "live": "50 psf"},
    "construction": {"live": "20 psf"},
}


def pour_bay(path: Path, schema: str = "IFC4") -> Path:
    a = ModelAuthor(schema, "foot", project="Pour bay", seed="pour-bay")
    a.storey("Level 2", 14.0)
    col, girder = profile("W12X65"), profile("W24X76")
    for x in (0.0, 30.0):
        for y in (0.0, 30.0):
            a.column("Level 2", (x, y, -14.0), 14.0, col, key=f"c{x}{y}", name=f"C{x:g}-{y:g}")
        a.beam("Level 2", (x, 0, 0), (x, 30, 0), girder, key=f"g{x}", name=f"G{x:g}",
               cardinal_point=8)  # fmt: skip
    for y, shape in ((0.0, "W21X44"), (10.0, "W21X44"), (20.0, "W16X26"), (30.0, "W21X44")):
        a.beam("Level 2", (0, y, 0), (30, y, 0), profile(shape), key=f"b{y}", name=f"B{y:g}",
               cardinal_point=8)  # fmt: skip
    outline = [(0.0, 0.0), (30.0, 0.0), (30.0, 30.0), (0.0, 30.0)]
    a.slab("Level 2", outline, SLAB_IN / 12, SLAB_IN / 12, name="Slab", key="slab")
    return a.write(path)


def pour_bay_result(path: Path, schema: str = "IFC4") -> tuple[Path, CheckResult]:
    model = pour_bay(path, schema)
    result, _, _ = run_check(model, settings_from_dict(SETTINGS))
    return model, result
