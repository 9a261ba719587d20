"""Hostile and careless input to the command line: one line, exit 2, never a traceback.

Covers issue 7's classes for the command line and input parsing: tracebacks
where a one-line error belongs (odd option values, closed or full output,
unreadable recipes, text that cannot be encoded, a deleted current folder,
impossible output folders), clear messages (negative values, abbreviations,
byte-order marks, long or control-character values, Unicode digits), huge
literals refused by length and exponent before converting, the size guard
(exact counts, time from j, per-kind one-value limits, the way to insist),
JSON errors, and BibTeX-safe text.  Facts of the trade are marked "common
practice, no source"; sympy is the outside reference for values.
"""

from __future__ import annotations

import json
import os
import shutil
import subprocess
import sys
from pathlib import Path

import pytest

from tablegen import cli
from tablegen.errors import QuantumNumberError, RecipeError, TooLargeError
from tablegen.kinds import KINDS
from tablegen.recipe import FamilyRange, Recipe, load_recipe, recipe_from_mapping
from tablegen.sizeguard import estimate_family, pair_count

ROOT = Path(__file__).resolve().parent.parent
SIXJ = ["value", "6j", "1", "1", "1", "1", "1", "1"]


def _run(capsys, *argv: str) -> tuple[int, str, list[str]]:
    status = cli.main(list(argv))
    captured = capsys.readouterr()
    return status, captured.out, captured.err.splitlines()


def _one_error(status: int, err: list[str], *words: str) -> str:
    assert status == 2, err
    assert len(err) == 1, err
    line = err[0]
    assert line.startswith("tablegen: error: ") and "Traceback" not in line
    for word in words:
        assert word in line, (word, line)
    return line


def _env() -> dict:
    env = dict(os.environ)
    env["PYTHONPATH"] = str(ROOT) + (os.pathsep + env["PYTHONPATH"] if env.get("PYTHONPATH") else "")
    return env


def _tablegen(*args, **kwargs) -> subprocess.CompletedProcess:
    return subprocess.run([sys.executable, "-m", "tablegen", *args], env=_env(), timeout=120, **kwargs)


# -- tracebacks where one line belongs --------------------------------------------------
@pytest.mark.parametrize("text", ["²", "٣", "１", "1_0", "1e3", "", " ", "15.0", "9" * 5000, "-5", "0x10"])
def test_digits_option_text_is_one_line(capsys, text):
    line = _one_error(*_run(capsys, *SIXJ, "--digits", text)[::2], "--digits", "from 1 to 10,000")
    assert len(line) < 200  # a 5000-digit value is cut, not echoed


def test_build_digits_shares_the_value_limit(capsys, tmp_path):
    # one documented limit for value --digits and build --digits (limits.MAX_DIGITS)
    status, _, err = _run(capsys, "build", "--cg", "1/2", "--digits", "10001", "--out", str(tmp_path / "s"))
    _one_error(status, err, "--digits", "10,000")
    status, _, err = _run(capsys, *SIXJ, "--digits", "10001")
    _one_error(status, err, "--digits", "10,000")
    assert not (tmp_path / "s").exists()


def test_every_value_command_shares_the_digits_limit(capsys, tmp_path):
    # value --from and value d|D|Y stop at the same limits.MAX_DIGITS as value and build
    src = tmp_path / "lines.txt"
    src.write_text("6j 1 1 1 1 1 1\n")
    for argv in (["value", "--from", str(src), "--digits", "10001"], ["value", "d", "1", "1", "0", "--digits", "10001"]):
        status, out, err = _run(capsys, *argv)
        assert status == 2 and out == "" and len(err) == 1 and "Traceback" not in err[0], err
        assert "argument --digits = 10001: must be from 1 to 10,000" in err[0]
        status, out, err = _run(capsys, *argv[:-1], "10000")
        assert status == 0 and err == [], (argv, err)


def test_closed_pipe_is_one_line():
    read_end, write_end = os.pipe()
    os.close(read_end)  # like `tablegen value ... | true`: nobody reads
    try:
        done = _tablegen("value", "cg", "1", "1", "1", "-1", "0", "0", stdout=write_end, stderr=subprocess.PIPE, text=True)
    finally:
        os.close(write_end)
    assert done.returncode == 2
    assert done.stderr.splitlines() == ["tablegen: error: output closed before everything was written (broken pipe)"]


