"""The review report: a static HTML page (inline CSS and SVG, no script) built from one Outcome.

    values.py        numbers as shown (units typeset, percent, plain ratios) and formulas with numbers put in
    entered.py       the "as entered" tables: the spec's own text beside the value read from it
    grouped.py       a trace of several cases: each relation once, a column of results a case
    checklist.py     the checks' rows, the passing checks by id, page 1's figures and review state
    chart_data.py    the numbers each chart needs, from the Results, and the calls to charts.py
    page_context.py  everything the template shows: checks, supplies, drives, modes, assumed values,
                     checklist, symbols, sign-off
    folder.py        rendering the templates (report_templates/), the report folder written
                     atomically, the PDF beside it
"""

from specgen.present.report.chart_data import MARGIN_CHECKS, MARGIN_ROWS_PER_CHART, margin_rows
from specgen.present.report.folder import (PDF_FILE, REPORT_FILE, Written, css_string, environment, render,
                                           render_index, start_drawing, write)
from specgen.present.report.page_context import MANUAL_ITEMS, SIGNOFF_ROLES, context
from specgen.present.report.values import STATUS_WORD, Segment, show, slug, substitute, trace_row

__all__ = ["MANUAL_ITEMS", "MARGIN_CHECKS", "MARGIN_ROWS_PER_CHART", "PDF_FILE", "REPORT_FILE", "SIGNOFF_ROLES",
           "STATUS_WORD", "Segment", "Written", "context", "css_string", "environment",
           "margin_rows", "render", "render_index", "show", "slug", "start_drawing", "substitute", "trace_row",
           "write"]
