"""The API's documents (pydantic models), error answers and upload body, for the OpenAPI schema."""

from typing import Any, Literal

from pydantic import BaseModel, Field

from ifccheck.service.uploads import TEXT_FIELDS


class ErrorBody(BaseModel):
    detail: str | list[Any] = Field(description="What was wrong, in one line")


class SubmissionReceived(BaseModel):
    id: str
    status: Literal["received"]


class RequirementStatus(BaseModel):
    identifier: str
    name: str
    met: bool
    failing: int


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
    requirements: list[RequirementStatus] | None = Field(
        default=None,
        description="The model-information audit, once finished: each requirement (the "
        "tool's, and a project IDS uploaded with the model) met or not, with its failing "
        "elements counted",
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


def errors(*codes: int) -> dict[int | str, dict[str, Any]]:
    text = {
        401: "Missing, unknown or revoked token",
        404: "No such submission or file for this token",
        413: "Upload larger than the service's limit",
        422: "Invalid upload or parameters",
    }
    return {c: {"model": ErrorBody, "description": text[c]} for c in codes}


UPLOAD_BODY = {
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
                    "ids": {
                        "type": "string",
                        "format": "binary",
                        "description": "A project's own IDS (buildingSMART IDS 1.0), audited "
                        "beside the tool's requirements, as for `ifccheck check --ids`",
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
                    "length_unit": {
                        "type": "string",
                        "maxLength": TEXT_FIELDS["length_unit"],
                        "description": "The length unit of a model that assigns none (m, cm, "
                        "mm, ft, in), as `ifccheck check --length-unit`; a model with its own "
                        "unit keeps it",
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
