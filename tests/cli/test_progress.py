"""The progress line: on a terminal after a second, never in a pipe, and
never with --quiet.  The line's content is tested with an injected stream
and clock; the command line in a real pseudo-terminal (the pty module)."""

from __future__ import annotations

import io
import os
import pty
import subprocess
import sys
from pathlib import Path

from click.testing import CliRunner

import checker.progress as progress_module
from checker.cli import main
from checker.progress import Progress, format_duration

ROOT = Path(__file__).resolve().parents[2]
PUMP = ROOT / "fixtures" / "tptp" / "derivations" / "pump_trip_alarm" / "proof.p"
CRANE = ROOT / "fixtures" / "tptp" / "derivations" / "crane_load_limit" / "proof.p"


class Terminal(io.StringIO):
    def isatty(self) -> bool:
        return True


class Clock:
    def __init__(self) -> None:
        self.now = 100.0

    def __call__(self) -> float:
        return self.now


def test_nothing_is_drawn_in_the_first_second_then_done_total_rate_and_estimate():
    stream, clock = Terminal(), Clock()
    progress = Progress(stream, clock=clock)
    progress.start(40, "proof.p")
    progress.advance(10)
    clock.now += 0.5
    progress.advance(2)
    assert stream.getvalue() == ""
    clock.now += 1.5  # 2 s in: 20 steps done, 10 steps/s, 20 to go
    progress.advance(8)
    assert stream.getvalue() == "\r\033[Kproof.p  20/40 steps  50%  10.0 steps/s  about 2s left"
    progress.finish()
    assert stream.getvalue().endswith("\r\033[K")


def test_redraws_are_spaced_but_the_last_one_is_always_drawn():
    stream, clock = Terminal(), Clock()
    progress = Progress(stream, unit="files", clock=clock, show_after=0)
    progress.start(3)
    progress.advance()
    progress.advance()
    assert stream.getvalue().count("\r") == 1  # drawn at the start; the next redraws wait
    progress.advance()
    assert stream.getvalue().endswith("3/3 files  100%  estimating")  # no time has passed: no rate yet


def test_a_stream_that_is_no_terminal_or_a_quiet_run_gets_nothing():
    for stream, enabled in ((io.StringIO(), True), (Terminal(), False)):
        clock = Clock()
        progress = Progress(stream, clock=clock, enabled=enabled)
        progress.start(5)
        clock.now += 10
        progress.advance(5)
        progress.finish()
        assert stream.getvalue() == ""


def test_durations_read_as_a_person_writes_them():
    assert [format_duration(s) for s in (0.4, 59, 61, 3599, 3600 * 2 + 600)] == ["0s", "59s", "1m01s", "59m59s",
                                                                                "2h10m"]


def _in_terminal(*arguments: str) -> tuple[int, str]:
    """Run assay with its standard error on a pseudo-terminal (the line
    shown from the start), standard output on a pipe."""
    script = "import sys, checker.progress as p; p.SHOW_AFTER = 0; from checker.cli import main; main(sys.argv[1:])"
    leader, follower = pty.openpty()
    process = subprocess.Popen([sys.executable, "-c", script, *arguments], cwd=ROOT, stdout=subprocess.PIPE,
                               stderr=follower, stdin=subprocess.DEVNULL)
    os.close(follower)
    seen = b""
    while True:
        try:
            chunk = os.read(leader, 4096)
        except OSError:  # the other end closed
            break
        if not chunk:
            break
        seen += chunk
    process.wait()
    process.stdout.close()
    os.close(leader)
    return process.returncode, seen.decode()


def test_check_draws_its_line_on_a_terminal_and_wipes_it():
    code, screen = _in_terminal("check", str(PUMP))
    assert code == 0
    assert "proof.p  7/7 steps  100%" in screen
    assert screen.endswith("\r\033[K")


def test_batch_counts_files_on_a_terminal():
    code, screen = _in_terminal("batch", str(PUMP), str(CRANE))
    assert code == 0
    assert "2/2 files  100%" in screen


def test_no_terminal_no_line(monkeypatch):
    monkeypatch.setattr(progress_module, "SHOW_AFTER", 0)
    for arguments in (["check", str(PUMP)], ["batch", str(PUMP)]):
        result = CliRunner().invoke(main, arguments, catch_exceptions=False)
        assert result.exit_code == 0 and result.stdout and result.stderr == ""


def test_quiet_prints_nothing_for_a_verdict_and_the_error_for_an_unreadable_file(tmp_path):
    result = CliRunner().invoke(main, ["check", str(PUMP), "--quiet"], catch_exceptions=False)
    assert result.exit_code == 0 and result.stdout == "" and result.stderr == ""
    garbled = tmp_path / "garbled.p"
    garbled.write_text("cnf(c1, axiom, p(X) | ).\n")
    result = CliRunner().invoke(main, ["check", str(garbled), "--quiet"], catch_exceptions=False)
    assert result.exit_code == 2 and result.stdout == ""
    assert result.stderr.startswith(f"{garbled}: unreadable: {garbled}:1:")
