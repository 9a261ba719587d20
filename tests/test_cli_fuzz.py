"""Fuzzing `tablegen value` and recipes (hypothesis): whatever the input, the command line
answers within its bound with exit status 0 or 2, never a traceback, and at most one
stderr line (the error, or one warning above a kind's one-value limit).

Runs in-process through cli.main (stdout/stderr captured), plus a few runs in a
subprocess to see the real streams and exit status.
"""

from __future__ import annotations

import io
import os
import subprocess
import sys
import time
from contextlib import redirect_stderr, redirect_stdout
from pathlib import Path

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from tablegen import cli
from tablegen.kinds import KINDS

ROOT = Path(__file__).resolve().parent.parent
#: Seconds one run may take: a value within the one-value limits takes about a second.
BOUND = 10.0

_NUMBER_TEXT = st.one_of(
    st.integers(-6, 12).map(str),
    st.integers(-13, 25).map(lambda n: f"{n}/2"),
    st.sampled_from(["1.5", "-0.5", ".5", "2.", "1e1", "5E-1", "+3", "\u22121/2", " 2 ", "4/2", "1/0", "0/0"]),
    st.sampled_from(["inf", "-inf", "nan", "-Infinity", "1e99999999", "9" * 5000, "1_0", "٣", "１", "²", "", "-",
                     "--", "-x", "1/2/3", "1..2", "0x10", "1e", "e1", "3/2.5", "\x00", "\n", "\x1b[2J"]),
    st.text(max_size=12),
    st.text(alphabet="0123456789/.-+eE_ ", max_size=45),
)
_OPTIONS = st.lists(
    st.one_of(
        st.just("--json"), st.just("--latex"), st.just("--"),
        st.tuples(st.sampled_from(["--digits", "--max-j", "--digits=", "--max-j="]),
                  st.one_of(st.integers(-3, 60).map(str), _NUMBER_TEXT)).map(
            lambda p: p[0] + p[1] if p[0].endswith("=") else [p[0], p[1]]),
        st.sampled_from(["--dig", "--lat", "-h", "--frobnicate", "-1", "--max-j"]),
    ),
    max_size=3,
)


def _flatten(items) -> list[str]:
    out: list[str] = []
    for item in items:
        out.extend(item if isinstance(item, list) else [item])
    return out


@st.composite
def value_argv(draw):
    kind = draw(st.one_of(st.sampled_from([k.key for k in KINDS]), st.sampled_from(["7j", "", "CG", "-1"])))
    known = {k.key: k for k in KINDS}
    count = len(known[kind].arguments) if kind in known and draw(st.booleans()) else draw(st.integers(0, 10))
    args = [draw(_NUMBER_TEXT) for _ in range(count)]
    options = _flatten(draw(_OPTIONS))
    position = draw(st.integers(0, len(args)))
    return ["value", kind, *args[:position], *options, *args[position:]]


def _main(argv: list[str]) -> tuple[int, str, str, float]:
    out, err = io.StringIO(), io.StringIO()
    started = time.perf_counter()
    with redirect_stdout(out), redirect_stderr(err):
        try:
            status = cli.main(argv)
        except SystemExit as exc:  # pragma: no cover - main turns --help into a status itself
            status = exc.code
    return status, out.getvalue(), err.getvalue(), time.perf_counter() - started


def _check(status: int, out: str, err: str, seconds: float, argv: list[str]) -> None:
    assert "Traceback" not in err and "Traceback" not in out, argv
    assert seconds < BOUND, (argv, seconds)
    help_asked = "-h" in argv and "--" not in argv[: argv.index("-h")]
    if help_asked and status == 0:
        return  # help text on stdout
    assert status in (0, 2), (argv, status, err)
    lines = err.splitlines()
    if status == 2:
        assert len(lines) == 1, (argv, err)
        assert lines[0].startswith(("tablegen: error: ", '{"format": 1, "error": ')), lines
        assert all(c.isprintable() for c in lines[0]), lines
        assert len(lines[0]) <= (400 if lines[0].startswith("tablegen") else 1000), lines  # JSON escapes grow
    else:
        assert len(lines) <= 1 and all(line.startswith("tablegen: warning: ") for line in lines), (argv, err)
        assert out, argv


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(value_argv())
def test_value_never_traces(argv):
    _check(*_main(argv), argv)


