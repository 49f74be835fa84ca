"""Regenerate the committed demo workbooks under ``workbooks/`` through the CLI.

Run ``python -m heatledger.sheet.workbooks [FOLDER]`` (default ``workbooks`` in the current
directory). It writes, with the ``heatledger`` command line itself:

- ``demo_project.toml``: the invented demo project (``heatledger demo --write-toml``);
- ``demo_template.xlsx``: the fill-in template filled with the demo (``heatledger template``);
- ``demo_audit.xlsx``: the audit workbook of the TOML file (``heatledger audit``).

Output is deterministic, so a test regenerates the files and fails on any drift.
"""

from __future__ import annotations

import sys
from pathlib import Path

__all__ = ["DEMO_FILES", "regenerate"]

#: The files :func:`regenerate` writes, in order.
DEMO_FILES = ("demo_project.toml", "demo_template.xlsx", "demo_audit.xlsx")


def regenerate(folder) -> list[Path]:
    """Write the demo files into ``folder`` with the CLI, replacing existing ones.

    Parameters
    ----------
    folder : str or path-like
        Target folder (created if missing). [-]

    Returns
    -------
    list of pathlib.Path
        The files written.

    Raises
    ------
    RuntimeError
        If a CLI command exits with a non-zero code.
    """
    from ..cli import main

    out = Path(folder)
    out.mkdir(parents=True, exist_ok=True)
    toml, template, audit = (out / name for name in DEMO_FILES)
    for argv in (["demo", "--write-toml", str(toml), "--force"],
                 ["template", "-o", str(template), "--force"],
                 ["audit", str(toml), "-o", str(audit), "--force", "--quiet"]):
        code = main(argv)
        if code != 0:
            raise RuntimeError(f"heatledger {' '.join(argv)} exited with {code}")
    return [toml, template, audit]


if __name__ == "__main__":  # pragma: no cover
    target = sys.argv[1] if len(sys.argv) > 1 else "workbooks"
    for path in regenerate(target):
        print(path)
