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


def strip_tags(html: str) -> str:
    return re.sub(r"<[^>]+>", "", html)


def case_values(page: str, anchor: str) -> list[str]:
    """Every result shown for the case (a mode or a duty point) with id ``anchor``, as printed with its
    unit: from its column of a grouped trace (a value across every column counts for each), or from
    the result column of a one-case trace block."""
    twin = re.search(rf'<span id="{re.escape(anchor)}"></span>', page)
    if twin is not None:  # a drive shown as the same as an earlier one: that drive's column
        para = page[twin.start():page.index("</p>", twin.start())]
        mine = re.match(r"duty-(.+?)-", anchor)
        same = re.search(r'as drive <a href="#drive-([^"]+)"', para).group(1)
        drive = next(d for d in re.findall(r'id="drive-([^"]+)-h"', page) if anchor.startswith(f"duty-{d}-"))
        return case_values(page, f"duty-{same}-" + anchor[len(f"duty-{drive}-"):]) if mine else []
    head = re.search(rf'<th\b[^>]*\bid="{re.escape(anchor)}"', page)
    if head is None:  # a one-case trace: the block itself
        text = block(page, anchor)
        return [strip_tags(c).replace("assumed", "").strip()
                for c in re.findall(r'<td class="num result">(.*?)</td>', text, re.S)]
    start = page.rindex("<table", 0, head.start())
    table = page[start:page.index("</table>", head.start())]
    cases = re.findall(r'<th scope="col" class="num case" id="([^"]+)"', table)
    k = cases.index(anchor)
    out = []
    for row in re.findall(r"<tr>(.*?)</tr>", table.split("<tbody>", 1)[1], re.S):
        unit = strip_tags(re.search(r'<td class="unit">(.*?)</td>', row, re.S).group(1)).strip()
        cells = re.findall(r'<td class="num( span)?"[^>]*>(.*?)</td>', row, re.S)
        if cells and cells[0][0]:  # the same in every case
            text = strip_tags(cells[0][1])
        else:
            text = strip_tags(cells[k][1]) if k < len(cells) else ""
        text = text.replace("assumed", "").strip()
        out.append(f"{text} {unit}".strip() if unit else text)
    return out


def table_of(page: str, anchor: str) -> str:
    """The HTML of the table holding the element with id ``anchor`` (a grouped trace's case column)."""
    m = re.search(rf'\bid="{re.escape(anchor)}"', page)
    assert m, f"no element with id {anchor}"
    start = page.rindex("<table", 0, m.start())
    return page[start:page.index("</table>", m.start())]
