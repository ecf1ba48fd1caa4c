"""European rolled sections by designation: dimensions from a maintained package.

The dimensions (h, b, tw, tf, r; r1 for sloped flanges and angles) come from
the profile tables that ``structuralcodes`` (fib, Apache-2.0) ships:
IPE, HE A / HE B / HE M (EN 10365), IPN, UPN, UPE, equal and unequal angles,
UB, UC, UBP, HD and HP. Nothing is typed here; section properties are computed
from those dimensions by :mod:`ifccheck.sections.compute`.

Flange slopes of the taper-flange series (from memory): IPN 14 % (DIN 1025-1);
UPN 8 % up to 300 mm deep, 5 % above (DIN 1026-1). Their tabulated tf is the
mean flange thickness, which is what the compute routines expect.

Not in those tables: the IPE A / IPE O / IPE AA variants, HE AA, PFC. A name of
one of those is recognised as such and reported as not in the catalogue.
Rectangular and circular hollow sections (EN 10210, EN 10219) carry all their
dimensions in the name and are read by :mod:`ifccheck.sections.names`.
"""

from __future__ import annotations

import ast
import importlib.util
import math
import re
from functools import cache
from pathlib import Path

from ifccheck.model import Section, ShapeFamily
from ifccheck.sections.dimensions import Shape, section_of

CATALOGUE = "EN 10365 via structuralcodes"
MM = 1e-3

IPN_SLOPE = math.atan(0.14)  # DIN 1025-1, from memory
UPN_SLOPE = math.atan(0.08)  # DIN 1026-1, h ≤ 300 mm, from memory
UPN_SLOPE_DEEP = math.atan(0.05)  # DIN 1026-1, h > 300 mm, from memory

# Series (canonical prefix) → (structuralcodes class, family)
_SERIES: dict[str, tuple[str, ShapeFamily]] = {
    "IPE": ("IPE", ShapeFamily.I_SHAPE),
    "HEA": ("HE", ShapeFamily.I_SHAPE),
    "HEB": ("HE", ShapeFamily.I_SHAPE),
    "HEM": ("HE", ShapeFamily.I_SHAPE),
    "IPN": ("IPN", ShapeFamily.I_SHAPE),
    "UPN": ("UPN", ShapeFamily.CHANNEL),
    "UPE": ("UPE", ShapeFamily.CHANNEL),
    "UB": ("UB", ShapeFamily.I_SHAPE),
    "UC": ("UC", ShapeFamily.I_SHAPE),
    "UBP": ("UBP", ShapeFamily.I_SHAPE),
    "HD": ("HD", ShapeFamily.I_SHAPE),
    "HP": ("HP", ShapeFamily.I_SHAPE),
    "L": ("L", ShapeFamily.ANGLE),
}

# Designations the catalogue does not carry, recognised so that they are not
# mistaken for their parent series.
NOT_CARRIED = ("IPE A", "IPE O", "IPE AA", "IPE V", "HE AA", "HE C", "PFC")

_NUM = r"(\d+(?:[.,]\d+)?)"
_X = r"\s*[X×*]\s*"
# Canonical spellings, on upper-case text without spaces or hyphens.
_IPE = re.compile(r"IPE(AA|A|O|V|R)?(\d{2,3})(AA|A|O|V|R)?")
_HE = re.compile(r"HE(AA|A|B|M|C)?(\d{3,4})(AA|A|B|M|C)?")
_PLAIN = re.compile(r"(IPN|INP|UPN|UNP|UPE|UAP)(\d{2,3})")
_TRIPLE = re.compile(rf"(UBP|UB|UC){_NUM}{_X}{_NUM}{_X}{_NUM}")
_DOUBLE = re.compile(rf"(HD|HP){_NUM}{_X}{_NUM}")
_ANGLE = re.compile(rf"L{_NUM}{_X}{_NUM}(?:{_X}{_NUM})?")
_PFC = re.compile(rf"PFC{_NUM}{_X}{_NUM}(?:{_X}{_NUM})?")
_ALIASES = {"INP": "IPN", "UNP": "UPN"}


