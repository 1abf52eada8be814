"""The one exception family of warpwise.

Every defect in user input (a file, a profile, a command-line value) is raised as a
:class:`WarpwiseError` subclass. Each carries the file it came from, what is wrong and,
where it applies, the coordinates of the defect, so that the command line can print one
line and exit with a non-zero code.

Examples
--------
>>> err = ProfileError("loop 2 is not closed", file="bar.txt", where=(10.0, 2.5))
>>> str(err)
'bar.txt: loop 2 is not closed at (10, 2.5)'

"""

from __future__ import annotations


class WarpwiseError(Exception):
    """Base of all errors that warpwise reports to a user.

    Parameters
    ----------
    message : str
        What is wrong, in plain words.
    file : str, optional
        The file (or other source) the defect was found in.
    where : tuple of float, optional
        Coordinates of the defect, in the drawing's length unit.

    """

    def __init__(
        self, message: str, *, file: str | None = None, where: tuple[float, float] | None = None
    ) -> None:
        self.message = message
        self.file = file
        self.where = where
        super().__init__(self.__str__())

    def __str__(self) -> str:
        text = self.message
        if self.where is not None:
            x, y = self.where
            text += f" at ({x:.6g}, {y:.6g})"
        if self.file:
            text = f"{self.file}: {text}"
        return text

    def with_file(self, file: str) -> WarpwiseError:
        """Return the same error with ``file`` set when it was not known yet."""
        if self.file is None:
            self.file = file
            self.args = (self.__str__(),)
        return self


class ProfileError(WarpwiseError):
    """The geometry of a profile is invalid (open, self-crossing, overlapping, empty...)."""


class InputFileError(WarpwiseError):
    """An input file is missing, unreadable, empty, corrupt or of an unknown kind."""


class UsageError(WarpwiseError):
    """A value given on the command line or to the API is missing or out of range."""


class AnalysisError(WarpwiseError):
    """The analysis failed a numerical check (singular system, residual too large...)."""
