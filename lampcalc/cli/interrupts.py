"""Ending a command by SIGINT (Ctrl-C) or SIGTERM: temporary files removed, the usual exit status.

A signal becomes an :class:`Interrupted` exception where the program is, so that every
``with`` block on the way out cleans up (temporary files of outputs are removed, earlier
outputs stay as they were). The process then ends by the same signal, so that a shell or
a scheduler sees the status it expects (130 for SIGINT, 143 for SIGTERM).
"""

import os
import signal

HANDLED = (signal.SIGINT, signal.SIGTERM)


class Interrupted(BaseException):
    """Raised in the main thread when a handled signal arrives; not an error of the input."""

    def __init__(self, signum):
        super().__init__(signal.Signals(signum).name)
        self.signum = signum


def _raise(signum, frame):
    for sig in HANDLED:  # a second signal does not cut the cleaning short
        signal.signal(sig, signal.SIG_IGN)
    raise Interrupted(signum)


def install():
    """Turn SIGINT and SIGTERM into :class:`Interrupted` (command-line use only)."""
    for sig in HANDLED:
        signal.signal(sig, _raise)


def end_by(interruption):
    """End the process by the signal that interrupted it, after the cleaning."""
    signal.signal(interruption.signum, signal.SIG_DFL)
    os.kill(os.getpid(), interruption.signum)