def _squash(text: str) -> str:
    return re.sub(r"[\s\-_]+", "", text.strip().upper())


def _num(text: str) -> str:
    value = float(text.replace(",", "."))
    return f"{value:g}"


def canonical(name: str) -> str | None:
    """Canonical designation of a European section name, or None if it is not one.

    ``IPE 300``, ``IPE-300`` → ``IPE300``; ``HE300A``, ``HE 300 A``, ``HEA 300`` →
    ``HEA300``; ``INP 200`` → ``IPN200``; ``L 100x100x10`` → ``L100X100X10``;
    ``L 100x10`` → ``L100X100X10``. Variants the catalogue lacks keep their own
    spelling (``IPEA300``, ``HEAA300``).
    """
    text = _squash(name)
    m = _IPE.fullmatch(text)
    if m:
        before, size, after = m.groups()
        if before and after:
            return None
        variant = before or after or ""
        return f"IPE{variant}{size}" if variant else f"IPE{size}"
    m = _HE.fullmatch(text)
    if m:
        before, size, after = m.groups()
        if bool(before) == bool(after):
            return None
        return f"HE{before or after}{size}"
    m = _PLAIN.fullmatch(text)
    if m:
        prefix, size = m.groups()
        return f"{_ALIASES.get(prefix, prefix)}{size}"
    m = _TRIPLE.fullmatch(text)
    if m:
        prefix, h, b, mass = m.groups()
        return f"{prefix}{_num(h)}X{_num(b)}X{_num(mass)}"
    m = _DOUBLE.fullmatch(text)
    if m:
        prefix, h, mass = m.groups()
        return f"{prefix}{_num(h)}X{_num(mass)}"
    m = _ANGLE.fullmatch(text)
    if m:
        h, b, t = m.groups()
        if t is None:  # L100x10: equal legs
            h, b, t = h, h, b
        return f"L{_num(h)}X{_num(b)}X{_num(t)}"
    m = _PFC.fullmatch(text)
    if m:
        return "PFC" + "X".join(_num(g) for g in m.groups() if g)
    return None


def series(designation: str) -> str:
    """Series of a canonical designation: 'IPE', 'HEA', 'IPE A', 'HE AA', 'PFC', ..."""
    m = re.match(r"(IPE|HE)(AA|A|B|M|C|O|V|R)?\d", designation)
    if m:
        base, variant = m.group(1), m.group(2) or ""
        if base == "IPE":
            return f"IPE {variant}" if variant else "IPE"
        return "HE AA" if variant == "AA" else ("HE C" if variant == "C" else f"HE{variant}")
    m = re.match(r"[A-Z]+", designation)
    return m.group(0) if m else ""


# structuralcodes module (geometry/profiles/_<name>.py) holding each class's table
_MODULES = {
    "IPE": "_ipe", "HE": "_he", "IPN": "_ipn", "UPN": "_upn", "UPE": "_upe", "UB": "_ub",
    "UC": "_uc", "UBP": "_ubp", "HD": "_hd", "HP": "_hp", "L": "_l", "LI": "_li",
}  # fmt: skip


def _read_parameters(folder: Path, module: str, cls_name: str) -> dict[str, dict[str, float]]:
    """The literal ``parameters`` table of a structuralcodes profile class, read from its
    source without importing the package (whose import loads every design code, ~0.7 s)."""
    tree = ast.parse((folder / f"{module}.py").read_text(encoding="utf-8"))
    for node in tree.body:
        if isinstance(node, ast.ClassDef) and node.name == cls_name:
            for stmt in node.body:
                if isinstance(stmt, ast.Assign) and any(
                    isinstance(t, ast.Name) and t.id == "parameters" for t in stmt.targets
                ):
                    return ast.literal_eval(stmt.value)
    raise LookupError(f"structuralcodes: no {cls_name}.parameters in {module}.py")


