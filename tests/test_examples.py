"""The example scripts and the README's "From Python" examples run, and what they print holds up against
hand calculations with CoolProp (IAPWS-95 water) and the fluids library (ASME B36.10M inside diameters,
Colebrook friction factor)."""

from __future__ import annotations

import math
import re
import subprocess
import sys
from pathlib import Path

import pytest
from CoolProp.CoolProp import PropsSI
from fluids.friction import friction_factor
from fluids.piping import nearest_pipe

ROOT = Path(__file__).resolve().parents[1]
EXAMPLES = ROOT / "examples"
ATM = 101325.0  # [Pa] standard atmosphere (NIST SP 811): the zero of barg
ROUGHNESS = 0.045e-3  # [m] the default pipe class's carbon steel (README, "Your own criteria and pipe classes"); Sch 40


def _run(script: str, *args: str) -> subprocess.CompletedProcess[str]:
    return subprocess.run([sys.executable, str(EXAMPLES / script), *args], capture_output=True, text=True,
                          timeout=300, cwd=ROOT)


def _water(mass_flow: float | None, volume_flow: float | None, t_k: float, p_pa: float, nps: float
           ) -> tuple[float, float]:
    """Velocity [m/s] and drop per length [kPa/100 m] of water in NPS ``nps`` Sch 40, by hand."""
    rho, mu = PropsSI("D", "T", t_k, "P", p_pa, "Water"), PropsSI("V", "T", t_k, "P", p_pa, "Water")
    _, di, _, _ = nearest_pipe(NPS=nps, schedule="40")
    q = volume_flow if volume_flow is not None else mass_flow / rho  # type: ignore[operator]
    v = q / (math.pi * di**2 / 4)
    f = friction_factor(Re=rho * v * di / mu, eD=ROUGHNESS / di)
    return v, f * rho * v**2 / (2 * di) / 10.0


# -- examples/throughput_sweep.py ------------------------------------------------------------
@pytest.fixture(scope="module")
def sweep(tmp_path_factory) -> tuple[str, Path]:
    out = tmp_path_factory.mktemp("sweep")
    proc = _run("throughput_sweep.py", "--out", str(out), "--no-plugins")
    assert proc.returncode == 0, proc.stderr
    return proc.stdout, out


def _first_failure(flow: dict[str, float], t_k: float, p_pa: float, nps: float, v_max: float, dp_max: float) -> int:
    """First throughput [%] (80 ... 130 in 5 % steps) at which the hand calculation breaks a limit."""
    for percent in range(80, 135, 5):
        scaled = {k: x * percent / 100 for k, x in flow.items()}
        v, dp = _water(scaled.get("mass"), scaled.get("volume"), t_k, p_pa, nps)
        rho = PropsSI("D", "T", t_k, "P", p_pa, "Water")
        if v > min(v_max, 1.2199 * 100 / math.sqrt(rho)) or dp > dp_max:  # API RP 14E erosional, C = 100
            return percent
    return 0


def test_sweep_reports_each_line_and_writes_a_png(sweep):
    stdout, out = sweep
    tags = ["50-P-101", "50-P-102", "50-CW-110", "50-G-120", "50-ST-130", "50-HC-140"]
    assert [line.split()[0] for line in stdout.splitlines()[:6]] == tags
    png = out / "throughput_sweep.png"
    assert png.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n" and png.stat().st_size > 10_000


@pytest.mark.parametrize(("tag", "flow", "t_k", "p_pa", "nps", "v_max", "dp_max"), [
    # 60 t/h of water, 40 degC, 8 barg in NPS 4; pump-discharge: 3.5 m/s, 45 kPa/100 m (shipped set, common practice)
    ("50-P-101", {"mass": 60_000 / 3600}, 313.15, 8e5 + ATM, 4, 3.5, 45.0),
    # 300 m3/h of cooling water, 28 degC, 4 barg in NPS 8; cooling-water: 3 m/s, 35 kPa/100 m (common practice)
    ("50-CW-110", {"volume": 300 / 3600}, 301.15, 4e5 + ATM, 8, 3.0, 35.0),
])
def test_sweep_names_the_throughput_a_hand_calculation_gives(sweep, tag, flow, t_k, p_pa, nps, v_max, dp_max):
    expected = _first_failure(flow, t_k, p_pa, nps, v_max, dp_max)
    line = next(text for text in sweep[0].splitlines() if text.startswith(tag))
    match = re.search(r"needs upsizing from (\d+) %", line)
    assert expected and match, line
    assert int(match.group(1)) == expected


# -- examples/flowsheet_streams.py -----------------------------------------------------------
def test_flowsheet_example_sizes_every_stream():
    proc = _run("flowsheet_streams.py", "--no-plugins")
    assert proc.returncode == 0, proc.stdout + proc.stderr
    rows = {line.split()[0]: line.split() for line in proc.stdout.splitlines()[1:]}
    assert list(rows) == ["S-301", "S-302", "S-303", "S-304", "S-305"]
    assert all(row[-1] == "pass" for row in rows.values())
    # S-305: 45 kg/s of water at 28 degC and 4.5 bar abs; velocity in the printed NPS by hand.
    nps, velocity = rows["S-305"][2], float(rows["S-305"][3])
    v, _ = _water(45.0, None, 301.15, 4.5e5, float(nps))
    assert velocity == pytest.approx(v, abs=0.006)  # printed to two decimals


# -- README "From Python" ----------------------------------------------------------------------
def _readme_blocks() -> list[str]:
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    start = text.index("### From Python")
    end = text.index("\n## ", start)
    return re.findall(r"```python\n(.*?)```", text[start:end], flags=re.DOTALL)


def test_readme_examples_run(tmp_path, monkeypatch):
    blocks = _readme_blocks()
    assert len(blocks) >= 7  # one line, quantities, cases, streams, many lines, dask, DataFrames
    monkeypatch.chdir(tmp_path)
    namespace: dict[str, object] = {"__name__": "readme"}
    for number, block in enumerate(blocks, start=1):
        exec(compile(block, f"README.md (From Python, block {number})", "exec"), namespace)  # noqa: S102
    # What the README's lines must hold, from the definitions of the units (SI brochure; NIST SP 811):
    assert namespace["by_header"].flow.value == pytest.approx(45_000 / 3600, rel=1e-15)  # type: ignore[attr-defined]
    assert namespace["by_header"].pressure == pytest.approx(9e5 + ATM, rel=1e-15)  # type: ignore[attr-defined]
    # a bare bar is absolute: 5 bar = 5e5 Pa
    assert namespace["toluene"].pressure == pytest.approx(5e5, rel=1e-15)  # type: ignore[attr-defined]
    result = namespace["result"]
    v, dp = _water(45_000 / 3600, None, 303.15, 9e5 + ATM, float(result.nps))  # type: ignore[attr-defined]
    assert result.velocity_m_s == pytest.approx(v, rel=1e-4)  # type: ignore[attr-defined]
    assert result.dp_kpa_per_100m == pytest.approx(dp, rel=1e-3)  # type: ignore[attr-defined]
