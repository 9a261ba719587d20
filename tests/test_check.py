"""``tablegen check FILE``: another program's floats judged against the exact values.

The "other program" here is sympy.physics.wigner, evaluated to a float via
sympy (``float(ref.evalf(40))``): its rows must agree.  Planted errors (a sign
flip, one ulp off, off by 1e-10, a non-zero where a selection rule forbids
one, a zero where none is) must each be found and named.  The ulp measure is
checked against sympy's own arithmetic at 60 digits.
"""

from __future__ import annotations

import csv
import io
import math
from fractions import Fraction

import pytest
import sympy
from sympy.physics.wigner import clebsch_gordan, racah, wigner_3j, wigner_6j, wigner_9j

from tablegen import cli
from tablegen.check import BadRow, check_rows, judge, parse_rtol, read_float, ulp_exponent
from tablegen.values import Surd

R = sympy.Rational
HALF_ULP = Fraction(1, 2) + Fraction(1, 2**60)  # the measure is exact to 2**-62 ulp


def _reference(kind: str, args: list[str]):
    """sympy.physics.wigner's exact value (its argument orders differ from ours)."""
    a = [R(x) for x in args]
    if kind == "cg":
        j1, m1, j2, m2, J, M = a
        return clebsch_gordan(j1, j2, J, m1, m2, M)
    if kind == "3j":
        return wigner_3j(*a)
    if kind == "6j":
        return wigner_6j(*a)
    if kind == "w":
        return racah(*a)
    return wigner_9j(*a, prec=None)


def _float(ref) -> float:
    """The outside program's number: sympy evaluates to 40 digits, then rounds to a double."""
    return float(sympy.N(ref, 40))


CORRECT = [  # symbols evaluated by the outside reference; every row must agree
    ("cg", "1 1 1/2 -1/2 3/2 1/2"),
    ("cg", "2 -1 3/2 1/2 5/2 -1/2"),
    ("cg", "5/2 1/2 2 -1 1/2 -1/2"),
    ("3j", "2 2 2 1 -1 0"),
    ("3j", "7/2 3 1/2 1/2 -1 1/2"),
    ("6j", "5/2 2 1/2 1 3/2 2"),
    ("6j", "4 3 2 1 3 3"),
    ("w", "1 2 3/2 1/2 1 3/2"),
    ("w", "3 2 2 3 1 2"),
    ("9j", "1 1/2 1/2 1 1/2 3/2 1 1 2"),
    ("9j", "2 1 1 1 1 1 1 1 1"),
    ("3j", "1 1 1 0 0 0"),  # zero by parity, given as 0.0
    ("6j", "1 1 5 1 1 1"),  # zero by the triangle rule, given as -0.0
]


def _rows() -> list[list[str]]:
    rows = [["kind", "arguments", "value", "note"]]
    for kind, args in CORRECT:
        ref = _reference(kind, args.split())
        value = _float(ref) if ref != 0 else (0.0 if kind == "3j" else -0.0)
        rows.append([kind, args, repr(value), "outside reference"])
    # planted errors (lines 15..20)
    six = _float(wigner_6j(R(5, 2), 2, R(1, 2), 1, R(3, 2), 2))
    rows.append(["6j", "5/2 2 1/2 1 3/2 2", repr(-six), "sign flip"])  # line 15
    cg = _float(clebsch_gordan(2, R(3, 2), R(5, 2), -1, R(1, 2), R(-1, 2)))
    rows.append(["cg", "2 -1 3/2 1/2 5/2 -1/2", repr(math.nextafter(cg, math.inf)), "one ulp up"])  # 16
    nine = _float(wigner_9j(1, R(1, 2), R(1, 2), 1, R(1, 2), R(3, 2), 1, 1, 2, prec=None))
    rows.append(["9j", "1 1/2 1/2 1 1/2 3/2 1 1 2", repr(nine * (1 + 1e-10)), "off by 1e-10"])  # 17
    rows.append(["3j", "1 1 1 0 0 0", "1e-17", "non-zero where parity forbids"])  # 18
    w = _float(racah(1, 2, R(3, 2), R(1, 2), 1, R(3, 2)))
    rows.append(["w", "1 2 3/2 1/2 1 3/2", "0", "zero where no rule is"])  # 19
    rows.append(["cg", "1/2 1/2 1/2 1/2 1 1", "1.0D0", "Fortran exponent, exactly 1"])  # 20
    assert w != 0
    return rows


