"""The design basis of a check: what it assumed and ran with, as data and in words.

One source for the report's "Design basis" section, ``basis`` in
``results.json`` and the command line's note on defaults: the project and
model, the standard and method, every effective setting (defaults marked),
the loads per level and case, the load combinations with their equation
numbers, the deflection limits and tolerances, the bracing, anchorage and
load-path assumptions, and how much was assumed rather than read.
Quantities stay SI here; :func:`setting_text` and :func:`load_text` word them.
"""

from __future__ import annotations

import re
from collections.abc import Iterable, Mapping
from dataclasses import dataclass
from typing import Any

from ifccheck.loads.combinations import SERVICE, Combination, strength_combinations
from ifccheck.report.display import DisplayUnits
from ifccheck.results import (
    STAGES,
    BeamResult,
    BeamStageResult,
    CheckResult,
    StageName,
    StageResult,
)
from ifccheck.units import G, to_si

# load setting → (load case, words); keys the settings may carry per level
LOAD_KEYS: dict[str, tuple[str, str]] = {
    "dead": ("D", "superimposed dead"),
    "live": ("L", "live"),
    "partitions": ("L", "partition allowance"),
    "roof_live": ("Lr", "roof live"),
    "snow": ("S", "snow"),
    "wind_uplift": ("W", "wind uplift"),
}
DENSITY_KEYS = ("concrete_density", "steel_density")
# what each assumption of the check says (code → words)
ASSUMPTIONS: dict[str, str] = {
    "slab_braces_top_flange": "A slab bearing on a beam's top flange braces that flange "
    "continuously over the length it covers, openings excluded; it never braces the "
    "bottom flange.",
    "slab_bracing_off": "Slabs are not taken to brace the top flange (bracing.slab = false).",
    "composite_ignored": "Composite action between slab and steel is ignored: every beam "
    "is checked as a bare steel section.",
    "framing_anchored": "Floor framing that frames in and carries the floor counts as an "
    "anchored brace, the floor being tied into the lateral system (common practice).",
    "no_diaphragm": "Levels with no slab or other diaphragm in the model: {levels}. Their "
    "framing braces are assumed anchored; the beams say so in their notes.",
    "struts_need_anchor": "Struts, braces and kickers count only when their line reaches an "
    "anchor (a column, wall, slab or braced bay); hardware never braces or supports.",
    "ends_restrained": "Beam ends are restrained against twist at their supports "
    "(common practice).",
    "load_path": "Floor load goes from the deck to the beams it spans between (tributary "
    "widths to the neighbouring parallel beams), infill beams deliver their reactions to "
    "the girders they frame into, girders to the columns; spans run between support "
    "centrelines.",
}
ASSUMED_WORDS = {
    "default_grade": "beams checked on the default steel grade",
    "inferred_deck_direction": "levels whose deck span direction was inferred from the framing",
    "inferred_role": "members whose role (column, brace, strut) was inferred from geometry",
}


@dataclass(frozen=True)
class Setting:
    key: str  # dotted, as in the settings file
    value: Any  # SI
    kind: str  # display kind: pressure, density, tolerance, span ratio, or "" for plain
    default: bool


@dataclass(frozen=True)
class LevelLoad:
    level: str
    case: str
    what: str
    pressure: float  # Pa
    source: str  # the setting's key, "slab:<thickness m>" for a slab's weight
    default: bool
    slab: str = ""  # the slab's GUID where that slab's own settings entry gives the load


def _is_default(explicit: Iterable[str], key: str) -> bool:
    return not any(k == key or k.startswith(key + ".") for k in explicit)


def _kind(key: str) -> str:
    leaf = key.rsplit(".", 1)[-1]
    if key.startswith("loads.") and leaf in LOAD_KEYS:
        return "pressure"
    if leaf in DENSITY_KEYS:
        return "density"
    if key.startswith("framing."):
        return "tolerance"
    if key.startswith("deflection."):
        return "span ratio"
    return ""


_NAMED = ("loads.storeys", "loads.slabs", "decks")  # tables keyed by a name or GUID


def settings_list(settings: Mapping[str, Any]) -> list[Setting]:
    """Every effective setting as a dotted key with its value, defaults marked."""
    explicit = list(settings.get("explicit", []))
    out: list[Setting] = []

    def walk(d: Mapping[str, Any], prefix: str, shown: str) -> None:
        for k, v in d.items():
            key = f"{prefix}.{k}" if prefix else str(k)
            # names under a table of names (storeys, slabs) are quoted, as TOML writes them
            part = f'"{k}"' if prefix in _NAMED else str(k)
            label = f"{shown}.{part}" if shown else part
            if isinstance(v, Mapping):
                walk(v, key, label)
            elif v is not None:
                out.append(Setting(label, v, _kind(key), _is_default(explicit, key)))

    walk({k: v for k, v in settings.items() if k not in ("source", "explicit")}, "", "")
    return out


