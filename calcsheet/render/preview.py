"""The live preview's own pages: the refresh script, the page shown while a sheet has errors, a message page.

A good build shows the package page itself (``render.page``) with the refresh
script added. The script carries the server's nonce, so the page's
Content-Security-Policy lets it run and nothing else.
"""
from __future__ import annotations

from pathlib import Path

from .markup import Html


def refresh_script(version: int, nonce: str) -> Html:
    """Polls /version on the page's own origin and reloads when the build moves on (keeps the scroll)."""
    return Html("""<script nonce="{nonce}">
(function () {{
  var shown = {version};
  try {{
    var y = sessionStorage.getItem("calcsheet-scroll");
    if (y !== null) {{ sessionStorage.removeItem("calcsheet-scroll"); window.scrollTo(0, parseInt(y, 10) || 0); }}
  }} catch (e) {{}}
  function poll() {{
    fetch("/version", {{cache: "no-store", credentials: "same-origin"}})
      .then(function (r) {{ return r.json(); }})
      .then(function (v) {{
        if (v.version !== shown) {{
          try {{ sessionStorage.setItem("calcsheet-scroll", String(window.scrollY)); }} catch (e) {{}}
          location.reload();
        }} else {{ setTimeout(poll, 400); }}
      }})
      .catch(function () {{ setTimeout(poll, 1500); }});
  }}
  setTimeout(poll, 400);
}})();
</script>""").format(nonce=nonce, version=int(version))


def error_page(sheet: str, result, last_good: Path | None, version: int, nonce: str) -> Html:
    """What the browser shows while the sheet has errors: the diagnostics, not a blank page."""
    diags = "\n\n".join(d.format(result.source_for(d)) for d in result.diagnostics if d.severity == "error")
    kept = (Html("<p>The last good package is kept at <code>{}</code>.</p>").format(last_good) if last_good
            else Html("<p>No good build yet.</p>"))
    return Html("""<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>{name}: errors</title>
<style>body {{ font-family: sans-serif; margin: 2em; }} pre {{ background: #fff4f4; border: 1px solid #c00;
padding: 1em; white-space: pre-wrap; }} h1 {{ color: #a00; font-size: 1.3em; }}</style></head><body>
<h1 class="watch-errors">{name}: {n} error(s) — package not rebuilt</h1>
<pre class="diagnostics">{diags}</pre>
{kept}
{script}
</body></html>""").format(name=Path(sheet).name, n=len(result.errors), diags=diags, kept=kept,
                           script=refresh_script(version, nonce))


def message_page(message: str, version: int, nonce: str) -> Html:
    """A page that only says something (the sheet cannot be read), and still refreshes itself."""
    return Html("<!DOCTYPE html><html><head><meta charset='utf-8'><title>calcsheet</title></head><body>"
                "<pre>{}</pre>{}</body></html>").format(message, refresh_script(version, nonce))
