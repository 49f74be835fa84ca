"""The demo project shipped with heatledger: an invented scenario (a small office and a
dwelling extension with heat-sink and trench-heater fins), not a real building. It feeds
``heatledger demo``, the example rows of the fill-in template and many tests."""

from __future__ import annotations

from importlib import resources

__all__ = ["demo_bytes", "demo_project", "DEMO_RESOURCE"]

#: Package resource holding the demo project file.
DEMO_RESOURCE = "data/demo_project.toml"


def demo_bytes() -> bytes:
    """The demo project file (an invented scenario), as bytes.

    Returns
    -------
    bytes
    """
    return resources.files("heatledger").joinpath(DEMO_RESOURCE).read_bytes()


def demo_project():
    """The demo project (an invented scenario), parsed.

    Returns
    -------
    heatledger.project.Project
    """
    from .project import project_from_dict, tomllib

    data = demo_bytes()
    return project_from_dict(tomllib.loads(data.decode("utf-8")), source_bytes=data,
                             source_name="demo_project.toml")