def test_verify_into_a_closed_pipe_is_one_line(tmp_path):
    site = tmp_path / "site"
    assert cli.main(["build", "--cg", "1/2", "--out", str(site), "--quiet"]) == 0
    read_end, write_end = os.pipe()
    os.close(read_end)  # like `tablegen verify site | head -1` after head has gone
    try:
        done = _tablegen("verify", str(site), stdout=write_end, stderr=subprocess.PIPE, text=True)
    finally:
        os.close(write_end)
    assert done.returncode == 2 and "Traceback" not in done.stderr
    assert len(done.stderr.splitlines()) == 1 and "broken pipe" in done.stderr


@pytest.mark.skipif(not os.path.exists("/dev/full"), reason="no /dev/full")
def test_full_output_device_is_one_line():
    with open("/dev/full", "w") as full:
        done = _tablegen("value", "6j", "1", "1", "1", "1", "1", "1", stdout=full, stderr=subprocess.PIPE, text=True)
    assert done.returncode == 2
    assert done.stderr.splitlines() == ["tablegen: error: cannot write the output: No space left on device"]


def test_unreadable_recipe_file_is_one_line(capsys, tmp_path):
    blocker = tmp_path / "file.txt"
    blocker.write_text("not a folder")
    status, _, err = _run(capsys, "build", "--recipe", str(blocker / "recipe.toml"), "--out", str(tmp_path / "s"))
    _one_error(status, err, "--recipe", "cannot be read")
    link = tmp_path / "dangling.toml"
    link.symlink_to(tmp_path / "gone.toml")
    status, _, err = _run(capsys, "build", "--recipe", str(link), "--out", str(tmp_path / "s"))
    _one_error(status, err, "--recipe", "file not found")


def _as_nobody() -> list[str] | None:
    """A command prefix that runs Python as an unprivileged user (root ignores permissions)."""
    if os.geteuid() != 0:
        return [sys.executable]
    # a system interpreter (>= 3.11 for tomllib) that any user may run; the recipe path needs only the stdlib
    python = next((p for p in ("/usr/bin/python3.12", "/usr/bin/python3.11") if os.access(p, os.X_OK)), None)
    if not (shutil.which("setpriv") and python):
        return None
    return ["setpriv", "--reuid=65534", "--regid=65534", "--clear-groups", python]


def test_recipe_without_read_permission_is_one_line():
    import tempfile

    prefix = _as_nobody()
    if prefix is None:
        pytest.skip("needs setpriv and a system python to drop root's privileges")
    with tempfile.TemporaryDirectory(prefix="tablegen-perm-") as folder:
        _unreadable_recipe_check(prefix, Path(folder))


def _unreadable_recipe_check(prefix: list[str], tmp_path: Path) -> None:
    tmp_path.chmod(0o777)  # reachable by the unprivileged user; only the recipe is unreadable
    recipe = tmp_path / "recipe.toml"
    recipe.write_text("[cg]\nmax_j = 1\n")
    recipe.chmod(0)
    done = subprocess.run([*prefix, "-m", "tablegen", "build", "--recipe", str(recipe), "--out", str(tmp_path / "s")],
                          env=_env(), capture_output=True, text=True, timeout=120)
    assert done.returncode == 2, done.stderr
    assert done.stderr.count("\n") == 1 and "--recipe" in done.stderr and "cannot be read (Permission denied)" in done.stderr


def test_non_utf8_title_is_refused_before_computing(capsys, tmp_path, monkeypatch):
    import tablegen.build as build_module

    def must_not_run(*args, **kwargs):
        raise AssertionError("the title should have been refused before planning")

    monkeypatch.setattr(build_module, "plan_site", must_not_run)
    title = b"T\xff".decode("utf-8", "surrogateescape")  # what Python makes of --title $'T\xff'
    status, _, err = _run(capsys, "build", "--cg", "1", "--title", title, "--out", str(tmp_path / "s"))
    _one_error(status, err, "--title", "not valid UTF-8")
    assert not (tmp_path / "s").exists()


