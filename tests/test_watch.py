"""Live preview: rebuild on save, serve on loopback only, diagnostics instead of a blank page, and a real
headless browser tab that refreshes by itself."""
import http.client
import json
import os
import re
import shutil
import subprocess
import textwrap
import threading
import time

import pytest

from calcsheet.watch import Watcher, is_loopback

SHEET = textwrap.dedent("""\
    ---
    project: Heron Quay Boathouse
    subject: Floor joist J-4
    rev: C
    ---
    # Joist
    b = 100 mm        -- joist breadth
    h = 200 mm        -- joist depth
    L = 4 m           -- span
    w = 5 kN/m
    M [kN*m] = w*L^2/8
    S [mm^3] = b*h^2/6
    sigma_b [MPa] = M/S   -- bending stress
    f = 12 MPa
    check sigma_b <= f  -- bending
    """)


def save(path, text):
    """Write the sheet as an editor would, and make sure its mtime moves even on a coarse clock."""
    before = path.stat().st_mtime_ns if path.exists() else 0
    path.write_text(text, encoding="utf-8")
    if path.stat().st_mtime_ns == before:
        os.utime(path, ns=(before + 1_000_000, before + 1_000_000))


@pytest.fixture
def watcher(tmp_path):
    sheet = tmp_path / "joist.calc"
    save(sheet, SHEET)
    log = []
    w = Watcher(sheet, tmp_path / "out", port=0, log=log.append).start()
    w.sheet, w.log_lines = sheet, log
    yield w
    w.stop()


def get(w, path="/", host=None, method="GET"):
    conn = http.client.HTTPConnection("127.0.0.1", w.server.port, timeout=5)
    conn.putrequest(method, path, skip_host=True)
    conn.putheader("Host", host if host is not None else f"127.0.0.1:{w.server.port}")
    conn.endheaders()
    resp = conn.getresponse()
    body = resp.read()
    conn.close()
    return resp, body.decode("utf-8")


def wait_for(predicate, seconds=10.0, step=0.05):
    end = time.monotonic() + seconds
    while time.monotonic() < end:
        value = predicate()
        if value:
            return value
        time.sleep(step)
    return predicate()


# ------------------------------------------------------------ the server


def test_the_server_binds_loopback_only(watcher):
    assert watcher.server.server_address[0] == "127.0.0.1"
    assert watcher.url.startswith("http://127.0.0.1:")


@pytest.mark.parametrize("peer, allowed", [
    ("127.0.0.1", True), ("127.8.9.10", True), ("::1", True), ("::ffff:127.0.0.1", True),
    ("192.0.2.10", False), ("10.0.0.5", False), ("::ffff:192.168.1.4", False), ("2001:db8::1", False),
    ("not-an-address", False),
])
def test_connections_from_anything_but_loopback_are_refused(watcher, peer, allowed):
    assert is_loopback(peer) is allowed
    assert watcher.server.verify_request(None, (peer, 40000)) is allowed


@pytest.mark.parametrize("host", ["evil.example", "evil.example:80", "192.0.2.10:{port}", "", "localhost:1"])
def test_a_request_naming_another_host_is_refused(watcher, host):
    resp, body = get(watcher, host=host.format(port=watcher.server.port))
    assert resp.status == 403 and "127.0.0.1" in body


def test_the_page_and_its_version_are_served_from_one_origin(watcher):
    resp, body = get(watcher)
    assert resp.status == 200 and "Floor joist J-4" in body
    csp = resp.getheader("Content-Security-Policy")
    assert "connect-src 'self'" in csp and "default-src 'none'" in csp
    assert 'fetch("/version"' in body and "http" not in body.split('fetch("/version"')[1].split(")")[0]
    resp, body = get(watcher, "/version")
    assert resp.status == 200 and json.loads(body)["version"] == 1
    resp, _ = get(watcher, "/localhost/../etc/passwd")
    assert resp.status == 404
    resp, _ = get(watcher, method="POST")
    assert resp.status == 405


def test_a_save_rebuilds_the_package_on_disk(watcher):
    out = watcher.sheet.parent / "out" / "joist.html"
    assert "sigma" in out.read_text(encoding="utf-8")
    save(watcher.sheet, SHEET.replace("h = 200 mm", "h = 250 mm"))
    assert wait_for(lambda: get(watcher, "/version")[1] == '{"version": 2}')
    assert "250" in out.read_text(encoding="utf-8")
    assert "<script" not in out.read_text(encoding="utf-8")  # the refresh script is for the browser only


def test_errors_show_diagnostics_and_keep_the_last_good_package(watcher):
    out = watcher.sheet.parent / "out" / "joist.html"
    good = out.read_bytes()
    save(watcher.sheet, SHEET.replace("M [kN*m] = w*L^2/8", "M [kN*m] = w*L/8 <script>x</script>"))
    assert wait_for(lambda: get(watcher, "/version")[1] == '{"version": 2}')
    _, page = get(watcher)
    assert "error(s)" in page and "joist.calc:11" in page  # the diagnostic, with its line
    assert "<script>x</script>" not in page and "&lt;script&gt;" in page
    assert str(out) in page
    assert out.read_bytes() == good
    save(watcher.sheet, SHEET.replace("M [kN*m] = w*L^2/8", "M [kN*m] = w*L/8"))  # a unit error
    assert wait_for(lambda: get(watcher, "/version")[1] == '{"version": 3}')
    assert "declared" in get(watcher)[1] and out.read_bytes() == good


