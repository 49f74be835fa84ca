"""The functions' metadata through Microsoft's own custom-functions metadata generator
(npm package ``custom-functions-metadata``, the tool Office add-ins build their metadata
with): every function of the registry is declared in JSDoc as Office.js expects, the
generator must accept every name, parameter and description, and what it produces must be
what xlwings sends to Excel (``xlwings.server.custom_functions_meta``).

Needs node and npm (Debian: ``apt-get install nodejs npm``) and the npm registry; without
them the test is skipped locally and fails in CI (``CI`` set), where ``.ci/run`` installs
them.
"""

from __future__ import annotations

import json
import os
import shutil
import subprocess

import pytest

from tests.addin.test_addin_xlwings_server import xl  # noqa: F401  (the xlwings fixture)

#: Versions of the generator and of the TypeScript it parses with, pinned.
GENERATOR = ("custom-functions-metadata@2.2.3", "typescript@5.9.3")


@pytest.fixture(scope="module")
def generator(tmp_path_factory):
    """Path of the generator's command, installed from the npm registry."""
    node, npm = shutil.which("node"), shutil.which("npm")
    if not (node and npm):
        if os.environ.get("CI"):
            pytest.fail("node and npm are needed for the metadata check (apt-get install "
                        "nodejs npm)")
        pytest.skip("node and npm are not installed")
    folder = tmp_path_factory.mktemp("npm")
    proc = subprocess.run([npm, "install", "--no-audit", "--no-fund", "--silent",
                           *GENERATOR], cwd=folder, capture_output=True, text=True,
                          timeout=600, check=False)
    if proc.returncode != 0:
        message = f"npm install of the generator failed: {proc.stderr[-500:]}"
        if os.environ.get("CI"):
            pytest.fail(message)
        pytest.skip(message)
    return node, folder / "node_modules" / "custom-functions-metadata" / "cli.js"


def _jsdoc(spec) -> str:
    """One function declared as an Office.js custom function in JSDoc."""
    lines = ["/**", f" * {spec.description}", f" * @customfunction {spec.name} {spec.name}"]
    for a in spec.args:
        name = f"[{a.name}]" if a.optional else a.name
        lines.append(f" * @param {{any[][]}} {name} {a.doc}")
    lines += [" * @param {CustomFunctions.Invocation} invocation The calling cell.",
              " * @returns {any[][]} The result.", " * @requiresAddress",
              " * @requiresParameterAddresses", " */",
              f"function {spec.name.lower()}("
              f"{', '.join([*(a.name for a in spec.args), 'invocation'])}) {{}}", ""]
    return "\n".join(lines)


def test_every_function_passes_the_generator_and_matches_what_xlwings_sends(
        xl, generator, tmp_path):  # noqa: F811
    node, cli = generator
    specs = sorted(xl.registry.values(), key=lambda s: s.name)
    assert all("*/" not in s.description + "".join(a.doc for a in s.args) for s in specs)
    source = tmp_path / "functions.js"
    source.write_text("\n".join(_jsdoc(s) for s in specs), encoding="utf-8")
    out = tmp_path / "functions.json"
    proc = subprocess.run([node, str(cli), "generate", str(source), str(out)],
                          capture_output=True, text=True, timeout=300, check=False)
    # the generator lists its findings and says "Errors found" (its exit code stays 0)
    assert proc.returncode == 0 and "rror" not in proc.stdout + proc.stderr, \
        proc.stdout[-3000:] + proc.stderr[-500:]
    assert out.exists()
    made = {f["id"]: f for f in json.loads(out.read_text(encoding="utf-8"))["functions"]}
    sent = {f["id"]: f for f in xl.server.custom_functions_meta(xl.udfs)["functions"]}
    assert set(made) == set(sent) == {s.name for s in specs}
    for fid, f in made.items():
        g = sent[fid]
        assert (f["name"], f["description"]) == (g["name"], g["description"]), fid
        # the generator leaves out a result type of "any", xlwings states it
        assert (f["result"]["dimensionality"], f["result"].get("type", "any")) == \
               (g["result"]["dimensionality"], g["result"]["type"]), fid
        assert f.get("options", {}) == g.get("options", {}), fid
        assert [(p["name"], p["description"], p.get("optional", False), p["dimensionality"],
                 p["type"]) for p in f["parameters"]] == \
               [(p["name"], p["description"], p.get("optional", False), p["dimensionality"],
                 p["type"]) for p in g["parameters"]], fid
