"""Writing the report: the template rendered, the report folder filled atomically, the PDF beside it.

``render`` has the charts drawn (chart_batch.py: in worker processes where that pays) while the
templates load, and renders them; ``write`` renders every spec into a temporary folder beside
OUTDIR and only then moves the files into place, so a failed run leaves an earlier report untouched.
"""

from __future__ import annotations

import os
import shutil
from dataclasses import dataclass
from pathlib import Path

from specgen import output
from specgen import __version__
from specgen.errors import Location, Problem, SpecError
from specgen.fingerprint import Fingerprint, fingerprint
from specgen.pipeline import Outcome
from specgen.present import chart_batch
from specgen.present.chart_batch import Batch
from specgen.present.report.page_context import context
from specgen.present.report.values import STATUS_WORD, slug
from specgen.resources import data_dir

REPORT_FILE = "index.html"
PDF_FILE = "report.pdf"


def environment():
    """The Jinja2 environment of report_templates/: autoescape on, undefined names an error."""
    import jinja2

    env = jinja2.Environment(loader=jinja2.FileSystemLoader(str(data_dir("report_templates"))),
                             autoescape=True, undefined=jinja2.StrictUndefined, trim_blocks=True,
                             lstrip_blocks=True, keep_trailing_newline=True)
    from markupsafe import Markup

    env.filters["css_string"] = css_string
    env.filters["dotted"] = dotted
    env.globals["Markup"] = Markup  # for the charts' SVG, which charts.py builds and escapes
    return env


def dotted(text: str):
    """A key path that may break after each dot and nowhere else: "drives.<wbr>winch.<wbr>motor"."""
    from markupsafe import Markup, escape

    return Markup(str(escape(text)).replace(".", ".<wbr>"))


def css_string(text: str):
    """Text as a quoted CSS string: every character that is not a plain letter, digit or space is
    written as a CSS hex escape, so no text from a spec can end the string or the style sheet."""
    from markupsafe import Markup

    # The space after each escape ends it (CSS consumes one whitespace after a hex escape).
    body = "".join(ch if ch.isascii() and (ch.isalnum() or ch == " ") else f"\\{ord(ch):x} " for ch in str(text))
    return Markup(f'"{body}"')


def render(o: Outcome, *, fp: Fingerprint | None = None, date: str | None = None,
           reviews: list | None = None, review=None) -> str:
    """The report page for one outcome, as HTML text. ``review``: the spec's review.ReviewStatus
    (its state and the warnings accepted in the record), when there is one."""
    from markupsafe import Markup

    fp = fp or fingerprint(o.source.raw, _spec_path(o))
    batch = Batch()
    ctx = context(o, fp=fp, date=date, reviews=reviews, draw=batch, review=review)
    batch.start()
    try:  # the templates load while the charts are drawn
        template = environment().get_template("report.html")
    finally:
        batch.finish()
    ctx["description_html"] = Markup(ctx["description_html"])
    for d in ctx["drives"]:
        d["notes_html"] = Markup(d["notes_html"])
    return template.render(**ctx)


def render_index(entries: list[dict], date: str | None) -> str:
    """The index page listing several specs' reports with their verdicts."""
    return environment().get_template("index.html").render(entries=entries, date=date, version=__version__)


def _spec_path(o: Outcome) -> Path | None:
    p = Path(o.source.name)
    return p if p.is_file() else None


def start_drawing() -> bool:
    """Start the chart workers now (chart_batch.start_workers), before the specs are read and
    checked, so that they import matplotlib meanwhile on the other cores; ``write`` stops them."""
    return chart_batch.start_workers()


@dataclass
class Written:
    files: list[Path]
    notes: list[str]


def _folder_names(outcomes: list[Outcome]) -> list[str]:
    names, used = [], set()
    for o in outcomes:
        base = slug(o.machine.id)
        name, k = base, 2
        while name in used:
            name, k = f"{base}-{k}", k + 1
        used.add(name)
        names.append(name)
    return names


def _refuse_outside(root: Path, dest: Path) -> None:
    """Refuse to write through a symlinked folder that leads out of the output folder."""
    parent = Path(os.path.realpath(dest.parent))
    if parent != root and root not in parent.parents:
        raise SpecError([Problem(Location(str(dest.parent)), "",
                                 "is a symlink out of the output folder; specgen will not write through it")])


def write(outcomes: list[Outcome], outdir: str | Path, *, date: str | None = None, pdf: bool = False,
          reviews_for=None, status_for=None) -> Written:
    """Write the report(s) into ``outdir``: one spec gives OUTDIR/index.html (and report.pdf with
    ``pdf``); several give one subfolder each plus OUTDIR/index.html listing them with their verdict.

    Everything is rendered into a temporary folder beside ``outdir`` first; only when all of it
    has been written are the files moved into place (os.replace, one file at a time), so an error
    in any render leaves the earlier report as it was. Files in ``outdir`` that are not ours stay.
    """
    from specgen.present import pdf as pdf_out

    target = Path(outdir)
    target.parent.mkdir(parents=True, exist_ok=True)
    notes: list[str] = []
    make_pdf = pdf and pdf_out.available(notes)
    staging = output.staging_folder(target)  # also clears what a killed run left beside it
    try:
        rel: list[Path] = []
        single = len(outcomes) == 1
        names = [""] if single else _folder_names(outcomes)
        entries = []
        for o, name in zip(outcomes, names):
            folder = staging / name if name else staging
            folder.mkdir(parents=True, exist_ok=True)
            fp = fingerprint(o.source.raw, _spec_path(o))
            reviews = reviews_for(o) if reviews_for else None
            html = render(o, fp=fp, date=date, reviews=reviews, review=status_for(o) if status_for else None)
            (folder / REPORT_FILE).write_text(html, encoding="utf-8")
            rel.append(Path(name) / REPORT_FILE if name else Path(REPORT_FILE))
            if make_pdf:
                pdf_out.write_pdf(html, folder / PDF_FILE, base=folder)
                rel.append(Path(name) / PDF_FILE if name else Path(PDF_FILE))
            c = o.results.counts()
            entries.append({"href": f"{name}/{REPORT_FILE}", "title": o.machine.title, "id": o.machine.id,
                            "revision": o.machine.revision, "spec_file": o.source.name, "verdict": o.results.verdict,
                            "verdict_word": STATUS_WORD[o.results.verdict], "counts": c, "sha": fp.short})
        if not single:
            (staging / REPORT_FILE).write_text(render_index(entries, date), encoding="utf-8")
            rel.append(Path(REPORT_FILE))
        for path in rel:
            with open(staging / path, "rb") as fh:
                os.fsync(fh.fileno())
        # All rendered: swap the files in. A PDF left from an earlier run would no longer match.
        target.mkdir(parents=True, exist_ok=True)
        root = Path(os.path.realpath(target))
        for path in rel:
            _refuse_outside(root, target / path)
        output.refuse_foreign_files(target, rel)  # a page specgen did not write is never replaced
        for path in rel:
            (target / path).parent.mkdir(parents=True, exist_ok=True)
            os.replace(staging / path, target / path)
        for name in names:
            stale = target / name / PDF_FILE if name else target / PDF_FILE
            _refuse_outside(root, stale)
            if not make_pdf and stale.exists():
                stale.unlink()
                notes.append(f"removed {stale} from an earlier run: it no longer matches this report")
        return Written([target / p for p in rel], notes)
    finally:
        chart_batch.stop_workers()
        shutil.rmtree(staging, ignore_errors=True)