def _csv(rows) -> str:
    buf = io.StringIO()
    csv.writer(buf, lineterminator="\n").writerows(rows)
    return buf.getvalue()


def test_planted_errors_are_found_and_correct_rows_agree():
    report = check_rows(csv.reader(io.StringIO(_csv(_rows()))), parse_rtol(None))
    assert not report.bad
    assert report.total.rows == len(CORRECT) + 6
    # the six planted rows: all but "one ulp up" and the exact 1.0D0 disagree
    assert report.total.agree == len(CORRECT) + 2
    problems = {d.line: d.explanation for d in report.disagreements}
    assert sorted(problems) == [15, 17, 18, 19]
    assert "sign wrong" in problems[15]
    assert "relative error 1e-10 > rtol 1e-12" in problems[17]
    assert "zero by parity: all m are 0 and j1 + j2 + j3 is odd, but given 1e-17" in problems[18]
    assert "given 0, but the value is" in problems[19] and "no selection rule" in problems[19]
    # the one-ulp row is the largest error of the CG rows, between 1/2 and 3/2 ulp
    cg = report.kinds["cg"]
    assert cg.worst_line == 16 and Fraction(1, 2) <= cg.worst <= Fraction(3, 2)
    # the correct rows of the other kinds are correctly rounded: within half an ulp
    for key in ("3j", "6j", "w"):
        assert report.kinds[key].worst <= HALF_ULP, key
    # overall, the 1e-10 row is the largest error (about 1e-10 / 2**-53 ulp)
    assert report.total.worst_line == 17 and 1e5 < float(report.total.worst) < 1e7


def test_cli_report_and_exit_status(tmp_path, capsys):
    path = tmp_path / "table.csv"
    path.write_text(_csv(_rows()))
    assert cli.main(["check", str(path)]) == 1
    out, err = capsys.readouterr()
    assert err == ""
    head = out.splitlines()[0]
    assert head.startswith(f"check {path}: 19 values, 15 agree to rtol 1e-12, 4 disagree; largest error")
    assert "(line 17)" in head
    assert any(line.startswith("  9j  3 values, 2 agree") for line in out.splitlines())
    # only the correct rows: exit 0
    good = tmp_path / "good.csv"
    good.write_text(_csv(_rows()[: len(CORRECT) + 1]))
    assert cli.main(["check", str(good)]) == 0
    out, _ = capsys.readouterr()
    assert f"{len(CORRECT)} agree" in out and "disagrees:" not in out
    # a looser tolerance forgives the 1e-10 row but never a sign
    assert cli.main(["check", str(path), "--rtol", "1e-9"]) == 1
    out, _ = capsys.readouterr()
    assert "disagrees: line 17" not in out and "disagrees: line 15" in out


def test_json_report_has_the_text_report_s_numbers(tmp_path, capsys):
    # check --json: one object on stdout, with the format version, the same counts and the same
    # four planted disagreements the text report names (sympy's rows agree, see _rows)
    import json

    from tablegen.commands import JSON_FORMAT

    path = tmp_path / "table.csv"
    path.write_text(_csv(_rows()))
    assert cli.main(["check", str(path), "--json"]) == 1
    out, err = capsys.readouterr()
    assert err == "" and len(out.splitlines()) == 1
    record = json.loads(out)
    assert record["format"] == JSON_FORMAT and record["file"] == str(path) and record["rtol"] == "1e-12"
    assert (record["values"], record["agree"], record["disagree"], record["bad_rows"]) == (19, 15, 4, 0)
    assert record["largest_error_line"] == 17 and 1e5 < float(record["largest_error_ulps"]) < 1e7
    assert record["kinds"]["9j"]["values"] == 3 and record["kinds"]["9j"]["agree"] == 2
    assert list(record["kinds"]) == [k for k in ("cg", "3j", "6j", "w", "9j") if k in record["kinds"]]
    problems = {d["line"]: d for d in record["disagreements"]}
    assert {n: d["problem"] for n, d in problems.items()} == {
        15: "sign", 17: "tolerance", 18: "zero-rule", 19: "nonzero"}
    assert problems[18]["zero_rule"] == "parity: all m are 0 and j1 + j2 + j3 is odd"
    assert problems[18]["exact"] == "0" and problems[18]["given"] == "1e-17"
    assert problems[15]["exact"] == "sqrt(7/180)" and problems[15]["given"].startswith("-0.1972")
    assert all(isinstance(d["explanation"], str) and d["symbol"] for d in record["disagreements"])


