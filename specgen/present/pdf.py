"""The paged PDF of the report, for the design file (optional extra: ``pip install 'specgen[pdf]'``).

WeasyPrint lays the same HTML out on pages. The report's print stylesheet does the paging: the
page size from the spec (A4 or Letter), "page N of M" with the document number, machine, revision and
file SHA-256 in every page footer (CSS @page margin boxes), and no chart or table row split across
a page break (break-inside: avoid). Without the extra the HTML is still written and a note says
how to add the PDF.
"""

from __future__ import annotations

from pathlib import Path

INSTALL_HINT = ("--pdf needs the optional PDF extra: pip install 'specgen[pdf]' (WeasyPrint; on Debian or Ubuntu "
                "also: apt-get install libpango-1.0-0 libpangoft2-1.0-0); the HTML report was written without it")


def available(notes: list[str]) -> bool:
    """True when WeasyPrint can be imported; otherwise add the install hint to ``notes``."""
    try:
        import weasyprint  # noqa: F401
    except (ImportError, OSError):  # OSError: the library is there but Pango is not
        notes.append(INSTALL_HINT)
        return False
    return True


def write_pdf(html: str, target: Path, base: Path) -> None:
    """Lay ``html`` out on pages and write the PDF to ``target``. No network: only file URLs load."""
    import weasyprint

    def no_network(url: str, *args, **kwargs):
        if not url.startswith("file:") and not url.startswith("data:"):
            raise ValueError(f"the report loads nothing from the network ({url})")
        return weasyprint.default_url_fetcher(url, *args, **kwargs)

    doc = weasyprint.HTML(string=html, base_url=str(base), url_fetcher=no_network)
    # A fixed identifier and no dates keep the PDF bytes the same for the same report.
    doc.write_pdf(str(target), pdf_identifier=b"specgen-report")
