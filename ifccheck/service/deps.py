"""The routes' dependencies: the service, the caller's token and the caller's submission."""

from typing import Annotated

from fastapi import Depends, HTTPException, Request
from fastapi import Path as PathParam
from fastapi.security import HTTPAuthorizationCredentials, HTTPBearer

from ifccheck.service.core import Service
from ifccheck.service.store import JobRow

bearer = HTTPBearer(auto_error=False, description="A token made with `ifccheck token create NAME`")
Credentials = Annotated[HTTPAuthorizationCredentials | None, Depends(bearer)]
SubmissionId = Annotated[str, PathParam(description="A submission's id", max_length=64)]


def service_of(request: Request) -> Service:
    """The service the application runs (set up by create_app)."""
    service: Service = request.app.state.service
    return service


TheService = Annotated[Service, Depends(service_of)]


def unauthorised(message: str = "a valid bearer token is required") -> HTTPException:
    return HTTPException(401, message, headers={"WWW-Authenticate": "Bearer"})


def token_of(service: Service, creds: HTTPAuthorizationCredentials | None) -> str:
    """The id of the caller's token; 401 when it is missing, unknown or revoked."""
    if creds is None or creds.scheme.lower() != "bearer":
        raise unauthorised()
    assert service.verifier is not None
    token_id = service.verifier.verify(creds.credentials)
    if token_id is None:
        raise unauthorised("the token is unknown or revoked")
    return token_id


def require_token(service: TheService, creds: Credentials) -> str:
    return token_of(service, creds)


Token = Annotated[str, Depends(require_token)]


def own_submission(service: Service, token_id: str, id: str) -> JobRow:
    """The caller's submission; 404 for any other (another token's is not found either)."""
    assert service.store is not None
    job = service.store.job(id, token_id) if len(id) == 16 else None
    if job is None:
        raise HTTPException(404, "no such submission")
    return job


def submission(service: TheService, token_id: Token, id: SubmissionId) -> JobRow:
    return own_submission(service, token_id, id)


OwnSubmission = Annotated[JobRow, Depends(submission)]
