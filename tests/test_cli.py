"""The command line: demo, calc, materials; exit codes and messages."""

import json

from heatledger.cli import main


def test_demo_prints_table_and_cautions(capsys):
    assert main(["demo"]) == 0
    out = capsys.readouterr().out
    assert "EW1 timber-frame external wall" in out
    assert "U (2 s.f.)" in out
    assert "do not replace" in out


def test_calc_json_schema(tmp_path, capsys):
    assert main(["demo", "--write-toml", str(tmp_path / "d.toml")]) == 0
    assert main(["calc", str(tmp_path / "d.toml"), "--json"]) == 0
    data = json.loads(capsys.readouterr().out)
    c = data["constructions"][0]
    for key in ("total_resistance", "u_value", "u_value_reported", "interface_temperatures",
                "energy_residual"):
        assert key in c
    assert abs(c["energy_residual"]) < 1e-9
    if not c["corrections_applied"]:
        assert abs(c["u_value"] * c["total_resistance"] - 1.0) < 1e-12


def test_calc_missing_file(capsys):
    assert main(["calc", "no-such-file.toml"]) == 1
    assert "cannot read project file" in capsys.readouterr().err


def test_calc_bad_input_exit_code(tmp_path, capsys):
    p = tmp_path / "bad.toml"
    p.write_text('[[constructions]]\nname = "W"\n[[constructions.layers]]\nthickness_mm = 0\n'
                 'conductivity = 1\n', encoding="utf-8")
    assert main(["calc", str(p)]) == 1
    err = capsys.readouterr().err
    assert "constructions[1].layers[1].thickness_mm: must be greater than zero" in err


def test_materials_lists_sources(capsys):
    assert main(["materials"]) == 0
    assert "ISO 10456:2007 Table 3" in capsys.readouterr().out


def test_no_command_is_usage_error(capsys):
    assert main([]) == 2


def test_write_toml_does_not_replace_without_force(tmp_path, capsys):
    # DEVELOPERS.md, "Design rules": an existing file is not replaced unless the user asks (--force)
    target = tmp_path / "d.toml"
    target.write_text("mine", encoding="utf-8")
    assert main(["demo", "--write-toml", str(target)]) == 1
    assert target.read_text(encoding="utf-8") == "mine"
    assert "--force" in capsys.readouterr().err
    assert main(["demo", "--write-toml", str(target), "--force"]) == 0
    assert "invented" in target.read_text(encoding="utf-8").lower()
