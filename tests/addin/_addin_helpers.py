"""Checks shared by the no-raise tests of the spreadsheet functions (all families).

A spreadsheet function answers any cell values with a result or a one-line text that starts
with its own name and names one of its arguments; spilled results are rectangular rows of
plain cell values; numbers are finite.
"""

from __future__ import annotations

import math
from numbers import Real

from hypothesis import strategies as st

from heatledger_xl.registry import REGISTRY


def check_result(name: str, out: object, *, text_results: tuple[str, ...] = ()) -> None:
    """Assert that ``out`` is an acceptable answer of the spreadsheet function ``name``.

    ``text_results`` lists the functions whose answer may be a text that is not an error
    (it then need not start with the function's name).
    """
    spec = REGISTRY[name]
    if isinstance(out, str):
        assert "\n" not in out and len(out) <= 250
        if out.startswith(f"{name}: "):
            assert "unexpected problem" not in out, out
            arg_names = [a.name for a in spec.args]
            assert any(a in out for a in arg_names), f"{out!r} names none of {arg_names}"
        else:  # a text result, not an error: only these functions return text
            assert name in text_results, out
        return
    if isinstance(out, list):
        assert spec.spills and out and all(isinstance(r, list) and r for r in out)
        assert len({len(r) for r in out}) == 1, "spilled rows must have one width"
        for row in out:
            for cell in row:
                assert cell is None or isinstance(cell, (str, bool, int, float)), cell
                if isinstance(cell, float):
                    assert math.isfinite(cell)
        return
    assert isinstance(out, Real) and not isinstance(out, bool), out
    assert math.isfinite(out), out


def call_with_drawn(name: str, draw, ranges, scalars) -> object:
    """Call ``name`` with drawn arguments (``ranges`` for range arguments, ``scalars`` for
    the others), sometimes leaving trailing optional arguments out, as a spreadsheet may."""
    spec = REGISTRY[name]
    args = [draw(ranges if a.is_range else scalars) for a in spec.args]
    n_required = sum(not a.optional for a in spec.args)
    keep = draw(st.integers(min_value=n_required, max_value=len(args)))
    return spec.function(*args[:keep])


def check_bad_optional_named(name: str, bad: object) -> None:
    """Give each optional argument of ``name`` the value ``bad`` with every other argument
    blank; the answer must be a one-line text starting with the name and naming it (TRUE is
    a valid ``header`` flag and passed over)."""
    spec = REGISTRY[name]
    for i, a in enumerate(spec.args):
        if not a.optional or (a.name == "header" and bad is True):
            continue
        args = [None] * len(spec.args)
        args[i] = bad
        out = spec.function(*args)
        assert isinstance(out, str) and out.startswith(f"{name}: ") and a.name in out, (
            a.name, bad, out)
