"""``tablegen value --from FILE``: batch answers, checked against sympy.physics.wigner.

sympy.physics.wigner is the outside reference for the exact values; the
decimals and LaTeX must be those of the one-value command for the same line
(which test_cli_value.py checks against sympy and math.isqrt).
"""

from __future__ import annotations

import csv
import io
import json
import os
import subprocess
import sys
from pathlib import Path

import pytest
import sympy
from sympy.physics.wigner import clebsch_gordan, racah, wigner_3j, wigner_6j, wigner_9j

from tablegen import batch, cli
from tablegen.batch import CSV_COLUMNS, answer_stream
from tablegen.kinds import KINDS

ROOT = Path(__file__).resolve().parent.parent
R = sympy.Rational


def _reference(kind: str, args: list[str]):
    """The exact value from sympy.physics.wigner (its argument orders differ from ours)."""
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


LINES = [
    "cg 1/2 1/2 1/2 -1/2 1 0",
    "cg 2 -1 3/2 1/2 5/2 -1/2",
    "3j 2 2 2 1 -1 0",
    "3j 3 2 1 0 0 0",
    "6j 5/2 2 1/2 1 3/2 2",
    "6j 3 2 2 0 2 2",
    "w 1 2 3/2 1/2 1 3/2",
    "9j 1 1/2 1/2 1 1/2 3/2 1 1 2",
    "9j 2 1 1 1 1 1 1 1 1",
    "cg 1 0 1 0 1 0",  # zero by parity
    "6j 1 1 5 1 1 1",  # zero by the triangle rule
]


def _run(capsys, argv, stdin_text: "str | None" = None, monkeypatch=None):
    if stdin_text is not None:
        monkeypatch.setattr(sys, "stdin", io.TextIOWrapper(io.BytesIO(stdin_text.encode())))
    status = cli.main(argv)
    out, err = capsys.readouterr()
    return status, out, err


def _single(capsys, line: str, digits: int = 15) -> dict:
    """What the one-value command says for the same line."""
    kind, *args = line.split()
    status = cli.main(["value", kind, *args, "--json", "--latex", "--digits", str(digits)])
    out, _ = capsys.readouterr()
    assert status == 0
    return json.loads(out)


def test_csv_answers_every_line_exactly(tmp_path, capsys):
    src = tmp_path / "in.txt"
    src.write_text("\n".join(LINES) + "\n")
    status, out, err = _run(capsys, ["value", "--from", str(src)])
    assert status == 0 and err == ""
    rows = list(csv.reader(io.StringIO(out)))
    assert tuple(rows[0]) == CSV_COLUMNS
    assert len(rows) == len(LINES) + 1
    for n, (line, row) in enumerate(zip(LINES, rows[1:]), 1):
        rec = dict(zip(CSV_COLUMNS, row))
        kind, *args = line.split()
        assert rec["line"] == str(n) and rec["kind"] == kind
        assert sympy.sympify(rec["exact"]) == _reference(kind, args), line
        single = _single(capsys, line)
        assert rec["exact"] == single["exact"] and rec["decimal"] == single["decimal"], line
        assert rec["latex"] == single["latex"]["root"], line
        assert rec["zero_rule"] == (single["zero_rule"] or ""), line
    assert rows[-2][-1].startswith("parity:") and rows[-1][-1].startswith("triangle:")


def test_json_lines_and_digits(tmp_path, capsys):
    src = tmp_path / "in.txt"
    src.write_text("\n".join(LINES) + "\n")
    status, out, err = _run(capsys, ["value", "--from", str(src), "--json", "--digits", "30"])
    assert status == 0 and err == ""
    records = [json.loads(x) for x in out.splitlines()]
    assert [r["line"] for r in records] == list(range(1, len(LINES) + 1))
    names = {k.key: k.arguments for k in KINDS}
    for line, rec in zip(LINES, records):
        kind, *args = line.split()
        assert list(rec["arguments"]) == list(names[kind])
        assert [R(x) for x in rec["arguments"].values()] == [R(x) for x in args]
        assert sympy.sympify(rec["exact"]) == _reference(kind, args)
        assert rec["decimal"] == _single(capsys, line, 30)["decimal"]
    assert records[-1]["zero_rule"].startswith("triangle:") and records[0]["zero_rule"] is None


