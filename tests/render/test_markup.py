"""Markup is a typed string: text is escaped wherever it meets markup, markup is kept as it is."""
import html

from calcsheet.render.markup import Html, anchor_id, esc

NASTY = '<script>alert("x")</script> & \'q\''


def test_text_formatted_into_markup_is_escaped_as_the_standard_library_does():
    page = Html("<td>{}</td>").format(NASTY)
    assert page == "<td>" + html.escape(NASTY, quote=True) + "</td>"
    assert isinstance(page, Html)


def test_markup_is_kept_and_text_is_escaped_by_join_and_plus():
    joined = Html(", ").join([NASTY, Html("<b>kept</b>")])
    assert joined == html.escape(NASTY, quote=True) + ", <b>kept</b>"
    assert Html("<p>") + NASTY == "<p>" + html.escape(NASTY, quote=True)
    assert NASTY + Html("</p>") == html.escape(NASTY, quote=True) + "</p>"


def test_escaping_twice_does_not_double_escape():
    assert esc(esc("a<b")) == "a&lt;b"


def test_an_anchor_keeps_only_safe_characters():
    assert anchor_id('v-x"><script>') == "v-x---script-"  # each of ", >, < becomes -


def test_format_escapes_keywords_keeps_number_specs_and_other_markup():
    from markupsafe import Markup

    page = Html("<p class='{cls}'>{:.2f} {}</p>").format(0.5, Markup("<br>"), cls="'x'")
    assert page == "<p class='&#x27;x&#x27;'>0.50 <br></p>"
    assert isinstance(Html("<p>{}</p>").format(1), Html)


def test_no_printer_builds_html_with_an_f_string():
    """HTML comes from Html templates only; an f-string would put text into a page unescaped."""
    import re
    from pathlib import Path

    root = Path(__file__).resolve().parents[2] / "calcsheet"
    sources = [*sorted((root / "render").glob("*.py")), root / "package.py", root / "watch.py"]
    offenders = [f"{p.name}:{n}" for p in sources
                 for n, line in enumerate(p.read_text(encoding="utf-8").splitlines(), 1)
                 if re.search(r"""\bf("|'|\"\"\")\s*<[a-zA-Z!/]""", line)]
    assert offenders == []
