"""Writing files atomically: through a temporary file in the same folder, then a rename.

A reader never sees a half-written file, and an earlier file of the same name survives
any failure before the rename. The outputs of one run are replaced together
(:func:`replaced_together`): all new or all as they were. The finished file gets the usual permissions (0666 less
the umask), not the temporary file's private ones.
"""

import contextlib
import os
import tempfile
from pathlib import Path


def _umask():
    mask = os.umask(0)
    os.umask(mask)
    return mask


@contextlib.contextmanager
def atomic_path(path):
    """Yield a temporary path beside ``path``; on success it replaces ``path``, on failure it is removed."""
    path = Path(path)
    fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    os.close(fd)
    try:
        yield tmp
        os.chmod(tmp, 0o666 & ~_umask())
        os.replace(tmp, path)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise


def write_atomic(path, text):
    """Write ``text`` (UTF-8) to ``path`` atomically."""
    with atomic_path(path) as tmp, open(tmp, "w", encoding="utf-8", newline="") as handle:
        handle.write(text)


@contextlib.contextmanager
def _signals_held():
    """Hold SIGINT and SIGTERM back while the block runs (where the platform allows)."""
    import signal

    held = {signal.SIGINT, signal.SIGTERM}
    if not hasattr(signal, "pthread_sigmask"):
        yield
        return
    before = signal.pthread_sigmask(signal.SIG_BLOCK, held)
    try:
        yield
    finally:
        signal.pthread_sigmask(signal.SIG_SETMASK, before)


@contextlib.contextmanager
def replaced_together(paths):
    """Temporary paths for several files, renamed onto them together: all new or all as before.

    Yields ``{path: temporary path}``. When the block ends without an error, every file is
    renamed into place with interruptions held back until the last is done; on any error or
    interruption every temporary file is removed and the earlier files stay as they were.
    """
    temps = {}
    try:
        for path in map(Path, paths):
            fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
            os.close(fd)
            temps[path] = tmp
        yield dict(temps)
        mode = 0o666 & ~_umask()
        with _signals_held():
            for path, tmp in temps.items():
                os.chmod(tmp, mode)
                os.replace(tmp, path)
    except BaseException:
        for tmp in temps.values():
            Path(tmp).unlink(missing_ok=True)
        raise
