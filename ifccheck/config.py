"""Settings: typed, validated, SI base units.

The TOML loader (``load_settings``) turns quantity strings such as "60 psf"
or "2.4 kPa" into these dataclasses; without a file the defaults apply.
"""

from __future__ import annotations

import tomllib
from collections.abc import Callable, Mapping
from dataclasses import asdict, dataclass, field
from pathlib import Path
from typing import Any

from ifccheck.errors import QuantityError, SettingsError
from ifccheck.units import parse_quantity


@dataclass
class DesignSettings:
    standard: str = "AISC 360-16"
    method: str = "LRFD"  # or "ASD"


@dataclass
class SteelSettings:
    # Grade assumed where the model names none. None (the default): such a member
    # is not checked; a grade set here is the user's stated assumption, noted on
    # every member checked on it.
    default_grade: str | None = None
    # Material name in the model → grade ("Metal - Steel - 250 MPa" = "250 MPa").
    materials: dict[str, str] = field(default_factory=dict)


@dataclass
class FramingSettings:
    # An end within half the host's flange width plus this gap (plan) counts
    # as framing into it; covers setbacks of an infill end short of a web.
    gap: float = 0.050  # m (common practice: 2 in)
    # Extra vertical tolerance beyond the host's depth.
    elevation_tolerance: float = 0.050  # m
    # A slab underside within this of the top of steel bears on the beam.
    slab_bearing_tolerance: float = 0.050  # m
    # Beams whose tops of steel lie within this of each other form one level
    # when the model has no storeys, or puts all its framing in one.
    level_tolerance: float = 0.150  # m


@dataclass
class BracingSettings:
    slab: bool = True  # a slab on the top flange braces it continuously
    # AISC 360-16 Appendix 6 strength and stiffness of each brace: "enforce" (an
    # inadequate brace does not count), "report" (checked and reported only) or "off"
    adequacy: str = "enforce"
    # bracing members (GUIDs or names) framing into the web with a moment connection:
    # they brace torsionally (Appendix 6.3.2)
    moment_connections: list[str] = field(default_factory=list)


@dataclass
class StoreyLoads:
    """Area loads of one level (``loads.storeys``) or one slab (``loads.slabs``); None: not
    given here (a slab entry falls back to its level's, a level's to the defaults)."""

    dead: float | None = None  # Pa, superimposed dead
    live: float | None = None  # Pa, floor live load L0 (on a roof: none unless given)
    deck_span: str | None = None  # "x", "y" or an angle in degrees as text
    # False for a level that carries no floor (a platform): its beams are checked
    # on what they carry (self-weight, line loads) rather than left unchecked
    floor: bool | None = None
    roof_live: float | None = None  # Pa, Lr (ASCE 7-16 §4.8), as the engineer gives it
    snow: float | None = None  # Pa, S (ASCE 7-16 Ch. 7), as the engineer computed it
    # Pa, strength-level wind pressure upward (W), not reduced by dead load: the
    # combinations take 0.9D (LRFD) or 0.6D (ASD) against it
    wind_uplift: float | None = None
    partitions: float | None = None  # Pa, partition allowance added as live load (§4.3.2)
    live_reduction: bool | None = None  # False: no live load reduction here (§4.7)
    assembly: bool | None = None  # an assembly occupancy: live load not reduced (§4.7.5)
    # a roof: no floor live load or partitions unless given, no live load reduction;
    # None: a roof where roof_live, snow or wind_uplift is given
    roof: bool | None = None


@dataclass
class DeckSettings:
    """A deck the model does not contain, declared for one level.

    It supplies the load and the bracing a modelled slab would, over the
    level's framed area. Its self-weight is ``thickness`` × concrete density
    or ``weight`` (a pressure); neither means none beyond the area loads.
    """

    deck_span: str | None = None
    thickness: float | None = None  # m
    weight: float | None = None  # Pa
    braces_top_flange: bool = True


LOAD_CASES = ("D", "L", "Lr", "S", "W")  # the cases a line or point load may name


@dataclass
class LineLoadSettings:
    """One ``[[loads.lines]]`` entry: a uniform load along beams named by one selector.

    ``intensity`` acts downward for D, L, Lr and S and upward for W (uplift, like
    ``wind_uplift``). ``start``/``end`` are stations along the beam from its start
    point; None: the beam's ends.
    """

    case: str
    intensity: float  # N/m
    guid: str | None = None
    name: str | None = None
    edge: str | None = None  # a level: every edge beam of it
    start: float | None = None  # m
    end: float | None = None
    label: str = ""  # what it is ("curtain wall"), for the load's source
    index: int = 0  # 1-based position in the settings file

    @property
    def key(self) -> str:
        return f"loads.lines[{self.index}]"


