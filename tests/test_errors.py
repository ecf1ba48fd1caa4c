"""The one error tree and its mapping to exit codes, by class."""

from __future__ import annotations

import inspect

import click
import pytest
from click.testing import CliRunner

from ifccheck import errors
from ifccheck.cli import EXIT_BAD_INPUT, EXIT_INTERNAL, CommandGroup, main


def test_every_error_is_in_the_tree():
    classes = [c for _, c in inspect.getmembers(errors, inspect.isclass)
               if issubclass(c, BaseException)]  # fmt: skip
    assert classes
    for c in classes:
        assert issubclass(c, errors.IfccheckError), c
    for c in (errors.ModelError, errors.SettingsError, errors.DemandFileError,
              errors.QuantityError, errors.UsageError):  # fmt: skip
        assert issubclass(c, errors.InputError)
    assert not issubclass(errors.OutOfScope, errors.InputError)


def test_the_modules_raise_the_tree_classes():
    from ifccheck.config import SettingsError
    from ifccheck.design import OutOfScope
    from ifccheck.ifc.reader import ModelError
    from ifccheck.loads.demand import DemandFileError
    from ifccheck.loads.statics import UnstableBeamError
    from ifccheck.service.jobs import JobError
    from ifccheck.service.uploads import UploadError
    from ifccheck.units import QuantityError

    assert SettingsError is errors.SettingsError and ModelError is errors.ModelError
    assert DemandFileError is errors.DemandFileError and QuantityError is errors.QuantityError
    assert OutOfScope is errors.OutOfScope and UnstableBeamError is errors.UnstableBeamError
    assert issubclass(JobError, errors.IfccheckError)
    assert issubclass(UploadError, errors.InputError)


def _group_raising(exc: BaseException) -> click.Group:
    @click.group(cls=CommandGroup)
    def g() -> None:
        pass

    @g.command()
    def boom() -> None:
        raise exc

    return g


@pytest.mark.parametrize(
    "exc, code",
    [
        (errors.ModelError("a.ifc: no beams"), EXIT_BAD_INPUT),
        (errors.SettingsError("settings: loads.live: bad"), EXIT_BAD_INPUT),
        (errors.UsageError("--cb must be positive"), EXIT_BAD_INPUT),
        (errors.OutOfScope("HSS: F7"), EXIT_BAD_INPUT),
        (KeyError("bug"), EXIT_INTERNAL),
        (ValueError("a ValueError is a bug, not bad input"), EXIT_INTERNAL),
    ],
)
def test_mapped_by_class_in_one_place(exc: BaseException, code: int):
    res = CliRunner().invoke(_group_raising(exc), ["boom"])
    assert res.exit_code == code
    lines = [ln for ln in res.output.splitlines() if ln.strip()]
    assert len(lines) == 1, res.output
    prefix = "ifccheck: error: " if code == EXIT_BAD_INPUT else "ifccheck: internal error: "
    assert lines[0].startswith(prefix)
    assert "Traceback" not in res.output


def test_usage_errors_are_one_line():
    for args in (["check"], ["check", "a.ifc", "--units", "furlongs"], ["nonsense"]):
        res = CliRunner().invoke(main, args)
        assert res.exit_code == EXIT_BAD_INPUT, args
        lines = [ln for ln in res.output.splitlines() if ln.strip()]
        assert len(lines) == 1 and lines[0].startswith("ifccheck: error: "), res.output


def test_long_input_is_not_echoed_in_full(tmp_path):
    res = CliRunner().invoke(main, ["strength", "W" * 10_000, "--lb", "3 m"])
    assert res.exit_code == EXIT_BAD_INPUT
    assert len(res.output) < 400


@pytest.mark.parametrize("args", [[], ["token"]], ids=["no command", "token without command"])
def test_a_group_without_its_command_is_one_line_naming_the_commands(args):
    res = CliRunner().invoke(main, args)
    assert res.exit_code == EXIT_BAD_INPUT
    lines = [ln for ln in res.output.splitlines() if ln.strip()]
    assert len(lines) == 1 and lines[0].startswith("ifccheck: error: "), res.output
    assert "missing command (one of" in lines[0] and "Usage:" not in lines[0]
