"""Text from a spec never becomes markup: HTML report, inline SVG charts, diff as HTML and markdown.

Every free-text field carries script tags, event-handler attributes, ``javascript:`` links, an
SVG payload and a CDATA break-out. The HTML outputs are parsed with the standard library's
html.parser; the markdown diff is rendered with Python-Markdown, as a review tool would show it,
and parsed the same way. No script, frame or embedding element, no on* attribute and no
``javascript:`` URL may appear, while the text itself must still be shown (escaped), so nothing
is silently dropped either.
"""

from __future__ import annotations

import copy
import json
from html.parser import HTMLParser

import pytest

from helpers import minimal, run_cli, write_spec

PAYLOAD = ('<script>alert(1)</script><img src=x onerror=alert(2)><a href="javascript:alert(3)">x</a>'
           '<svg onload=alert(4)></svg>"><iframe src=javascript:alert(5)>]]><b onclick=alert(6)>')
MARKDOWN = PAYLOAD + "\n\n[click](javascript:alert(7)) and <a href='jav&#x61;script:alert(8)'>y</a>\n"
FORBIDDEN_TAGS = {"script", "iframe", "object", "embed", "img", "frame", "frameset", "base", "form", "meta-refresh"}
URL_ATTRS = {"href", "src", "xlink:href", "action", "formaction", "data", "srcdoc"}


def hostile(data: dict, mark: str = "") -> dict:
    """``data`` with the payload in every text field the schema allows."""
    d = copy.deepcopy(data)
    m = d["machine"]
    m["title"] = PAYLOAD + mark
    m["description"] = MARKDOWN + mark
    m["signoff"] = {"prepared_by": PAYLOAD, "checked_by": PAYLOAD, "approved_by": PAYLOAD}
    m["revision"] = "<i onmouseover=alert(9)>A"
    for s in d["supplies"].values():
        s["title"] = PAYLOAD + mark
    for dr in d["drives"].values():
        dr["title"] = PAYLOAD + mark
        dr["notes"] = PAYLOAD + mark
        dr["motor"]["model"] = PAYLOAD + mark
        for u in dr["duty_points"].values():
            u["title"] = PAYLOAD + mark
    for mode in d["modes"].values():
        mode["title"] = PAYLOAD + mark
    return d


class Markup(HTMLParser):
    """Collects every element and attribute the browser would build."""

    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.tags: list[tuple[str, dict]] = []
        self.text: list[str] = []

    def handle_starttag(self, tag, attrs):
        self.tags.append((tag.lower(), {k.lower(): (v or "") for k, v in attrs}))

    handle_startendtag = handle_starttag

    def handle_data(self, data):
        self.text.append(data)


def assert_inert(html: str) -> Markup:
    page = Markup()
    page.feed(html)
    page.close()
    for tag, attrs in page.tags:
        assert tag not in FORBIDDEN_TAGS, f"<{tag} {attrs}> survived"
        for name, value in attrs.items():
            assert not name.startswith("on"), f"<{tag} {name}={value!r}> survived"
            if name in URL_ATTRS:
                squeezed = "".join(value.split()).lower()
                assert not squeezed.startswith(("javascript:", "vbscript:", "data:text/html")), f"<{tag} {name}={value!r}>"
    return page


def shown_as_text(page: Markup) -> str:
    return "".join(page.text)


@pytest.fixture(scope="module")
def report_html(tmp_path_factory):
    folder = tmp_path_factory.mktemp("inj")
    spec = write_spec(folder, hostile(minimal()))
    code, _, err = run_cli("report", "-o", folder / "out", spec)
    assert code == 0, err  # the minimal machine passes; the payload changes no number
    return (folder / "out" / "index.html").read_text(encoding="utf-8")


def test_report_builds_no_markup_from_spec_text(report_html):
    page = assert_inert(report_html)
    text = shown_as_text(page)
    assert text.count("<script>alert(1)</script>") >= 5  # the titles are shown, as text
    # a javascript: link is refused by the markdown renderer: it stays as its literal text, builds no link
    assert text.count("[click](javascript:alert(7))") == 1


def test_report_charts_hold_spec_text_only_as_text(report_html):
    svgs = [part.split("</svg>", 1)[0] for part in report_html.split("<svg")[1:]]
    assert svgs, "the report has no inline chart"
    assert any("&lt;script&gt;alert(1)&lt;/script&gt;" in svg for svg in svgs)  # titles reach the charts
    for svg in svgs:
        assert "<script" not in svg.lower() and "onload" not in svg.replace("onload=alert(4)&gt;", "")
        assert "]]>" not in svg


def diff_pair(tmp_path):
    old = write_spec(tmp_path, hostile(minimal(), " (old)"), "old.yaml")
    new_data = hostile(minimal(), " (new)")
    new_data["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "300 N*m"
    new = write_spec(tmp_path, new_data, "new.yaml")
    return old, new


def diff_output(tmp_path, fmt: str) -> str:
    old, new = diff_pair(tmp_path)
    out = tmp_path / f"diff.{fmt}"
    code, _, err = run_cli("diff", old, new, "--format", fmt, "-o", out)
    assert code == 0, err  # 300 N*m still passes every check: nothing got worse to a failure
    return out.read_text(encoding="utf-8")


def test_html_diff_builds_no_markup_from_spec_text(tmp_path):
    html = diff_output(tmp_path, "html")
    text = shown_as_text(assert_inert(html))
    assert "(old)" in text and "(new)" in text  # the changed titles are listed


def test_markdown_diff_renders_to_no_markup(tmp_path):
    import markdown

    md = diff_output(tmp_path, "markdown")
    assert "(old)" in md and "(new)" in md
    for raw in ("<script", "<img", "<iframe", "<svg", "<b ", "<i "):
        assert raw not in md.lower(), f"raw {raw!r} in the markdown"
    assert "](javascript:" not in md.replace(" ", "").lower()
    assert_inert(markdown.markdown(md, extensions=["tables"]))


def test_json_diff_keeps_the_text_exactly(tmp_path):
    """JSON is data, not markup: the text goes through unchanged (and so is not lost)."""
    doc = json.loads(diff_output(tmp_path, "json"))

    def strings(node):
        if isinstance(node, dict):
            for v in node.values():
                yield from strings(v)
        elif isinstance(node, list):
            for v in node:
                yield from strings(v)
        elif isinstance(node, str):
            yield node

    assert PAYLOAD + " (new)" in set(strings(doc))


def test_terminal_control_characters_in_text_are_refused(tmp_path):
    d = minimal()
    d["drives"]["hoist"]["title"] = "Hoist \x1b[2J\x1b[31m cleared"
    spec = write_spec(tmp_path, d)
    code, out, err = run_cli("check", spec)
    assert code == 2 and "\x1b" not in out + err
    assert "drives.hoist.title" in err and "control character" in err
