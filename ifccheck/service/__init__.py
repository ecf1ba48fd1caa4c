"""service stage: `ifccheck serve`, the check as an HTTP service.

FastAPI application (:func:`create_app`) over an embedded SQLite job store,
with jobs run in local worker processes or on a Dask cluster.
"""

from __future__ import annotations

from ifccheck.service.settings import ServiceConfig

__all__ = ["ServiceConfig", "create_app"]


def create_app(config: ServiceConfig, runner=None):
    """The ASGI application (see :mod:`ifccheck.service.app`)."""
    from ifccheck.service.app import create_app as make

    return make(config, runner)