def level_names(result: CheckResult) -> list[str]:
    """The levels the loads were applied to: the load path's, else the storeys."""
    names = [lv.name for lv in result.levels] or [n for n, _ in result.storeys]
    return list(dict.fromkeys(names))


def stage_index(result: CheckResult, stage: int | str = 0) -> int:
    """The index in ``result.stages`` of a stage given by index or by name
    ("in_service", "construction"); a name the result does not carry gives its
    index past the end (no loads, the standard's combinations)."""
    if isinstance(stage, int):
        return stage
    for i, st in enumerate(result.stages):
        if st.stage == stage:
            return i
    return len(result.stages) if stage != "in_service" else 0


def stage_record(result: CheckResult, stage: int | str = 0) -> StageResult | None:
    """The design basis and findings of one stage, None where the check did not run it."""
    i = stage_index(result, stage)
    return result.stages[i] if 0 <= i < len(result.stages) else None


def _stage_name(result: CheckResult, stage: int | str) -> str:
    st = stage_record(result, stage)
    if st is not None:
        return st.stage
    return stage if isinstance(stage, str) else ("in_service" if stage == 0 else "")


def level_loads(result: CheckResult, stage: int | str = 0) -> list[LevelLoad]:
    """The area loads on every level of one stage (in service by default; by index into
    ``result.stages`` or by name), by case: the stage's loads as the load path applied
    them, then, in service, the slabs' self-weight from their modelled thickness.

    During construction the wet concrete of slabs of one thickness is given once per
    level, from that thickness (``slab:<thickness m>``) unless construction.wet_concrete
    gives the pressure."""
    s = result.settings
    loads: Mapping[str, Any] = s.get("loads", {})
    explicit = list(s.get("explicit", []))
    density = float(loads.get("concrete_density", 2400.0))
    thickness = {sl.guid: sl.thickness for sl in result.slabs}
    name = _stage_name(result, stage)
    record = stage_record(result, stage)
    out: list[LevelLoad] = []
    seen: set[tuple[str, str, str, float, str]] = set()
    for x in record.loads if record is not None else []:
        if x.pressure == 0.0 and x.origin.startswith("roof"):
            continue  # a roof's floor live load: none
        slab = x.slab
        if x.what == "wet concrete" and x.origin.startswith("slab thickness"):
            # from the slab's modelled thickness and the concrete density, as in service
            t = thickness.get(x.slab, 0.0) or x.pressure / (density * G)
            source, default, slab = (
                f"slab:{round(t, 4)}",
                _is_default(explicit, "loads.concrete_density"),
                "",
            )
        else:
            # "default loads.live": the level takes the [loads] value, given or not
            source = x.origin.removeprefix("default ").replace("'", '"')
            source = re.sub(r" \(.*\)$", "", source)  # "construction.live (20 psf)"
            default = source.startswith(("loads.", "construction.")) and _is_default(
                explicit, source.replace('"', "")
            )
        key = (x.level, x.case, x.what, round(x.pressure, 6), source + slab)
        if key in seen:
            continue  # two slabs of one thickness on a level: one row
        seen.add(key)
        out.append(LevelLoad(x.level, x.case, x.what, x.pressure, source, default, slab))
    if name != "in_service":
        return out
    for level in level_names(result):
        thicknesses = sorted({round(sl.thickness, 4) for sl in result.slabs
                              if sl.storey == level and sl.thickness > 0})  # fmt: skip
        for t in thicknesses:
            out.append(
                LevelLoad(level, "D", "slab self-weight", t * density * G,
                          f"slab:{t}", _is_default(explicit, "loads.concrete_density"))
            )  # fmt: skip
    return out


def combinations(result: CheckResult, stage: int | str = 0) -> list[Combination]:
    """The strength combinations of one stage (those of the cases that load its beams;
    by index into ``result.stages`` or by name), then, in service, the serviceability
    ones."""
    name = _stage_name(result, stage)
    record = stage_record(result, stage)
    if record is not None:
        strength = [
            Combination(c.name, c.factors, "strength", c.source, c.number)
            for c in record.combinations
        ]
    else:
        strength = list(
            strength_combinations(result.method, name if name in STAGES else "in_service")
        )
    return [*strength, *SERVICE] if name == "in_service" else strength