@dataclass
class PointLoadSettings:
    """One ``[[loads.points]]`` entry: a force at a station of one beam (or every beam of
    that name); downward for D, L, Lr and S, upward for W."""

    case: str
    force: float  # N
    station: float  # m from the beam's start point
    guid: str | None = None
    name: str | None = None
    label: str = ""
    index: int = 0

    @property
    def key(self) -> str:
        return f"loads.points[{self.index}]"


@dataclass
class LoadSettings:
    dead: float = 2872.8  # Pa (60 psf) superimposed dead on every floor
    live: float = 4788.0  # Pa (100 psf)
    concrete_density: float = 2400.0  # kg/m³, normal-weight concrete
    steel_density: float = 7850.0  # kg/m³
    storeys: dict[str, StoreyLoads] = field(default_factory=dict)
    slabs: dict[str, StoreyLoads] = field(default_factory=dict)  # by slab GUID
    # ASCE 7-16 §4.7 live load reduction, off unless asked for
    live_reduction: bool = False
    partitions: float = 0.0  # Pa, partition allowance on every floor (§4.3.2), live load
    lines: list[LineLoadSettings] = field(default_factory=list)
    points: list[PointLoadSettings] = field(default_factory=list)


@dataclass
class ConstructionSettings:
    """``[construction]``: the stage when the concrete is placed on the steel and deck.

    ``wet_concrete`` None: each slab's own weight (modelled or declared thickness ×
    ``loads.concrete_density``). ``live``: construction live load (personnel,
    equipment, placement), 20 psf by default; ASCE 37-14 Table 4-1 (from memory)
    gives duty classes of 20, 25, 50 and 75 psf, and placement by pump or hose is
    commonly taken as medium duty, 50 psf. ``deck_braces`` False: the deck is not
    attached, so it braces nothing. ``levels`` None: every level with a concrete slab.
    """

    wet_concrete: float | None = None  # Pa
    live: float = 957.6  # Pa (20 psf)
    deck_braces: bool = False
    levels: list[str] | None = None


@dataclass
class DeflectionSettings:
    live: float = 360.0  # span / 360
    total: float = 240.0  # span / 240


@dataclass
class RequirementSettings:
    """The model information requirements (``ifccheck requirements``, audited by ``check``).

    Each flag switches one requirement on or off; ``grades`` is the project's own list
    of steel grades the material names must give (empty: any grade the tool reads).
    """

    grades: list[str] = field(default_factory=list)
    beam_grade: bool = True
    member_grade: bool = True
    member_type: bool = True
    storey: bool = True
    profile: bool = True
    axis: bool = True
    floor_deck: bool = True
    hardware: bool = True

    def enabled(self, key: str) -> bool:
        """Whether the requirement ``key`` (a flag name above) is switched on."""
        return bool(getattr(self, key))


REQUIREMENT_KEYS = tuple(k for k in RequirementSettings.__dataclass_fields__ if k != "grades")


@dataclass
class Settings:
    design: DesignSettings = field(default_factory=DesignSettings)
    steel: SteelSettings = field(default_factory=SteelSettings)
    framing: FramingSettings = field(default_factory=FramingSettings)
    bracing: BracingSettings = field(default_factory=BracingSettings)
    loads: LoadSettings = field(default_factory=LoadSettings)
    deflection: DeflectionSettings = field(default_factory=DeflectionSettings)
    requirements: RequirementSettings = field(default_factory=RequirementSettings)
    # declared decks by level: a storey name or a level elevation such as "+36 ft"
    decks: dict[str, DeckSettings] = field(default_factory=dict)
    # the construction stage, checked as well when given
    construction: ConstructionSettings | None = None
    # where the settings came from (None: the built-in defaults) and which dotted
    # keys it set; every other value is a default (the design basis says which)
    source: str | None = None
    explicit: frozenset[str] = frozenset()

    def is_default(self, key: str) -> bool:
        """Whether a dotted key ("loads.live") was left at its default."""
        return not any(k == key or k.startswith(key + ".") for k in self.explicit)


# --------------------------------------------------------------------------
# TOML loading and validation
# --------------------------------------------------------------------------