_TOML_VALUE = st.one_of(
    _NUMBER_TEXT.map(lambda s: '"' + s.replace("\\", "\\\\").replace('"', '\\"').encode("unicode_escape").decode() + '"'),
    st.integers(-5, 30).map(str),
    st.sampled_from(["1e99999999", "9" * 5000, "inf", "-inf", "nan", "3.5", "true", "[1, 2]", "{a = 1}", '""',
                     "2000000", "1_000", "0x10", "1979-05-27"]),
)


@st.composite
def recipe_text(draw):
    lines = []
    if draw(st.booleans()):
        lines.append("title = " + draw(st.one_of(_TOML_VALUE, st.just('"T\\u0007"'), st.just('"ok"'))))
    if draw(st.booleans()):
        lines.append("digits = " + draw(_TOML_VALUE))
    if draw(st.booleans()):
        lines.append("latex_style = " + draw(st.sampled_from(['"root"', '"rational"', '"x"', "1"])))
    for key in draw(st.lists(st.sampled_from(["cg", "3j", "6j", "9j", "12j"]), max_size=3, unique=True)):
        lines.append(f"[{key}]")
        for field in draw(st.lists(st.sampled_from(["max_j", "min_j", "other"]), max_size=2, unique=True)):
            lines.append(f"{field} = " + draw(_TOML_VALUE))
    text = "\n".join(lines) + "\n"
    prefix = draw(st.sampled_from([b"", b"\xef\xbb\xbf", b"\xff"]))
    return prefix + text.encode("utf-8", "surrogatepass")


@settings(max_examples=200, deadline=None, suppress_health_check=[HealthCheck.too_slow, HealthCheck.function_scoped_fixture])
@given(data=recipe_text())
def test_recipes_never_trace(tmp_path_factory, monkeypatch, data):
    import tablegen.build as build_module
    from tablegen.sizeguard import check_size

    class Result:
        out_dir, pages, files, values, bytes, data_digest, seconds = "x", 0, 0, 0, 0, "0" * 64, 0.0

    def fake_build(recipe, out_dir, *, allow_large=False, **kwargs):  # everything up to computing
        check_size(recipe, allow_large)
        return Result()

    monkeypatch.setattr(build_module, "build", fake_build)
    path = tmp_path_factory.mktemp("recipe") / "recipe.toml"
    path.write_bytes(data)
    argv = ["build", "--recipe", str(path), "--out", str(path.parent / "site"), "--quiet"]
    status, out, err, seconds = _main(argv)
    _check(status, out or "-", err, seconds, argv)


@pytest.mark.parametrize("argv", [
    ["value", "cg", "1", "-inf", "1", "0", "1", "0"],
    ["value", "9j", "1e99999999", "1", "1", "1", "1", "1", "1", "1", "0", "--json"],
    ["value", "3j", "1", "1", "0", "1", "-1", "0", "--digits", "٣"],
    ["value", "w", "1", "1", "1", "1", "1", "1", "--latex", "--digits", "40"],
])
def test_value_in_a_subprocess(argv):
    env = dict(os.environ, PYTHONPATH=os.pathsep.join(filter(None, [str(ROOT), os.environ.get("PYTHONPATH")])))
    done = subprocess.run([sys.executable, "-m", "tablegen", *argv], env=env, capture_output=True, text=True,
                          timeout=BOUND * 6)
    _check(done.returncode, done.stdout, done.stderr, 0.0, argv)