def _parameters() -> dict[str, dict[str, dict[str, float]]]:
    spec = importlib.util.find_spec("structuralcodes")
    if spec is None or not spec.submodule_search_locations:
        raise ModuleNotFoundError("structuralcodes is not installed")
    folder = Path(next(iter(spec.submodule_search_locations))) / "geometry" / "profiles"
    try:
        return {c: _read_parameters(folder, m, c) for c, m in _MODULES.items()}
    except (OSError, SyntaxError, ValueError, LookupError):  # a layout this reader does not know
        from structuralcodes.geometry import profiles

        return {c: getattr(profiles, c).parameters for c in _MODULES}


@cache
def _tables() -> dict[str, dict[str, dict[str, float]]]:
    """Series class name → {catalogue key (canonical) → dimensions in mm}."""
    return {
        cls_name: {
            _catalogue_key(k): {n: float(v) for n, v in dims.items()} for k, dims in table.items()
        }
        for cls_name, table in _parameters().items()
    }


def _catalogue_key(key: str) -> str:
    """structuralcodes keys ('HEA300', 'L100x100x10', 'UB457x191x67') → canonical."""
    return canonical(key) or key.upper()


def _row(designation: str) -> tuple[str, dict[str, float]] | None:
    prefix = series(designation)
    entry = _SERIES.get(prefix)
    if entry is None:
        return None
    tables = _tables()
    found = tables[entry[0]].get(designation)
    if found is None and prefix == "L":
        found = tables["LI"].get(designation)
        if found is None:  # unequal angles are tabulated long leg first
            m = re.fullmatch(r"L([\d.]+)X([\d.]+)X([\d.]+)", designation)
            if m:
                found = tables["LI"].get(f"L{m.group(2)}X{m.group(1)}X{m.group(3)}")
                if found is not None:  # keep the legs in the order the name gives them
                    found = {**found, "h": found["b"], "b": found["h"]}
    return (prefix, found) if found is not None else None


def shape(name: str) -> Shape | None:
    """Dimensions of a European section from the catalogue, or None if not carried."""
    designation = canonical(name)
    if designation is None:
        return None
    found = _row(designation)
    if found is None:
        return None
    prefix, v = found
    family = _SERIES[prefix][1]
    slope = 0.0
    if prefix == "IPN":
        slope = IPN_SLOPE
    elif prefix == "UPN":
        slope = UPN_SLOPE if v["h"] <= 300.0 else UPN_SLOPE_DEEP
    if family is ShapeFamily.ANGLE:
        d, bf, tw, tf, r = v["h"], v["b"], v["t"], v["t"], v.get("r1", 0.0)
    else:
        d, bf, tw, tf = v["h"], v["b"], v["tw"], v["tf"]
        r = v.get("r", v.get("r1", 0.0))
    return Shape(
        name=designation,
        family=family,
        d=d * MM,
        bf=bf * MM,
        tw=tw * MM,
        tf=tf * MM,
        r=r * MM,
        flange_slope=slope,
        fabrication="rolled",
        source=CATALOGUE,
    )


def section(name: str) -> Section | None:
    """Section properties of a European I-shape or channel computed from catalogue
    dimensions; None for names not in the catalogue and for other families."""
    found = shape(name)
    if found is None:
        return None
    computed, _ = section_of(found)
    if computed is None:
        return None
    from dataclasses import replace

    return replace(computed, source=f"computed from {CATALOGUE} dimensions")


def designations(prefix: str | None = None) -> list[str]:
    """Every designation the catalogue carries, optionally of one series ('HEB', 'L')."""
    out = []
    for series_prefix, (cls_name, _) in _SERIES.items():
        if prefix is not None and series_prefix != prefix:
            continue
        for key in _tables()[cls_name]:
            if series(key) == series_prefix:
                out.append(key)
        if series_prefix == "L":
            out += list(_tables()["LI"])
    return out
