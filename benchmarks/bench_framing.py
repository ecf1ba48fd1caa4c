"""Framing-stage benchmark on synthetic framed floors.

Generates multi-storey framed floors directly as Model objects: a grid of
columns, girders on the column lines, beams on the other column lines,
infill at girder third points, one slab per bay (every seventh bay with an
opening over an infill; some bays left open with a strut tying their two
infill, which reaches no anchor) and strut lines in every fifth bay (under
the slab, or at mid-depth ending on slab-covered beams). Prints per size the time of each stage
(CPU seconds, best of REPEATS runs) and the growth exponent
log(t2/t1)/log(n2/n1) between sizes.

    python benchmarks/bench_framing.py            # ~1k, 10k, 50k members
    python benchmarks/bench_framing.py 2000 20000 # other sizes
"""

from __future__ import annotations

import gc
import itertools
import math
import sys
import time
from collections.abc import Callable
from typing import Any

import numpy as np
from shapely.geometry import box

from ifccheck.config import BracingSettings, FramingSettings
from ifccheck.framing import (
    Links,
    analyse_framing,
    bracing_anchorage,
    build_framing,
    end_links,
    host_index,
    intermediate_links,
    member_geometry,
    slab_coverage,
    wall_geometry,
)
from ifccheck.model import (
    MaterialCategory,
    Member,
    MemberRole,
    Model,
    Section,
    ShapeFamily,
    Slab,
    Storey,
)
from ifccheck.perf import gc_paused

BAY = 9.0  # m
STOREY = 4.0  # m
MEMBERS_PER_BAY = 5.6  # column, girder, column-line beam, 2 infill, 3/5 strut
REPEATS = 3  # best of, per stage


def _section(name: str, d: float, bf: float) -> Section:
    """Only the dimensions matter to the framing stage (plausible W sizes)."""
    return Section(
        name, ShapeFamily.I_SHAPE, d, bf, 0.01, 0.015, 0.0,
        0.01, 1e-4, 1e-5, 1e-3, 1e-4, 1e-3, 1e-4, 0.2, 0.05, 1e-6, 1e-6, d, bf / 4, "bench",
    )  # fmt: skip


GIRDER = _section("W24X84", 0.612, 0.229)
INFILL = _section("W18X35", 0.450, 0.152)
COLUMN = _section("W14X90", 0.356, 0.368)
STRUT = _section("L4X4X3/8", 0.102, 0.102)


def _member(guid: str, role: MemberRole, sec: Section, a, b, storey: str) -> Member:
    vertical = role is MemberRole.COLUMN
    ifc_class = {MemberRole.COLUMN: "IfcColumn", MemberRole.BEAM: "IfcBeam"}.get(role, "IfcMember")
    return Member(
        guid=guid,
        ifc_class=ifc_class,
        predefined_type=role.value.upper(),
        name=guid,
        storey=storey,
        role=role,
        start=a,
        end=b,
        web_up=(1.0, 0.0, 0.0) if vertical else (0.0, 0.0, 1.0),
        profile_name=sec.name,
        section=sec,
        steel=None,
        material_name="A992",
        material=MaterialCategory.STEEL,
        axis_source="axis",
        profile_source="bench",
        grade_source="bench",
    )


def synthetic_model(nx: int, ny: int, storeys: int) -> Model:
    """A framed building of nx × ny bays and the given number of storeys."""
    members: list[Member] = []
    slabs: list[Slab] = []
    add = members.append
    for k in range(1, storeys + 1):
        st = f"L{k}"
        top = k * STOREY
        zg, zi, zs = top - GIRDER.d / 2, top - INFILL.d / 2, top - STRUT.d / 2
        for i in range(nx + 1):
            for j in range(ny + 1):
                x, y = i * BAY, j * BAY
                add(_member(f"C{k}.{i}.{j}", MemberRole.COLUMN, COLUMN,
                            (x, y, top - STOREY), (x, y, top), st))  # fmt: skip
                if i < nx:  # girder on the column line along x
                    add(_member(f"G{k}.{i}.{j}", MemberRole.BEAM, GIRDER,
                                (x, y, zg), (x + BAY, y, zg), st))  # fmt: skip
                if j < ny:  # beam on the column line along y
                    add(_member(f"B{k}.{i}.{j}", MemberRole.BEAM, INFILL,
                                (x, y, zi), (x, y + BAY, zi), st))  # fmt: skip
        for i in range(nx):
            for j in range(ny):
                x, y = i * BAY, j * BAY
                for t in (1, 2):  # infill at the girders' third points
                    xi = x + t * BAY / 3
                    add(_member(f"I{k}.{i}.{j}.{t}", MemberRole.BEAM, INFILL,
                                (xi, y, zi), (xi, y + BAY, zi), st))  # fmt: skip
                n = (k * 7919 + i * 31 + j) % 35
                ym = y + BAY / 2
                if n % 11 == 3:  # a bay left open (a shaft), its infill tied by a strut
                    add(_member(f"T{k}.{i}.{j}", MemberRole.STRUT, STRUT,
                                (x + BAY / 3, ym, zi), (x + 2 * BAY / 3, ym, zi), st))  # fmt: skip
                    continue
                if n % 5 == 0:  # a strut line across the bay at mid-span
                    z = zs if n % 10 == 0 else zi  # under the slab, or at mid-depth
                    for t in range(3):
                        add(_member(f"S{k}.{i}.{j}.{t}", MemberRole.STRUT, STRUT,
                                    (x + t * BAY / 3, ym, z), (x + (t + 1) * BAY / 3, ym, z),
                                    st))  # fmt: skip
                outline = box(x, y, x + BAY, y + BAY)
                foot = outline
                if n % 7 == 0:  # an opening over the first infill
                    foot = outline.difference(
                        box(x + BAY / 3 - 0.5, y + 3.0, x + BAY / 3 + 0.5, y + 4.0)
                    )
                slabs.append(Slab(f"D{k}.{i}.{j}", "deck", st, foot, underside=top, top=top + 0.14))
    return Model(
        source="synthetic",
        schema="IFC4",
        length_unit="metre",
        length_scale=1.0,
        storeys=[Storey(f"s{k}", f"L{k}", k * STOREY) for k in range(storeys + 1)],
        members=members,
        slabs=slabs,
    )