def beam_stages(b: BeamResult) -> list[BeamStageResult]:
    """A beam's result per stage, in service first. A result that carries no stage
    breakdown (one stage only, from another writer) is its in-service stage."""
    if b.stages:
        return list(b.stages)
    return [
        BeamStageResult(
            stage="in_service", outcome=b.outcome, utilisation=b.utilisation,
            controlling_limit=b.controlling_limit,
            strength_utilisation=b.strength_utilisation,
            flexure_utilisation=b.flexure_utilisation, shear_demand=b.shear_demand,
            shear_capacity=b.shear_capacity, shear_utilisation=b.shear_utilisation,
            deflection_utilisation=b.deflection_utilisation,
            governing_segment=b.governing_segment, reason=b.reason, demand=b.demand,
            diagram=b.diagram, curve=b.curve,
        )
    ]  # fmt: skip


def beam_stage(b: BeamResult, stage: StageName) -> BeamStageResult | None:
    """A beam's result in one stage, None where it was not checked in that stage."""
    return next((s for s in beam_stages(b) if s.stage == stage), None)


def stage_combination(b: BeamResult, st: BeamStageResult) -> str:
    """The load combination of a stage's governing segment ('' where it has none)."""
    i = st.governing_segment
    if i is None or not 0 <= i < len(b.segments):
        return ""
    return b.segments[i].load_combination


def stage_only_failure(b: BeamResult) -> StageName | None:
    """The one stage a failing beam fails in when it passes the others ("construction"
    for a beam that fails only while the concrete is wet); None otherwise."""
    failing = [s.stage for s in beam_stages(b) if s.outcome == "fail"]
    if b.outcome != "fail" or len(failing) != 1 or len(beam_stages(b)) < 2:
        return None
    return failing[0]


def levels_without_slab(result: CheckResult) -> list[str]:
    with_slab = {sl.storey for sl in result.slabs if sl.diaphragm}
    beams_on = {b.storey for b in result.beams}
    return [n for n in level_names(result) if n in beams_on and n not in with_slab]


def assumptions(result: CheckResult) -> list[tuple[str, str]]:
    """(code, words) of every bracing, anchorage and load-path assumption of the check."""
    bracing = result.settings.get("bracing", {})
    out = []
    if bracing.get("slab", True):
        out.append(("slab_braces_top_flange", ASSUMPTIONS["slab_braces_top_flange"]))
    else:
        out.append(("slab_bracing_off", ASSUMPTIONS["slab_bracing_off"]))
    out.append(("composite_ignored", ASSUMPTIONS["composite_ignored"]))
    out.append(("framing_anchored", ASSUMPTIONS["framing_anchored"]))
    bare = levels_without_slab(result)
    if bare:
        out.append(("no_diaphragm", ASSUMPTIONS["no_diaphragm"].format(levels=", ".join(bare))))
    for code in ("struts_need_anchor", "ends_restrained", "load_path"):
        out.append((code, ASSUMPTIONS[code]))
    return out


def assumed_grade(result: CheckResult) -> dict[str, Any] | None:
    """{"grade", "count"} when beams were checked on the default grade, else None."""
    n = result.assumptions.get("default_grade", 0)
    if not n:
        return None
    grade = result.settings.get("steel", {}).get("default_grade", "")
    return {"grade": grade, "count": n}


def basis_document(result: CheckResult) -> dict[str, Any]:
    """The design basis as plain JSON data, SI (``basis`` in results.json)."""
    from ifccheck.report.json_out import num

    s = result.settings

    def value(v: Any) -> Any:
        return num(v) if isinstance(v, float) else v

    return {
        "project": result.project or result.model.file,
        "model": {"file": result.model.file, "sha256": result.model.sha256},
        "standard": result.standard,
        "method": result.method,
        "settings_file": s.get("source"),
        "settings": [
            {
                "key": x.key,
                "value": value(x.value),
                "unit": _SI_UNIT.get(x.kind, ""),
                "default": x.default,
            }
            for x in settings_list(s)
        ],
        "loads": loads_document(result, 0),
        "steel_self_weight": "from each section's area at loads.steel_density",
        "combinations": combinations_document(result, 0),
        "stages": stages_document(result),
        "deflection_limits": {
            "live": num(s.get("deflection", {}).get("live")),
            "total": num(s.get("deflection", {}).get("total")),
            "cantilever": "twice the overhang length in place of the span",
        },
        "tolerances": {k: num(v) for k, v in s.get("framing", {}).items()},
        "levels": [
            {
                "name": lv.name,
                "elevation": num(lv.elevation),
                "deck_angle": num(lv.deck_angle),
                "deck_source": lv.deck_source,
                "deck_evidence": lv.deck_evidence,
                "typical_spacing": num(lv.typical_spacing),
            }
            for lv in result.levels
        ],
        "assumptions": [{"code": c, "text": t} for c, t in assumptions(result)],
        "assumed": dict(result.assumptions),
    }


