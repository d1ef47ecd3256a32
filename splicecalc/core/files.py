"""Atomic file writes: the one implementation every module uses.

Nothing half-written is ever left under the final name: data go to a temporary
file in the target folder, are flushed and fsync'ed, then ``os.replace``'d.
"""

from __future__ import annotations

import os
import tempfile
from pathlib import Path


def write_atomic(path: str | os.PathLike, data: bytes | str) -> Path:
    """Write ``data`` (bytes, or text written as UTF-8 with LF newlines) to ``path`` atomically."""
    p = Path(path)
    raw = data.encode("utf-8") if isinstance(data, str) else bytes(data)
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{p.name}.", suffix=".part", dir=str(p.parent) if str(p.parent) else ".")
    except OSError as err:      # name the file meant, not the temporary one
        raise OSError(err.errno, err.strerror, str(p)) from None
    try:
        with os.fdopen(fd, "wb") as fh:
            fh.write(raw)
            fh.flush()
            os.fsync(fh.fileno())
        # mkstemp creates 0600; give the file the mode an ordinary open() would (0666 & ~umask)
        os.chmod(tmp, 0o666 & ~_umask())
        os.replace(tmp, p)
    except BaseException as err:
        try:
            os.unlink(tmp)
        except OSError:
            pass
        if isinstance(err, OSError) and err.errno is not None:
            raise OSError(err.errno, err.strerror, str(p)) from None
        raise
    return p


def _read_umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


#: the process umask, read once at import: reading it means setting it, which must not happen
#: while another thread creates files (builds write files from background threads)
_UMASK = _read_umask()


def _umask() -> int:
    return _UMASK
