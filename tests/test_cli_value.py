"""``tablegen value KIND ARGS``: one exact value on the command line.

Values are checked against sympy.physics.wigner (a general-purpose
reference); decimals against an exact integer computation (math.isqrt).
Bad input: one line on stderr naming the argument and the rule, exit status
2, never a traceback.
"""

from __future__ import annotations

import json
from fractions import Fraction
import os
import subprocess
import sys
from math import isqrt
from pathlib import Path

import pytest
import sympy
from sympy.physics.wigner import clebsch_gordan, racah, wigner_3j, wigner_6j, wigner_9j

from tablegen import Surd, cli

ROOT = Path(__file__).resolve().parent.parent
R = sympy.Rational


def _run(capsys, argv):
    status = cli.main(argv)
    out, err = capsys.readouterr()
    return status, out, err


def _field(out: str, name: str) -> str:
    for line in out.splitlines():
        if line.strip().startswith(name + " "):
            return line.strip()[len(name):].strip()
    raise AssertionError(f"no {name!r} line in {out!r}")


def _subprocess(*args: str, code: str | None = None) -> subprocess.CompletedProcess:
    env = dict(os.environ)
    env["PYTHONPATH"] = str(ROOT) + (os.pathsep + env["PYTHONPATH"] if env.get("PYTHONPATH") else "")
    cmd = [sys.executable, "-c", code] if code is not None else [sys.executable, "-m", "tablegen", *args]
    return subprocess.run(cmd, capture_output=True, text=True, env=env, cwd=str(ROOT), timeout=120)