# ------------------------------------------------------------ a real browser

def shows(text, number, unit="MPa"):
    """The number and unit as the package prints them (a thin space may sit between them)."""
    return re.search(re.escape(number) + r"\s*" + unit, text) is not None


CHROMIUM = shutil.which("chromium") or shutil.which("chromium-browser")


class DevTools:
    """The DevTools protocol over --remote-debugging-pipe (NUL-separated JSON on fds 3 and 4)."""

    def __init__(self, profile):
        flags = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                 "--disable-background-networking", "--disable-component-update", "--disable-sync",
                 "--disable-extensions", "--disable-default-apps", f"--user-data-dir={profile}",
                 "--remote-debugging-pipe", "about:blank"]
        # the shell gives chromium our stdin as fd 3 (its commands) and our stdout as fd 4 (its replies)
        self.proc = subprocess.Popen(["sh", "-c", 'exec "$@" 3<&0 4>&1 </dev/null >/dev/null', "sh", CHROMIUM,
                                      *flags], stdin=subprocess.PIPE, stdout=subprocess.PIPE,
                                     stderr=subprocess.DEVNULL)
        self.replies: dict[int, dict] = {}
        self.cv = threading.Condition()
        self.next_id = 0
        threading.Thread(target=self._read, daemon=True).start()

    def _read(self):
        buf = b""
        while True:
            chunk = self.proc.stdout.read1(65536)
            if not chunk:
                return
            buf += chunk
            while b"\0" in buf:
                raw, buf = buf.split(b"\0", 1)
                msg = json.loads(raw)
                if "id" in msg:
                    with self.cv:
                        self.replies[msg["id"]] = msg
                        self.cv.notify_all()

    def send(self, method, params=None, session=None, timeout=20):
        self.next_id += 1
        mid = self.next_id
        msg = {"id": mid, "method": method, "params": params or {}}
        if session:
            msg["sessionId"] = session
        self.proc.stdin.write(json.dumps(msg).encode() + b"\0")
        self.proc.stdin.flush()
        with self.cv:
            if not self.cv.wait_for(lambda: mid in self.replies, timeout):
                raise TimeoutError(f"chromium did not answer {method}")
            reply = self.replies.pop(mid)
        if "error" in reply:
            raise RuntimeError(f"{method}: {reply['error']}")
        return reply["result"]

    def close(self):
        try:
            self.send("Browser.close", timeout=5)
        except Exception:
            pass
        try:
            self.proc.wait(timeout=10)
        except subprocess.TimeoutExpired:
            self.proc.kill()
            self.proc.wait()


@pytest.mark.skipif(CHROMIUM is None, reason="chromium is not installed (CI installs it via .ci/system-deps)")
def test_an_open_tab_refreshes_by_itself_in_headless_chromium(watcher, tmp_path):
    browser = DevTools(tmp_path / "profile")
    try:
        target = browser.send("Target.createTarget", {"url": watcher.url})["targetId"]
        session = browser.send("Target.attachToTarget", {"targetId": target, "flatten": True})["sessionId"]

        def page_text():
            try:
                r = browser.send("Runtime.evaluate", {"expression": "document.body ? document.body.innerText : ''",
                                                      "returnByValue": True}, session)
                return r["result"].get("value", "")
            except RuntimeError:  # mid-reload: no context yet
                return ""

        def marker():
            r = browser.send("Runtime.evaluate", {"expression": "window.__calcsheet_marker || 0",
                                                  "returnByValue": True}, session)
            return r["result"].get("value", 0)

        # sigma_b = M/S = (5*4^2/8 kN*m) / (100*200^2/6 mm^3) = 15.0 MPa — M = wL^2/8, common practice;
        # S = b h^2/6, Roark's Formulas for Stress and Strain, Table A.1
        assert wait_for(lambda: shows(page_text(), "15.0"), 20), page_text()[:500]
        browser.send("Runtime.evaluate", {"expression": "window.__calcsheet_marker = 1"}, session)

        save(watcher.sheet, SHEET.replace("h = 200 mm", "h = 250 mm"))
        # 10e6 N*mm / (100*250^2/6 mm^3) = 9.60 MPa
        assert wait_for(lambda: shows(page_text(), "9.60"), 20), page_text()[:500]
        assert marker() == 0  # the tab reloaded itself: nobody navigated it

        save(watcher.sheet, SHEET.replace("h = 250 mm", "h = 200 mm").replace("S [mm^3] = b*h^2/6",
                                                                              "S [mm^3] = b*h/6"))
        assert wait_for(lambda: "error(s)" in page_text(), 20), page_text()[:500]
        assert "declared" in page_text()  # the diagnostics, not a blank page

        save(watcher.sheet, SHEET.replace("h = 200 mm", "h = 300 mm"))
        # 10e6 / (100*300^2/6) = 6.67 MPa
        assert wait_for(lambda: shows(page_text(), "6.67"), 20), page_text()[:500]
    finally:
        browser.close()