def load_settings(path: Path | None) -> Settings:
    """Read a TOML settings file; ``None`` gives the defaults."""
    if path is None:
        return Settings()
    path = Path(path)
    try:
        text = path.read_bytes()
    except FileNotFoundError:
        raise SettingsError(f"settings: {path}: no such file") from None
    except OSError as e:
        raise SettingsError(f"settings: {path}: cannot be read ({e.strerror})") from None
    try:
        data = tomllib.loads(text.decode("utf-8"))
    except UnicodeDecodeError:
        raise SettingsError(f"settings: {path}: not UTF-8 text") from None
    except tomllib.TOMLDecodeError as e:
        raise SettingsError(f"settings: {path}: invalid TOML: {e}") from None
    settings = settings_from_dict(data)
    settings.source = str(path)
    return settings


def settings_from_dict(d: Mapping[str, Any]) -> Settings:
    """Validate a parsed TOML document (nested dicts) into :class:`Settings`."""
    s = Settings()
    _check_table(d, "", {*_SECTIONS, "decks", "construction"})
    s.decks = _deck_table(d.get("decks", {}), "decks")
    if "construction" in d:
        s.construction = _construction_table(d["construction"], "construction")
    for section, fields in _SECTIONS.items():
        table = d.get(section)
        if table is None:
            continue
        _check_table(table, section, set(fields))
        target = getattr(s, section)
        for key, value in table.items():
            setattr(target, key, fields[key](value, f"{section}.{key}"))
    s.explicit = frozenset(_dotted_keys(d))
    return s


def _dotted_keys(d: Mapping[str, Any], prefix: str = "") -> list[str]:
    out: list[str] = []
    for k, v in d.items():
        key = f"{prefix}.{k}" if prefix else str(k)
        if isinstance(v, Mapping):
            out += _dotted_keys(v, key) or [key]  # an empty table is given too
        else:
            out.append(key)
    return out


def settings_to_dict(s: Settings) -> dict[str, Any]:
    """Plain dict of the settings in SI base units (Pa, m, kg/m³; deflection as span/N)."""
    out = asdict(s)
    out["explicit"] = sorted(s.explicit)
    return out


def deck_span_degrees(text: str) -> float:
    """Plan angle (degrees from +x, in [0, 180)) of a normalised deck_span value."""
    if text == "x":
        return 0.0
    if text == "y":
        return 90.0
    return float(text) % 180.0


def _key(path: str, key: str) -> str:
    part = key if key.replace("_", "").replace("-", "").isalnum() else f'"{key}"'
    return f"{path}.{part}" if path else part


def _fail(key: str, message: str) -> SettingsError:
    return SettingsError(f"settings: {key}: {message}")


def _check_table(value: Any, key: str, allowed: set[str]) -> None:
    if not isinstance(value, Mapping):
        raise _fail(key or "(top level)", f"{value!r} is not a table")
    for k in value:
        if k not in allowed:
            where = _key(key, k)
            raise _fail(where, f"unknown key (expected one of: {', '.join(sorted(allowed))})")


def _quantity(
    dimension: str, minimum: float = 0.0, strict: bool = False
) -> Callable[[Any, str], float]:
    def parse(value: Any, key: str) -> float:
        if isinstance(value, int | float) and not isinstance(value, bool) and value == 0:
            q = 0.0  # a bare zero needs no unit
        else:
            try:
                q = parse_quantity(value, dimension)
            except QuantityError as e:
                raise _fail(key, str(e)) from None
        if strict and q <= minimum:
            raise _fail(key, f"{value!r} must be greater than {minimum:g}")
        if q < minimum:
            raise _fail(key, f"{value!r} must not be negative")
        return q

    return parse


def _string(value: Any, key: str) -> str:
    if not isinstance(value, str) or not value.strip():
        raise _fail(key, f"{value!r} is not a non-empty string")
    return value.strip()


def _grade(value: Any, key: str) -> str:
    """A steel grade the tool knows: "A992", "S355", "A572 Gr 50", "250 MPa", "Fy 50 ksi"."""
    from ifccheck.sections.grades import known_grades, steel_from_name

    text = _string(value, key)
    if steel_from_name(text) is None:
        raise _fail(
            key,
            f"{value!r} is not a steel grade this tool knows (one of {', '.join(known_grades())}, "
            "or a yield strength such as '250 MPa' or 'Fy 50 ksi')",
        )
    return text


def _grade_table(value: Any, key: str) -> dict[str, str]:
    """Material name → grade; every grade must be one the tool knows."""
    if not isinstance(value, Mapping):
        raise _fail(key, f"{value!r} is not a table")
    out: dict[str, str] = {}
    for name, grade in value.items():
        if not name.strip():
            raise _fail(key, "a material name is empty")
        out[name] = _grade(grade, _key(key, name))
    return out