def _rounded_digits(p: int, q: int, digits: int) -> str:
    """Significant digits of sqrt(p/q) for 0.1 <= sqrt(p/q) < 1, half-even, by isqrt."""
    num = p * 10 ** (2 * digits)
    a = isqrt(num // q)
    lhs, rhs = 4 * num, (2 * a + 1) ** 2 * q
    if lhs > rhs or (lhs == rhs and a % 2):
        a += 1
    chunks = []  # decimal text in chunks: Python's str() refuses ints of more than 4300 digits
    while a >= 10**1000:
        a, r = divmod(a, 10**1000)
        chunks.append(str(r).zfill(1000))
    return str(a) + "".join(reversed(chunks))


# ---------------------------------------------------------------------------
# values
# ---------------------------------------------------------------------------
CASES = [
    # kind, arguments, sympy reference
    ("cg", ["1", "1", "1/2", "-1/2", "3/2", "1/2"], clebsch_gordan(1, R(1, 2), R(3, 2), 1, R(-1, 2), R(1, 2))),
    ("cg", ["3/2", "-1/2", "1", "-1", "5/2", "-3/2"], clebsch_gordan(R(3, 2), 1, R(5, 2), R(-1, 2), -1, R(-3, 2))),
    ("3j", ["1", "1", "1", "1", "0", "-1"], wigner_3j(1, 1, 1, 1, 0, -1)),
    ("3j", ["2", "3/2", "1/2", "-1", "1/2", "1/2"], wigner_3j(2, R(3, 2), R(1, 2), -1, R(1, 2), R(1, 2))),
    ("6j", ["1", "1", "1", "1", "1", "1"], wigner_6j(1, 1, 1, 1, 1, 1)),
    ("6j", ["5/2", "2", "1/2", "1", "3/2", "2"], wigner_6j(R(5, 2), 2, R(1, 2), 1, R(3, 2), 2)),
    ("w", ["1", "2", "2", "1", "1", "2"], racah(1, 2, 2, 1, 1, 2)),
    ("9j", ["1", "1", "1", "1", "1", "1", "1", "1", "0"], wigner_9j(1, 1, 1, 1, 1, 1, 1, 1, 0)),
    ("9j", ["1/2", "1/2", "1", "1/2", "1/2", "0", "1", "1", "1"], wigner_9j(R(1, 2), R(1, 2), 1, R(1, 2), R(1, 2), 0, 1, 1, 1)),
]


@pytest.mark.parametrize("kind, args, reference", CASES, ids=[f"{c[0]}-{i}" for i, c in enumerate(CASES)])
def test_value_text(capsys, kind, args, reference):
    assert reference != 0
    status, out, err = _run(capsys, ["value", kind, *args])
    assert status == 0 and err == ""
    exact = _field(out, "exact")
    assert sympy.sympify(exact) == reference
    decimal = _field(out, "decimal")
    # 15 significant digits by default, agreeing with sympy to that precision
    significant = decimal.lstrip("-").replace(".", "").lstrip("0")
    assert len(significant) == 15, decimal
    assert abs(sympy.Float(decimal, 30) - reference.evalf(40)) <= abs(reference.evalf(40)) * R(1, 10**14)
    assert "zero by" not in out
    # the first line names the symbol with the arguments as given
    first = out.splitlines()[0]
    for a in args:
        assert a in first


def test_cg_example_exact_output(capsys):
    status, out, _ = _run(capsys, ["value", "cg", "1", "1", "1/2", "-1/2", "3/2", "1/2"])
    assert status == 0
    assert _field(out, "exact") == "sqrt(1/3)"
    # sqrt(1/3) = 0.577350269189625764509... (common practice, no source)
    assert _field(out, "decimal") == "0.577350269189626"


def test_digits_option(capsys):
    for digits in (1, 5, 40, 1000):
        status, out, _ = _run(capsys, ["value", "cg", "1", "1", "1/2", "-1/2", "3/2", "1/2", "--digits", str(digits)])
        assert status == 0
        decimal = _field(out, "decimal")
        assert decimal == "0." + _rounded_digits(1, 3, digits)
    status, out, _ = _run(capsys, ["value", "--digits=7", "6j", "1", "1", "1", "1", "1", "1"])
    assert status == 0 and _field(out, "decimal") == "0.1666667"  # 1/6 (Edmonds 1957, table 5; from memory)


def test_latex_option(capsys):
    status, out, _ = _run(capsys, ["value", "cg", "5/2", "1/2", "2", "-1", "1/2", "-1/2", "--latex"])
    reference = clebsch_gordan(R(5, 2), 2, R(1, 2), R(1, 2), -1, R(-1, 2))
    assert status == 0 and reference != 0
    latex = [line.split("latex", 1)[1].strip() for line in out.splitlines() if line.strip().startswith("latex")]
    assert len(latex) == 2 and latex[1].endswith("(rationalised)")
    value = Surd.from_square(Fraction(str(reference**2)), int(sympy.sign(reference)))
    assert latex[0] == value.latex("root")
    assert latex[1].replace("(rationalised)", "").strip() == value.latex("rational")
    # the Surd's LaTeX itself is checked against sympy in test_surd.py
    assert "\\sqrt" in latex[0] and "\\frac" in latex[0]


def test_json_option(capsys):
    status, out, err = _run(capsys, ["value", "6j", "5/2", "2", "1/2", "1", "3/2", "2", "--json", "--digits", "30"])
    assert status == 0 and err == ""
    assert len(out.strip().splitlines()) == 1
    record = json.loads(out)
    reference = wigner_6j(R(5, 2), 2, R(1, 2), 1, R(3, 2), 2)
    assert record["kind"] == "6j"
    assert sympy.sympify(record["exact"]) == reference
    # value = sign * sqrt(p/q), against sympy.physics.wigner's exact 6j
    assert record["sign"] == sympy.sign(reference) != 0
    assert sympy.Rational(int(record["p"]), int(record["q"])) == reference**2
    assert "square" not in record
    assert record["zero_rule"] is None
    assert record["digits"] == 30
    assert len(record["decimal"].lstrip("-").replace(".", "").lstrip("0")) == 30
    assert record["arguments"] == {"j1": "5/2", "j2": "2", "j3": "1/2", "j4": "1", "j5": "3/2", "j6": "2"}
    # the 6j has no phase choice of its own (Edmonds 1957, ch. 6): the record must not claim one
    assert "no phase choice" in record["convention"] and not record["convention"].startswith("Condon")


def test_json_with_latex_and_zero(capsys):
    status, out, _ = _run(capsys, ["value", "--json", "--latex", "cg", "1", "0", "1", "0", "1", "0"])
    assert json.loads(out)["convention"] == "Condon-Shortley phase"
    assert status == 0
    record = json.loads(out)
    assert record["exact"] == "0" and record["decimal"] == "0"
    assert (record["sign"], record["p"], record["q"]) == (0, "0", "1")
    assert record["zero_rule"].startswith("parity:")
    assert record["latex"] == {"root": "0", "rational": "0"}


def test_negative_half_integers_as_positional_arguments(capsys):
    status, out, err = _run(capsys, ["value", "cg", "1/2", "-1/2", "1/2", "1/2", "1", "0"])
    assert status == 0, err
    assert sympy.sympify(_field(out, "exact")) == clebsch_gordan(R(1, 2), R(1, 2), 1, R(-1, 2), R(1, 2), 0)
    # options anywhere, "--" accepted, and -1 as a projection
    status, out, err = _run(capsys, ["value", "3j", "--digits", "5", "1", "1", "0", "--", "-1", "1", "0"])
    assert status == 0, err
    assert sympy.sympify(_field(out, "exact")) == wigner_3j(1, 1, 0, -1, 1, 0)


@pytest.mark.parametrize(
    "args, rule",
    [
        (["cg", "1", "0", "1", "0", "1", "0"], "parity"),
        (["cg", "1", "1", "1", "1", "1", "1"], "m-sum"),
        (["cg", "1", "0", "1", "0", "3", "0"], "triangle"),
        (["6j", "1/2", "1/2", "1/2", "1", "1", "1"], "triad-sum"),
        (["9j", "1", "1", "3", "1", "1", "1", "1", "1", "1"], "triangle"),
    ],
)
def test_zero_says_which_rule(capsys, args, rule):
    status, out, _ = _run(capsys, ["value", *args])
    assert status == 0
    assert _field(out, "exact") == "0"
    assert _field(out, "zero by").startswith(rule + ":")


# ---------------------------------------------------------------------------
# bad input: one line, exit 2, no traceback
# ---------------------------------------------------------------------------
BAD = [
    # argv, words the single line must contain
    (["value", "7j", "1", "1", "1", "1", "1", "1"], ["KIND", "7j"]),
    (["value", "6j", "1", "1", "1"], ["6 arguments", "j1 j2 j3 j4 j5 j6", "got 3"]),
    (["value", "9j", "1", "1", "1", "1", "1", "1", "1", "1", "1", "1"], ["9 arguments", "got 10"]),
    (["value", "6j", "abc", "1", "1", "1", "1", "1"], ["j1", "'abc'", "not a number"]),
    (["value", "6j", "1", "1", "1", "1", "1", "0.3"], ["j6", "0.3", "not a multiple of 1/2"]),
    (["value", "6j", "1", "1", "1", "1", "1/3", "1"], ["j5", "1/3", "not a multiple of 1/2"]),
    (["value", "w", "1", "1", "-1", "1", "1", "1"], ["argument c", "-1", "j must be >= 0"]),
    (["value", "3j", "nan", "1", "1", "0", "0", "0"], ["j1", "nan", "NaN or infinity"]),
    (["value", "3j", "1", "1", "inf", "0", "0", "0"], ["j3", "inf", "NaN or infinity"]),
    (["value", "cg", "1", "1/2", "1", "0", "1", "1/2"], ["m1", "1/2", "j1 - m1 must be an integer"]),
    (["value", "9j", "1", "1", "1", "1", "1e9", "1", "1", "1", "0"], ["j22", "1e9", "size limit"]),
    (["value", "6j", "1", "1", "1", "1", "1", "1", "--digits", "0"], ["--digits", "0"]),
    (["value", "6j", "1", "1", "1", "1", "1", "1", "--digits", "-3"], ["--digits", "-3"]),
    (["value", "6j", "1", "1", "1", "1", "1", "1", "--digits", "x"], ["--digits", "x"]),
    (["value", "6j", "1", "1", "1", "1", "1", "1", "--max-j", "-1"], ["--max-j", "-1"]),
    (["value", "6j", "1", "1", "1", "1", "1", "1", "--frobnicate"], ["--frobnicate"]),
    (["value"], ["KIND"]),
    (["frobnicate"], ["frobnicate"]),
]


@pytest.mark.parametrize("argv, words", BAD, ids=[" ".join(a[0]) for a in BAD])
def test_bad_input_one_line_exit_2(capsys, argv, words):
    status, out, err = _run(capsys, argv)
    assert status == 2
    assert out == ""
    lines = err.splitlines()
    assert len(lines) == 1, err
    assert "Traceback" not in err
    for word in words:
        assert word in lines[0], (word, lines[0])


def test_max_j_option_lets_a_larger_j_through(capsys):
    status, _, err = _run(capsys, ["value", "6j", "5001", "5001", "0", "0", "0", "5001"])
    assert status == 2 and "size limit 5000" in err and "--max-j" in err
    status, out, err = _run(capsys, ["value", "6j", "5001", "5001", "0", "0", "0", "5001", "--max-j", "5001"])
    assert status == 0, err
    # above the kind's one-value limit: one warning line about time and memory
    assert err.startswith("tablegen: warning: j = 5001 is above the 6j limit 5,000") and "memory" in err
    assert len(err.splitlines()) == 1
    # {a b 0; 0 0 b}-type symbols reduce to (-1)^(a+b+c) / sqrt((2a+1)(2b+1)); here compared with sympy
    assert sympy.sympify(_field(out, "exact")) == wigner_6j(5001, 5001, 0, 0, 0, 5001)


def _status_or_exit(argv) -> int:
    """argparse ends --help/--version with SystemExit; either form of success is fine."""
    try:
        return cli.main(argv)
    except SystemExit as exc:
        return exc.code


def test_help_and_version_do_not_trace(capsys):
    assert _status_or_exit(["--version"]) == 0
    assert "tablegen" in capsys.readouterr().out
    assert _status_or_exit(["value", "--help"]) == 0
    out = capsys.readouterr().out
    assert "KIND" in out and "--digits" in out


# ---------------------------------------------------------------------------
# subprocess runs
# ---------------------------------------------------------------------------
def test_subprocess_value():
    proc = _subprocess("value", "cg", "1", "1", "1/2", "-1/2", "3/2", "1/2", "--digits", "20")
    assert proc.returncode == 0, proc.stderr
    assert proc.stderr == ""
    assert _field(proc.stdout, "exact") == "sqrt(1/3)"
    assert _field(proc.stdout, "decimal") == "0." + _rounded_digits(1, 3, 20)


def test_subprocess_bad_input():
    proc = _subprocess("value", "6j", "1", "1", "1", "1", "1", "x")
    assert proc.returncode == 2
    assert proc.stdout == ""
    assert "Traceback" not in proc.stderr
    assert proc.stderr.splitlines() == ["tablegen: error: argument j6 = 'x': not a number"]


_IMPORT_PROBE = """
import sys
from tablegen import Surd, cli
status = cli.main({argv!r})
print('RESULT', status, 'sympy' in sys.modules, 'jinja2' in sys.modules)
"""


def _probe(argv: list[str]) -> tuple[str, str, str]:
    proc = _subprocess(code=_IMPORT_PROBE.format(argv=argv))
    assert proc.returncode == 0, proc.stderr
    last = proc.stdout.strip().splitlines()[-1].split()
    assert last[0] == "RESULT"
    return last[1], last[2], last[3]


@pytest.mark.parametrize(
    "argv",
    [
        ["value", "6j", "1", "1", "1", "1", "1", "1"],
        ["value", "cg", "3/2", "1/2", "1", "-1", "5/2", "-1/2", "--latex", "--json", "--digits", "50"],
        ["value", "9j", "1", "2", "3", "2", "1", "3", "3", "3", "2", "--latex"],
        ["value", "3j", "40", "30", "20", "5", "-7", "2", "--latex"],
        ["value", "6j", "1", "1", "1", "1", "1", "x"],
    ],
)
def test_value_path_imports_neither_sympy_nor_jinja2(argv):
    status, sympy_loaded, jinja_loaded = _probe(argv)
    assert status in ("0", "2")
    assert sympy_loaded == "False"
    assert jinja_loaded == "False"


def test_value_path_latex_of_a_large_symbol_imports_no_sympy():
    _, sympy_loaded, _ = _probe(["value", "6j", "37", "41", "43", "47", "53", "59", "--latex"])
    assert sympy_loaded == "False"


def test_digits_above_4300_no_traceback():
    proc = _subprocess("value", "cg", "1", "1", "1/2", "-1/2", "3/2", "1/2", "--digits", "5000")
    assert "Traceback" not in proc.stderr
    assert proc.returncode == 0
    assert _field(proc.stdout, "decimal") == "0." + _rounded_digits(1, 3, 5000)
