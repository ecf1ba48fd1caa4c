"""The HTTP API (FastAPI) and the web page.

Every route but the health check needs ``Authorization: Bearer <token>``; a
token sees only the submissions made with it (another token's is "not found").
"""

import shutil
from contextlib import asynccontextmanager
from importlib import resources
from pathlib import Path
from string import Template
from typing import Annotated, Any, Literal

from fastapi import Depends, FastAPI, HTTPException, Query, Request
from fastapi import Path as PathParam
from fastapi.concurrency import run_in_threadpool
from fastapi.responses import FileResponse, HTMLResponse, JSONResponse, Response
from fastapi.security import HTTPAuthorizationCredentials, HTTPBearer
from pydantic import BaseModel, Field
from starlette.requests import ClientDisconnect

from ifccheck import CAUTION, __version__
from ifccheck.report.html_out import TABLE_SCRIPT_HASH
from ifccheck.service.core import API, Service
from ifccheck.service.jobs import FILE_NAMES, one_line
from ifccheck.service.runners import Runner
from ifccheck.service.settings import ServiceConfig
from ifccheck.service.uploads import TEXT_FIELDS, Upload, UploadError, receive
from ifccheck.service.webhooks import check_callback_url

JOB_ID = r"^[0-9a-f]{16}$"
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


class ErrorBody(BaseModel):
    detail: str | list[Any] = Field(description="What was wrong, in one line")


class SubmissionReceived(BaseModel):
    id: str
    status: Literal["received"]


class SubmissionStatus(BaseModel):
    id: str
    status: Literal["received", "checking", "finished", "errored"]
    progress: float = Field(ge=0.0, le=1.0)
    model_key: str | None = Field(description="The model this job is a revision of")
    model_file: str = Field(description="The uploaded model's file name as stored")
    summary: dict[str, int] | None = Field(
        description="Beams by outcome (pass, fail, not_checked, total), once finished"
    )
    diff: dict[str, int] | None = Field(
        description="Against the previous revision: matched, added, removed, weakened"
    )
    error: str | None = Field(description="Why the check could not finish, one line")
    files: dict[str, str] = Field(description="File name → URL path, once finished")
    compared_with: str | None = Field(description="The previous revision's submission id")
    units: str | None
    created_at: str
    started_at: str | None
    finished_at: str | None


class SubmissionList(BaseModel):
    model_key: str | None
    submissions: list[SubmissionStatus]


class Health(BaseModel):
    status: Literal["ok"]
    version: str


class Link(BaseModel):
    url: str = Field(description="URL path of the file, valid without a token until expires_at")
    expires_at: int = Field(description="Unix time")


def _errors(*codes: int) -> dict[int | str, dict[str, Any]]:
    text = {
        401: "Missing, unknown or revoked token",
        404: "No such submission or file for this token",
        413: "Upload larger than the service's limit",
        422: "Invalid upload or parameters",
    }
    return {c: {"model": ErrorBody, "description": text[c]} for c in codes}


_UPLOAD_BODY = {
    "required": True,
    "content": {
        "multipart/form-data": {
            "schema": {
                "type": "object",
                "required": ["model"],
                "additionalProperties": False,
                "properties": {
                    "model": {
                        "type": "string",
                        "format": "binary",
                        "description": "The IFC file (STEP physical file, ISO 10303-21)",
                    },
                    "settings": {
                        "type": "string",
                        "format": "binary",
                        "description": "Settings file (TOML), as for `ifccheck check --config`",
                    },
                    "demands": {
                        "type": "string",
                        "format": "binary",
                        "description": "Demand CSV, as for `ifccheck check --demands`",
                    },
                    "model_key": {
                        "type": "string",
                        "maxLength": TEXT_FIELDS["model_key"],
                        "description": "Name of the model; uploads with one key are its "
                        "revisions, each compared with the latest finished one",
                    },
                    "units": {
                        "type": "string",
                        "enum": ["si", "imperial"],
                        "description": "Units of the CSV and reports (default: the model's)",
                    },
                    "callback_url": {
                        "type": "string",
                        "maxLength": TEXT_FIELDS["callback_url"],
                        "description": "URL to POST the status document to when the check "
                        "ends (its host must be allowed by the service)",
                    },
                },
            }
        }
    },
}


