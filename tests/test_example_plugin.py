"""The example in-house plugin, installed and uninstalled for real with pip in a throw-away venv.

The venv sees boresize and its dependencies through a .pth file that adds this environment's
site-packages, so only the plugin is installed into it. Acceptance of the issue: after ``pip install
plugins/acme-rack-minimum`` the criterion is listed by ``boresize criteria`` and applies to a service that
names it; the plugin's own tests pass against the installed package; after ``pip uninstall`` it is gone.
"""

from __future__ import annotations

import importlib.metadata
import importlib.util
import json
import os
import shutil
import subprocess
import sys
import sysconfig
import textwrap
from pathlib import Path

import pytest

import boresize
from boresize.pipes import nps_value

PLUGIN = Path(__file__).resolve().parents[1] / "plugins" / "acme-rack-minimum"
CRITERION = "acme-rack-min-nps"
CLI = "import sys; from boresize.cli import main; sys.exit(main(sys.argv[1:]))"

pytestmark = pytest.mark.slow  # about 20-40 s: a venv, a wheel build, three CLI runs with CoolProp


def _run(python: Path, *args: str, cwd: Path) -> subprocess.CompletedProcess[str]:
    env = {k: v for k, v in os.environ.items() if k not in ("PYTHONPATH", "PIP_REQUIRE_VIRTUALENV")}
    env.update(PIP_DISABLE_PIP_VERSION_CHECK="1", PYTHONDONTWRITEBYTECODE="1")
    return subprocess.run([str(python), *args], cwd=cwd, env=env, capture_output=True, text=True, timeout=300)


def _venv(root: Path) -> Path:
    """A venv without pip whose interpreter also sees this environment's site-packages (pip, pytest) and, first,
    the boresize under test (a worktree's, when the environment's editable install points at another tree)."""
    subprocess.run([sys.executable, "-m", "venv", "--without-pip", str(root)], check=True, timeout=120)
    python = root / ("Scripts/python.exe" if os.name == "nt" else "bin/python")
    purelib = _run(python, "-c", "import sysconfig; print(sysconfig.get_path('purelib'))", cwd=root).stdout.strip()
    here = sysconfig.get_path("purelib")
    tested = str(Path(boresize.__file__).resolve().parents[1])
    Path(purelib, "boresize-dev.pth").write_text(f"{tested}\nimport site; site.addsitedir({here!r})\n")
    return python


def _build_flags() -> list[str]:
    """Build without network when this environment's setuptools can build wheels by itself (>= 70.1)."""
    try:
        major, minor = (int(part) for part in importlib.metadata.version("setuptools").split(".")[:2])
    except (importlib.metadata.PackageNotFoundError, ValueError):
        return []
    return ["--no-build-isolation"] if (major, minor) >= (70, 1) else []


def _files(work: Path) -> tuple[Path, Path]:
    lines, criteria = work / "lines.csv", work / "criteria.toml"
    lines.write_text("tag,fluid,flow,pressure,temperature,service,location\n"
                     "U-1,water,0.5 t/h,4 barg,20 degC,utility-rack,pipe rack 3\n"
                     "U-2,water,0.5 t/h,4 barg,20 degC,utility-rack,unit 140 grade\n")
    criteria.write_text(textwrap.dedent(f"""
        [service.utility-rack]
        phase = "liquid"
        velocity = {{ max = "2 m/s" }}
        {CRITERION} = {{ min_nps = 2 }}
    """))
    return lines, criteria


def test_pip_install_lists_and_applies_the_criterion_and_uninstall_removes_it(tmp_path: Path):
    if importlib.util.find_spec("acme_rack_minimum") is not None:
        pytest.skip("acme-rack-minimum is installed in this environment; uninstall it to run this test")
    source = tmp_path / "acme-rack-minimum"  # a copy, so that the build leaves no files in the repository
    shutil.copytree(PLUGIN, source, ignore=shutil.ignore_patterns("build", "*.egg-info", "__pycache__"))
    python = _venv(tmp_path / "venv")
    lines, criteria = _files(tmp_path)

    before = _run(python, "-c", CLI, "criteria", cwd=tmp_path)
    assert before.returncode == 0 and CRITERION not in before.stdout

    install = _run(python, "-m", "pip", "install", "--no-deps", *_build_flags(), str(source), cwd=tmp_path)
    assert install.returncode == 0, install.stdout + install.stderr
    listed = _run(python, "-c", CLI, "criteria", cwd=tmp_path)
    assert f"{CRITERION:<18} ACME: lines on pipe racks at least NPS 2  [plugin acme-rack-minimum]" in listed.stdout

    sized = _run(python, "-c", CLI, "size", str(lines), "--criteria", str(criteria), "--json", cwd=tmp_path)
    assert sized.returncode == 0, sized.stderr
    rack, grade = json.loads(sized.stdout)["lines"]
    assert rack["nps"] == "2" and {"criterion": CRITERION, "status": "pass"}.items() <= rack["verdicts"][-2].items()  # line-feasibility closes every service
    assert nps_value(grade["nps"]) < 2  # off the rack the rule does not apply

    own_tests = _run(python, "-m", "pytest", "-q", "-p", "no:cacheprovider", str(source / "tests"), cwd=source)
    assert own_tests.returncode == 0, own_tests.stdout + own_tests.stderr

    removed = _run(python, "-m", "pip", "uninstall", "-y", "acme-rack-minimum", cwd=tmp_path)
    assert removed.returncode == 0, removed.stdout + removed.stderr
    after = _run(python, "-c", CLI, "criteria", cwd=tmp_path)
    assert after.returncode == 0 and CRITERION not in after.stdout
    orphan = _run(python, "-c", CLI, "size", str(lines), "--criteria", str(criteria), "--json", cwd=tmp_path)
    assert orphan.returncode == 2
    assert f"service.utility-rack.{CRITERION}: unknown criterion '{CRITERION}'" in orphan.stderr
