"""``tablegen value d|D|Y``: rotation functions and spherical harmonics on the command line.

Outside references, named beside each check:
* sympy.physics.quantum.spin.Rotation.d / Rotation.D: by their docstrings and a check of
  d^1_{10}, <j m'| exp(-i beta Jy) |j m> with D = exp(-i m' alpha) d exp(-i m gamma), the
  same definition as tablegen's, so they are compared element by element;
* sympy.physics.wigner.wigner_d_small(J, beta)[J-m', J-m] is exp(+i beta Jy) by its
  docstring, so tablegen's d(beta) is compared with it at -beta;
* sympy.Ynm (Condon-Shortley phase) for the spherical harmonics;
* handbook closed forms of d^{1/2} and d^1 (Edmonds 1957, ch. 4, table of d^j; from memory).
Bad input: one line on stderr naming the argument and the rule, exit 2, no traceback.
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
from fractions import Fraction
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
import sympy
from sympy.physics.quantum.spin import Rotation
from sympy.physics.wigner import wigner_d_small

from tablegen import cli

ROOT = Path(__file__).resolve().parent.parent
R = sympy.Rational
BETA, ALPHA, GAMMA = sympy.symbols("beta alpha gamma", real=True)
THETA, PHI = sympy.symbols("theta phi", real=True)
SYMBOLS = {"beta": BETA, "alpha": ALPHA, "gamma": GAMMA, "theta": THETA, "phi": PHI}


def _run(capsys, argv):
    status = cli.main(argv)
    out, err = capsys.readouterr()
    return status, out, err


def _field(out: str, name: str) -> str:
    for line in out.splitlines():
        if line.strip().startswith(name + " "):
            return line.strip()[len(name):].strip()
    raise AssertionError(f"no {name!r} line in {out!r}")


def _read(text: str):
    return sympy.sympify(text, locals=SYMBOLS)


def _same_function(a, b, points=(R(3, 10), R(11, 10), R(5, 2), -R(7, 10))) -> bool:
    """Equal at several angles to 40 digits (exact equality of trigonometric forms is slow in sympy)."""
    for x in points:
        subs = {s: x + k for k, s in enumerate((BETA, ALPHA, GAMMA, THETA, PHI))}
        if abs(sympy.N((a - b).subs(subs), 50)) > sympy.Float(10) ** -40:
            return False
    return True


def _halves(tj: int):
    return [R(k, 2) for k in range(tj, -tj - 1, -2)]


def _text(x) -> str:
    return str(x)


ALL_D = [(R(tj, 2), mp, m) for tj in range(0, 5) for mp in _halves(tj) for m in _halves(tj)]


# ---------------------------------------------------------------------------
# the function
# ---------------------------------------------------------------------------
@pytest.mark.parametrize("j, mp, m", ALL_D, ids=[f"{j},{mp},{m}" for j, mp, m in ALL_D])
def test_d_function_against_sympy(capsys, j, mp, m):
    status, out, err = _run(capsys, ["value", "d", _text(j), _text(mp), _text(m)])
    assert status == 0 and err == ""
    ours = _read(_field(out, "function"))
    # sympy Rotation.d(j, m', m, beta) = <j m'| exp(-i beta Jy) |j m> (its docstring)
    assert _same_function(ours, Rotation.d(j, mp, m, BETA).doit())
    # sympy wigner_d_small is exp(+i beta Jy) (its docstring): ours at beta equals it at -beta
    small = wigner_d_small(j, -BETA)[int(j - mp), int(j - m)]
    assert _same_function(ours, small)
    # the LaTeX speaks of beta exactly when the function depends on it
    assert ("\\beta" in _field(out, "latex")) == ("beta" in _field(out, "function"))


# Edmonds 1957, ch. 4 (table of d^{1/2} and d^1; from memory)
HANDBOOK = [
    (("1/2", "1/2", "1/2"), sympy.cos(BETA / 2)),
    (("1/2", "1/2", "-1/2"), -sympy.sin(BETA / 2)),
    (("1/2", "-1/2", "1/2"), sympy.sin(BETA / 2)),
    (("1", "1", "1"), (1 + sympy.cos(BETA)) / 2),
    (("1", "1", "0"), -sympy.sin(BETA) / sympy.sqrt(2)),
    (("1", "1", "-1"), (1 - sympy.cos(BETA)) / 2),
    (("1", "0", "0"), sympy.cos(BETA)),
    (("1", "0", "1"), sympy.sin(BETA) / sympy.sqrt(2)),
]


@pytest.mark.parametrize("args, closed", HANDBOOK, ids=[" ".join(a) for a, _ in HANDBOOK])
def test_d_handbook_closed_forms_exactly(capsys, args, closed):
    status, out, _ = _run(capsys, ["value", "d", *args])
    assert status == 0
    assert sympy.simplify(_read(_field(out, "function")) - closed) == 0


def test_d_function_text_and_latex_exact_output(capsys):
    status, out, _ = _run(capsys, ["value", "d", "1", "1", "0"])
    assert status == 0
    assert out.splitlines()[0] == "d^{1}_{1,0}(beta)"
    assert _field(out, "function") == "-sqrt(1/2)*sin(beta)"
    assert _field(out, "latex") == "-\\sqrt{\\frac{1}{2}}\\,\\sin \\beta"
    assert "exp(-i beta Jy)" in _field(out, "convention")


@pytest.mark.parametrize("j, mp, m", [(1, 1, 0), (R(3, 2), R(1, 2), R(-3, 2)), (2, -1, 2), (2, 0, 0)])
def test_D_function_against_sympy(capsys, j, mp, m):
    status, out, _ = _run(capsys, ["value", "D", str(j), str(mp), str(m)])
    assert status == 0
    # sympy Rotation.D(j, m', m, alpha, beta, gamma) = exp(-i m' alpha) d^j_{m'm}(beta) exp(-i m gamma)
    assert _same_function(_read(_field(out, "function")), Rotation.D(j, mp, m, ALPHA, BETA, GAMMA).doit())


@pytest.mark.parametrize("l, m", [(l, m) for l in range(0, 4) for m in range(-l, l + 1)])
def test_Y_function_against_sympy(capsys, l, m):
    status, out, _ = _run(capsys, ["value", "Y", str(l), str(m)])
    assert status == 0
    ours = _read(_field(out, "function"))
    # sympy.Ynm carries the Condon-Shortley phase (its docstring)
    assert sympy.simplify(ours - sympy.Ynm(l, m, THETA, PHI).expand(func=True)) == 0


# ---------------------------------------------------------------------------
# values
# ---------------------------------------------------------------------------
@pytest.mark.parametrize("j, mp, m", [x for x in ALL_D if x[0] <= 2])
def test_d_at_pi_over_2_exact_against_sympy(capsys, j, mp, m):
    status, out, _ = _run(capsys, ["value", "d", str(j), str(mp), str(m), "--beta", "pi/2"])
    assert status == 0
    reference = sympy.nsimplify(sympy.simplify(Rotation.d(j, mp, m, sympy.pi / 2).doit()))
    assert sympy.simplify(sympy.sympify(_field(out, "exact")) - reference) == 0


@pytest.mark.parametrize("args", [["3/2", "1/2", "-1/2"], ["2", "1", "0"], ["3", "-2", "1"]])
def test_d_at_rational_cosine(capsys, args):
    status, out, _ = _run(capsys, ["value", "d", *args, "--cos-beta", "1/3", "--digits", "30"])
    assert status == 0
    exact = sympy.sympify(_field(out, "exact"))
    assert (exact**2).is_rational  # +-sqrt(p/q) at a rational cosine (issue 9)
    j, mp, m = (R(a) for a in args)
    reference = Rotation.d(j, mp, m, sympy.acos(R(1, 3))).doit()
    assert abs(sympy.N(exact - reference, 50)) < sympy.Float(10) ** -45
    decimal = sympy.Float(_field(out, "decimal"), 40)
    assert abs(decimal - sympy.N(reference, 50)) <= abs(sympy.N(reference, 50)) * sympy.Float(10) ** -29


def test_d_at_radians_gives_a_decimal(capsys):
    status, out, _ = _run(capsys, ["value", "d", "2", "1", "-1", "--beta", "0.7", "--digits", "25"])
    assert status == 0
    assert _field(out, "exact").startswith("(no exact form")
    reference = sympy.N(Rotation.d(2, 1, -1, R(7, 10)).doit(), 60)
    got = sympy.Float(_field(out, "decimal"), 40)
    assert abs(got - reference) <= abs(reference) * sympy.Float(10) ** -24
    assert len(_field(out, "decimal").lstrip("-").replace(".", "").lstrip("0")) == 25


@pytest.mark.parametrize("angles", [["--alpha", "pi/3", "--beta", "pi/2", "--gamma", "pi/4"],
                                    ["--alpha", "-pi/2", "--cos-beta", "1/3", "--gamma", "2*pi/3"],
                                    ["--alpha", "pi", "--beta", "2*pi/3"]])
def test_D_exact_value_against_sympy(capsys, angles):
    status, out, _ = _run(capsys, ["value", "D", "3/2", "1/2", "-3/2", *angles, "--digits", "20"])
    assert status == 0
    exact = sympy.sympify(_field(out, "exact"))
    given = dict(zip(angles[::2], angles[1::2]))
    a = sympy.sympify(given.get("--alpha", "0"))
    g = sympy.sympify(given.get("--gamma", "0"))
    b = sympy.acos(sympy.sympify(given["--cos-beta"])) if "--cos-beta" in given else sympy.sympify(given["--beta"])
    reference = Rotation.D(R(3, 2), R(1, 2), R(-3, 2), a, b, g).doit()
    assert abs(sympy.N(exact - reference, 50)) < sympy.Float(10) ** -45
    decimal = sympy.sympify(_field(out, "decimal"))
    assert abs(sympy.N(decimal - reference, 40)) < sympy.Float(10) ** -18


def test_D_at_radians(capsys):
    status, out, _ = _run(capsys, ["value", "D", "1", "1", "0", "--alpha", "0.3", "--cos-beta", "1/2"])
    assert status == 0
    reference = Rotation.D(1, 1, 0, R(3, 10), sympy.pi / 3, 0).doit()
    assert abs(sympy.N(sympy.sympify(_field(out, "decimal")) - reference, 30)) < sympy.Float(10) ** -14


@pytest.mark.parametrize("l, m, theta, phi", [(2, 1, "pi/3", "pi/4"), (3, -2, "2*pi/3", "pi/2"), (0, 0, "pi/3", "1"),
                                              (4, 3, "pi/2", "-pi/3"), (1, -1, "pi", "pi/6")])
def test_Y_values_against_sympy(capsys, l, m, theta, phi):
    status, out, _ = _run(capsys, ["value", "Y", str(l), str(m), "--theta", theta, "--phi", phi, "--digits", "25"])
    assert status == 0
    reference = sympy.Ynm(l, m, sympy.sympify(theta), sympy.sympify(phi)).expand(func=True)
    if "pi" in phi:  # exact phase: an exact value
        assert sympy.simplify(sympy.sympify(_field(out, "exact")) - reference) == 0
    got = sympy.sympify(_field(out, "decimal"))
    assert abs(sympy.N(got - reference, 40)) <= sympy.Float(10) ** -23


def test_Y_at_rational_cos_theta(capsys):
    status, out, _ = _run(capsys, ["value", "Y", "2", "0", "--cos-theta", "1/3"])
    assert status == 0
    # Y_2^0 = sqrt(5/(16 pi)) (3 cos^2 - 1) (sympy.Ynm); at cos = 1/3: -(2/3) sqrt(5/(16 pi))
    assert sympy.simplify(sympy.sympify(_field(out, "exact")) - sympy.Ynm(2, 0, sympy.acos(R(1, 3)), 0).expand(func=True)) == 0


# ---------------------------------------------------------------------------
# zeros say why
# ---------------------------------------------------------------------------
@pytest.mark.parametrize("argv, rule", [
    (["value", "d", "1", "2", "0"], "m-range"),
    (["value", "d", "1", "0", "-3", "--beta", "pi/3"], "m-range"),
    (["value", "Y", "2", "3", "--theta", "1"], "m-range"),
    (["value", "d", "1", "0", "0", "--beta", "pi/2"], "angle"),  # d^1_00 = cos(beta)
    (["value", "d", "1", "1", "0", "--beta", "pi"], "angle"),  # -sin(beta)/sqrt(2)
    (["value", "Y", "1", "0", "--theta", "pi/2", "--phi", "0.3"], "angle"),
    (["value", "D", "1", "0", "0", "--alpha", "0.5", "--cos-beta", "0"], "angle"),
])
def test_zero_says_which_rule(capsys, argv, rule):
    status, out, _ = _run(capsys, argv)
    assert status == 0
    if "--beta" in argv or "--theta" in argv or "--cos-beta" in argv:
        assert _field(out, "exact") == "0" and _field(out, "decimal") == "0"
    assert _field(out, "zero by").startswith(rule + ":")


# ---------------------------------------------------------------------------
# JSON
# ---------------------------------------------------------------------------
def test_json_function_record(capsys):
    status, out, err = _run(capsys, ["value", "Y", "2", "-1", "--json"])
    assert status == 0 and err == "" and len(out.strip().splitlines()) == 1
    record = json.loads(out)
    assert record["format"] == 1
    assert record["kind"] == "Y" and record["arguments"] == {"l": "2", "m": "-1"}
    assert sympy.simplify(_read(record["function"]) - sympy.Ynm(2, -1, THETA, PHI).expand(func=True)) == 0
    assert record["zero_rule"] is None and "Condon-Shortley" in record["convention"]
    assert "function_latex" in record and "exact" not in record


def test_json_value_record(capsys):
    status, out, _ = _run(capsys, ["value", "--json", "--latex", "d", "1", "1", "-1", "--beta", "2*pi/3", "--digits", "30"])
    assert status == 0
    record = json.loads(out)
    # d^1_{1,-1} = (1 - cos beta)/2 = 3/4 at 2pi/3 (Edmonds 1957, ch. 4; from memory)
    assert record["exact"] == "3/4" and record["decimal"] == "0.750000000000000000000000000000"
    assert record["angles"] == {"beta": "2*pi/3"} and record["digits"] == 30
    assert record["latex"] == {"root": "\\frac{3}{4}", "rational": "\\frac{3}{4}"}
    assert record["zero_rule"] is None and record["symbol"] == "d^{1}_{1,-1}(2*pi/3)"


def test_json_decimal_only_value(capsys):
    status, out, _ = _run(capsys, ["value", "Y", "1", "1", "--theta", "0.5", "--phi", "0.25", "--json"])
    assert status == 0
    record = json.loads(out)
    assert record["exact"] is None
    reference = sympy.Ynm(1, 1, R(1, 2), R(1, 4)).expand(func=True)
    assert abs(sympy.N(sympy.sympify(record["decimal"]) - reference, 30)) < sympy.Float(10) ** -14


# ---------------------------------------------------------------------------
# bad input: one line, exit 2, no traceback
# ---------------------------------------------------------------------------
BAD = [
    (["value", "d", "1", "1"], ["3 arguments", "j mp m", "got 2"]),
    (["value", "d", "1/2", "1", "0"], ["mp", "'1'", "must be an integer"]),
    (["value", "d", "x", "0", "0"], ["argument j", "'x'", "not a number"]),
    (["value", "d", "1", "1", "0", "--beta", "abc"], ["--beta", "'abc'", "not an angle"]),
    (["value", "d", "1", "1", "0", "--cos-beta", "2"], ["--cos-beta", "'2'", "[-1, 1]"]),
    (["value", "d", "1", "1", "0", "--cos-beta", "1/0"], ["--cos-beta", "1/0", "not an exact rational"]),
    (["value", "d", "1", "1", "0", "--theta", "1"], ["--theta", "not an angle of d", "--beta"]),
    (["value", "Y", "1/2", "1/2"], ["argument l", "whole number"]),
    (["value", "Y", "2", "1", "--cos-theta", "1/2", "--theta", "1"], ["cos", "not both"]),
    (["value", "D", "1", "1", "0", "--alpha", "pi/0"], ["--alpha"]),
    (["value", "d", "1", "1", "0", "--digits", "0"], ["--digits", "0"]),
    (["value", "d", "1", "1", "0", "--frobnicate"], ["--frobnicate"]),
    (["value", "d", "3000", "1", "0"], ["argument j", "size limit"]),
]


@pytest.mark.parametrize("argv, words", BAD, ids=[" ".join(a[1:]) for a, _ in BAD])
def test_bad_input_one_line_exit_2(capsys, argv, words):
    status, out, err = _run(capsys, argv)
    assert status == 2, out
    assert out == ""
    lines = err.splitlines()
    assert len(lines) == 1, err
    assert "Traceback" not in err
    for word in words:
        assert word in lines[0], (word, lines[0])


def test_help_names_the_angles(capsys):
    try:
        status = cli.main(["value", "D", "--help"])
    except SystemExit as exc:  # argparse ends --help with SystemExit
        status = exc.code
    assert status == 0
    out = capsys.readouterr().out
    for word in ("--alpha", "--beta", "--gamma", "--cos-beta", "Condon-Shortley"):
        assert word in out


# ---------------------------------------------------------------------------
# start-up: no sympy, no jinja2; mpmath only for a decimal that needs it
# ---------------------------------------------------------------------------
_PROBE = """
import sys
from tablegen import cli
status = cli.main({argv!r})
print('RESULT', status, *(name in sys.modules for name in ('sympy', 'jinja2', 'mpmath')))
"""


def _probe(argv):
    env = dict(os.environ)
    env["PYTHONPATH"] = str(ROOT) + (os.pathsep + env["PYTHONPATH"] if env.get("PYTHONPATH") else "")
    proc = subprocess.run([sys.executable, "-c", _PROBE.format(argv=argv)], capture_output=True, text=True,
                          env=env, cwd=str(ROOT), timeout=120)
    assert proc.returncode == 0, proc.stderr
    return proc.stdout.strip().splitlines()[-1].split()[1:]


@pytest.mark.parametrize("argv, mpmath_expected", [
    (["value", "d", "2", "1", "0"], "False"),
    (["value", "d", "2", "1", "0", "--beta", "pi/3", "--latex"], "False"),
    (["value", "d", "5/2", "1/2", "-3/2", "--cos-beta", "1/3", "--json"], "False"),
    (["value", "Y", "3", "-2"], "False"),
    (["value", "D", "1", "1", "0", "--alpha", "pi", "--beta", "pi/2"], "False"),
    (["value", "D", "1/2", "1/2", "1/2", "--alpha", "pi", "--beta", "pi/3"], "False"),  # a quarter turn: -i * surd
    (["value", "d", "2", "1", "0", "--beta", "0.5"], "True"),
    (["value", "Y", "3", "-2", "--theta", "pi/3"], "True"),
    (["value", "d", "2", "1", "x"], "False"),
])
def test_value_path_imports(argv, mpmath_expected):
    status, sympy_loaded, jinja_loaded, mpmath_loaded = _probe(argv)
    assert status in ("0", "2")
    assert sympy_loaded == "False" and jinja_loaded == "False"
    assert mpmath_loaded == mpmath_expected


def test_subprocess_value_and_error():
    env = dict(os.environ)
    env["PYTHONPATH"] = str(ROOT)
    ok = subprocess.run([sys.executable, "-m", "tablegen", "value", "d", "1/2", "1/2", "-1/2", "--beta", "pi/3"],
                        capture_output=True, text=True, env=env, cwd=str(ROOT), timeout=120)
    assert ok.returncode == 0 and ok.stderr == ""
    assert _field(ok.stdout, "exact") == "-1/2"  # -sin(pi/6) (Edmonds 1957, ch. 4; from memory)
    bad = subprocess.run([sys.executable, "-m", "tablegen", "value", "d", "1", "1", "0", "--beta", "pi/"],
                         capture_output=True, text=True, env=env, cwd=str(ROOT), timeout=120)
    assert bad.returncode == 2 and "Traceback" not in bad.stderr and len(bad.stderr.splitlines()) == 1


_ANGLE_TEXT = st.text(alphabet="pi/*-+0123456789.π eI", min_size=0, max_size=10)


@settings(max_examples=120, deadline=None)
@given(st.sampled_from(["d", "D", "Y"]), st.lists(st.sampled_from(["0", "1", "1/2", "-1/2", "2", "-1", "3/2", "x"]), min_size=2, max_size=3),
       st.sampled_from(["--alpha", "--beta", "--gamma", "--theta", "--phi", "--cos-beta", "--cos-theta"]), _ANGLE_TEXT)
def test_fuzz_angles_never_a_traceback(key, args, option, angle):
    """Random arguments and angle texts: exit 0, or 2 with exactly one error line (never a traceback)."""
    import contextlib
    import io

    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        status = cli.main(["value", key, *args, f"{option}={angle}", "--digits", "12"])
    assert status in (0, 2), err.getvalue()
    if status == 2:
        assert out.getvalue() == "" and len(err.getvalue().splitlines()) == 1, err.getvalue()
    else:
        assert err.getvalue() == ""
