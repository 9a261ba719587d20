"""Holding SIGINT and SIGTERM back for the moments that must not be cut short.

A build is stopped by an exception (the command line turns SIGTERM into
KeyboardInterrupt).  Clean-up (killing workers, removing a staging folder) and
the final swap run with both signals blocked; a signal that arrives meanwhile
is either delivered afterwards or, once the build is ending anyway, dropped, so
that a second Ctrl-C never interrupts the clean-up of the first.
"""

from __future__ import annotations

import signal
import threading
from contextlib import contextmanager
from typing import Iterator

__all__ = ["signals_held", "drop_pending", "stop_once", "after_stop", "sigint_ignored_by_children"]

_HELD = {signal.SIGINT, signal.SIGTERM}


def _can_block() -> bool:
    return hasattr(signal, "pthread_sigmask") and threading.current_thread() is threading.main_thread()


_depth = 0  # how many signals_held sections are open
_deferred = False  # a stop that came during one, to be raised when the last one closes
_interrupted = False  # the build is being stopped: later signals change nothing


@contextmanager
def signals_held() -> Iterator[None]:
    """Defer SIGINT and SIGTERM for a critical section.

    The signals are blocked in this thread; a stop that still reaches
    ``stop_once`` (delivered through another thread, which has its own mask) is
    recorded and raised when the outermost section closes, unless
    ``drop_pending`` settled the outcome first.
    """
    global _depth, _deferred
    can_block = _can_block()
    if can_block:
        previous = signal.pthread_sigmask(signal.SIG_BLOCK, _HELD)
    _depth += 1
    try:
        yield
    finally:
        _depth -= 1
        if can_block:
            signal.pthread_sigmask(signal.SIG_SETMASK, previous)
        if _depth == 0 and _deferred:
            _deferred = False
            raise KeyboardInterrupt


def drop_pending() -> bool:
    """Inside ``signals_held``: discard SIGINT/SIGTERM that arrived meanwhile; True if any did.

    Used when the outcome is already settled (the build is being stopped, or
    the new site is installed), so a late signal cannot turn a true outcome
    message into a false one.
    """
    global _deferred
    dropped, _deferred = _deferred, False
    if not _can_block() or not hasattr(signal, "sigtimedwait"):
        return dropped
    while signal.sigtimedwait(_HELD, 0) is not None:
        dropped = True
    return dropped


def stop_once(signum, frame) -> None:
    """Signal handler for a build: the first SIGINT/SIGTERM stops it, later ones change nothing.

    It blocks both signals before raising KeyboardInterrupt, so a second
    Ctrl-C cannot cut the clean-up (workers, staging folder, lock) short; inside
    a ``signals_held`` section the stop waits for the section's end.  See
    ``after_stop`` for what happens to the signals held back.
    """
    global _interrupted, _deferred
    if _interrupted:
        return
    _interrupted = True
    if _can_block():
        signal.pthread_sigmask(signal.SIG_BLOCK, _HELD)
    if _depth:
        _deferred = True
        return
    raise KeyboardInterrupt


def after_stop(process_ends: bool) -> None:
    """After a build: drop signals held back since ``stop_once``; unblock them unless the process now ends.

    A program about to exit keeps them blocked to the end, so that neither its
    last message nor Python's own exit handlers can be interrupted.
    """
    global _interrupted
    if not _interrupted:
        return
    _interrupted = False
    drop_pending()
    if not process_ends and _can_block():
        signal.pthread_sigmask(signal.SIG_UNBLOCK, _HELD)


@contextmanager
def sigint_ignored_by_children() -> Iterator[None]:
    """Start processes (worker, fork server) that ignore Ctrl-C from their first instruction.

    A terminal sends Ctrl-C to the whole process group; a child still importing
    would print a KeyboardInterrupt traceback.  An ignored signal stays ignored
    across exec, so SIGINT is ignored here while the child starts, with
    SIGINT/SIGTERM held so that no stop is lost meanwhile: one already pending
    stops the build before the child is started.
    """
    if not _can_block():
        yield
        return
    with signals_held():
        if signal.SIGINT in signal.sigpending():
            raise KeyboardInterrupt
        previous = signal.signal(signal.SIGINT, signal.SIG_IGN)
        try:
            yield
        finally:
            signal.signal(signal.SIGINT, previous)
