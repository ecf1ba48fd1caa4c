"""The elevation-banded box index returns exactly the intersecting pairs.

Reference: a brute-force all-pairs box test (only here, on small inputs).
"""

from __future__ import annotations

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from ifccheck.framing.index import BoxIndex, is_in, unique_sorted


def brute(lo, hi, qlo, qhi) -> set[tuple[int, int]]:
    hit = np.all(qlo[:, None, :] <= hi[None, :, :], axis=2) & np.all(
        qhi[:, None, :] >= lo[None, :, :], axis=2
    )
    return {(int(a), int(b)) for a, b in zip(*np.nonzero(hit), strict=True)}


boxes = st.integers(min_value=1, max_value=40).flatmap(
    lambda n: st.tuples(
        st.lists(
            st.tuples(*[st.floats(-20, 20, allow_nan=False) for _ in range(3)]),
            min_size=n,
            max_size=n,
        ),
        st.lists(
            st.tuples(*[st.floats(0, 8, allow_nan=False) for _ in range(3)]),
            min_size=n,
            max_size=n,
        ),
    )
)


@settings(max_examples=60, deadline=None)
@given(items=boxes, queries=boxes, band=st.sampled_from([0.5, 1.5, 7.0]))
def test_box_index_matches_brute_force(items, queries, band):
    lo = np.array(items[0])
    hi = lo + np.array(items[1])
    qlo = np.array(queries[0])
    qhi = qlo + np.array(queries[1])
    q, i = BoxIndex(lo, hi, band=band).query(qlo, qhi)
    got = set(zip(q.tolist(), i.tolist(), strict=True))
    assert len(got) == len(q)  # no duplicate pairs
    assert got == brute(lo, hi, qlo, qhi)


def test_points_and_absent_rows():
    lo = np.array([[0, 0, 0], [np.inf, np.inf, np.inf], [5, 5, 5]], dtype=float)
    hi = np.array([[1, 1, 10], [-np.inf, -np.inf, -np.inf], [6, 6, 6]], dtype=float)
    pts = np.array([[0.5, 0.5, 9.0], [5.5, 5.5, 5.5], [0.5, 0.5, 11.0]])
    q, i = BoxIndex(lo, hi).query(pts, pts)
    assert sorted(zip(q.tolist(), i.tolist(), strict=True)) == [(0, 0), (1, 2)]


@settings(max_examples=60, deadline=None)
@given(
    a=st.lists(st.integers(-(2**40), 2**40), max_size=50),
    b=st.lists(st.integers(-(2**40), 2**40), max_size=50),
)
def test_sorted_set_helpers_match_python_sets(a, b):
    arr_a, arr_b = np.array(a, dtype=np.int64), np.array(b, dtype=np.int64)
    assert unique_sorted(arr_a).tolist() == sorted(set(a))
    assert is_in(arr_a, arr_b).tolist() == [x in set(b) for x in a]