def test_non_utf8_title_in_a_subprocess(tmp_path):
    done = subprocess.run(
        [sys.executable.encode(), b"-m", b"tablegen", b"build", b"--cg", b"1", b"--title", b"T\xff",
         b"--out", str(tmp_path / "s").encode()],
        env=_env(), capture_output=True, timeout=120,
    )
    assert done.returncode == 2 and b"Traceback" not in done.stderr
    assert done.stderr.count(b"\n") == 1 and b"not valid UTF-8" in done.stderr


def test_build_from_a_deleted_current_folder(tmp_path):
    script = 'mkdir gone && cd gone && rmdir ../gone && exec "$0" -m tablegen build --cg 1/2 --quiet'
    done = subprocess.run(["sh", "-c", script, sys.executable], cwd=tmp_path, env=_env(),
                          capture_output=True, text=True, timeout=120)
    assert done.returncode == 2, done.stderr
    assert done.stderr.count("\n") == 1 and "current folder no longer exists" in done.stderr


@pytest.mark.parametrize("target", ["/proc/x", "/proc/self/x/y"])
def test_impossible_output_folder_is_one_line(capsys, target):
    status, _, err = _run(capsys, "build", "--cg", "1/2", "--out", target, "--quiet")
    _one_error(status, err)
    assert not os.path.exists(target)


def test_empty_out_and_long_paths_are_one_short_line(capsys, tmp_path):
    status, _, err = _run(capsys, "build", "--cg", "1/2", "--out", "", "--quiet")
    _one_error(status, err, "argument --out = ''", "must name a folder")
    status, _, err = _run(capsys, "verify", str(tmp_path / ("x" * 4000)))
    assert len(_one_error(status, err)) < 200


def test_dangling_symlink_out_is_one_line(capsys, tmp_path):
    link = tmp_path / "site"
    link.symlink_to(tmp_path / "nowhere")
    status, _, err = _run(capsys, "build", "--cg", "1/2", "--out", str(link), "--quiet")
    _one_error(status, err)
    assert link.is_symlink() and not (tmp_path / "nowhere").exists()


# -- clear messages ----------------------------------------------------------------------
@pytest.mark.parametrize("value", ["-inf", "-nan", "-Infinity"])
def test_negative_infinity_names_the_argument(capsys, value):
    status, _, err = _run(capsys, "value", "cg", "1", value, "1", "0", "1", "0")
    _one_error(status, err, "argument m1", value, "NaN or infinity")


def test_option_looking_value_names_the_argument(capsys):
    status, _, err = _run(capsys, "value", "cg", "1", "-x", "1", "0", "1", "0")
    _one_error(status, err, "argument m1 = '-x'", "not a number")


@pytest.mark.parametrize("option", ["--cg", "--3j", "--6j", "--9j"])
def test_range_starting_with_minus_is_read_as_the_value(capsys, tmp_path, option):
    status, _, err = _run(capsys, "build", option, "-1..1", "--out", str(tmp_path / "s"))
    _one_error(status, err, f"argument {option} = '-1..1'", "j must be >= 0")
    status, _, err = _run(capsys, "build", "--title", "-dash", option, "none", "--cg", "-1", "--out", str(tmp_path / "s"))
    _one_error(status, err, "argument --cg = '-1'")


@pytest.mark.parametrize("argv", [[*SIXJ, "--dig", "5"], [*SIXJ, "--dig=5"], [*SIXJ, "--lat"],
                                  ["build", "--c", "1"], ["build", "--cg", "1", "--tit=x"]])
def test_abbreviated_options_are_refused_alike(capsys, argv):
    status, _, err = _run(capsys, *argv)
    _one_error(status, err, "unknown option")


def test_recipe_with_a_byte_order_mark_is_read(tmp_path):
    path = tmp_path / "recipe.toml"
    path.write_bytes(b"\xef\xbb\xbf" + 'title = "Mit BOM"\n[cg]\nmax_j = 1\n'.encode())
    recipe = load_recipe(str(path))
    assert recipe.title == "Mit BOM" and recipe.families == (FamilyRange("cg", 0, 2),)


def test_long_values_with_control_characters_are_cut_and_escaped(capsys):
    status, _, err = _run(capsys, "value", "6j", "1", "1", "1", "1", "1", "x\n\x1b[31m" + "7" * 4000)
    line = _one_error(status, err, "argument j6")
    assert "\\n" in line and "\\x1b" in line and "\x1b" not in line
    assert "..." in line and len(line) < 200