def loads_document(result: CheckResult, stage: int | str = 0) -> list[dict[str, Any]]:
    """One stage's area loads per level and case as JSON data (Pa)."""
    from ifccheck.report.json_out import num

    return [
        {
            "level": x.level,
            "slab": x.slab,
            "case": x.case,
            "load": x.what,
            "pressure": num(x.pressure),
            "source": x.source,
            "default": x.default,
        }
        for x in level_loads(result, stage)
    ]


def combinations_document(result: CheckResult, stage: int | str = 0) -> list[dict[str, Any]]:
    """One stage's combinations as JSON data, each with its standard and number."""
    from ifccheck.report.json_out import num

    return [
        {
            "name": c.name,
            "purpose": c.purpose,
            "source": c.source,
            "number": c.number,
            "factors": {k: num(v) for k, v in c.factors.items()},
        }
        for c in combinations(result, stage)
    ]


def stages_document(result: CheckResult) -> list[dict[str, Any]]:
    """Per stage (in service first, then construction when the settings give it): what
    it covers and assumes, its loads and combinations, its load balance and its beams
    counted by outcome."""
    from ifccheck.report.json_out import num

    out = []
    for i, st in enumerate(result.stages):
        counts = {k: int(st.summary.get(k, 0)) for k in
                  ("pass", "fail", "not_checked", "total", "governing")}  # fmt: skip
        out.append(
            {
                "stage": st.stage,
                "title": st.title,
                "levels": list(st.levels),
                "slab_bracing": st.slab_bracing,
                "notes": list(st.notes),
                "loads": loads_document(result, i),
                "combinations": combinations_document(result, i),
                "load_balance": [
                    {
                        "level": x.level,
                        "case": x.case,
                        "applied": num(x.applied),
                        "delivered": num(x.delivered),
                    }
                    for x in st.load_balance
                ],
                "summary": counts,
            }
        )
    return out


_SI_UNIT = {"pressure": "Pa", "density": "kg/m³", "tolerance": "m", "span ratio": "L/N"}


# --- words ------------------------------------------------------------------------
def density_text(du: DisplayUnits, value: float) -> str:
    if du.system == "imperial":
        return f"{value / to_si(1.0, 'pcf'):.0f} pcf"
    return f"{value:.0f} kg/m³"


def setting_text(du: DisplayUnits, x: Setting) -> str:
    """A setting's value in the trade's units."""
    if isinstance(x.value, bool) or not isinstance(x.value, int | float):
        return ("true" if x.value else "false") if isinstance(x.value, bool) else str(x.value)
    if x.kind == "pressure":
        return du.trade(float(x.value), "pressure")
    if x.kind == "density":
        return density_text(du, float(x.value))
    if x.kind == "tolerance":
        return du.trade(float(x.value), "thickness")
    if x.kind == "span ratio":
        return f"L/{float(x.value):g}"
    return f"{x.value:g}"


def load_source_text(du: DisplayUnits, x: LevelLoad, result: CheckResult) -> str:
    """Where a level's load came from, in words."""
    if x.source.startswith("slab:"):
        t = float(x.source.split(":", 1)[1])
        density = float(result.settings.get("loads", {}).get("concrete_density", 2400.0))
        return f"modelled slab {du.trade(t, 'thickness')} thick at {density_text(du, density)}" + (
            " (default density)" if x.default else ""
        )
    return x.source + (" (default)" if x.default else "")


def defaults_line(result: CheckResult, du: DisplayUnits) -> str | None:
    """One line saying which default loads were used, when no settings file was given."""
    if result.settings.get("source") is not None:
        return None
    loads = result.settings.get("loads", {})
    parts = [
        f"{what} {du.trade(float(loads[key]), 'pressure')}"
        for key, (_case, what) in LOAD_KEYS.items()
        if isinstance(loads.get(key), int | float) and loads.get(key)
    ]
    grade = result.settings.get("steel", {}).get("default_grade", "")
    text = (
        "no settings file (--config): default loads used, "
        + " and ".join(parts)
        + " on every level, the roof included"
    )
    if grade:
        text += f"; grade {grade} where the model names none"
    else:
        text += "; no default grade: a beam whose grade the model does not give is not checked"
    return text