def _grade_list(value: Any, key: str) -> list[str]:
    """A list of steel grades the tool knows, each once."""
    if not isinstance(value, list):
        raise _fail(key, f'{value!r} is not a list of grades such as ["A992", "S355"]')
    out: list[str] = []
    for i, grade in enumerate(value):
        text = _grade(grade, f"{key}[{i}]")
        if text not in out:
            out.append(text)
    return out


def _method(value: Any, key: str) -> str:
    text = _string(value, key).upper()
    if text not in ("LRFD", "ASD"):
        raise _fail(key, f"{value!r} is not 'LRFD' or 'ASD'")
    return text


def _bool(value: Any, key: str) -> bool:
    if not isinstance(value, bool):
        raise _fail(key, f"{value!r} is not true or false")
    return value


def _adequacy(value: Any, key: str) -> str:
    text = _string(value, key).lower()
    if text not in ("enforce", "report", "off"):
        raise _fail(key, f"{value!r} is not 'enforce', 'report' or 'off'")
    return text


def _names(value: Any, key: str) -> list[str]:
    if not isinstance(value, list) or not all(isinstance(v, str) and v.strip() for v in value):
        raise _fail(key, f"{value!r} is not a list of GUIDs or names")
    return [v.strip() for v in value]


def _ratio(value: Any, key: str) -> float:
    """A deflection limit as span/N: 360, 360.0, "360" or "L/360"."""
    number: Any = value
    if isinstance(value, str):
        text = value.strip().replace(" ", "")
        if text[:2].upper() == "L/":
            text = text[2:]
        try:
            number = float(text)
        except ValueError:
            raise _fail(key, f"{value!r} is not a span ratio like 360 or 'L/360'") from None
    if isinstance(number, bool) or not isinstance(number, int | float):
        raise _fail(key, f"{value!r} is not a span ratio like 360 or 'L/360'")
    if not number > 0 or number == float("inf"):
        raise _fail(key, f"{value!r} must be a positive span ratio")
    return float(number)


def _deck_span(value: Any, key: str) -> str:
    if isinstance(value, str) and value.strip().lower() in ("x", "y"):
        return value.strip().lower()
    try:
        degrees = parse_quantity(value, "angle")
    except QuantityError:
        raise _fail(key, f"{value!r} is not 'x', 'y' or an angle like '30 deg'") from None
    return f"{degrees % 180.0:g}"


_STOREY_FIELDS: dict[str, Callable[[Any, str], Any]] = {
    "dead": _quantity("pressure"),
    "live": _quantity("pressure"),
    "deck_span": _deck_span,
    "floor": _bool,
    "roof_live": _quantity("pressure"),
    "snow": _quantity("pressure"),
    "wind_uplift": _quantity("pressure"),
    "partitions": _quantity("pressure"),
    "live_reduction": _bool,
    "assembly": _bool,
    "roof": _bool,
}


def _case(value: Any, key: str) -> str:
    if not isinstance(value, str) or value.strip() not in LOAD_CASES:
        raise _fail(key, f"{value!r} is not a load case (one of {', '.join(LOAD_CASES)})")
    return value.strip()


def _label(value: Any, key: str) -> str:
    if not isinstance(value, str):
        raise _fail(key, f"{value!r} is not text")
    return value.strip()


_LINE_FIELDS: dict[str, Callable[[Any, str], Any]] = {
    "guid": _string,
    "name": _string,
    "edge": _string,
    "case": _case,
    "intensity": _quantity("line load"),
    "start": _quantity("length"),
    "end": _quantity("length"),
    "label": _label,
}

_POINT_FIELDS: dict[str, Callable[[Any, str], Any]] = {
    "guid": _string,
    "name": _string,
    "station": _quantity("length"),
    "case": _case,
    "force": _quantity("force"),
    "label": _label,
}


def _entries(value: Any, key: str) -> list[Mapping[str, Any]]:
    if not isinstance(value, list) or not all(isinstance(v, Mapping) for v in value):
        raise _fail(key, f"{value!r} is not an array of tables (write [[{key}]] entries)")
    return value


def _selector(entry: Mapping[str, Any], where: str, allowed: tuple[str, ...]) -> None:
    given = [k for k in allowed if k in entry]
    if len(given) != 1:
        raise _fail(where, f"give exactly one of {', '.join(allowed)} to say which beams it loads")


def _required(entry: Mapping[str, Any], where: str, names: tuple[str, ...]) -> None:
    for n in names:
        if n not in entry:
            raise _fail(_key(where, n), "missing (required)")