@pytest.mark.parametrize("argv, argument", [
    (["check", "/nonexistent.csv", "--json"], "FILE"),
    (["check", "x.csv", "--rtol", "abc", "--json"], "--rtol"),
    (["check", "x.csv", "--json", "--rtol", "2"], "--rtol"),
])
def test_json_errors_are_json_on_stderr(capsys, argv, argument):
    import json

    assert cli.main(argv) == 2
    out, err = capsys.readouterr()
    assert out == "" and len(err.splitlines()) == 1
    record = json.loads(err)
    assert record["format"] == 1 and record["error"]["argument"] == argument
    assert record["error"]["message"].startswith(f"argument {argument} = ")


def test_json_bad_rows_are_json_on_stderr_and_the_rest_checked(tmp_path, capsys):
    import json

    path = tmp_path / "bad.csv"
    path.write_text("kind,arguments,value\n6j,1 1 1 1 1 1,abc\n6j,1 1 1 1 1 1,0.16666666666666666\n7j,1 1,0.5\n")
    assert cli.main(["check", str(path), "--json"]) == 2
    out, err = capsys.readouterr()
    record = json.loads(out)
    assert (record["values"], record["agree"], record["bad_rows"]) == (1, 1, 2)
    errors = [json.loads(line) for line in err.splitlines()]
    assert [(e["format"], e["error"]["file"], e["error"]["line"]) for e in errors] == [(1, str(path), 2), (1, str(path), 4)]
    assert "column value = 'abc'" in errors[0]["error"]["message"]
    assert "column kind = '7j'" in errors[1]["error"]["message"]


def test_argument_columns_layout(tmp_path, capsys):
    ref = wigner_6j(2, 2, 2, 2, 2, 2)
    rows = [["Kind", "arg1", "arg2", "arg3", "arg4", "arg5", "arg6", "arg7", "arg8", "arg9", "Value"],
            ["6j", "2", "2", "2", "2", "2", "2", "", "", "", repr(_float(ref))],
            ["9j", "1", "1", "1", "1", "1", "1", "1", "1", "0", repr(_float(wigner_9j(1, 1, 1, 1, 1, 1, 1, 1, 0, prec=None)))]]
    path = tmp_path / "cols.csv"
    path.write_text(_csv(rows))
    assert cli.main(["check", str(path)]) == 0
    out, _ = capsys.readouterr()
    assert "2 values, 2 agree" in out


@pytest.mark.parametrize("text, rule", [
    ("kind,args,value\n6j,1 1 1 1 1 1,0.1\n", "needs a column 'arguments'"),
    ("kind,arguments\n6j,1 1 1 1 1 1\n", "needs a column 'value'"),
    ("", "no header row"),
])
def test_bad_header_is_bad_input(tmp_path, capsys, text, rule):
    path = tmp_path / "bad.csv"
    path.write_text(text)
    assert cli.main(["check", str(path)]) == 2
    _, err = capsys.readouterr()
    assert rule in err and "Traceback" not in err


def test_bad_rows_are_named_and_the_rest_checked(tmp_path, capsys):
    path = tmp_path / "bad.csv"
    path.write_text("kind,arguments,value\n6j,1 1 1 1 1 1,abc\n6j,1 1 1 1 1 1,0.16666666666666666\n"
                    "7j,1 1,0.5\ncg,1 3/2 1 0 1 0,0.1\n6j,1 1 1,0.1\n")
    assert cli.main(["check", str(path)]) == 2
    out, err = capsys.readouterr()
    assert "1 value, 1 agree" in out
    lines = err.splitlines()
    assert len(lines) == 4
    assert "line 2: column value = 'abc': not a decimal number" in lines[0]
    assert "line 4: column kind = '7j'" in lines[1]
    assert "line 5: argument m1 = '3/2': j1 - m1 must be an integer" in lines[2]
    assert "line 6: 6j needs 6 arguments" in lines[3]


@pytest.mark.parametrize("argv, rule", [
    (["check", "/nonexistent.csv"], "cannot read"),
    (["check", "x.csv", "--rtol", "-1"], "--rtol = '-1'"),
    (["check", "x.csv", "--rtol", "abc"], "--rtol = 'abc'"),
])
def test_usage_mistakes(capsys, argv, rule):
    assert cli.main(argv) == 2
    _, err = capsys.readouterr()
    assert rule in err and len(err.splitlines()) == 1


