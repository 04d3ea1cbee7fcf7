"""Reading the report page in tests: a fixed fingerprint, escaped text, one element's HTML, the outline."""

from __future__ import annotations

import re
from html.parser import HTMLParser

import markupsafe

from specgen.fingerprint import Fingerprint

FIXED = Fingerprint("0" * 64)

def esc(text: str) -> str:
    """Text as the templates write it (Jinja2 autoescape via markupsafe)."""
    return str(markupsafe.escape(text))

def block(page: str, anchor: str) -> str:
    """The HTML of the trace block, section or table row with id ``anchor``."""
    m = re.search(rf'<(div|section|tr)\b[^>]*\bid="{re.escape(anchor)}"', page)
    assert m, f"no element with id {anchor}"
    tag = m.group(1)
    end = page.index(f"</{tag}>", m.end()) if tag != "section" else page.index("</section>", m.end())
    if tag == "div":  # trace blocks hold a table, then close
        end = page.index("</table>", m.end())
    return page[m.start():end]

class Outline(HTMLParser):
    def __init__(self):
        super().__init__()
        self.headings, self.ths, self.ids, self.figures, self.stack = [], [], [], [], []

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if re.fullmatch(r"h[1-6]", tag):
            self.headings.append(int(tag[1]))
        if tag == "th":
            self.ths.append(a.get("scope"))
        if "id" in a:
            self.ids.append(a["id"])
        if tag == "figure":
            self.figures.append({"svg": 0, "caption": 0, "alt": 0})
        if self.figures and tag == "svg":
            self.figures[-1]["svg"] += 1
        if self.figures and tag == "figcaption":
            self.figures[-1]["caption"] += 1
        if self.figures and tag == "p" and a.get("class") == "alt":
            self.figures[-1]["alt"] += 1
