"""The record speaks the trade's words: no class or attribute names, no unexplained marks."""

from __future__ import annotations

import re

from heatledger.demo import demo_project
from heatledger.sheet.audit import CONFIDENCE_LEGEND, audit_plan
from heatledger.sheet.template import template_plan

#: A class attribute (DeclaredWindow.u_value), a dotted snake name (result.u_value), a
#: Python mapping word, or the bare "[M]" mark of the developers' notes.
CODE_NAME = re.compile(r"\b[A-Z][a-z]+(?:[A-Z][a-z0-9]*)+\.[a-z_]+\b|\b[a-z]+(?:_[a-z]+)+\."
                       r"[a-z_]+\b|\[M\]|\bmapping\)|\bNone\b|\bself\b")


def _texts(plan):
    for sheet in plan.sheets:
        for cell in sheet.cells():
            if isinstance(cell.value, str) and not cell.value.endswith(".toml"):
                yield sheet.name, cell.ref, cell.value


def test_the_pattern_catches_what_it_is_for():
    for text in ("DeclaredWindow.u_value", "GroundFloorU.u_value", "EN 12831-1 [M]",
                 "construction \"W\" (building mapping)", "ground_floor.u_value"):
        assert CODE_NAME.search(text), text
    assert not CODE_NAME.search("EN ISO 10077-1 clause 6, from glazing and frame")


def test_no_code_names_in_the_audit_or_the_template():
    hits = [(s, r, v) for plan in (audit_plan(demo_project()), template_plan())
            for s, r, v in _texts(plan) if CODE_NAME.search(v)]
    assert not hits, hits[:5]


def test_the_confidence_words_are_explained_on_the_cover():
    plan = audit_plan(demo_project())
    cover = [c.value for c in plan.sheet("Cover").cells() if isinstance(c.value, str)]
    assert CONFIDENCE_LEGEND in cover
    words = {w for v in cover for w in ("recalled", "read", "verified numerically", "typical")
             if w in v}
    assert "recalled" in words
