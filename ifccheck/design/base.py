"""The interface every design standard implements, and the registry.

A standard takes a section, a steel, unbraced lengths Lb and moment-gradient
factors Cb (numpy arrays, one entry per segment) and a method ("LRFD" or
"ASD"), and returns numpy arrays. The pipeline talks only to this interface,
so another standard (EN 1993-1-1, ...) is a new module that registers itself.
"""

from __future__ import annotations

from abc import ABC, abstractmethod
from collections.abc import Callable, Sequence
from dataclasses import dataclass
from typing import Literal

import numpy as np
from numpy.typing import ArrayLike, NDArray

from ifccheck.errors import OutOfScope
from ifccheck.model import Section, Steel

Method = Literal["LRFD", "ASD"]
FloatArray = NDArray[np.float64]


def check_method(method: str) -> Method:
    """Normalise 'lrfd'/'asd' to 'LRFD'/'ASD'; ValueError otherwise."""
    m = method.strip().upper()
    if m not in ("LRFD", "ASD"):
        raise ValueError(f"method must be LRFD or ASD, got {method!r}")
    return m  # type: ignore[return-value]


@dataclass(frozen=True)
class FlexureResult:
    """Flexural strength per segment (arrays of one length), SI units.

    ``design_strength`` is φMn (LRFD) or Mn/Ω (ASD); ``factor`` is φ or Ω.
    ``limit_state`` names the limit state that governs ``mn``. ``mp`` is the
    plastic limit the standard caps the strength at (e.g. 1.6My where it
    applies). ``lp`` and ``lr`` are 0.0 where the section has no
    lateral-torsional buckling (round HSS, minor-axis bending).
    """

    mp: FloatArray  # plastic moment, N·m
    mn: FloatArray  # nominal flexural strength, N·m
    design_strength: FloatArray  # N·m
    limit_state: NDArray[np.object_]  # str per segment
    lp: FloatArray  # limiting unbraced length for yielding, m
    lr: FloatArray  # limiting unbraced length for inelastic LTB, m
    mr: FloatArray  # moment at Lr (0.7·Fy·Sx for AISC), N·m
    factor: float
    method: Method

    def __len__(self) -> int:
        return int(self.mn.shape[0])


@dataclass(frozen=True)
class ShearResult:
    """Shear strength of the web, SI units."""

    vn: float  # nominal shear strength, N
    design_strength: float  # φVn or Vn/Ω, N
    cv1: float  # shear strength coefficient (AISC: Cv1 of G2.1, Cv2 of G3 to G6)
    factor: float  # φv or Ωv
    method: Method
    clause: str  # which provision applied, e.g. "AISC 360-16 G2.1(a)"


@dataclass(frozen=True)
class StrengthCurve:
    """Design strength against unbraced length for plots and reports."""

    lb: FloatArray
    design_strength: FloatArray
    limit_state: NDArray[np.object_]


@dataclass(frozen=True)
class BraceNeed:
    """Required strength (N, or N·m) and stiffness (N/m, or N·m/rad) of a brace."""

    strength: float
    stiffness: float
    clause: str


@dataclass(frozen=True)
class AxialCapacity:
    """Available axial strength of a member in compression and in tension (N)."""

    compression: float
    tension: float
    clause: str

    @property
    def either_way(self) -> float:
        """A brace force may push or pull: the lower of the two."""
        return min(self.compression, self.tension)