def test_comments_blank_lines_and_spellings(tmp_path, capsys):
    src = tmp_path / "in.txt"
    src.write_text("# a header comment\n\n  cg 1/2 1/2 1/2 -1/2 1 0   # trailing note\n\t\n3j 1.5 1 0.5 0.5 -1.0 0.5\n")
    status, out, err = _run(capsys, ["value", "--from", str(src)])
    assert status == 0 and err == ""
    rows = list(csv.reader(io.StringIO(out)))[1:]
    assert [r[0] for r in rows] == ["3", "5"]  # the input's line numbers
    assert rows[1][2] == "3/2 1 1/2 1/2 -1 1/2"  # canonical text of 1.5, 0.5, -1.0
    assert sympy.sympify(rows[1][3]) == wigner_3j(R(3, 2), 1, R(1, 2), R(1, 2), -1, R(1, 2)) != 0


def test_bad_lines_are_reported_and_the_rest_answered(tmp_path, capsys):
    src = tmp_path / "in.txt"
    src.write_text(
        "cg 1/2 1/2 1/2 -1/2 1 0\n"
        "cg 1 3/2 1 0 1 0\n"  # j1 - m1 not whole
        "7j 1 1 1\n"  # no such kind
        "6j 1 2 3\n"  # too few arguments
        "6j -1 1 1 1 1 1\n"  # negative j
        "3j 1 1 0 1 -1 0\n"
        "9j 1 1 1 1 1 1 1 1 x\n"  # not a number
    )
    status, out, err = _run(capsys, ["value", "--from", str(src)])
    assert status == 2
    rows = list(csv.reader(io.StringIO(out)))[1:]
    assert [r[0] for r in rows] == ["1", "6"]
    lines = err.splitlines()
    assert len(lines) == 6 and "Traceback" not in err
    assert all(line.startswith("tablegen: error: ") for line in lines)  # one format for every error line
    assert lines[0].endswith("line 2: argument m1 = '3/2': j1 - m1 must be an integer (j1 = 1)")
    assert "line 3: kind = '7j': must be one of cg, 3j, 6j, w, 9j" in lines[1]
    assert "line 4: 6j needs 6 arguments" in lines[2]
    assert "line 5: argument j1 = '-1': j must be >= 0" in lines[3]
    assert "line 7: argument j33 = 'x': not a number" in lines[4]
    assert lines[5] == "tablegen: error: 5 bad lines, 2 answered"


def test_bad_line_reads_the_same_after_its_tokens_were_cached():
    # the token cache must not change a message: '-1' was seen as an m first
    a = batch.Answerer()
    a.answer("3j 1 1 0 1 -1 0")
    with pytest.raises(batch.BadLine, match=r"argument j1 = '-1': j must be >= 0"):
        a.answer("6j -1 1 1 1 1 1")


def test_json_bad_lines_are_json_on_stderr(tmp_path, capsys):
    src = tmp_path / "in.txt"
    src.write_text("cg 1 3/2 1 0 1 0\n3j 1 1 0 1 -1 0\n")
    status, out, err = _run(capsys, ["value", "--json", "--from", str(src)])
    assert status == 2 and len(out.splitlines()) == 1
    first, last = (json.loads(line) for line in err.splitlines())
    # the same shape as every other error of the command line: {"format": 1, "error": {...}}
    assert first["format"] == 1 and first["error"]["line"] == 1 and first["error"]["file"] == str(src)
    assert "m1" in first["error"]["message"]
    assert last["error"]["bad"] == 1 and last["error"]["answered"] == 1


def test_stdin_and_non_utf8_line(capsys, monkeypatch):
    monkeypatch.setattr(sys, "stdin", io.TextIOWrapper(io.BytesIO(b"3j 1 1 0 1 -1 0\n\xff\xfe\n6j 1 1 1 1 1 1\n")))
    status, out, err = _run(capsys, ["value", "--from", "-"])
    assert status == 2
    assert [r[0] for r in list(csv.reader(io.StringIO(out)))[1:]] == ["1", "3"]
    assert "stdin line 2: not UTF-8 text" in err


def test_repeated_lines_give_identical_records():
    lines = [b"6j 5/2 2 1/2 1 3/2 2\n", b"6j 2.5 2 0.5 1 1.5 2\n", b"6j 5/2 2 1/2 1 3/2 2\n"] * 3
    out = io.StringIO()
    answered, bad = answer_stream(iter(lines), out, lambda n, m: None)
    rows = [r[1:] for r in list(csv.reader(io.StringIO(out.getvalue())))[1:]]
    assert answered == 9 and bad == 0 and all(r == rows[0] for r in rows)


