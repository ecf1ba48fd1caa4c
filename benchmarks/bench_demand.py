"""Demand-stage benchmark on synthetic framed floors.

Two timings per size:

* statics — ``analyse_beams`` on synthetic beams (simple spans with uniform
  load and third-point loads, every tenth a two-span continuous beam, every
  tenth an overhang), two load cases each;
* tributary and demand — ``compute_tributary`` and the whole
  ``compute_demand`` on a grid of bays (girders on one set of column lines,
  beams on the other, infill at girder third points, one slab per bay, every
  seventh bay with an opening), with the Framing built directly.

Prints per size the time of each part and the growth exponent
log(t2/t1)/log(n2/n1) between sizes (1 is linear).

    python benchmarks/bench_demand.py             # 1k, 10k, 50k beams
    python benchmarks/bench_demand.py 2000 20000  # other sizes
"""

from __future__ import annotations

import itertools
import math
import sys
import time
from collections.abc import Callable
from typing import Any

import networkx as nx
import numpy as np
from shapely.geometry import box

from ifccheck.config import Settings
from ifccheck.framing.types import Framing, MemberFraming, Support
from ifccheck.loads.demand import compute_demand
from ifccheck.loads.statics import BeamProblem, CaseLoads, LineLoad, PointLoad, analyse_beams
from ifccheck.loads.tributary import compute_tributary
from ifccheck.model import (
    MaterialCategory,
    Member,
    MemberRole,
    Model,
    Section,
    ShapeFamily,
    Slab,
    Steel,
    Storey,
)

BAY = 9.0  # m
TOP = 4.0  # m, top of steel
BEAMS_PER_BAY = 4  # girder, column-line beam, two infill

STEEL = Steel("A992", 345e6, 450e6, 200e9, 77.2e9, "bench")


def _section(name: str, d: float, bf: float, A: float, Ix: float) -> Section:
    """Plausible W-shape numbers; only d, A and Ix matter to the demand stage."""
    return Section(
        name, ShapeFamily.I_SHAPE, d, bf, 0.01, 0.015, 0.0,
        A, Ix, Ix / 20, Ix / d * 2, 1e-4, Ix / d * 2.3, 1e-4, 0.2, 0.05, 1e-6, 1e-6, d, bf / 4,
        "bench",
    )  # fmt: skip


GIRDER = _section("G", 0.60, 0.23, 0.0105, 5.6e-4)
INFILL = _section("B", 0.40, 0.14, 0.0050, 1.3e-4)


def synthetic_beams(n: int, seed: int = 0) -> list[BeamProblem]:
    rng = np.random.default_rng(seed)
    out = []
    for i in range(n):
        L = float(rng.uniform(5.0, 12.0))
        d = CaseLoads((LineLoad(float(rng.uniform(2e3, 8e3)), 0.0, L),))
        lv = CaseLoads((LineLoad(float(rng.uniform(3e3, 1e4)), 0.0, L),))
        sup: list[float] = [0.0, L]
        if i % 10 == 3:
            sup = [0.0, L / 2, L]
        elif i % 10 == 7:
            sup = [0.0, 0.8 * L]
        elif i % 2:
            P = float(rng.uniform(1e4, 8e4))
            d = CaseLoads(d.line, (PointLoad(P, L / 3), PointLoad(P, 2 * L / 3)))
        out.append(BeamProblem(L, sup, {"D": d, "L": lv}, 200e9 * 2e-4, (L / 4, L / 2)))
    return out


def _beam(guid: str, a: tuple[float, float], b: tuple[float, float], sec: Section) -> Member:
    z = TOP - sec.d / 2
    return Member(
        guid, "IfcBeam", "BEAM", guid, "L2", MemberRole.BEAM, (a[0], a[1], z), (b[0], b[1], z),
        (0.0, 0.0, 1.0), sec.name, sec, STEEL, "A992", MaterialCategory.STEEL, "axis", "bench",
        "bench",
    )  # fmt: skip


