"""CLI commands of the workbook layer: template, audit, demo -o."""

from __future__ import annotations

import copy
import zipfile

import openpyxl
import pytest

from heatledger.cli import main
from heatledger.demo import demo_project


def test_template_then_audit_from_the_filled_template(tmp_path, capsys):
    tpl = tmp_path / "project.xlsx"
    assert main(["template", "-o", str(tpl)]) == 0
    out = tmp_path / "audit.xlsx"
    assert main(["audit", str(tpl), "-o", str(out)]) == 0
    assert "written to" in capsys.readouterr().out
    wb = openpyxl.load_workbook(out)
    assert wb.sheetnames[:3] == ["Cover", "Materials", "Summary"]
    names = [e.name for e in demo_project().constructions]
    for i, name in enumerate(names, 1):  # one sheet per construction, numbered in order
        assert any(s.startswith(f"{i:02d} {name[:10]}") for s in wb.sheetnames), name


def test_blank_template_has_no_rows(tmp_path):
    tpl = tmp_path / "blank.xlsx"
    assert main(["template", "-o", str(tpl), "--blank"]) == 0
    ws = openpyxl.load_workbook(tpl)["Constructions"]
    assert ws["A4"].value is None


def test_no_overwrite_without_force(tmp_path, capsys):
    out = tmp_path / "demo.xlsx"
    out.write_bytes(b"keep me")
    assert main(["demo", "-o", str(out)]) == 1
    err = capsys.readouterr().err
    assert "exists" in err and "--force" in err and len(err.strip().splitlines()) == 1
    assert out.read_bytes() == b"keep me"
    assert main(["demo", "-o", str(out), "--force"]) == 0
    assert zipfile.is_zipfile(out)
    assert main(["template", "-o", str(out)]) == 1
    assert main(["audit", str(out), "-o", str(out)]) == 1


def test_demo_without_output_still_prints_the_table(capsys):
    assert main(["demo"]) == 0
    assert "U (2 s.f.)" in capsys.readouterr().out


def test_bad_template_fails_naming_the_cell_and_writes_nothing(tmp_path, capsys):
    tpl = tmp_path / "project.xlsx"
    assert main(["template", "-o", str(tpl)]) == 0
    wb = openpyxl.load_workbook(tpl)
    wb["Layers"]["E5"] = -140
    wb.save(tpl)
    out = tmp_path / "audit.xlsx"
    assert main(["audit", str(tpl), "-o", str(out)]) == 1
    err = capsys.readouterr().err
    assert "Layers!E5" in err
    assert not out.exists()
    assert sorted(p.name for p in tmp_path.iterdir()) == ["project.xlsx"]


@pytest.mark.parametrize("name, message", [("project.csv", "must be a project file"),
                                           ("missing.toml", "does not exist")])
def test_bad_input_names(tmp_path, capsys, name, message):
    src = tmp_path / name
    if name.endswith(".csv"):
        src.write_text("a,b\n")
    assert main(["audit", str(src), "-o", str(tmp_path / "a.xlsx")]) == 1
    assert message in capsys.readouterr().err


def test_output_must_be_xlsx(tmp_path, capsys):
    assert main(["template", "-o", str(tmp_path / "t.ods")]) == 1
    assert ".xlsx" in capsys.readouterr().err


def test_progress_for_many_constructions(tmp_path, capsys):
    raw = {k: copy.deepcopy(v) for k, v in demo_project().raw.items()
           if k in ("project", "design", "materials", "constructions")}  # no rooms
    base = raw["constructions"]
    raw["constructions"] = [dict(copy.deepcopy(base[i % len(base)]), name=f"C{i:02d}")
                            for i in range(12)]
    src = tmp_path / "big.toml"
    src.write_text(_to_toml(raw), encoding="utf-8")
    assert main(["audit", str(src), "-o", str(tmp_path / "big.xlsx")]) == 0
    err = capsys.readouterr().err
    assert "construction 12/12" in err
    assert main(["audit", str(src), "-o", str(tmp_path / "q.xlsx"), "--quiet"]) == 0
    assert "construction" not in capsys.readouterr().err


def _to_toml(data) -> str:
    """Enough TOML for the project schema (tables, arrays of tables, scalars)."""
    def scalar(v):
        if isinstance(v, bool):
            return "true" if v else "false"
        if isinstance(v, (int, float)):
            return repr(v)
        return '"' + str(v).replace("\\", "\\\\").replace('"', '\\"') + '"'

    lines = []
    for key in ("project", "design"):
        lines.append(f"[{key}]")
        lines += [f"{k} = {scalar(v)}" for k, v in data.get(key, {}).items()]
    for mat in data.get("materials", []):
        lines.append("[[materials]]")
        lines += [f"{k} = {scalar(v)}" for k, v in mat.items()]
    for con in data.get("constructions", []):
        lines.append("[[constructions]]")
        lines += [f"{k} = {scalar(v)}" for k, v in con.items()
                  if k not in ("layers", "corrections")]
        for child in ("layers", "corrections"):
            for row in con.get(child, []):
                lines.append(f"[[constructions.{child}]]")
                lines += [f"{k} = {scalar(v)}" for k, v in row.items()]
    return "\n".join(lines) + "\n"
