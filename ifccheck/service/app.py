"""The HTTP application (FastAPI): the service, its routers and the security headers.

Every route but the health check needs ``Authorization: Bearer <token>``; a
token sees only the submissions made with it (another token's is "not found").
The routes themselves are in ``ifccheck.service.routes``, their dependencies
in ``ifccheck.service.deps``.
"""

from collections.abc import AsyncIterator, Awaitable, Callable
from contextlib import asynccontextmanager

from fastapi import FastAPI, Request, Response
from fastapi.concurrency import run_in_threadpool

from ifccheck import CAUTION, __version__
from ifccheck.service import routes
from ifccheck.service.core import API, Service
from ifccheck.service.routes import MEDIA_TYPES, PAGE_CSP, REPORT_CSP
from ifccheck.service.runners import Runner
from ifccheck.service.settings import ServiceConfig

__all__ = ["MEDIA_TYPES", "PAGE_CSP", "REPORT_CSP", "create_app"]


def create_app(config: ServiceConfig, runner: Runner | None = None) -> FastAPI:
    """The application; the service starts and stops with it (ASGI lifespan)."""
    service = Service(config, runner)

    @asynccontextmanager
    async def lifespan(app: FastAPI) -> AsyncIterator[None]:
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
        openapi_url=f"{API}/openapi.json",
    )
    app.state.service = service
    app.middleware("http")(security_headers)
    for router in (routes.service_routes, routes.submissions, routes.page):
        app.include_router(router)
    return app


async def security_headers(
    request: Request, call_next: Callable[[Request], Awaitable[Response]]
) -> Response:
    """Headers every answer carries; submissions' answers are never cached."""
    response = await call_next(request)
    response.headers.setdefault("X-Content-Type-Options", "nosniff")
    response.headers.setdefault("Referrer-Policy", "no-referrer")
    response.headers.setdefault("X-Frame-Options", "DENY")
    if request.url.path.startswith(f"{API}/submissions"):
        response.headers.setdefault("Cache-Control", "no-store")
    return response
