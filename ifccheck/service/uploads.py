"""Streaming multipart upload: files go straight to disk, capped while they arrive.

The body is parsed chunk by chunk as it comes off the socket; file parts are
written to a staging directory and never held whole in memory. The total of
the file parts is capped: past the cap reading stops at once and the caller
deletes the partial files. The model's first bytes must be a STEP physical
file header (ISO 10303-21), checked before the rest is read.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from pathlib import Path
from typing import BinaryIO

from python_multipart.multipart import MultipartParseError, MultipartParser, parse_options_header
from starlette.requests import Request

from ifccheck.errors import InputError

FILE_FIELDS = {
    "model": None,
    "settings": "settings.toml",
    "demands": "demands.csv",
    "ids": "project.ids",  # a project's own IDS, audited as well as the tool's
}
TEXT_FIELDS = {
    "model_key": 200,
    "units": 20,
    "length_unit": 40,
    "callback_url": 2048,
}  # longest accepted value
STEP_HEADER = b"ISO-10303-21;"
_LEADING = b"\xef\xbb\xbf \t\r\n"  # a UTF-8 byte order mark and white space may precede it
_HEAD_LIMIT = 4096  # bytes of a model read before its header must have appeared
OVERHEAD = 1 << 20  # multipart framing and text fields allowed beyond the file cap


class UploadError(InputError):
    """An upload refused with an HTTP status and a one-line reason."""

    def __init__(self, status: int, message: str) -> None:
        super().__init__(message)
        self.status = status
        self.message = message


@dataclass
class StoredFile:
    path: Path
    filename: str  # as sent by the client
    size: int = 0


@dataclass
class Upload:
    fields: dict[str, str] = field(default_factory=dict)
    files: dict[str, StoredFile] = field(default_factory=dict)


def model_file_name(filename: str) -> str:
    """A safe file name for the stored model, keeping the client's where it can."""
    base = re.split(r"[\\/]", filename or "")[-1]
    base = re.sub(r"[^A-Za-z0-9._-]+", "_", base).lstrip("._")[:100]
    if not base:
        return "model.ifc"
    return base if base.lower().endswith(".ifc") else f"{base}.ifc"


def too_large(limit: int) -> UploadError:
    return UploadError(413, f"upload too large: the limit is {limit} bytes")