@pytest.mark.parametrize("text", ["٣", "１", "²", "1_0", "3/٢"])
def test_unicode_digits_and_underscores_are_not_quantum_numbers(capsys, text):
    # decided: only the ASCII digits 0-9, as for --digits (documented in `tablegen value --help`)
    status, _, err = _run(capsys, "value", "6j", text, "1", "1", "1", "1", "1")
    _one_error(status, err, "argument j1")
    with pytest.raises(RecipeError):
        recipe_from_mapping({"cg": {"max_j": text}})


def test_verify_problem_lines_are_cut(capsys, monkeypatch):
    import tablegen.verify as verify_module

    class Report:
        ok = False
        problems = ["data/x.csv: value " + "9" * 5000 + "\x1b"]

        def summary(self):
            return "verify: 1 problem"

    monkeypatch.setattr(verify_module, "verify_site", lambda folder: Report())
    status, out, err = _run(capsys, "verify", "anything")
    assert status == 1 and err == []
    assert all(len(line) <= 302 for line in out.splitlines()) and "\x1b" not in out


# -- JSON ----------------------------------------------------------------------------------
def test_json_errors_are_one_json_object_with_a_format(capsys):
    status, out, err = _run(capsys, "value", "--json", "6j", "1", "1", "1", "1", "1", "x")
    assert status == 2 and out == "" and len(err) == 1
    record = json.loads(err[0])
    assert record["format"] == 1
    assert record["error"]["argument"] == "j6" and record["error"]["value"] == "x"
    assert record["error"]["rule"] == "not a number" and "j6" in record["error"]["message"]
    status, out, err = _run(capsys, "value", "--json", "6j", "1", "--digits", "0", "1", "1", "1", "1", "1")
    assert status == 2 and json.loads(err[0])["error"]["argument"] == "--digits"


def test_json_records_carry_the_format(capsys):
    status, out, err = _run(capsys, *SIXJ, "--json")
    assert status == 0 and err == []
    assert json.loads(out)["format"] == 1


# -- huge literals ---------------------------------------------------------------------------
@pytest.mark.parametrize("literal", ["1e99999999", "1E+99999999", "-1e-99999999", "9" * 5000, "1" * 41, "1/" + "3" * 5000])
def test_huge_literals_are_refused_unconverted(capsys, literal):
    status, _, err = _run(capsys, "value", "cg", "1", "1", "1", literal, "1", "1")
    _one_error(status, err, "argument m2")
    status, _, err = _run(capsys, "build", "--cg", literal, "--out", "unused-never-written")
    _one_error(status, err, "argument --cg")
    with pytest.raises(RecipeError):
        recipe_from_mapping({"9j": {"max_j": literal}})
    # the engine's parser, which verify uses on data files, refuses it too
    with pytest.raises(QuantumNumberError):
        KINDS[0].parse(("1", "0", "1", "0", literal, "0"), None)


def test_huge_numbers_in_a_recipe_file(capsys, tmp_path):
    for text in ["[cg]\nmax_j = " + "9" * 5000 + "\n", "[cg]\nmax_j = 1e99999999\n", "[cg]\nmax_j = 99999999999\n",
                 '[cg]\nmax_j = "1e99999999"\n']:
        path = tmp_path / "recipe.toml"
        path.write_text(text)
        status, _, err = _run(capsys, "build", "--recipe", str(path), "--out", str(tmp_path / "s"))
        _one_error(status, err)
    assert not (tmp_path / "s").exists()


# -- size guard ------------------------------------------------------------------------------
def _plan_count(family: str, lo: int, hi: int) -> int:
    from tablegen.plan import plan_site

    plan = plan_site(Recipe(families=(FamilyRange(family, lo, hi),)))
    return sum(len(t.entries) for t in plan.tables_of(family))


@pytest.mark.parametrize("family, lo, hi", [("cg", 0, 0), ("cg", 3, 3), ("3j", 1, 6), ("cg", 4, 9), ("3j", 0, 8),
                                            ("6j", 0, 8), ("6j", 3, 7), ("9j", 0, 4), ("9j", 2, 4)])
