"""Writing files atomically: through a temporary file in the same folder, then a rename.

A reader never sees a half-written file, and an earlier file of the same name survives
any failure before the rename. The finished file gets the usual permissions (0666 less
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