class _Receiver:
    """Callbacks of the multipart parser, writing into ``staging``."""

    def __init__(self, staging: Path, max_upload: int) -> None:
        self.staging = staging
        self.max_upload = max_upload
        self.upload = Upload()
        self.file_bytes = 0
        self.ended = False
        self._reset()

    def _reset(self) -> None:
        self._hfield = bytearray()
        self._hvalue = bytearray()
        self._headers: dict[str, str] = {}
        self._name: str | None = None
        self._fh: BinaryIO | None = None
        self._text: bytearray | None = None
        self._head: bytearray | None = None  # model bytes held until the header is seen

    def callbacks(self) -> dict:
        return {
            "on_part_begin": self._reset,
            "on_header_field": lambda d, s, e: self._hfield.extend(d[s:e]),
            "on_header_value": lambda d, s, e: self._hvalue.extend(d[s:e]),
            "on_header_end": self._header_end,
            "on_headers_finished": self._headers_finished,
            "on_part_data": self._data,
            "on_part_end": self._part_end,
            "on_end": self._end,
        }

    def _end(self) -> None:
        self.ended = True

    def _header_end(self) -> None:
        self._headers[self._hfield.decode("latin-1").strip().lower()] = self._hvalue.decode(
            "latin-1"
        )
        self._hfield, self._hvalue = bytearray(), bytearray()

    def _headers_finished(self) -> None:
        disposition, options = parse_options_header(self._headers.get("content-disposition", ""))
        if disposition != b"form-data" or b"name" not in options:
            raise UploadError(422, "a part of the form has no Content-Disposition name")
        name = options[b"name"].decode("utf-8", "replace")
        if name not in FILE_FIELDS and name not in TEXT_FIELDS:
            raise UploadError(422, f"unknown form field {name!r}")
        if name in self.upload.files or name in self.upload.fields:
            raise UploadError(422, f"form field {name!r} given twice")
        self._name = name
        if name in FILE_FIELDS:
            filename = options.get(b"filename", b"").decode("utf-8", "replace")
            stored = FILE_FIELDS[name] or model_file_name(filename)
            path = self.staging / stored
            self.upload.files[name] = StoredFile(path, filename or stored)
            self._fh = path.open("wb")
            if name == "model":
                self._head = bytearray()
        else:
            self._text = bytearray()

    def _data(self, data: bytes, start: int, end: int) -> None:
        chunk = data[start:end]
        if self._text is not None:
            self._text.extend(chunk)
            assert self._name is not None
            if len(self._text) > TEXT_FIELDS[self._name]:
                raise UploadError(422, f"{self._name}: longer than {TEXT_FIELDS[self._name]} bytes")
            return
        if self._fh is None:
            return
        self.file_bytes += len(chunk)
        if self.file_bytes > self.max_upload:
            raise too_large(self.max_upload)
        if self._head is not None:
            self._head.extend(chunk)
            if not self._check_head(final=False):
                return
            chunk, self._head = bytes(self._head), None
        self._fh.write(chunk)
        self.upload.files[self._name or ""].size += len(chunk)

    def _check_head(self, final: bool) -> bool:
        """True once the model's header is confirmed; raises when it cannot be one."""
        assert self._head is not None
        stripped = bytes(self._head).lstrip(_LEADING)
        if len(stripped) >= len(STEP_HEADER):
            if not stripped.startswith(STEP_HEADER):
                raise _not_ifc(stripped)
            return True
        if final or len(self._head) > _HEAD_LIMIT or not STEP_HEADER.startswith(stripped):
            raise _not_ifc(stripped)
        return False

    def _part_end(self) -> None:
        if self._text is not None and self._name is not None:
            try:
                self.upload.fields[self._name] = self._text.decode("utf-8")
            except UnicodeDecodeError:
                raise UploadError(422, f"{self._name}: not UTF-8 text") from None
        if self._head is not None:
            self._check_head(final=True)
        if self._fh is not None:
            self._fh.close()
        self._reset()

    def close(self) -> None:
        if self._fh is not None and not self._fh.closed:
            self._fh.close()


def _not_ifc(head: bytes = b"") -> UploadError:
    if head.startswith(b"PK"):  # a zip archive, as the command line tells it
        return UploadError(422, "model: compressed IFC (ifcZIP) is not read; unzip it first")
    return UploadError(
        422, "model: not an IFC file (it does not start with the STEP header ISO-10303-21;)"
    )


async def receive(request: Request, staging: Path, max_upload: int) -> Upload:
    """Parse the request's multipart body into ``staging``; raises UploadError."""
    ctype, options = parse_options_header(request.headers.get("content-type", ""))
    if ctype != b"multipart/form-data" or not options.get(b"boundary"):
        raise UploadError(422, "the body must be multipart/form-data with a model file")
    length = request.headers.get("content-length")
    if length is not None and length.isdigit() and int(length) > max_upload + OVERHEAD:
        raise too_large(max_upload)
    staging.mkdir(parents=True, exist_ok=True)
    receiver = _Receiver(staging, max_upload)
    parser = MultipartParser(options[b"boundary"], receiver.callbacks())  # type: ignore[arg-type]
    received = 0
    try:
        async for chunk in request.stream():
            received += len(chunk)
            if received > max_upload + OVERHEAD:
                raise too_large(max_upload)
            parser.write(chunk)
        parser.finalize()
    except MultipartParseError as exc:
        raise UploadError(422, f"malformed multipart body: {exc}") from None
    finally:
        receiver.close()
    if not receiver.ended:
        raise UploadError(422, "malformed multipart body: it ends before its closing boundary")
    if "model" not in receiver.upload.files:
        raise UploadError(422, "model: missing (send the IFC file in the form field 'model')")
    if receiver.upload.files["model"].size == 0:
        raise _not_ifc()
    return receiver.upload
