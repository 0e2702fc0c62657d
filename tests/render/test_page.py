"""The package page: title block, summary, numbered steps, back matter; sheet text escaped everywhere."""
import textwrap

import calcsheet
from calcsheet.render.page import PackageDocument


def html_of(text):
    r = calcsheet.run(textwrap.dedent(text).lstrip())
    return PackageDocument(r).html()


def test_sheet_text_is_escaped_everywhere():
    h = html_of("""
        ---
        project: <script>alert(1)</script>
        subject: <img src=file:///etc/passwd>
        ---
        # <b>Heading</b>
        > <script>alert("prose")</script> & <img src="file:///etc/passwd">
        x = 2 m   -- <img src=x onerror=alert(1)>
        t = "<i>text</i>"
    """)
    assert "<script>" not in h and "<img" not in h and "<b>Heading" not in h and "<i>text" not in h
    assert "&lt;script&gt;alert(1)&lt;/script&gt;" in h
    assert "&lt;img src=file:///etc/passwd&gt;" in h


def test_package_carries_the_caution_hash_and_versions():
    r = calcsheet.run("x = 2 m\ncheck x <= 3 m\n")
    h = PackageDocument(r).html()
    assert "not a substitute for" in h and "governing local codes" in h
    assert r.sha256 in h and f"calcsheet {calcsheet.__version__}" in h