def _line_table(value: Any, key: str) -> list[LineLoadSettings]:
    out = []
    for i, entry in enumerate(_entries(value, key), start=1):
        where = f"{key}[{i}]"
        _check_table(entry, where, set(_LINE_FIELDS))
        _selector(entry, where, ("guid", "name", "edge"))
        _required(entry, where, ("case", "intensity"))
        kw = {k: _LINE_FIELDS[k](v, _key(where, k)) for k, v in entry.items()}
        line = LineLoadSettings(index=i, **kw)
        if line.start is not None and line.end is not None and line.end <= line.start:
            raise _fail(where, "end must be beyond start")
        out.append(line)
    return out


def _point_table(value: Any, key: str) -> list[PointLoadSettings]:
    out = []
    for i, entry in enumerate(_entries(value, key), start=1):
        where = f"{key}[{i}]"
        _check_table(entry, where, set(_POINT_FIELDS))
        _selector(entry, where, ("guid", "name"))
        _required(entry, where, ("station", "case", "force"))
        kw = {k: _POINT_FIELDS[k](v, _key(where, k)) for k, v in entry.items()}
        out.append(PointLoadSettings(index=i, **kw))
    return out


def _levels_list(value: Any, key: str) -> list[str]:
    if not isinstance(value, list) or not value:
        raise _fail(key, f"{value!r} is not a list of levels")
    return [_string(v, f"{key}[{i}]") for i, v in enumerate(value, start=1)]


_CONSTRUCTION_FIELDS: dict[str, Callable[[Any, str], Any]] = {
    "wet_concrete": _quantity("pressure", strict=True),
    "live": _quantity("pressure"),
    "deck_braces": _bool,
    "levels": _levels_list,
}


def _construction_table(value: Any, key: str) -> ConstructionSettings:
    _check_table(value, key, set(_CONSTRUCTION_FIELDS))
    return ConstructionSettings(
        **{k: _CONSTRUCTION_FIELDS[k](v, _key(key, k)) for k, v in value.items()}
    )


_DECK_FIELDS: dict[str, Callable[[Any, str], Any]] = {
    "deck_span": _deck_span,
    "thickness": _quantity("length", strict=True),
    "weight": _quantity("pressure"),
    "braces_top_flange": _bool,
}


def _deck_table(value: Any, key: str) -> dict[str, DeckSettings]:
    if not isinstance(value, Mapping):
        raise _fail(key, f"{value!r} is not a table")
    out: dict[str, DeckSettings] = {}
    for name, entry in value.items():
        where = _key(key, name)
        _check_table(entry, where, set(_DECK_FIELDS))
        deck = DeckSettings(**{k: _DECK_FIELDS[k](v, _key(where, k)) for k, v in entry.items()})
        if deck.thickness is not None and deck.weight is not None:
            raise _fail(where, "give either thickness or weight, not both")
        out[name] = deck
    return out


def _storey_table(value: Any, key: str) -> dict[str, StoreyLoads]:
    if not isinstance(value, Mapping):
        raise _fail(key, f"{value!r} is not a table")
    out: dict[str, StoreyLoads] = {}
    for name, entry in value.items():
        where = _key(key, name)
        _check_table(entry, where, set(_STOREY_FIELDS))
        out[name] = StoreyLoads(
            **{k: _STOREY_FIELDS[k](v, _key(where, k)) for k, v in entry.items()}
        )
    return out


_SECTIONS: dict[str, dict[str, Callable[[Any, str], Any]]] = {
    "design": {"standard": _string, "method": _method},
    "steel": {"default_grade": _grade, "materials": _grade_table},
    "framing": {
        "gap": _quantity("length"),
        "elevation_tolerance": _quantity("length"),
        "slab_bearing_tolerance": _quantity("length"),
        "level_tolerance": _quantity("length", strict=True),
    },
    "bracing": {"slab": _bool, "adequacy": _adequacy, "moment_connections": _names},
    "loads": {
        "dead": _quantity("pressure"),
        "live": _quantity("pressure"),
        "concrete_density": _quantity("density", strict=True),
        "steel_density": _quantity("density", strict=True),
        "storeys": _storey_table,
        "slabs": _storey_table,
        "live_reduction": _bool,
        "partitions": _quantity("pressure"),
        "lines": _line_table,
        "points": _point_table,
    },
    "deflection": {"live": _ratio, "total": _ratio},
    "requirements": {"grades": _grade_list, **{k: _bool for k in REQUIREMENT_KEYS}},
}