def test_estimates_are_exact_against_the_plan(family, lo, hi):
    e = estimate_family(FamilyRange(family, lo, hi))
    assert e.exact and e.low == _plan_count(family, lo, hi)


def test_pair_count_against_a_direct_count():
    # entries of one coupling: every (J, M, m1) with |m2| <= j2 (common practice, no source)
    for a in range(7):
        for b in range(7):
            direct = sum(
                1
                for tJ in range(abs(a - b), a + b + 1, 2)
                for tM in range(-tJ, tJ + 1, 2)
                for tm1 in range(-a, a + 1, 2)
                if abs(tM - tm1) <= b
            )
            assert pair_count(a, b) == direct


def test_cg_estimates_from_the_issue():
    # --cg 25/2 really holds 1,308,411 entries (issue 7); --cg 100..100 is not 0
    assert estimate_family(FamilyRange("cg", 0, 25)).low == 1_308_411
    big = estimate_family(FamilyRange("cg", 200, 200))
    assert big.exact and big.low == pair_count(200, 200) > 5_000_000


def test_class_bounds_hold_beyond_the_enumeration_budget():
    from tablegen.families import family

    e = estimate_family(FamilyRange("6j", 0, 12))
    sixj = family("6j")
    true = len(sixj.layout.classes_in_range(sixj.kind_record, 0, 12))  # the plan's own classes
    assert e.low <= true <= e.high


@pytest.mark.parametrize("option, text, words", [
    ("--cg", "100..100", "recipe too large"),
    ("--6j", "1000000..1000000", "one-value limit"),
    ("--9j", "1000..1001", "one-value limit"),
    ("--6j", "100", "recipe too large"),
    ("--9j", "20", "recipe too large"),
])
def test_size_guard_refuses_with_the_way_to_insist(capsys, tmp_path, monkeypatch, option, text, words):
    import tablegen.build as build_module

    monkeypatch.setattr(build_module, "plan_site", lambda *a: pytest.fail("planned a refused recipe"))
    status, _, err = _run(capsys, "build", option, text, "--out", str(tmp_path / "s"))
    _one_error(status, err, words, "--allow-large")
    assert not (tmp_path / "s").exists()
    # the way to insist exists for build: --allow-large lifts the guard
    from tablegen.sizeguard import check_size

    check_size(recipe_from_mapping({option[2:]: _range_table(text)}), allow_large=True)


def _range_table(text: str) -> dict:
    lo, sep, hi = text.partition("..")
    return {"min_j": lo, "max_j": hi} if sep else {"max_j": text}


def test_recipe_j_beyond_the_engine_is_refused_even_when_insisting(capsys, tmp_path):
    status, _, err = _run(capsys, "build", "--cg", "2000000", "--allow-large", "--out", str(tmp_path / "s"))
    _one_error(status, err, "--cg", "engine's limit 1,000,000")


def test_time_is_estimated_from_j():
    small = estimate_family(FamilyRange("9j", 0, 0))
    large = estimate_family(FamilyRange("9j", 2000, 2000))
    assert small.low == large.low == 1  # one class each: {0 0 0;...} and all nine j = 1000
    assert large.seconds > 1000 * max(small.seconds, 1e-3)


