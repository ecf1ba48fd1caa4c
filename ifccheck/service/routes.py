"""The service's routes, as routers: health, submissions (the API) and the web page.

Each route takes what it needs through dependencies (``ifccheck.service.deps``):
the service, the caller's token, the caller's submission. The routers hold no
state of their own, so one application (``create_app``) can include them.
"""

import functools
import shutil
from importlib import resources
from pathlib import Path
from string import Template
from typing import Annotated, Any

from fastapi import APIRouter, HTTPException, Query, Request
from fastapi import Path as PathParam
from fastapi.concurrency import run_in_threadpool
from fastapi.responses import FileResponse, HTMLResponse, JSONResponse, Response
from starlette.requests import ClientDisconnect

from ifccheck import CAUTION, __version__
from ifccheck.report.html_out import TABLE_SCRIPT_HASH
from ifccheck.service.api_models import (
    UPLOAD_BODY,
    Health,
    Link,
    SubmissionList,
    SubmissionReceived,
    SubmissionStatus,
    errors,
)
from ifccheck.service.core import API
from ifccheck.service.deps import (
    Credentials,
    OwnSubmission,
    SubmissionId,
    TheService,
    Token,
    own_submission,
    token_of,
    unauthorised,
)
from ifccheck.service.jobs import FILE_NAMES, LENGTH_UNIT_FILE, one_line
from ifccheck.service.settings import ServiceConfig
from ifccheck.service.uploads import TEXT_FIELDS, Upload, UploadError, receive
from ifccheck.service.webhooks import check_callback_url

MEDIA_TYPES = {
    ".json": "application/json",
    ".csv": "text/csv; charset=utf-8",
    ".ifc": "application/x-step",
    ".bcf": "application/zip",
    ".html": "text/html; charset=utf-8",
}
# Served reports are our own HTML but carry names from uploaded models: shown
# sandboxed (an opaque origin) so nothing in them can reach the page's token; the
# only script allowed to run is the report's own beam-table script, by its hash.
REPORT_CSP = (
    "sandbox allow-scripts; default-src 'none'; style-src 'unsafe-inline'; img-src data:; "
    f"script-src '{TABLE_SCRIPT_HASH}'"
)
PAGE_CSP = (
    "default-src 'none'; script-src 'self'; style-src 'self'; connect-src 'self'; "
    "img-src 'self' data:; form-action 'self'; frame-ancestors 'none'; base-uri 'none'"
)

service_routes = APIRouter(prefix=API, tags=["service"])
submissions = APIRouter(prefix=f"{API}/submissions", tags=["submissions"])
page = APIRouter(include_in_schema=False)


# --- health ---------------------------------------------------------------------------
@service_routes.get("/health", response_model=Health)
def health() -> dict[str, str]:
    """Whether the service is up (no token needed)."""
    return {"status": "ok", "version": __version__}


@service_routes.get(
    "/requirements.ids",
    response_class=Response,
    responses={200: {"content": {"application/xml": {}}}},
)
def requirements_ids() -> Response:
    """The information the check needs, as an IDS 1.0 file (no token needed)."""
    return Response(
        _requirements_text(),
        media_type="application/xml",
        headers={"Content-Disposition": "attachment; filename=ifccheck.ids"},
    )


@functools.cache
def _requirements_text() -> str:
    from ifccheck.ifc.requirements import build_ids, ids_text

    return ids_text(build_ids())


# --- submissions ----------------------------------------------------------------------
@submissions.post(
    "",
    status_code=202,
    response_model=SubmissionReceived,
    responses=errors(401, 413, 422),
    openapi_extra={"requestBody": UPLOAD_BODY},
)
async def create_submission(request: Request, token_id: Token, service: TheService) -> Any:
    """Upload a model to check; it is received and checked in the background."""
    config = service.config
    staging = service.new_staging()
    try:
        upload = await receive(request, staging, config.max_upload)
        fields = await run_in_threadpool(validate_upload, upload, staging, config)
        job_id = await run_in_threadpool(
            service.create_job,
            token_id,
            staging,
            upload.files["model"].path.name,
            "settings.toml" if "settings" in upload.files else None,
            "demands.csv" if "demands" in upload.files else None,
            fields["model_key"],
            fields["units"],
            fields["callback_url"],
        )
    except ClientDisconnect:  # the client went away mid-upload: drop what came
        shutil.rmtree(staging, ignore_errors=True)
        return Response(status_code=400)
    except UploadError as exc:
        shutil.rmtree(staging, ignore_errors=True)
        headers = {"Connection": "close"} if exc.status == 413 else None
        return JSONResponse({"detail": exc.message}, exc.status, headers=headers)
    except BaseException:
        shutil.rmtree(staging, ignore_errors=True)
        raise
    return JSONResponse({"id": job_id, "status": "received"}, 202)


@submissions.get("", response_model=SubmissionList, responses=errors(401, 422))
def list_submissions(
    token_id: Token,
    service: TheService,
    model_key: Annotated[
        str | None, Query(max_length=TEXT_FIELDS["model_key"], description="Only this model")
    ] = None,
    limit: Annotated[int, Query(ge=1, le=1000)] = 100,
) -> dict[str, Any]:
    """The token's submissions, newest first (the revisions of one model with model_key)."""
    assert service.store is not None
    key = model_key.strip() if model_key and model_key.strip() else None
    jobs = service.store.jobs(token_id, key, limit)
    return {"model_key": key, "submissions": [service.status(j) for j in jobs]}


