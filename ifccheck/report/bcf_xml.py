"""A faster XML handler for bcf-client: the same data model, the same XML.

bcf-client serialises each markup and viewpoint with xsdata's ``XmlSerializer``,
which turns every dataclass into a stream of sax events (one generator frame per
field and value) and feeds them through ``xml.sax.saxutils.XMLGenerator``:
about 1 ms a document, 12 s for 6,000 topics (two documents each). Neither the
``indent`` setting nor the other writer (lxml, not a dependency) changes the
event generation, which is half of it.

:class:`FastXmlHandler` keeps bcf-client's dataclasses and xsdata's metadata
(``XmlContext``): from each class's ``XmlMeta`` it builds once a plan of its
attributes, text and child elements, in the order xsdata writes them, and
renders a document straight to text with xsdata's own value converter and the
sax escaping rules. The output is byte for byte what xsdata writes
(``tests/test_bcf_xml.py``). A class whose metadata uses a feature the plan does
not cover (wildcards, compound or mixed content, sequences, tokens, nillable or
namespaced names, wrappers) falls back to xsdata for the whole document.
Parsing is xsdata's, unchanged.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from enum import Enum
from typing import Any, TypeVar
from xml.sax.saxutils import escape, quoteattr

from bcf.xml_parser import XmlParserSerializer
from xsdata.formats.converter import converter
from xsdata.formats.dataclass.models.elements import XmlMeta, XmlVar

T = TypeVar("T")

INDENT = "  "  # bcf-client's serializer configuration (SerializerConfig(indent="  "))
DECLARATION = '<?xml version="1.0" encoding="UTF-8"?>\n'
_SEQUENCES = (list, tuple)  # exactly: XmlDateTime is a NamedTuple, a value
DEFAULT_NS = {"xs": "http://www.w3.org/2001/XMLSchema"}


class _Unsupported(Exception):
    """The class's metadata uses a feature the plan does not cover."""


def _text(value: Any, var: XmlVar) -> str:
    """A simple value as xsdata encodes it (``EventGenerator.encode_primitive``)."""
    kind = type(value)
    if kind is str:
        return value
    if kind is float and math.isfinite(value):  # xsdata's FloatConverter, inlined
        return repr(value).upper().replace("E+", "E")
    if kind is bool:
        return "true" if value else "false"  # xsdata's BoolConverter
    if isinstance(value, str):
        return value
    if isinstance(value, Enum):
        return _text(value.value, var)
    return converter.serialize(value, format=var.format)


@dataclass(frozen=True)
class _Field:
    name: str  # the dataclass field
    qname: str
    var: XmlVar
    model: bool  # a dataclass value (a nested element with its own plan)
    many: bool  # a list of values


@dataclass(frozen=True)
class _Plan:
    qname: str
    attributes: tuple[_Field, ...]
    text: _Field | None
    elements: tuple[_Field, ...]


class FastXmlHandler:
    """bcf-client's ``AbstractXmlParserSerializer``: xsdata parsing, planned writing."""

    def __init__(self) -> None:
        self._xsdata = XmlParserSerializer()
        self.context = self._xsdata.context
        self.parser = self._xsdata.parser
        self._plans: dict[type, _Plan | None] = {}

    def parse(self, xml: bytes, clazz: type[T]) -> T:
        return self._xsdata.parse(xml, clazz)

    def serialize(self, obj: object, ns_map: dict[str, str] | None = None) -> str:
        ns = ns_map or self.parser.ns_map or DEFAULT_NS
        try:
            plan = self._plan(type(obj))
            out: list[str] = [DECLARATION]
            xmlns = "".join(
                f" xmlns:{p}={quoteattr(u)}" if p else f" xmlns={quoteattr(u)}"
                for p, u in ns.items()
            )
            self._element(obj, plan, plan.qname, 0, out, xmlns)
            out.append("\n")
            return "".join(out)
        except _Unsupported:
            return self._xsdata.serialize(obj, ns_map)  # type: ignore[arg-type]

    # --- plans ----------------------------------------------------------------------
    def _plan(self, clazz: type) -> _Plan:
        if clazz in self._plans:
            plan = self._plans[clazz]
            if plan is None:
                raise _Unsupported(clazz.__name__)
            return plan
        try:
            plan = self._build(self.context.build(clazz))
        except _Unsupported:
            self._plans[clazz] = None
            raise
        self._plans[clazz] = plan
        return plan

    def _build(self, meta: XmlMeta) -> _Plan:
        if meta.nillable or meta.namespace or "}" in meta.qname:
            raise _Unsupported(meta.qname)
        attributes, elements = [], []
        for var in meta.get_attribute_vars():
            if not var.is_attribute or "}" in var.qname or var.tokens:
                raise _Unsupported(var.name)
            attributes.append(_Field(var.name, var.qname, var, False, False))
        text = None
        if meta.text is not None:
            var = meta.text
            if var.mixed or var.tokens:
                raise _Unsupported(var.name)
            text = _Field(var.name, var.qname, var, False, False)
        for var in meta.get_element_vars():
            if (
                var.sequence is not None
                or var.mixed
                or var.tokens
                or var.is_elements
                or var.is_wildcard
                or var.any_type
                or var.nillable
                or var.wrapper_qname
                or "}" in var.qname
            ):
                raise _Unsupported(var.name)
            model = var.clazz is not None and self.context.class_type.is_model(var.clazz)
            many = bool(var.list_element)
            elements.append(_Field(var.name, var.qname, var, model, many))
        if text is not None and elements:
            raise _Unsupported(meta.qname)  # mixed text and children
        return _Plan(meta.qname, tuple(attributes), text, tuple(elements))

    # --- writing ----------------------------------------------------------------------
    def _element(
        self, obj: Any, plan: _Plan, qname: str, depth: int, out: list[str], xmlns: str = ""
    ) -> None:
        pad = INDENT * depth
        head = pad + "<" + qname + xmlns
        for f in plan.attributes:
            value = getattr(obj, f.name)
            if value is None or (type(value) in _SEQUENCES and not value):
                continue
            if type(value) in _SEQUENCES:
                raise _Unsupported(f.name)
            head += f" {f.qname}={quoteattr(_text(value, f.var))}"
        out.append(head)
        if plan.text is not None:
            value = getattr(obj, plan.text.name)
            data = "" if value is None else _text(value, plan.text.var)
            out.append(f">{_escape(data)}</{qname}>" if data else "/>")
            return
        opened = False
        inner = INDENT * (depth + 1)
        for f in plan.elements:
            value = getattr(obj, f.name)
            if value is None:
                continue
            values = value if f.many and type(value) in _SEQUENCES else (value,)
            for v in values:
                if v is None:
                    continue
                if not opened:
                    out.append(">")
                    opened = True
                out.append("\n")
                if f.model:
                    if type(v) is not f.var.clazz:
                        raise _Unsupported(f.name)  # a derived type would need xsi:type
                    self._element(v, self._plan(f.var.clazz), f.qname, depth + 1, out)
                    continue
                if type(v) in _SEQUENCES or _is_model(v):
                    raise _Unsupported(f.name)
                data = _text(v, f.var)
                out.append(
                    f"{inner}<{f.qname}>{_escape(data)}</{f.qname}>"
                    if data
                    else f"{inner}<{f.qname}/>"
                )
        out.append(f"\n{pad}</{qname}>" if opened else "/>")


def _escape(data: str) -> str:
    """Character data as ``XMLGenerator.characters`` escapes it."""
    if "&" in data or "<" in data or ">" in data:
        return escape(data)
    return data


def _is_model(value: Any) -> bool:
    return hasattr(type(value), "__dataclass_fields__")