def test_not_utf8_is_bad_input(tmp_path, capsys):
    path = tmp_path / "bin.csv"
    path.write_bytes(b"kind,arguments,value\n6j,1 1 1 1 1 1,\xff\n")
    assert cli.main(["check", str(path)]) == 2
    assert "not UTF-8" in capsys.readouterr()[1]


def test_ulp_exponent_by_hand():
    # ulp(x) = 2**(e - 52) for 2**e <= |x| < 2**(e+1) (IEEE 754 binary64; common practice, no source)
    assert ulp_exponent(1, 1) == -52  # ulp(1) = 2**-52, the machine epsilon
    assert ulp_exponent(1, 2) == -53  # sqrt(1/2) in [1/2, 1)
    assert ulp_exponent(2, 1) == -52  # sqrt(2) in [1, 2)
    assert ulp_exponent(4, 1) == -51  # 2 in [2, 4)
    assert ulp_exponent(3, 1) == -52  # sqrt(3) in [1, 2)
    assert ulp_exponent(1, 4) == -53  # 1/2
    assert ulp_exponent(1, 1 << 2200) == -1074  # 2**-1100: below the normal range
    for k in range(-60, 61):
        assert ulp_exponent(1 << (2 * k) if k >= 0 else 1, 1 if k >= 0 else 1 << (-2 * k)) == k - 52
        assert math.ulp(2.0**k) == 2.0 ** (k - 52)  # Python's own ulp agrees


def test_ulp_measure_against_sympy():
    # |f - v| / ulp(v) from sympy's arithmetic at 60 digits versus the integer measure
    import random

    rng = random.Random(8)
    for _ in range(300):
        v = Surd(rng.choice((-1, 1)), rng.randrange(1, 10**9), rng.randrange(1, 10**9))
        nearest = rng.random() < 0.5
        f = float(v) if nearest else math.nextafter(float(v), math.inf)
        exact = v.to_sympy()
        ref = abs(sympy.Float(f, 60) - exact.evalf(60)) / sympy.Float(2.0 ** ulp_exponent(v.p, v.q), 60)
        verdict = judge(f, v, parse_rtol(None))
        assert abs(float(verdict.ulps) - float(ref)) < 1e-12
        # the nearest double is within half an ulp; its neighbour is not
        assert verdict.ulps <= HALF_ULP if nearest else verdict.ulps >= Fraction(1, 2) - Fraction(1, 2**60)


def test_judge_exact_cases():
    rtol = parse_rtol("1e-12")
    assert judge(0.5, Surd(1, 1, 4), rtol).ulps == 0  # exactly 1/2
    assert judge(-0.0, Surd(), rtol).problem is None
    assert judge(1e-300, Surd(), rtol, "triangle: x").problem == "zero-rule"
    assert judge(float("nan"), Surd(1, 1, 4), rtol).problem == "not-finite"
    # the tolerance is decided exactly: 1/2 * (1 + 2**-30) is off by 2**-30 relative
    off = 0.5 * (1 + 2.0**-30)
    assert judge(off, Surd(1, 1, 4), Fraction(1, 2**30)).problem is None
    assert judge(off, Surd(1, 1, 4), Fraction(1, 2**30) - Fraction(1, 2**80)).problem == "tolerance"


def test_read_float():
    assert read_float(" 1.5D-3 ") == 1.5e-3 and read_float("-2.5e+01") == -25.0 and read_float(".5") == 0.5
    assert math.isnan(read_float("NaN")) and read_float("-inf") == -math.inf
    for bad in ("1_0", "0x10", "", "1.2.3", "abc"):
        with pytest.raises(BadRow):
            read_float(bad)


def test_spreadsheet_export_with_bom_and_crlf(tmp_path, capsys):
    path = tmp_path / "sheet.csv"
    value = _float(wigner_3j(2, 2, 2, 1, -1, 0))  # sympy.physics.wigner as a float
    path.write_bytes(("\ufeffKind,Arguments,Value\r\n3j,2 2 2 1 -1 0," + repr(value) + "\r\n").encode())
    assert cli.main(["check", str(path)]) == 0
    assert "1 value, 1 agree" in capsys.readouterr()[0]
