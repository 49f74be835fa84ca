"""The one exception family of heatledger.

Every rejected input raises :class:`HeatLedgerError`, a subclass of :class:`ValueError`,
so both plain Python (``except ValueError``) and the spreadsheet layer can catch it. The
message always names the input, the value and the rule, and where it helps, what to do.
"""

from __future__ import annotations

__all__ = ["HeatLedgerError", "HeatLedgerWarning"]


class HeatLedgerError(ValueError):
    """An input heatledger cannot accept.

    Parameters
    ----------
    message : str
        One line naming the input, the value and the rule broken.
    where : str, optional
        Where the input came from (a TOML key, a sheet and cell, a function argument).
    """

    def __init__(self, message: str, *, where: str | None = None) -> None:
        self.where = where
        super().__init__(f"{where}: {message}" if where else message)


class HeatLedgerWarning(UserWarning):
    """A result that is computed but deserves the user's attention (for example a fin that
    does not help, or a method used outside its stated validity)."""