class DesignStandard(ABC):
    """What the pipeline needs from a design standard."""

    name: str

    @abstractmethod
    def scope(self, section: Section, steel: Steel | None = None, axis: str = "major") -> str:
        """'' if flexure of this section about ``axis`` is covered, else the reason with
        the clause."""

    @abstractmethod
    def flexure(
        self,
        section: Section,
        steel: Steel,
        lb: ArrayLike,
        cb: ArrayLike = 1.0,
        method: str = "LRFD",
        *,
        axis: str = "major",
        compression_top: ArrayLike | None = None,
    ) -> FlexureResult:
        """Flexural strength for each (Lb, Cb); OutOfScope if not covered.

        ``axis`` is "major" (bending about x) or "minor" (about y);
        ``compression_top`` (per segment) is True where the top of the section
        (see ``Section``) is in compression, False where the bottom is, which
        matters for sections that are not doubly symmetric; None (not known)
        takes the weaker side.
        """

    @abstractmethod
    def shear(
        self, section: Section, steel: Steel, method: str = "LRFD", *, axis: str = "major"
    ) -> ShearResult:
        """Shear strength for a shear force along y (``axis="major"``) or x ("minor")."""

    @abstractmethod
    def moment_gradient(
        self,
        x: ArrayLike,
        m: ArrayLike,
        start: ArrayLike,
        end: ArrayLike,
        cantilever: ArrayLike = False,
    ) -> FloatArray:
        """The standard's moment-gradient factor (Cb, C1, ...) of segments [start, end]
        of a sampled moment diagram; ``cantilever`` marks segments with a free tip."""

    def point_brace(
        self, mr: float, ho: float, lbr: float, method: str = "LRFD", cd: float = 1.0
    ) -> BraceNeed:
        """What a point lateral brace of a beam's compression flange must provide."""
        raise OutOfScope(f"{self.name}: brace requirements are not implemented")

    def torsional_brace(
        self, mr: float, span: float, braces: int, cb: float, section: Section, steel: Steel,
        method: str = "LRFD", *, compression_top: bool = True,
    ) -> BraceNeed:  # fmt: skip
        """What a point torsional brace of a beam must provide (N·m, N·m/rad)."""
        raise OutOfScope(f"{self.name}: torsional brace requirements are not implemented")

    def axial_strength(
        self, section: Section, steel: Steel, length: float, method: str = "LRFD"
    ) -> AxialCapacity:
        """Design (or allowable) axial strength of a bracing member of ``length``."""
        raise OutOfScope(f"{self.name}: member axial strength is not implemented")

    def flexure_many(
        self,
        pairs: Sequence[tuple[Section, Steel]],
        index: ArrayLike,
        lb: ArrayLike,
        cb: ArrayLike,
        method: str = "LRFD",
        *,
        axis: ArrayLike = "major",
        compression_top: ArrayLike | None = None,
    ) -> FlexureResult:
        """Flexure of many segments of many sections in one call.

        ``pairs`` are distinct (section, steel) combinations and ``index`` the
        pair of each segment; ``axis`` and ``compression_top`` are per segment
        or scalars. This default evaluates pair by pair and axis by axis; a
        standard may override it with a fully vectorised version.
        """
        idx = np.asarray(index, dtype=np.intp)
        lb_a = np.broadcast_to(np.asarray(lb, dtype=float), idx.shape)
        cb_a = np.broadcast_to(np.asarray(cb, dtype=float), idx.shape)
        axes = np.broadcast_to(np.asarray(axis), idx.shape)
        top = (
            None
            if compression_top is None
            else np.broadcast_to(np.asarray(compression_top, dtype=bool), idx.shape)
        )
        fields = ("mp", "mn", "design_strength", "lp", "lr", "mr")
        out = {f: np.zeros(idx.size) for f in fields}
        states = np.empty(idx.size, dtype=object)
        factor = 0.0
        for k, (section, steel) in enumerate(pairs):
            for ax in ("major", "minor"):
                sel = np.flatnonzero((idx == k) & (axes == ax))
                if sel.size == 0:
                    continue
                side = None if top is None else top[sel]
                res = self.flexure(
                    section, steel, lb_a[sel], cb_a[sel], method, axis=ax, compression_top=side
                )
                for f in fields:
                    out[f][sel] = getattr(res, f)
                states[sel] = res.limit_state
                factor = res.factor
        return FlexureResult(limit_state=states, factor=factor, method=check_method(method), **out)

    def strength_curve(
        self,
        section: Section,
        steel: Steel,
        cb: float = 1.0,
        method: str = "LRFD",
        lb_max: float | None = None,
        n: int = 200,
        *,
        axis: str = "major",
        compression_top: bool | None = None,
    ) -> StrengthCurve:
        """Design strength sampled over Lb from 0 to ``lb_max``.

        The default is 1.5·Lr, or 30 times the depth (at least 1 m) for a
        section without lateral-torsional buckling (Lr reported as 0).
        """
        if lb_max is None:
            probe = self.flexure(
                section, steel, [0.0], [1.0], method, axis=axis, compression_top=compression_top
            )
            reach = float(max(probe.lr[0], probe.lp[0]))
            lb_max = 1.5 * reach if 0.0 < reach < np.inf else max(30.0 * section.d, 1.0)
        if not lb_max > 0.0 or n < 2:
            raise ValueError("lb_max must be positive and n at least 2")
        lb = np.linspace(0.0, lb_max, n)
        res = self.flexure(
            section, steel, lb, np.full(n, cb), method, axis=axis, compression_top=compression_top
        )
        return StrengthCurve(lb, res.design_strength, res.limit_state)