def create_app(config: ServiceConfig, runner: Runner | None = None) -> FastAPI:
    """The application; the service starts and stops with it (ASGI lifespan)."""
    service = Service(config, runner)

    @asynccontextmanager
    async def lifespan(app: FastAPI):
        await run_in_threadpool(service.start)
        try:
            yield
        finally:
            await run_in_threadpool(service.stop)

    app = FastAPI(
        title="ifccheck service",
        version=__version__,
        description=(
            "Checks steel beams of uploaded IFC models for lateral-torsional buckling "
            "(AISC 360-16), with brace points inferred from the framing, and compares "
            f"each revision of a model with the previous one. {CAUTION}"
        ),
        lifespan=lifespan,
        docs_url=None,  # the interactive docs page loads assets from the internet
        redoc_url=None,
        openapi_url="/api/v1/openapi.json",
    )
    app.state.service = service
    bearer = HTTPBearer(
        auto_error=False, description="A token made with `ifccheck token create NAME`"
    )

    def unauthorised(message: str = "a valid bearer token is required") -> HTTPException:
        return HTTPException(401, message, headers={"WWW-Authenticate": "Bearer"})

    def token_of(creds: HTTPAuthorizationCredentials | None) -> str:
        if creds is None or creds.scheme.lower() != "bearer":
            raise unauthorised()
        assert service.verifier is not None
        token_id = service.verifier.verify(creds.credentials)
        if token_id is None:
            raise unauthorised("the token is unknown or revoked")
        return token_id

    def require_token(
        creds: Annotated[HTTPAuthorizationCredentials | None, Depends(bearer)],
    ) -> str:
        return token_of(creds)

    Token = Annotated[str, Depends(require_token)]
    JobId = Annotated[str, PathParam(description="A submission's id", max_length=64)]

    def own_job(token_id: str, id: str):
        assert service.store is not None
        job = service.store.job(id, token_id) if len(id) == 16 else None
        if job is None:
            raise HTTPException(404, "no such submission")
        return job

    @app.middleware("http")
    async def headers(request: Request, call_next):
        response = await call_next(request)
        response.headers.setdefault("X-Content-Type-Options", "nosniff")
        response.headers.setdefault("Referrer-Policy", "no-referrer")
        response.headers.setdefault("X-Frame-Options", "DENY")
        if request.url.path.startswith(f"{API}/submissions"):
            response.headers.setdefault("Cache-Control", "no-store")
        return response

    @app.get(f"{API}/health", response_model=Health, tags=["service"])
    def health() -> dict[str, str]:
        """Whether the service is up (no token needed)."""
        return {"status": "ok", "version": __version__}

    @app.post(
        f"{API}/submissions",
        status_code=202,
        response_model=SubmissionReceived,
        responses=_errors(401, 413, 422),
        openapi_extra={"requestBody": _UPLOAD_BODY},
        tags=["submissions"],
    )
    async def create_submission(request: Request, token_id: Token) -> Any:
        """Upload a model to check; it is received and checked in the background."""
        staging = service.new_staging()
        try:
            upload = await receive(request, staging, config.max_upload)
            fields = await run_in_threadpool(_validate, upload, staging, config)
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

    @app.get(
        f"{API}/submissions",
        response_model=SubmissionList,
        responses=_errors(401, 422),
        tags=["submissions"],
    )
    def list_submissions(
        token_id: Token,
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

    @app.get(
        f"{API}/submissions/{{id}}",
        response_model=SubmissionStatus,
        responses=_errors(401, 404),
        tags=["submissions"],
    )
    def get_submission(id: JobId, token_id: Token) -> dict[str, Any]:
        """A submission's status, summary and files."""
        return service.status(own_job(token_id, id))

    @app.post(
        f"{API}/submissions/{{id}}/files/{{name}}/link",
        response_model=Link,
        responses=_errors(401, 404),
        tags=["submissions"],
    )
    def file_link(id: JobId, name: str, token_id: Token) -> dict[str, Any]:
        """A short-lived link to one file, for opening it in a browser tab."""
        job = own_job(token_id, id)
        if service.file_path(job, name) is None:
            raise HTTPException(404, "no such file")
        assert service.links is not None
        expires, signature = service.links.sign(token_id, id, name)
        query = f"token={token_id}&expires={expires}&signature={signature}"
        url = f"{API}/submissions/{id}/files/{name}?{query}"
        return {"url": url, "expires_at": expires}

    @app.get(
        f"{API}/submissions/{{id}}/files/{{name}}",
        responses={
            200: {"description": "The file", "content": {"application/octet-stream": {}}},
            **_errors(401, 404),
        },
        response_class=Response,
        tags=["submissions"],
    )
    def get_file(
        id: JobId,
        name: Annotated[str, PathParam(description=", ".join(FILE_NAMES), max_length=64)],
        creds: Annotated[HTTPAuthorizationCredentials | None, Depends(bearer)],
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
            token_id = token_of(creds)
        job = own_job(token_id, id)
        if name not in FILE_NAMES:
            raise HTTPException(404, "no such file")
        path = service.file_path(job, name)
        if path is None:
            raise HTTPException(404, "no such file")
        suffix = Path(name).suffix
        stem = Path(job.model_file).stem
        if suffix == ".html":
            return FileResponse(
                path,
                media_type=MEDIA_TYPES[suffix],
                headers={"Content-Security-Policy": REPORT_CSP},
            )
        return FileResponse(
            path,
            media_type=MEDIA_TYPES[suffix],
            filename=f"{stem}.{name}",
            content_disposition_type="attachment",
        )

    static = resources.files("ifccheck.service") / "static"
    page = Template((static / "index.html").read_text(encoding="utf-8"))

    @app.get("/", include_in_schema=False)
    def index() -> HTMLResponse:
        html = page.substitute(caution=CAUTION, version=__version__)
        return HTMLResponse(html, headers={"Content-Security-Policy": PAGE_CSP})

    @app.get("/static/{asset}", include_in_schema=False)
    def asset(asset: str) -> Response:
        types = {"app.js": "text/javascript; charset=utf-8", "app.css": "text/css; charset=utf-8"}
        if asset not in types:
            raise HTTPException(404, "not found")
        return Response((static / asset).read_bytes(), media_type=types[asset])

    return app


def _validate(upload: Upload, staging: Path, config: ServiceConfig) -> dict[str, str | None]:
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
    return out
