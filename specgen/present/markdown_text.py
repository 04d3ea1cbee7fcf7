"""The machine's markdown description as safe HTML for the report.

markdown converts the text; nh3 then keeps only an allow-list of plain document tags and
attributes, so raw HTML in a spec (a script, an event handler, a style, a ``javascript:`` link)
cannot run or restyle the report. Links keep only http, https and mailto targets and open nothing
by themselves.

Example: ``to_html("**main** pump")`` -> ``"<p><strong>main</strong> pump</p>"``.
"""

from __future__ import annotations

import re

TAGS = {
    "p", "br", "hr", "strong", "em", "b", "i", "code", "pre", "blockquote", "ul", "ol", "li",
    "a", "h3", "h4", "h5", "h6", "table", "thead", "tbody", "tr", "th", "td", "sub", "sup",
}
ATTRIBUTES = {"a": {"href", "title"}, "th": {"scope"}, "td": set()}
URL_SCHEMES = {"http", "https", "mailto"}


_HEADING = re.compile(r"<(/?)h([1-6])\b")


def _fit_outline(html: str) -> str:
    """Place the description under the report's own h2: shift its headings down two levels (h1 -> h3,
    at most h6) so the page's headings stay in order; mark table header cells as column headers."""
    html = _HEADING.sub(lambda m: f"<{m.group(1)}h{min(int(m.group(2)) + 2, 6)}", html)
    return html.replace("<th>", '<th scope="col">')


def to_html(text: str) -> str:
    """Markdown -> sanitised HTML (a string safe to place in the page unescaped)."""
    import markdown
    import nh3

    if not text or not text.strip():
        return ""
    html = markdown.markdown(text, extensions=["tables", "sane_lists"], output_format="html")
    return nh3.clean(_fit_outline(html), tags=TAGS, attributes=ATTRIBUTES, url_schemes=URL_SCHEMES,
                     link_rel="noopener noreferrer nofollow", strip_comments=True)
