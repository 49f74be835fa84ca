"""The xlwings renderer uses only calls that the installed xlwings really has.

The renderer is exercised on :class:`RecordingBook` (tests/addin/test_addin_render.py), which is
our own stand-in; this module holds that stand-in to the real thing: every property the
renderer sets is a settable property of the xlwings class, every method it calls takes the
keyword arguments it passes, and every option value (chart type, alignment, border style,
marker) passes xlwings' own validators.
"""

from __future__ import annotations

import inspect

import pytest
from xlwings import main as xw

SETTABLE = [
    (xw.Range, ["value", "formula", "number_format", "color", "wrap_text",
                "horizontal_alignment", "vertical_alignment", "column_width", "row_height"]),
    (xw.Font, ["name", "size", "bold", "italic", "color"]),
    (xw.Borders, ["line_style", "weight", "color"]),
    (xw.Border, ["line_style", "weight", "color"]),
    (xw.Chart, ["title"]),
    (xw.App, ["screen_updating"]),
]


@pytest.mark.parametrize(("cls", "names"), SETTABLE, ids=[c.__name__ for c, _ in SETTABLE])
def test_properties_the_renderer_sets_exist_and_are_settable(cls, names):
    for name in names:
        prop = inspect.getattr_static(cls, name)
        assert isinstance(prop, property) and prop.fset is not None, f"{cls.__name__}.{name}"


def _params(func):
    return set(inspect.signature(func).parameters)


def test_methods_the_renderer_calls_take_its_arguments():
    assert {"anchor", "width", "height", "chart_type", "source", "plot_by"} <= _params(
        xw.Charts.add)
    assert {"name", "marker_style", "line_color", "marker_foreground_color"} <= _params(
        xw.ChartSeries.set)
    assert "source" in _params(xw.Chart.set_x_axis_values)
    assert {"name", "after"} <= _params(xw.Sheets.add)
    assert {"name", "refers_to"} <= _params(xw.Names.add)
    assert "frozen_range" in _params(xw.FreezePanes.freeze_at)
    assert callable(xw.Range.merge) and callable(xw.Sheet.clear)
    assert callable(xw.Borders.__getitem__)
    assert isinstance(inspect.getattr_static(xw.Range, "borders"), property)
    assert isinstance(inspect.getattr_static(xw.Range, "font"), property)
    assert isinstance(inspect.getattr_static(xw.Range, "data_validation"), property)
    assert callable(xw.DataValidation.set_list)
    assert isinstance(inspect.getattr_static(xw.Sheet, "freeze_panes"), property)
    assert isinstance(inspect.getattr_static(xw.Chart, "series"), property)
    assert isinstance(inspect.getattr_static(xw.Book, "selection"), property)
    assert isinstance(inspect.getattr_static(xw.Name, "refers_to_range"), property)
    assert {"prompt", "title"} <= _params(xw.App.alert)


def test_option_values_pass_xlwings_validators():
    for kind in ("xy_scatter_lines", "column_clustered"):
        assert xw._chart_type(kind) == kind
    assert xw._chart_plot_by("columns") == "columns"
    for align in ("left", "center", "right"):
        assert xw._horizontal_alignment(align) == align
    assert xw._vertical_alignment("center") == "center"
    assert xw._border_line_style("continuous") == "continuous"
    for weight in ("thin", "medium"):
        assert xw._border_weight(weight) == weight
    for marker in ("circle", "diamond", "square", "none"):
        assert xw._chart_marker_style(marker) == marker
    assert xw._border_side("edge_bottom") == "edge_bottom"
