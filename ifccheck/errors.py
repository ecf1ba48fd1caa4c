"""One exception tree for the whole tool.

``InputError`` and its branches are the user's to fix: the CLI prints their
one-line message and exits 2, the service ends the submission with the same
line. ``OutOfScope`` says a design standard does not cover a section or
member: the beam is listed as not checked, never the run stopped. Anything
else escaping a command is a bug (exit 3).
"""

from __future__ import annotations


class IfccheckError(Exception):
    """Base of every error this tool raises on purpose; the message is one line."""


class InputError(IfccheckError):
    """Bad input: a model, settings file, demand file, quantity or command line to fix."""


class ModelError(InputError):
    """The file cannot be read as a model."""


class ElementError(ModelError):
    """One element of a model cannot be read (a profile, placement or body that makes no
    sense). The reader catches it and lists that element as not checked, or skips it with
    a warning; it reaches the command line only if a model-wide object is at fault."""


class SettingsError(InputError, ValueError):
    """A settings file or value that cannot be used; the message names the key."""


class DemandFileError(InputError, ValueError):
    """A demand (analysis) CSV that cannot be read."""


class IdsFileError(InputError, ValueError):
    """An IDS (information delivery specification) file that cannot be used."""


class QuantityError(InputError, ValueError):
    """Text that is not a quantity of the expected dimension."""


class UsageError(InputError):
    """A command-line argument or option that cannot be used."""


class OutOfScope(IfccheckError, ValueError):
    """A design standard does not cover this section, member or limit state."""


class UnstableBeamError(IfccheckError, ValueError):
    """A beam whose supports do not make it stable (a mechanism)."""


def one_line(exc: BaseException) -> str:
    """The first line of an exception's message, whitespace collapsed."""
    text = str(exc).strip()
    return " ".join(text.splitlines()[0].split()) if text else type(exc).__name__
