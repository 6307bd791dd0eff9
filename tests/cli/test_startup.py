"""What one line from the command line loads (issue 19: one line within the property floor + 0.3 s).

The time itself is measured by ``benchmarks/bench_scale.py --one-line``, never here; these tests keep out of a
one-line run the modules whose import was its start-up cost (each measured where it was taken out).
"""

from __future__ import annotations

import json
import subprocess
import sys

ONE_LINE = ["size", "--fluid", "water", "--flow", "10 t/h", "--pressure", "5 barg", "--temperature", "25 degC",
            "--length", "50 m", "--service", "pump-discharge", "--quiet"]
# scipy.special: the Wright omega of the friction factor is plain Python (hydraulics/wright.py);
# pint, and numpy and scipy that pint imports: the units of one line are in units/common.py's table;
# dask and what it brings (jinja2, yaml, psutil): pint loads without it on the command line when it loads;
# the optional outputs' modules: imported by their writers only
NOT_LOADED = ["pint", "numpy", "scipy", "dask", "jinja2", "yaml", "psutil", "pandas", "matplotlib", "openpyxl", "rich", "fpdf",
              "thermo", "chemicals"]


def _loaded_after(argv: list[str]) -> tuple[int, list[str]]:
    code = ("import json, sys\nfrom boresize.cli import main\ncode = main(json.loads(sys.argv[1]))\n"
            "print(json.dumps(sorted(sys.modules)))\nsys.exit(code)")
    proc = subprocess.run([sys.executable, "-c", code, json.dumps(argv)], capture_output=True, text=True)
    assert "Traceback" not in proc.stderr, proc.stderr
    return proc.returncode, json.loads(proc.stdout.splitlines()[-1])


def test_one_line_loads_none_of_the_heavy_modules() -> None:
    code, modules = _loaded_after(ONE_LINE)
    assert code == 0
    assert [name for name in NOT_LOADED if name in modules] == []


def test_one_line_with_a_criteria_file_loads_none_of_them() -> None:
    code, modules = _loaded_after([*ONE_LINE, "--criteria", "examples/demo-unit/criteria.toml"])
    assert code in (0, 1)  # 1: a criterion failed, which is a result
    assert [name for name in NOT_LOADED if name in modules] == []


def test_dask_still_imports_after_pint_loaded_without_it() -> None:
    code = ("import importlib.util, sys\n"
            "from boresize.units.quantities import leave_dask_out_of_pint, parse_quantity, registry\n"
            "leave_dask_out_of_pint()\n"
            "registry()\n"
            "print('dask' in sys.modules, parse_quantity('2 bar', 'p', 'pressure_difference'))\n"
            "if importlib.util.find_spec('dask') is not None:\n"
            "    import dask\n"
            "    print(dask.__name__)\n")
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True).stdout.split()
    assert out[:2] == ["False", "200000.0"]  # 1 bar = 1e5 Pa exactly (NIST SP 811 B.8)
    assert out[2:] in ([], ["dask"])
