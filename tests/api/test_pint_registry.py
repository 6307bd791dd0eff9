"""The quantities a result returns live in pint's application registry (issue 18): they add to the caller's own
quantities, follow ``pint.set_application_registry``, and boresize's extra units never clobber the caller's.

Each case runs in its own interpreter: the application registry is process-wide state."""

from __future__ import annotations

import os
import subprocess
import sys
import textwrap
from pathlib import Path

SRC = str(Path(__file__).resolve().parents[2] / "src")
LINE = ('make_line(tag="P-1", fluid="water", flow="45 t/h", pressure="9 barg", temperature="30 degC", '
        'length="120 m")')


def _run(code: str) -> str:
    env = {**os.environ, "PYTHONPATH": SRC + os.pathsep + os.environ.get("PYTHONPATH", "")}
    script = "import pint\nfrom boresize import make_line, size\nfrom boresize.units import parse_flow, parse_quantity\n" + textwrap.dedent(code)
    proc = subprocess.run([sys.executable, "-c", script], capture_output=True, text=True, timeout=120, env=env)
    assert proc.returncode == 0, proc.stderr
    return proc.stdout


def test_a_result_quantity_adds_to_one_of_the_application_registry():
    out = _run(f"""
        ureg = pint.get_application_registry()
        result = size({LINE}, plugins=False)
        total = result.velocity + ureg.Quantity(1, "m/s")
        assert abs(total.to("m/s").magnitude - (result.velocity_m_s + 1)) < 1e-12
        assert abs(result.drop_per_length.to("Pa/m").magnitude - result.dp_kpa_per_100m * 10) < 1e-9
        print(ureg.Quantity(2, "barg").to("kPa").magnitude)  # boresize's extra units were added there
    """)
    assert abs(float(out) - (200 + 101.325)) < 1e-9  # 2 bar gauge + 1 atm (101.325 kPa), NIST SP 811


def test_a_registry_the_caller_set_gets_the_results():
    _run(f"""
        mine = pint.UnitRegistry()
        pint.set_application_registry(mine)
        result = size({LINE}, plugins=False)
        assert result.velocity._REGISTRY is mine and result.density._REGISTRY is mine
        print(result.velocity + mine.Quantity(1, "ft/s"))
    """)


def test_the_callers_own_unit_definitions_are_kept():
    out = _run(f"""
        ureg = pint.get_application_registry()
        ureg.define("kPa_per_100m = 3 * Pa / m")          # the caller's own (odd) meaning
        ureg.define("scf = 0.03 * m**3")                   # and a plain-volume scf
        result = size({LINE}, plugins=False)
        assert ureg.Quantity(1, "kPa_per_100m").to("Pa/m").magnitude == 3   # not redefined
        assert abs(ureg.Quantity(1, "scf").to("m**3").magnitude - 0.03) < 1e-15
        assert abs(result.drop_per_length.to("Pa/m").magnitude - result.dp_kpa_per_100m * 10) < 1e-9
        assert ureg.Quantity(1, "Sm3").units == ureg.Unit("Sm3")              # a missing one was added
        # the parser keeps its own registry: the caller's units do not change what a cell means
        print(parse_quantity("10 barg", "pressure", "pressure"), parse_quantity("250 m3/h", "flow", "volume_flow"),
              parse_quantity("1 kPa/100 m", "limit", "drop_per_length"))
    """)
    barg, m3h, drop = map(float, out.split())
    assert abs(barg - (10e5 + 101325.0)) < 1e-6   # 10 bar gauge + 1 standard atmosphere (NIST SP 811)
    assert abs(m3h - 250 / 3600) < 1e-15      # m3/s
    assert abs(drop - 10.0) < 1e-12           # 1 kPa per 100 m = 10 Pa/m


def test_the_parser_still_reads_the_trades_units():
    out = _run("""
        print(parse_quantity("10 barg", "pressure", "pressure"), parse_quantity("250 m3/h", "flow", "volume_flow"))
        print(parse_flow("5 MMSCFD").value)
    """)
    barg, m3h = map(float, out.split()[:2])
    assert abs(barg - (10e5 + 101325.0)) < 1e-6 and abs(m3h - 250 / 3600) < 1e-15  # 1 atm = 101325 Pa, NIST SP 811
    # 5e6 scf/d * 0.028316846592 m3/scf (exact, NIST SP 811) / 86400 s/d
    assert abs(float(out.splitlines()[1]) - 5e6 * 0.028316846592 / 86400) < 1e-12