def test_output_streams_before_the_input_ends():
    out = io.StringIO()
    seen: list[str] = []

    def lines():
        yield b"cg 1/2 1/2 1/2 -1/2 1 0\n"
        yield b"3j 1 1 0 1 -1 0\n"
        seen.append(out.getvalue())  # both answers must be written by now
        yield b"6j 1 1 1 1 1 1\n"

    answer_stream(lines(), out, lambda n, m: None)
    assert seen[0].count("\n") == 3  # header and two records


@pytest.mark.parametrize("argv, rule", [
    (["value", "--from"], "expected a file name"),
    (["value", "--from", "x", "--digits", "0"], "--digits = 0"),
    (["value", "--from", "x", "--latex"], "not an option"),
    (["value", "--from", "/nonexistent/file"], "cannot read"),
])
def test_usage_mistakes_are_one_line(capsys, argv, rule):
    status, out, err = _run(capsys, argv)
    assert status == 2 and out == "" and rule in err and len(err.splitlines()) == 1


def _cli(args, **kw):
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    return subprocess.run([sys.executable, "-m", "tablegen", *args], env=env, cwd=ROOT, **kw)


def test_broken_pipe_is_one_line(tmp_path):
    src = tmp_path / "in.txt"
    src.write_text("3j 1 1 0 1 -1 0\n" * 50_000)  # far more than a pipe buffer
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    with subprocess.Popen([sys.executable, "-m", "tablegen", "value", "--from", str(src)], env=env,
                          stdout=subprocess.PIPE, stderr=subprocess.PIPE) as proc:
        assert proc.stdout.readline().startswith(b"line,")
        proc.stdout.close()  # the reader goes away, as `| head -1` does
        err = proc.stderr.read().decode()
        assert proc.wait(timeout=60) == 2
    assert "Traceback" not in err and "Exception ignored" not in err
    assert err.strip().splitlines() == ["tablegen: error: cannot write the output: Broken pipe"]


@pytest.mark.skipif(not os.path.exists("/dev/full"), reason="needs /dev/full")
def test_full_device_is_one_line(tmp_path):
    src = tmp_path / "in.txt"
    src.write_text("3j 1 1 0 1 -1 0\n" * 20_000)
    with open("/dev/full", "w") as full:
        proc = _cli(["value", "--from", str(src)], stdout=full, stderr=subprocess.PIPE, timeout=60)
    err = proc.stderr.decode()
    assert proc.returncode == 2 and "Traceback" not in err
    assert err.strip().splitlines() == ["tablegen: error: cannot write the output: No space left on device"]


def test_help_names_the_format(capsys):
    status, out, _ = _run(capsys, ["value", "--from", "-", "--help"])
    assert status == 0 and ",".join(CSV_COLUMNS) in out


def test_interrupt_is_one_line(tmp_path):
    import signal
    import time

    src = tmp_path / "in.txt"
    src.write_text("".join(f"6j {j} {j} {j} {j} {j} {j}\n" for j in range(1, 9)) * 100_000)
    env = dict(os.environ, PYTHONPATH=str(ROOT))
    with subprocess.Popen([sys.executable, "-m", "tablegen", "value", "--from", str(src)], env=env,
                          stdout=subprocess.DEVNULL, stderr=subprocess.PIPE) as proc:
        time.sleep(0.5)
        proc.send_signal(signal.SIGINT)
        err = proc.stderr.read().decode()
        assert proc.wait(timeout=60) == 130
    assert err.splitlines() == ["tablegen: error: interrupted"]


def test_batch_path_stays_light(tmp_path):
    # a batch of values needs neither sympy, jinja2 nor mpmath (common practice, no source: start-up cost)
    src = tmp_path / "in.txt"
    src.write_text("\n".join(LINES) + "\n")
    code = (
        "import sys\nfrom tablegen import cli\nstatus = cli.main(['value', '--from', sys.argv[1]])\n"
        "heavy = sorted({m.split('.')[0] for m in sys.modules} & {'sympy', 'jinja2', 'mpmath'})\n"
        "print(status, heavy, file=sys.stderr)\n"
    )
    proc = subprocess.run([sys.executable, "-c", code, str(src)], env=dict(os.environ, PYTHONPATH=str(ROOT)),
                          capture_output=True, text=True, timeout=60)
    assert proc.stderr.strip().splitlines()[-1] == "0 []"
    assert len(proc.stdout.splitlines()) == len(LINES) + 1
