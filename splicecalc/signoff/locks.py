"""One build at a time per output folder (an OS file lock, released when the process ends).

A second build into the same folder waits for the first, saying so on stderr, for up to
``$SPLICECALC_BUILD_WAIT`` seconds (default 1800; ``0`` stops at once) and then stops with
a clear message. The lock is ``fcntl.flock`` on ``<folder>/.splicecalc-build.lock``: the
kernel drops it when the holder dies, so a killed build never leaves the folder locked.
"""

from __future__ import annotations

import os
import sys
import time
from pathlib import Path

LOCK_NAME = ".splicecalc-build.lock"
WAIT_ENV = "SPLICECALC_BUILD_WAIT"
DEFAULT_WAIT_S = 1800.0


class FolderBusyError(RuntimeError):
    """Another build holds the output folder."""


class FolderLock:
    def __init__(self, fd: int, path: Path) -> None:
        self._fd: int | None = fd
        self.path = path

    def release(self) -> None:
        import fcntl

        if self._fd is not None:
            try:
                fcntl.flock(self._fd, fcntl.LOCK_UN)
            finally:
                os.close(self._fd)
                self._fd = None

    def __enter__(self) -> "FolderLock":
        return self

    def __exit__(self, *exc: object) -> None:
        self.release()


def _holder(path: Path) -> str:
    try:
        pid = path.read_text(encoding="ascii").strip()
    except OSError:
        return "another process"
    return f"pid {pid}" if pid.isdigit() else "another process"


def folder_lock(folder: str | os.PathLike, *, progress: bool = True, wait_s: float | None = None) -> FolderLock:
    """Take the build lock of ``folder`` (created if missing); wait or stop clearly when it is held."""
    import fcntl

    d = Path(folder)
    d.mkdir(parents=True, exist_ok=True)
    path = d / LOCK_NAME
    if wait_s is None:
        try:
            wait_s = float(os.environ.get(WAIT_ENV, DEFAULT_WAIT_S))
        except ValueError:
            wait_s = DEFAULT_WAIT_S
    fd = os.open(path, os.O_RDWR | os.O_CREAT, 0o666)
    t0 = time.monotonic()
    said = False
    while True:
        try:
            fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
            break
        except BlockingIOError:
            if time.monotonic() - t0 >= wait_s:
                os.close(fd)
                raise FolderBusyError(f"another build ({_holder(path)}) is writing into {d}; wait for it to finish "
                                      f"or build into another folder (-o OTHER/NAME.pdf)") from None
            if not said:
                print(f"splicecalc: waiting for another build ({_holder(path)}) writing into {d} ...",
                      file=sys.stderr, flush=True)
                said = True
            time.sleep(0.2)
    os.ftruncate(fd, 0)
    os.pwrite(fd, str(os.getpid()).encode("ascii"), 0)
    return FolderLock(fd, path)


__all__ = ["DEFAULT_WAIT_S", "FolderBusyError", "FolderLock", "LOCK_NAME", "WAIT_ENV", "folder_lock"]