_REGISTRY: dict[str, Callable[[], DesignStandard]] = {}


def _key(name: str) -> str:
    return "".join(ch for ch in name.upper() if ch.isalnum())


def register_standard(name: str, factory: Callable[[], DesignStandard]) -> None:
    """Make a standard available to ``get_standard`` under ``name``."""
    _REGISTRY[_key(name)] = factory


def get_standard(name: str) -> DesignStandard:
    """The design standard registered under ``name`` ("AISC 360-16", "aisc360-16"...)."""
    factory = _REGISTRY.get(_key(name))
    if factory is None:
        known = ", ".join(sorted(available_standards()))
        raise ValueError(f"unknown design standard {name!r}; available: {known}")
    return factory()


def available_standards() -> list[str]:
    """Registered standards by their display names."""
    return [factory().name for factory in _REGISTRY.values()]


# Moment diagram sampling, common to every standard.


def segment_moments(
    x: ArrayLike, m: ArrayLike, start: ArrayLike, end: ArrayLike
) -> tuple[FloatArray, FloatArray, FloatArray, FloatArray]:
    """(|Mmax|, |MA|, |MB|, |MC|) of each segment [start, end] of a sampled diagram.

    ``x`` (increasing) and ``m`` sample the moment diagram of one member;
    ``start``/``end`` are arrays of segment ends. Mmax is taken over the
    samples inside the segment and the interpolated ends and quarter points.
    """
    xs = np.asarray(x, dtype=float)
    am = np.abs(np.asarray(m, dtype=float))
    s = np.atleast_1d(np.asarray(start, dtype=float))
    e = np.atleast_1d(np.asarray(end, dtype=float))
    if xs.ndim != 1 or xs.shape != am.shape or xs.size < 2:
        raise ValueError("x and M must be 1-D arrays of the same length (at least 2)")
    if np.any(np.diff(xs) < 0.0):
        raise ValueError("x must be increasing")
    if np.any(e < s):
        raise ValueError("segment end before its start")
    span = e - s
    quarter = [np.interp(s + f * span, xs, am) for f in (0.25, 0.5, 0.75)]
    ends = np.maximum(np.interp(s, xs, am), np.interp(e, xs, am))
    # Largest sample strictly inside each segment: reduceat over [i0, i1).
    i0 = np.searchsorted(xs, s, side="left")
    i1 = np.searchsorted(xs, e, side="right")
    padded = np.append(am, 0.0)
    bounds = np.empty(2 * s.size, dtype=np.intp)
    bounds[0::2], bounds[1::2] = i0, i1
    inner = np.maximum.reduceat(padded, bounds)[0::2]
    inner = np.where(i1 > i0, inner, 0.0)
    m_max = np.maximum.reduce([inner, ends, *quarter])
    return m_max, quarter[0], quarter[1], quarter[2]


# Deflection (serviceability) helpers, common to every standard.


def allowable_deflection(span: ArrayLike, ratio: ArrayLike) -> FloatArray:
    """Allowable deflection span/ratio (common practice: L/360 live, L/240 total)."""
    span_a = np.asarray(span, dtype=float)
    ratio_a = np.asarray(ratio, dtype=float)
    if np.any(ratio_a <= 0.0):
        raise ValueError("deflection ratio must be positive")
    return np.asarray(span_a / ratio_a, dtype=float)


def deflection_ratio(actual: ArrayLike, span: ArrayLike, ratio: ArrayLike) -> FloatArray:
    """|actual| / allowable: 1.0 is at the limit."""
    ratio_a = np.abs(np.asarray(actual, dtype=float)) / allowable_deflection(span, ratio)
    return np.asarray(ratio_a, dtype=float)


def deflection_limits(
    span: ArrayLike, live_ratio: float = 360.0, total_ratio: float = 240.0
) -> tuple[FloatArray, FloatArray]:
    """(live-load, total-load) allowable deflections; defaults L/360 and L/240 (common practice)."""
    return allowable_deflection(span, live_ratio), allowable_deflection(span, total_ratio)
