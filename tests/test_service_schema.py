"""Property-based tests of the API from its own OpenAPI schema (schemathesis).

Every operation gets a bounded number of generated requests, with a valid
token, against a real server process; no answer may be a 5xx, and every
answer must be one the schema documents, in the documented shape.
"""

from __future__ import annotations

from pathlib import Path

import httpx
import pytest

schemathesis = pytest.importorskip("schemathesis")

from hypothesis import HealthCheck, settings  # noqa: E402
from schemathesis.checks import (  # noqa: E402
    content_type_conformance,
    not_a_server_error,
    response_schema_conformance,
    status_code_conformance,
)

from ifccheck.service.app import create_app  # noqa: E402
from ifccheck.service.client import ServerProcess, make_token  # noqa: E402
from ifccheck.service.settings import ServiceConfig  # noqa: E402

CHECKS = [
    not_a_server_error,
    status_code_conformance,
    response_schema_conformance,
    content_type_conformance,
]


@pytest.fixture(scope="module")
def live(tmp_path_factory):
    data = tmp_path_factory.mktemp("schema") / "data"
    token = make_token(data, "fuzz")
    with ServerProcess(data, "--workers", "1", "--max-upload", "64KiB") as server:
        server.token = token
        yield server


# The schema as the application generates it (no server is needed to build
# it); test_live_schema_is_this_schema checks the server serves the same one.
# (schemathesis.pytest.from_fixture would load it from the live server, but it
# does not work with pytest 9.)
SCHEMA = create_app(ServiceConfig(data_dir=Path("unused"))).openapi()
schema = schemathesis.openapi.from_dict(SCHEMA)


@schema.parametrize()
@settings(
    max_examples=15,
    deadline=None,
    suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much],
)
def test_api_follows_its_schema(case, live):
    case.call_and_validate(
        base_url=live.url,
        headers={"Authorization": f"Bearer {live.token}"},
        checks=CHECKS,
    )


def test_live_schema_is_this_schema(live):
    served = httpx.get(f"{live.url}/api/v1/openapi.json").json()
    assert served == SCHEMA


def test_schema_documents_the_api():
    paths = SCHEMA["paths"]
    assert {
        "/api/v1/health",
        "/api/v1/submissions",
        "/api/v1/submissions/{id}",
        "/api/v1/submissions/{id}/files/{name}",
    } <= set(paths)
    upload = paths["/api/v1/submissions"]["post"]["requestBody"]["content"]["multipart/form-data"]
    assert upload["schema"]["required"] == ["model"]
    assert "bearer" in str(SCHEMA["components"]["securitySchemes"]).lower()
