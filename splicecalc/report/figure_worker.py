"""A process that draws figures for a build: ``python -m splicecalc.report.figure_worker``.

:class:`splicecalc.report.figures.FigureDrawer` starts it when a build starts; it
imports matplotlib at once and then answers requests on stdin/stdout until stdin
closes. A request is a figure's JSON data, a reply the PDF or an error text, each
framed as an 8-byte big-endian length and the bytes (a reply's first byte is
``0`` for a PDF, ``1`` for an error). One request at a time, in order.
"""

from __future__ import annotations

import struct
import sys
from typing import BinaryIO

_LEN = struct.Struct(">Q")


def write_frame(stream: BinaryIO, payload: bytes) -> None:
    """Write one length-prefixed frame and flush."""
    stream.write(_LEN.pack(len(payload)) + payload)
    stream.flush()


def read_frame(stream: BinaryIO) -> bytes | None:
    """Read one length-prefixed frame; None at the end of the stream."""
    head = stream.read(_LEN.size)
    if len(head) < _LEN.size:
        return None
    (n,) = _LEN.unpack(head)
    body = stream.read(n)
    if len(body) < n:
        raise EOFError("figure worker: a frame was cut short")
    return body


def main() -> int:
    import json

    from .figures import _warm_matplotlib, draw_pdf

    _warm_matplotlib()
    stdin, stdout = sys.stdin.buffer, sys.stdout.buffer
    while True:
        request = read_frame(stdin)
        if request is None:
            return 0
        try:
            write_frame(stdout, b"\0" + draw_pdf(json.loads(request.decode("utf-8"))))
        except Exception as err:  # noqa: BLE001 - sent back to the build, which names the cell
            write_frame(stdout, b"\1" + f"{type(err).__name__}: {err}".encode("utf-8"))


if __name__ == "__main__":
    sys.exit(main())