def layout_for(target: int) -> tuple[int, int, int]:
    """Bays and storeys giving about ``target`` members (taller as it grows)."""
    storeys = max(1, round(math.sqrt(target / 500.0)))
    bays = target / (MEMBERS_PER_BAY * storeys)
    side = max(1, round(math.sqrt(bays)))
    return side, max(1, round(bays / side)), storeys


def _timed(fn: Callable[[], Any]) -> tuple[Any, float]:
    """Result and CPU time of this process (steadier than wall time on a
    shared machine; the stages are single-threaded)."""
    t0 = time.process_time()
    out = fn()
    return out, time.process_time() - t0


def run_stages(model: Model) -> tuple[dict[str, float], Any]:
    fs, bs = FramingSettings(), BracingSettings()
    times: dict[str, float] = {}
    geom, times["index"] = _timed(lambda: member_geometry(model.members))
    (walls, index), t = _timed(lambda: (wall_geometry(model.walls, fs.gap), host_index(geom, fs)))
    times["index"] += t

    def connect() -> Links:
        ends = end_links(geom, walls, fs, index)
        return Links.concat([ends, intermediate_links(geom, walls, fs, index, ends)])

    links, times["connections"] = _timed(connect)
    rows = np.flatnonzero(geom.is_connector)
    coverage, times["slabs"] = _timed(
        lambda: slab_coverage(geom, model.slabs, fs.slab_bearing_tolerance, rows)
    )
    anch, times["anchorage"] = _timed(
        lambda: bracing_anchorage(geom, links, coverage, fs.gap, [w.guid for w in model.walls])
    )
    framing, times["graph"] = _timed(
        lambda: build_framing(model, geom, links, coverage, anch, bs.slab)
    )
    times["total"] = sum(times.values())
    return times, framing


def main(argv: list[str]) -> None:
    targets = [int(a) for a in argv] or [1_000, 10_000, 50_000]
    rows: list[tuple[int, dict[str, float]]] = []
    for target in targets:
        nx, ny, storeys = layout_for(target)
        model, t_gen = _timed(lambda: synthetic_model(nx, ny, storeys))  # noqa: B023
        n = len(model.members)
        times: dict[str, float] = {}
        for _ in range(REPEATS):
            framing = None
            gc.collect()
            with gc_paused():  # as analyse_framing runs
                t, framing = run_stages(model)
            times = {k: min(v, times.get(k, math.inf)) for k, v in t.items()}
        gc.collect()
        _, t_api = _timed(lambda: analyse_framing(model))  # noqa: B023
        edges = framing.graph.number_of_edges()
        unanchored = sum(1 for _, m in framing.warnings if "reaches no anchor" in m)
        print(
            f"n={n:6d} members ({nx}x{ny} bays, {storeys} storeys, {len(model.slabs)} slabs): "
            f"generate {t_gen:.2f} s, {edges} edges, {len(framing.cycles)} cycles, "
            f"{unanchored} unanchored struts"
        )
        print("   " + "  ".join(f"{k} {v:7.3f} s" for k, v in times.items()))
        print(f"   analyse_framing end to end {t_api:.3f} s")
        rows.append((n, times))
    if len(rows) > 1:
        print("growth exponent log(t2/t1)/log(n2/n1) (1 = linear, n log n ≈ 1.1):")
        for (n1, t1), (n2, t2) in itertools.pairwise(rows):
            parts = [
                f"{k} {math.log(t2[k] / t1[k]) / math.log(n2 / n1):5.2f}"
                for k in t1
                if t1[k] > 0 and t2[k] > 0
            ]
            print(f"   {n1:>6d} → {n2:<6d} " + "  ".join(parts))


if __name__ == "__main__":
    main(sys.argv[1:])
