"""Throughput of the vectorised AISC 360-16 F2/F3 engine against a plain Python loop.

Run: python benchmarks/bench_design.py [--segments N] [--loop-segments M]

Evaluates N segments (default 10^6: random W shapes from the AISC Shapes
Database v16.0, random grade, Lb and Cb) with ``flexure_segments`` in one
call, and the first M of them (default 10^5) with scalar formulas in a
Python loop; the loop rate is scaled to N (stated in the output). Each
timing is the best of three runs; both results are checked equal.
"""

from __future__ import annotations

import argparse
import math
import time

import numpy as np

from ifccheck.design.aisc360 import flexure_segments, torsion_c
from ifccheck.sections import designations, lookup, steel_from_name

REPEATS = 3  # best of three for both timings


def scalar_mn(
    fy: float,
    e: float,
    zx: float,
    sx: float,
    ry: float,
    rts: float,
    j: float,
    ho: float,
    c: float,
    lam: float,
    htw: float,
    lb: float,
    cb: float,
) -> float:
    """Mn by AISC 360-16 F2/F3, one segment, plain Python."""
    mp = fy * zx
    mr = 0.7 * fy * sx
    lp = 1.76 * ry * math.sqrt(e / fy)
    jc = j * c / (sx * ho)
    ratio = 0.7 * fy / e
    lr = 1.95 * rts / ratio * math.sqrt(jc + math.sqrt(jc * jc + 6.76 * ratio * ratio))
    if lb <= lp:
        mn = mp
    elif lb <= lr:
        mn = min(mp, cb * (mp - (mp - mr) * (lb - lp) / (lr - lp)))
    else:
        s = lb / rts
        fcr = cb * math.pi**2 * e / s**2 * math.sqrt(1.0 + 0.078 * jc * s**2)
        mn = min(mp, fcr * sx)
    root = math.sqrt(e / fy)
    lpf, lrf = 0.38 * root, root
    if lam > lpf:
        if lam <= lrf:
            flb = mp - (mp - mr) * (lam - lpf) / (lrf - lpf)
        else:
            kc = min(max(4.0 / math.sqrt(htw), 0.35), 0.76)
            flb = 0.9 * e * kc * sx / lam**2
        mn = min(mn, flb)
    return mn


def main() -> None:
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--segments", type=int, default=1_000_000)
    parser.add_argument("--loop-segments", type=int, default=100_000)
    args = parser.parse_args()
    n, m = args.segments, min(args.loop_segments, args.segments)

    grades = [steel_from_name(g) for g in ("A992", "A36", "A913 Gr 65")]
    pairs = []
    for name in designations(prefix="W"):
        section = lookup(name)
        assert section is not None
        for steel in grades:
            assert steel is not None
            pairs.append((section, steel))
    rng = np.random.default_rng(2016)
    index = rng.integers(0, len(pairs), n)
    lb = rng.uniform(0.0, 15.0, n)
    cb = rng.uniform(1.0, 2.3, n)

    t_vec = math.inf
    for _ in range(REPEATS):
        t0 = time.perf_counter()
        res = flexure_segments(pairs, index, lb, cb)
        t_vec = min(t_vec, time.perf_counter() - t0)

    props = [
        (g.fy, g.E, s.Zx, s.Sx, s.ry, s.rts, s.J, s.ho, torsion_c(s), s.flange_slenderness,
         s.web_slenderness)
        for s, g in pairs
    ]  # fmt: skip
    idx_list, lb_list, cb_list = index[:m].tolist(), lb[:m].tolist(), cb[:m].tolist()
    t_loop = math.inf
    for _ in range(REPEATS):
        t0 = time.perf_counter()
        loop = [
            scalar_mn(*props[k], lbi, cbi)
            for k, lbi, cbi in zip(idx_list, lb_list, cb_list, strict=True)
        ]
        t_loop = min(t_loop, time.perf_counter() - t0)

    np.testing.assert_allclose(res.mn[:m], loop, rtol=1e-12)
    vec_rate = n / t_vec
    loop_rate = m / t_loop
    print(
        f"segments: {n:,} vectorised; plain Python loop timed on the first {m:,}"
        f" (best of {REPEATS} runs each)"
    )
    print(f"vectorised (flexure_segments): {t_vec:8.3f} s  {vec_rate:14,.0f} segments/s")
    print(
        f"Python loop (scalar formulas): {t_loop:8.3f} s  {loop_rate:14,.0f} segments/s"
        f"  (scaled to {n:,}: {n / loop_rate:.2f} s)"
    )
    print(f"ratio: {vec_rate / loop_rate:.1f}x; results equal (rtol 1e-12) on {m:,} segments")


if __name__ == "__main__":
    main()
