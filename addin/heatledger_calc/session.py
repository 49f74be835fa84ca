"""A headless Calc with the extension installed in a throw-away profile, driven over UNO.

:class:`CalcSession` installs an extension into a profile and shared-extension folder of its
own (nothing outside its work folder changes), starts ``soffice`` headless listening on a
pipe, and starts ``uno/driver.py`` under LibreOffice's Python, which connects to it; requests
go to the driver as JSON lines (see the driver). One session serves many documents, so a test
module starts LibreOffice once.
"""

from __future__ import annotations

import json
import os
import subprocess
import uuid
from importlib import resources
from pathlib import Path

from heatledger.errors import HeatLedgerError

from .build import NO_LIBREOFFICE, office_env, program_dir, soffice_path
from .install import install_extension, location_args

__all__ = ["NO_UNO", "uno_python", "CalcSession"]

NO_UNO = ("LibreOffice's Python cannot import uno; install the bridge and the Python "
          "component loader with `sudo apt-get install python3-uno "
          "libreoffice-script-provider-python` (Debian/Ubuntu)")


def uno_python() -> str:
    """A Python that can ``import uno`` (``HEATLEDGER_UNO_PYTHON``, LibreOffice's own
    ``program/python``, then ``/usr/bin/python3``)."""
    candidates = [os.environ.get("HEATLEDGER_UNO_PYTHON", "")]
    try:
        candidates.append(str(program_dir() / "python"))
    except HeatLedgerError:
        pass
    candidates.append("/usr/bin/python3")
    for exe in filter(None, candidates):
        if os.access(exe, os.X_OK) and subprocess.run(
                [exe, "-c", "import uno"], capture_output=True, timeout=60,
                env=office_env(), check=False).returncode == 0:
            return exe
    raise HeatLedgerError(NO_UNO)


class CalcSession:
    """Headless Calc with an extension installed, in a folder of its own.

    Parameters
    ----------
    workdir : Path
        Folder for the profile, the shared extensions and the logs. [-]
    oxt : Path
        The extension to install. [-]
    """

    def __init__(self, workdir: Path, oxt: Path):
        self.workdir = Path(workdir)
        self.oxt = Path(oxt)
        self.profile = self.workdir / "profile"
        self.shared = self.workdir / "shared"
        self.pipe = f"heatledger-{uuid.uuid4().hex[:12]}"
        self.soffice = None
        self.driver = None

    def start(self) -> CalcSession:
        """Install the extension, start soffice and the driver; wait until connected."""
        exe = soffice_path()
        if exe is None:
            raise HeatLedgerError(NO_LIBREOFFICE)
        python = uno_python()
        self.profile.mkdir(parents=True, exist_ok=True)
        self.shared.mkdir(parents=True, exist_ok=True)
        install_extension(self.oxt, shared=True, profile=self.profile,
                          shared_cache=self.shared)
        log = open(self.workdir / "soffice.log", "wb")  # noqa: SIM115 - closed in close()
        self.soffice = subprocess.Popen(
            [exe, *location_args(self.profile, self.shared), "--headless", "--invisible",
             "--norestore", "--nologo", "--nodefault", "--nolockcheck",
             f"--accept=pipe,name={self.pipe};urp;"], stdout=log, stderr=log,
            env=office_env())
        self._log = log
        driver = resources.files("heatledger_calc").joinpath("uno/driver.py")
        self.driver = subprocess.Popen([python, str(driver), self.pipe], stdin=subprocess.PIPE,
                                       stdout=subprocess.PIPE, text=True, env=office_env())
        if json.loads(self.driver.stdout.readline() or "{}").get("ready") is not True:
            self.close()
            raise HeatLedgerError("the UNO driver could not connect to LibreOffice; see "
                                  f"{self.workdir / 'soffice.log'}")
        return self

    def request(self, req: dict) -> dict:
        """Send one request to the driver and return its answer.

        Parameters
        ----------
        req : dict
            The request (see ``uno/driver.py``). [-]
        """
        self.driver.stdin.write(json.dumps(req) + "\n")
        self.driver.stdin.flush()
        line = self.driver.stdout.readline()
        if not line:
            raise HeatLedgerError("the UNO driver stopped; see "
                                  f"{self.workdir / 'soffice.log'}")
        answer = json.loads(line)
        if "failure" in answer:
            raise HeatLedgerError(f"Calc request failed: {answer['failure']}")
        return answer

    def close(self) -> None:
        """Quit LibreOffice and the driver (killed, by process id, if they hang)."""
        if self.driver is not None and self.driver.poll() is None:
            try:
                self.request({"op": "quit"})
            except (HeatLedgerError, OSError, ValueError):
                pass
            _stop(self.driver)
        if self.soffice is not None:
            _stop(self.soffice)
            self._log.close()


def _stop(proc: subprocess.Popen, wait_s: float = 20.0) -> None:
    try:
        proc.wait(timeout=wait_s)
    except subprocess.TimeoutExpired:
        proc.terminate()
        try:
            proc.wait(timeout=wait_s)
        except subprocess.TimeoutExpired:
            proc.kill()
            proc.wait()
    for stream in (proc.stdin, proc.stdout):
        if stream is not None:
            stream.close()
