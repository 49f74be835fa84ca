"""The one exception family of heatledger.

Every rejected input raises :class:`HeatLedgerError`, a subclass of :class:`ValueError`,
so both plain Python (``except ValueError``) and the spreadsheet layer can catch it. The
message always names the input, the value and the rule, and where it helps, what to do.
"""

from __future__ import annotations

__all__ = ["HeatLedgerError", "HeatLedgerWarning", "ProjectError"]


class HeatLedgerError(ValueError):
    """An input heatledger cannot accept.

    Parameters
    ----------
    message : str
        One line naming the input, the value and the rule broken. [-]
    where : str, optional
        Where the input came from (a TOML key, a sheet and cell, a function argument). [-]
    """

    def __init__(self, message: str, *, where: str | None = None) -> None:
        self.where = where
        super().__init__(f"{where}: {message}" if where else message)


class HeatLedgerWarning(UserWarning):
    """A result that is computed but deserves the user's attention (for example a fin that
    does not help, or a method used outside its stated validity)."""


class ProjectError(HeatLedgerError):
    """A project file (TOML or filled-in template) with one or more problems.

    Parameters
    ----------
    problems : list of (str, str)
        Every problem found, as ``(where, message)``: a key path such as
        ``constructions[2].layers[3].thickness_mm`` or a sheet and cell such as
        ``Layers!C7``. [-]
    source : str
        The file the problems were found in. [-]
    """

    def __init__(self, problems, *, source: str = "") -> None:
        self.problems = list(problems)
        self.source = source
        head = f"{source}: " if source else ""
        count = len(self.problems)
        lines = [f"{head}{count} problem{'s' if count != 1 else ''} in the project input"]
        lines += [f"  {where}: {msg}" for where, msg in self.problems]
        ValueError.__init__(self, "\n".join(lines))
        self.where = source or None
