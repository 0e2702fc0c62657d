"""The live preview's request handling is bounded too (issue 16): an over-long request target is refused
unread, a request body is never parsed as a next request, an idle connection times out, and a sheet that
cannot be read shows a located message instead of stopping the preview."""
from __future__ import annotations

import http.client
import socket

import pytest

from calcsheet.watch import Preview, Watcher, _Handler


@pytest.fixture
def watcher(tmp_path):
    sheet = tmp_path / "s.calc"
    sheet.write_text("x = 2 m\n")
    w = Watcher(sheet, tmp_path / "out", port=0, log=lambda m: None).start()
    yield w
    w.stop()


def request(w, method, path, body=b""):
    conn = http.client.HTTPConnection("127.0.0.1", w.server.port, timeout=5)
    conn.request(method, path, body=body, headers={"Host": f"127.0.0.1:{w.server.port}"})
    resp = conn.getresponse()
    data = resp.read()
    conn.close()
    return resp, data


def test_an_over_long_request_target_is_refused(watcher):
    resp, _ = request(watcher, "GET", "/" + "a" * 10_000)
    assert resp.status == 414
    resp, _ = request(watcher, "GET", "/")
    assert resp.status == 200  # and the preview still serves


def test_a_post_body_is_never_read_as_another_request(watcher):
    smuggled = b"GET /version HTTP/1.1\r\nHost: 127.0.0.1\r\n\r\n"
    with socket.create_connection(("127.0.0.1", watcher.server.port), timeout=5) as s:
        s.sendall(b"POST / HTTP/1.1\r\nHost: 127.0.0.1:%d\r\nContent-Length: %d\r\n\r\n"
                  % (watcher.server.port, len(smuggled)) + smuggled)
        data = b""
        while chunk := s.recv(65536):
            data += chunk
    assert data.startswith(b"HTTP/1.1 405") and data.count(b"HTTP/1.1 ") == 1


def test_an_idle_connection_has_a_timeout():
    assert 0 < _Handler.timeout <= 30


def test_a_sheet_that_is_not_utf8_shows_a_located_message(tmp_path):
    sheet = tmp_path / "s.calc"
    sheet.write_bytes(b"x = 2 m\ny = \xe6\n")
    p = Preview(sheet, tmp_path / "out")
    status = p.build()
    assert f"{sheet}:2:5:" in status and "not UTF-8" in status
    assert f"{sheet}:2:5:" in p.page.decode("utf-8")