# -- per-kind one-value limits -------------------------------------------------------------------
def _at(k, tj: int) -> list[str]:
    """Arguments with every j = tj/2 and every m = 0 (an allowed symbol when tj is even);
    arguments that are neither take a fixed allowed value (the LS-jj kind's number of shells)."""
    fixed = _FIXED.get(k.key, {})
    return [fixed.get(a, str(tj // 2) if i in k.j_positions else "0") for i, a in enumerate(k.arguments)]


_FIXED = {"lsjj": {"shells": "2"}}


@pytest.mark.parametrize("k", KINDS, ids=[k.key for k in KINDS])
def test_one_value_limit_per_kind(capsys, k):
    status, _, err = _run(capsys, "value", k.key, *_at(k, 2 * k.max_j + 2))
    _one_error(status, err, f"size limit {k.max_j}", "--max-j")
    status, out, err = _run(capsys, "value", k.key, *_at(k, 2 * k.max_j + 2), "--max-j", str(k.max_j + 1))
    assert status == 0 and len(err) == 1 and err[0].startswith("tablegen: warning:") and "memory" in err[0]


_WORST = {"3j": ["5000", "5000", "5000", "1", "-1", "0"], "cg": ["5000", "1", "5000", "-1", "5000", "0"]}


@pytest.mark.slow
@pytest.mark.parametrize("k", KINDS, ids=[k.key for k in KINDS])
def test_values_at_the_limit_are_answered_with_latex_and_no_sympy(k):
    # the rationalised LaTeX needs the square-free part of p*q: every factorial prime must be
    # found by trial division (intmath), or a factoring library would be called and take minutes
    args = _WORST.get(k.key, _at(k, 2 * k.max_j))
    code = (
        "import sys; from tablegen.cli import main; status = main(" + repr(["value", k.key, *args, "--latex"]) + ");"
        "print(status, 'sympy' in sys.modules)"
    )
    done = subprocess.run([sys.executable, "-c", code], env=_env(), capture_output=True, text=True, timeout=120)
    assert done.returncode == 0 and done.stderr == "", done.stderr
    assert done.stdout.splitlines()[-1] == "0 False"


def test_max_j_has_a_ceiling(capsys):
    status, _, err = _run(capsys, *SIXJ, "--max-j", "1000001")
    _one_error(status, err, "--max-j", "1,000,000")


# -- start-up ---------------------------------------------------------------------------------
def test_value_path_imports_no_heavy_module():
    code = (
        "import sys; before = set(sys.modules); from tablegen.cli import main; main(['value', '9j', '1', '1', '1', '1', '1', '1', '1', '1', '0',"
        " '--json', '--latex']); print([m for m in ('sympy', 'jinja2', 'mpmath', 'dataclasses') if m in set(sys.modules) - before])"
    )
    done = subprocess.run([sys.executable, "-c", code], env=_env(), capture_output=True, text=True, timeout=60)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip().splitlines()[-1] == "[]"


# what a lookup needs not: typing, dataclasses, fractions (with decimal), numbers, shutil (argparse's own
# help formatter), the other commands' parsers' modules and the other kinds' modules
_UNUSED = ("typing", "dataclasses", "fractions", "decimal", "numbers", "shutil", "tablegen.commands.build",
           "tablegen.kinds.lsjj", "tablegen.kinds.recoupling", "tablegen.kinds.states", "tablegen.values.exact_sum")


@pytest.mark.parametrize("argv, more", [
    (["value", "6j", "2", "3", "3", "2", "3", "3", "--latex"], ("json", "tablegen.kinds.ninej")),
    (["value", "cg", "3/2", "1/2", "1", "-1", "5/2", "-1/2"], ("json", "tablegen.kinds.sixj")),
    (["value", "9j", "1", "1", "1", "1", "1", "1", "1", "1", "0", "--json"], ()),
])
def test_value_path_imports_only_what_it_uses(argv, more):
    code = (
        f"import sys; before = set(sys.modules); from tablegen.cli import main; status = main({argv!r});"
        f"print(status, [m for m in {_UNUSED + more!r} if m in set(sys.modules) - before])"
    )
    done = subprocess.run([sys.executable, "-c", code], env=_env(), capture_output=True, text=True, timeout=60)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip().splitlines()[-1] == "0 []"


@pytest.mark.parametrize("argv", [
    ["value", "d", "1", "1", "0"],
    ["value", "Y", "2", "1", "--theta", "pi/3"],
    ["lsjj", "1", "1"],
    ["check", "--help"],
])
def test_commands_with_their_own_parsers_do_not_load_shutil(argv):
    # argparse's own help formatter imports shutil (and bz2, lzma) on the first add_argument;
    # every parser here uses commands.help_formatter, which does not
    code = (
        f"import sys, io; before = set(sys.modules); from tablegen.cli import main; out = sys.stdout; sys.stdout = io.StringIO();"
        f"status = main({argv!r}); sys.stdout = out;"
        f"print(status, [m for m in ('shutil', 'sympy', 'jinja2') if m in set(sys.modules) - before])"
    )
    done = subprocess.run([sys.executable, "-c", code], env=_env(), capture_output=True, text=True, timeout=60)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip().splitlines()[-1] == "0 []"


@pytest.mark.parametrize("argv", [
    ["value", "d", "3/2", "1/2", "-1/2", "--beta", "pi/3"],
    ["value", "Y", "3", "-2"],
    ["value", "state3", "1/2", "1/2", "1/2", "1", "3/2", "1/2", "1/2", "1/2", "-1/2"],  # a coupled-state coefficient
])
def test_function_lookups_load_neither_typing_nor_dataclasses(argv):
    # typing.NamedTuple and dataclasses would pull in typing, inspect and ast: most of a lookup's start-up
    code = (
        f"import sys, io; before = set(sys.modules); from tablegen.cli import main; out = sys.stdout; sys.stdout = io.StringIO();"
        f"status = main({argv!r}); sys.stdout = out;"
        f"print(status, [m for m in ('typing', 'dataclasses', 'inspect', 'mpmath') if m in set(sys.modules) - before])"
    )
    done = subprocess.run([sys.executable, "-c", code], env=_env(), capture_output=True, text=True, timeout=60)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip().splitlines()[-1] == "0 []"


# -- BibTeX ------------------------------------------------------------------------------------
HOSTILE_TITLE = "Übung ✓ ⟨j m| -- `` !` ?` naïve Łódź α ⊗ 😀 $ & % # _ { } ~ ^ \\"


def test_bibtex_text_is_ascii_with_commands_and_placeholders():
    from tablegen.latex_escape import bibtex_text

    text = bibtex_text(HOSTILE_TITLE)
    assert text.isascii()
    assert "{\\\"U}bung" in text and "[U+2713]" in text and "[U+1F600]" in text
    assert "\\ensuremath{\\langle}" in text and "\\ensuremath{\\otimes}" in text and "\\ensuremath{\\alpha}" in text
    assert "-{}-" in text and "`{}`" in text and "!{}`" in text and "?{}`" in text
    assert "{\\L}{\\'o}d{\\'z}" in text and "na{\\\"\\i}ve" in text


@pytest.mark.skipif(not (shutil.which("pdflatex") and shutil.which("bibtex")), reason="needs pdflatex and bibtex")
def test_cite_bib_of_a_hostile_title_compiles_under_pdflatex(tmp_path):
    from tablegen.buildinfo import BuildMeta, bibtex

    meta = BuildMeta(tool="tablegen", version="0.1.0", data_digest="ab" * 32, recipe_toml="", title=HOSTILE_TITLE,
                     counts=(("cg", 1),))
    (tmp_path / "cite.bib").write_text(bibtex(meta), encoding="utf-8")
    (tmp_path / "paper.tex").write_text(
        "\\documentclass{article}\\begin{document}See \\cite{" + meta.citation_key + "}."
        "\\bibliographystyle{plain}\\bibliography{cite}\\end{document}\n"
    )
    run = dict(cwd=tmp_path, capture_output=True, text=True, timeout=120)
    assert subprocess.run(["pdflatex", "-interaction=nonstopmode", "-halt-on-error", "paper.tex"], **run).returncode == 0
    assert subprocess.run(["bibtex", "paper"], **run).returncode == 0
    for _ in range(2):
        done = subprocess.run(["pdflatex", "-interaction=nonstopmode", "-halt-on-error", "paper.tex"], **run)
        assert done.returncode == 0, done.stdout[-2000:]
    log = (tmp_path / "paper.log").read_text(errors="replace")
    assert "Missing character" not in log


def test_a_recipe_that_is_a_pipe_is_refused_without_blocking(capsys, tmp_path):
    # opening a FIFO for reading blocks until a writer comes (POSIX; common practice, no source)
    fifo = tmp_path / "recipe.toml"
    os.mkfifo(fifo)
    status, _, err = _run(capsys, "build", "--recipe", str(fifo), "--out", str(tmp_path / "s"))
    _one_error(status, err, "--recipe", "not a regular file")
    assert not (tmp_path / "s").exists()


def test_phase_refuses_a_huge_literal_at_once():
    # the literal's length and exponent are checked before any conversion (issue 7: nothing hangs)
    from tablegen import phase

    with pytest.raises(ValueError, match="needs an integer"):
        phase("1e99999999")
    assert (phase("3"), phase("-4/2"), phase("2.0"), phase("\u22121")) == (-1, 1, 1, -1)