@submissions.get("/{id}", response_model=SubmissionStatus, responses=errors(401, 404))
def get_submission(job: OwnSubmission, service: TheService) -> dict[str, Any]:
    """A submission's status, summary and files."""
    return service.status(job)


@submissions.post("/{id}/files/{name}/link", response_model=Link, responses=errors(401, 404))
def file_link(
    job: OwnSubmission, name: str, token_id: Token, service: TheService
) -> dict[str, Any]:
    """A short-lived link to one file, for opening it in a browser tab."""
    if service.file_path(job, name) is None:
        raise HTTPException(404, "no such file")
    assert service.links is not None
    expires, signature = service.links.sign(token_id, job.id, name)
    query = f"token={token_id}&expires={expires}&signature={signature}"
    return {"url": f"{API}/submissions/{job.id}/files/{name}?{query}", "expires_at": expires}


@submissions.get(
    "/{id}/files/{name}",
    responses={
        200: {"description": "The file", "content": {"application/octet-stream": {}}},
        **errors(401, 404),
    },
    response_class=Response,
)
def get_file(
    id: SubmissionId,
    name: Annotated[str, PathParam(description=", ".join(FILE_NAMES), max_length=64)],
    creds: Credentials,
    service: TheService,
    token: Annotated[str | None, Query(max_length=64, description="Signed link")] = None,
    expires: Annotated[int | None, Query(description="Signed link")] = None,
    signature: Annotated[str | None, Query(max_length=128, description="Signed link")] = None,
) -> Response:
    """One output file of a finished submission (a bearer token, or a signed link)."""
    if creds is None and token and expires is not None and signature:
        assert service.links is not None and service.store is not None
        if not (
            service.links.check(token, id, name, expires, signature)
            and service.store.token_active(token)
        ):
            raise unauthorised("the link is invalid or has expired")
        token_id = token
    else:
        token_id = token_of(service, creds)
    job = own_submission(service, token_id, id)
    if name not in FILE_NAMES:
        raise HTTPException(404, "no such file")
    path = service.file_path(job, name)
    if path is None:
        raise HTTPException(404, "no such file")
    suffix = Path(name).suffix
    if suffix == ".html":
        return FileResponse(
            path, media_type=MEDIA_TYPES[suffix], headers={"Content-Security-Policy": REPORT_CSP}
        )
    return FileResponse(
        path,
        media_type=MEDIA_TYPES[suffix],
        filename=f"{Path(job.model_file).stem}.{name}",
        content_disposition_type="attachment",
    )


def validate_upload(upload: Upload, staging: Path, config: ServiceConfig) -> dict[str, str | None]:
    """Check the form's fields and small files before a submission is made; raises UploadError."""
    from ifccheck.config import load_settings
    from ifccheck.errors import DemandFileError, SettingsError
    from ifccheck.loads.demand import load_demand_csv

    out: dict[str, str | None] = {}
    key = upload.fields.get("model_key", "").strip()
    if key and not key.isprintable():
        raise UploadError(422, "model_key: must be printable text")
    out["model_key"] = key or None
    units = upload.fields.get("units", "").strip().lower()
    if units and units not in ("si", "imperial"):
        raise UploadError(422, f"units: {units!r} is not 'si' or 'imperial'")
    out["units"] = units or None
    length_unit = upload.fields.get("length_unit", "").strip()
    if length_unit:
        from ifccheck.errors import QuantityError
        from ifccheck.units import model_length_unit

        try:
            unit = model_length_unit(length_unit)
        except QuantityError as exc:
            raise UploadError(422, f"length_unit: {exc}") from None
        # kept beside the inputs, read by the job (as --length-unit)
        (staging / LENGTH_UNIT_FILE).write_text(unit, encoding="utf-8")
    url = upload.fields.get("callback_url", "").strip()
    if url:
        problem = check_callback_url(url, config.callback_hosts)
        if problem:
            raise UploadError(422, problem)
    out["callback_url"] = url or None
    if "settings" in upload.files:
        try:
            load_settings(upload.files["settings"].path)
        except SettingsError as exc:
            raise UploadError(422, one_line(exc, str(staging))) from None
    if "demands" in upload.files:
        try:
            load_demand_csv(upload.files["demands"].path)
        except DemandFileError as exc:
            raise UploadError(422, "demands: " + one_line(exc, str(staging))) from None
    if "ids" in upload.files:
        from ifccheck.errors import IdsFileError
        from ifccheck.ifc.requirements import load_ids

        try:
            load_ids(upload.files["ids"].path)
        except IdsFileError as exc:
            raise UploadError(422, "ids: " + one_line(exc, str(staging))) from None
    return out


# --- the web page -----------------------------------------------------------------------
STATIC = resources.files("ifccheck.service") / "static"
ASSET_TYPES = {"app.js": "text/javascript; charset=utf-8", "app.css": "text/css; charset=utf-8"}


@functools.cache
def _page_html() -> str:
    template = Template((STATIC / "index.html").read_text(encoding="utf-8"))
    return template.substitute(caution=CAUTION, version=__version__)


@page.get("/")
def index() -> HTMLResponse:
    html = _page_html()
    return HTMLResponse(html, headers={"Content-Security-Policy": PAGE_CSP})


@page.get("/static/{asset}")
def asset(asset: str) -> Response:
    if asset not in ASSET_TYPES:
        raise HTTPException(404, "not found")
    return Response((STATIC / asset).read_bytes(), media_type=ASSET_TYPES[asset])