def synthetic_floor(n_beams: int) -> tuple[Model, Framing]:
    """A square grid of bays with about ``n_beams`` beams, and its Framing."""
    side = max(1, round(math.sqrt(n_beams / BEAMS_PER_BAY)))
    members: list[Member] = []
    framing: dict[str, MemberFraming] = {}
    order_infill: list[str] = []
    order_girder: list[str] = []
    slabs: list[Slab] = []

    def col(i: int, j: int) -> str:
        return f"C{i}_{j}"

    for i in range(side + 1):
        for j in range(side + 1):
            x, y = i * BAY, j * BAY
            if i < side:  # girder along x on column line j
                g = f"G{i}_{j}"
                members.append(_beam(g, (x, y), (x + BAY, y), GIRDER))
                framing[g] = MemberFraming(
                    g,
                    [Support(0.0, col(i, j), "IfcColumn", "start"),
                     Support(BAY, col(i + 1, j), "IfcColumn", "end")],
                )  # fmt: skip
                order_girder.append(g)
            if j < side:  # column-line beam along y
                e = f"E{i}_{j}"
                members.append(_beam(e, (x, y), (x, y + BAY), INFILL))
                framing[e] = MemberFraming(
                    e,
                    [Support(0.0, col(i, j), "IfcColumn", "start"),
                     Support(BAY, col(i, j + 1), "IfcColumn", "end")],
                )  # fmt: skip
                order_infill.append(e)
    for i in range(side):
        for j in range(side):
            x, y = i * BAY, j * BAY
            for k in (1, 2):
                b = f"B{i}_{j}_{k}"
                xb = x + k * BAY / 3
                members.append(_beam(b, (xb, y), (xb, y + BAY), INFILL))
                framing[b] = MemberFraming(
                    b,
                    [Support(0.0, f"G{i}_{j}", "IfcBeam", "start"),
                     Support(BAY, f"G{i}_{j + 1}", "IfcBeam", "end")],
                )  # fmt: skip
                framing[f"G{i}_{j}"].carries.append(b)
                framing[f"G{i}_{j + 1}"].carries.append(b)
                order_infill.append(b)
            foot = box(x, y, x + BAY, y + BAY)
            if (i * side + j) % 7 == 0:
                foot = foot.difference(box(x + 2.5, y + 3.0, x + 3.5, y + 5.0))
            slabs.append(Slab(f"S{i}_{j}", f"S{i}_{j}", "L2", foot, TOP, TOP + 0.14))
    model = Model(
        "bench", "IFC4", "metre", 1.0, [Storey("s2", "L2", TOP)], members, slabs,
    )  # fmt: skip
    graph = nx.MultiDiGraph()
    return model, Framing(graph, framing, order_infill + order_girder)


def _time(fn: Callable[[], Any]) -> float:
    t = time.perf_counter()
    fn()
    return time.perf_counter() - t


def run(sizes: list[int]) -> list[dict[str, float]]:
    """Time each part at each size; returns one row per size."""
    rows = []
    settings = Settings()
    for n in sizes:
        problems = synthetic_beams(n)
        model, framing = synthetic_floor(n)
        nb = len(model.members)
        row = {
            "n": float(n),
            "floor_beams": float(nb),
            "statics": _time(lambda p=problems: analyse_beams(p)),
            "tributary": _time(lambda m=model, f=framing: compute_tributary(m, settings, f)),
            "demand": _time(lambda m=model, f=framing: compute_demand(m, f, settings)),
        }
        rows.append(row)
        print(
            f"{n:>7} beams: statics {row['statics']:7.3f} s | floor of {nb} beams: "
            f"tributary {row['tributary']:7.3f} s, whole demand {row['demand']:7.3f} s",
            flush=True,
        )
    for a, b in itertools.pairwise(rows):
        parts = []
        for key, size in (
            ("statics", "n"),
            ("tributary", "floor_beams"),
            ("demand", "floor_beams"),
        ):
            k = math.log(b[key] / a[key]) / math.log(b[size] / a[size])
            parts.append(f"{key} {k:.2f}")
        print(f"growth {int(a['n'])} → {int(b['n'])}: " + ", ".join(parts))
    return rows


if __name__ == "__main__":
    run([int(x) for x in sys.argv[1:]] or [1000, 10000, 50000])
