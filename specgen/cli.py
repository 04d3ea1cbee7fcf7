"""Command line: parse arguments, call the pipeline, return the exit status.

The statuses and the rules that give them are in specgen/exits.py: 0 all checks pass (warnings
allowed unless --strict); 1 a check fails (or warns with --strict), a required review is missing,
or a diff shows a regression; 2 the input is invalid or a file cannot be read or written; 3 an
internal error. Dates given with --date follow specgen/dates.py.
"""

from __future__ import annotations

import argparse
import os
import sys
from pathlib import Path

from specgen import __version__, exits
from specgen.errors import Location, Problem, SpecError
from specgen.safe_text import clip, escape


def spec_paths(args: list[str]) -> list[str]:
    """Expand folders to the YAML specs inside them (sorted, so runs are repeatable)."""
    out = []
    for a in args:
        p = Path(a)
        if p.is_dir() and any(p.glob("*.y*ml")):
            from specgen.review import is_reviews_file  # review records sit beside specs; they are not specs

            out += sorted(str(f) for f in p.rglob("*.y*ml") if f.suffix in (".yaml", ".yml") and not is_reviews_file(f)
                          and not f.name.endswith((".parts.yaml", ".parts.yml")))  # motor parts files
        else:
            out.append(a)
    return out


def _parser() -> argparse.ArgumentParser:
    ap = argparse.ArgumentParser(prog="specgen", description="Check hydraulic rotary drive specs and report them for review.")
    ap.add_argument("--version", action="version", version=f"specgen {__version__}")
    sub = ap.add_subparsers(dest="command", metavar="COMMAND")
    c = sub.add_parser("check", help="validate, compute and check specs; print the results")
    c.add_argument("specs", nargs="+", metavar="SPEC", help="spec files or folders of specs")
    c.add_argument("--format", choices=["text", "json", "github", "junit"], default="text",
                   help="text; json; github: GitHub Actions error and warning commands at the spec's lines; "
                        "junit: JUnit XML, one testcase per check [text]")
    c.add_argument("--strict", action="store_true", help="count warnings as failures")
    c.add_argument("-q", "--quiet", action="store_true", help="print only the verdict, failures and warnings")
    c.add_argument("-o", "--output", metavar="FILE", help="write the output to FILE instead of standard output")
    c.add_argument("--require-review", action="store_true",
                   help="exit 1 unless a recorded review accepts each spec's current content")
    c.add_argument("--allow-outside-files", action="store_true",
                   help="let a spec name files (a sizing parts file) outside its own folder tree")
    _variant_option(c)
    c.add_argument("--sensitivity", action="store_true",
                   help="also rank, for every check's margin, the inputs that move it most (each numeric input of "
                        "the model moved by --step of its value; json: the whole table)")
    _step_option(c)
    _diff_parser(sub)
    _review_parser(sub)
    _report_parser(sub)
    s = sub.add_parser("schema", help="print the spec's JSON Schema (for editors), or its key reference")
    s.add_argument("-o", "--output", metavar="FILE")
    s.add_argument("--keys", action="store_true",
                   help="print the key reference as markdown instead: every key, its meaning, kind and an example "
                        "(the repository keeps it as schemas/keys.md)")
    i = sub.add_parser("init", help="write a starter spec")
    i.add_argument("path", nargs="?", default="machine.yaml")
    i.add_argument("--force", action="store_true", help="overwrite an existing file")
    return ap


def _variant_option(p) -> None:
    p.add_argument("--variant", action="append", metavar="ID", dest="variants",
                   help="run only this design variant of the spec (repeat for more) beside the base design "
                        "[every variant the spec declares]")


def _step_option(p) -> None:
    p.add_argument("--step", default="1 %", metavar="STEP",
                   help="with --sensitivity: how far each input moves, a percentage or fraction of its value "
                        "(up to 50 %%) [1 %%]")


def _diff_parser(sub) -> None:
    from specgen.diff import FAIL_ON
    from specgen.present.diff_out import FORMATS, MAX_CHARS

    d = sub.add_parser("diff", help="compare two revisions of a spec, or two of its design variants: inputs, results "
                                    "and checks")
    d.add_argument("old", metavar="OLD", help="spec file, or REV:path read from git (e.g. main:specs/loader.yaml); "
                                              "add #ID for one of its design variants (spec.yaml#larger_reel)")
    d.add_argument("new", metavar="NEW", help="spec file, or REV:path read from git; add #ID for a design variant")
    d.add_argument("--format", choices=FORMATS, default="text")
    d.add_argument("-o", "--output", metavar="FILE", help="write the output to FILE instead of standard output")
    d.add_argument("--max-chars", type=int, default=MAX_CHARS, metavar="N",
                   help="markdown only: cut the comment to N characters, failures and regressions kept first; "
                        "0 for the whole diff [%(default)s]")
    d.add_argument("--fail-on", choices=FAIL_ON, default="fail",
                   help="exit 1 when a check got worse and now stands at this status or beyond [fail]")


def _review_parser(sub) -> None:
    from specgen.review import VERDICTS

    r = sub.add_parser("review", help="record a review of a spec's current content beside it, or accept a warning")
    r.add_argument("spec", metavar="SPEC")
    r.add_argument("--by", required=True, metavar="NAME", help="reviewer's name")
    r.add_argument("--role", required=True, metavar="ROLE", help="reviewer's role, e.g. 'checking engineer'")
    r.add_argument("--verdict", choices=VERDICTS, help="the review's verdict (needed unless --accept-warning)")
    r.add_argument("--accept-warning", metavar="CHECK",
                   help="accept the warning of this check id (e.g. pressure_margin) for the current content, "
                        "with --reason; a failing check cannot be accepted")
    r.add_argument("--where", metavar="WHERE",
                   help="where the accepted check applies, as the checklist writes it "
                        "(e.g. 'drive track_left, duty point climb'); needed when it warns at several places")
    r.add_argument("--reason", default="", metavar="TEXT", help="why the warning is acceptable (one line)")
    r.add_argument("--remarks", default="", metavar="TEXT")
    r.add_argument("--date", metavar="YYYY-MM-DD", help="review date, YYYY-MM-DD or YYYYMMDD [SOURCE_DATE_EPOCH, else today]")
    r.add_argument("--allow-outside-files", action="store_true",
                   help="let the spec name files (a sizing parts file) outside its own folder tree")


def _report_parser(sub) -> None:
    r = sub.add_parser("report", help="write the review report: static HTML with charts, traces, checklist and sign-off")
    r.add_argument("specs", nargs="+", metavar="SPEC", help="spec files or folders of specs")
    r.add_argument("-o", "--output", metavar="OUTDIR", required=True,
                   help="folder for the report (index.html; several specs: one subfolder each and an index)")
    r.add_argument("--pdf", action="store_true", help="also write a paged PDF, report.pdf (needs the 'pdf' extra)")
    r.add_argument("--date", metavar="YYYY-MM-DD",
                   help="date printed on the report, YYYY-MM-DD or YYYYMMDD [SOURCE_DATE_EPOCH, else none]")
    r.add_argument("--strict", action="store_true", help="count warnings as failures")
    r.add_argument("--allow-outside-files", action="store_true",
                   help="let a spec name files (a sizing parts file) outside its own folder tree")
    _variant_option(r)
    r.add_argument("--sensitivity", action="store_true",
                   help="add the sensitivity of the weakest margins to the report (tornado charts): each numeric "
                        "input moved by --step of its value")
    _step_option(r)


def _emit(text: str, output: str | None, inputs=()) -> None:
    """Write ``text`` to ``output`` (never one of ``inputs``: exit 2, nothing written), else stdout."""
    if output:
        from specgen.output import refuse_inputs, write_atomic

        refuse_inputs(output, inputs)
        write_atomic(output, text)
    else:
        sys.stdout.write(text)


def _inputs(paths: list[str], sources) -> list[Path]:
    """Every file a run reads: the specs, their review records and the parts files they name."""
    from specgen.intake.build_sizing import resolve_inside
    from specgen.review import reviews_path

    out = [Path(p) for p in paths] + [reviews_path(p) for p in paths]
    for source in sources:
        sizing = source.data.get("sizing")
        name = sizing.get("parts_file") if isinstance(sizing, dict) else None
        if isinstance(name, str):
            out.append(resolve_inside(source.name, name, allow_outside=True)[0])
    return out


def _evaluate_all(paths: list[str], allow_outside_files: bool = False, variants: list[str] | None = None):
    from specgen.pipeline import run_file

    outcomes, problems = [], []
    for path in paths:
        try:
            outcomes.append(run_file(path, allow_outside_files=allow_outside_files,
                                     variants=tuple(variants) if variants else None))
        except SpecError as exc:
            problems += exc.problems
    return outcomes, problems


def cmd_check(args) -> int:
    paths = spec_paths(args.specs)
    step = _step(args.step) if args.sensitivity else None
    outcomes, problems = _evaluate_all(paths, args.allow_outside_files, args.variants)
    if problems:
        raise SpecError(problems)
    if step is not None:
        from specgen.sensitivity import with_sensitivity

        outcomes = [with_sensitivity(o, step) for o in outcomes]
    inputs = _inputs(paths, [o.source for o in outcomes])
    if args.output:
        from specgen.output import refuse_inputs

        refuse_inputs(args.output, inputs)
    from specgen.review import status

    reviews = [status(o.source.name, o.source, list(o.results.checks)) for o in outcomes]
    if args.format == "json":
        from specgen.present import json_out

        _emit(json_out.render(outcomes, reviews=reviews), args.output, inputs)
    elif args.format in ("github", "junit"):
        from specgen.present import annotations, junit

        _emit((annotations if args.format == "github" else junit).render(outcomes), args.output, inputs)
    else:
        from specgen.present import text

        _emit("\n".join(text.render(o, quiet=args.quiet, review=r) for o, r in zip(outcomes, reviews)), args.output,
              inputs)
    code = exits.outcomes_status(outcomes, args.strict)
    if args.require_review:
        for o, r in zip(outcomes, reviews):
            if not r.covered:
                print(f"review required: {escape(o.source.name)}: {escape(r.text)}", file=sys.stderr)
            code = exits.review_status(code, r.covered)
    return code


def _step(text: str | None) -> float | None:
    """The sensitivity step as a fraction ('1 %' -> 0.01, '0.5%', 0.02); exit 2 when it is not one."""
    if text is None:
        return None
    from specgen.sensitivity import parse_step

    step = parse_step(text)
    if step is None:
        raise SpecError([Problem(Location("--step"), "", f"'{text}' is not a step between 0 and 50 %, "
                                                                 "e.g. '1 %' or 0.01")])
    return step


def cmd_diff(args) -> int:
    from specgen.diff import compare
    from specgen.gitsource import read_spec, split_revision
    from specgen.pipeline import evaluate
    from specgen.present.diff_out import render

    from specgen.gitsource import split_variant
    from specgen.variants import as_outcome, without_variants

    sides, problems = [], []
    for arg in (args.old, args.new):  # both sides read, so every problem is told at once
        spec, vid = split_variant(arg)
        try:
            o = evaluate(read_spec(spec), variants=(vid,) if vid else ())
            sides.append(as_outcome(o, vid, arg) if vid else o)
        except SpecError as exc:
            problems += exc.problems
    if problems:
        raise SpecError(problems)
    if any(split_variant(a)[1] for a in (args.old, args.new)):  # a base design against a variant: inputs only
        sides = [without_variants(o) for o in sides]
    files = [s for s in (split_variant(a)[0] for a in (args.old, args.new)) if split_revision(s) is None]
    d = compare(*sides)
    _emit(render(d, args.format, args.max_chars), args.output, _inputs(files, [s.source for s in sides]))
    return exits.diff_status(d, args.fail_on)


def cmd_review(args) -> int:
    from specgen.pipeline import run_file
    from specgen.dispositions import append_disposition
    from specgen.review import append_review, reviews_path

    if args.accept_warning is None and args.verdict is None:
        raise SpecError([Problem(Location("--verdict"), "", "give the review's verdict, or --accept-warning CHECK")])
    if args.accept_warning is not None and args.verdict is not None:
        raise SpecError([Problem(Location("--accept-warning"), "", "records one thing at a time: a verdict or "
                                 "an accepted warning, not both")])
    o = run_file(args.spec, allow_outside_files=args.allow_outside_files)
    if args.accept_warning is not None:
        d = append_disposition(args.spec, o.source, o.machine.revision, list(o.results.checks), args.by, args.role,
                               args.accept_warning, args.where, args.reason, args.date)
        print(escape(f"recorded in {reviews_path(args.spec)}: warning {d.warning['check']} "
                     f"({d.warning['where'] or 'whole machine'}) accepted by {d.who} on {d.date} for content "
                     f"fingerprint {d.short} ({o.machine.title} rev {o.machine.revision})"))
        return exits.OK
    r = append_review(args.spec, o.source, o.machine.revision, args.by, args.role, args.verdict,
                      args.remarks, args.date)
    print(escape(f"recorded in {reviews_path(args.spec)}: {r.verdict} by {r.who} on {r.date} "
                 f"for content fingerprint {r.short} ({o.machine.title} rev {o.machine.revision})"))
    return exits.OK


def cmd_report(args) -> int:
    from specgen.dates import given_date
    from specgen.present import report
    from specgen.present.text import headline

    date = given_date(args.date, os.environ)
    report.start_drawing()  # chart workers import matplotlib while the specs are checked; write stops them
    paths = spec_paths(args.specs)
    step = _step(args.step) if args.sensitivity else None
    outcomes, problems = _evaluate_all(paths, args.allow_outside_files, args.variants)
    if problems:
        raise SpecError(problems)
    if step is not None:
        from specgen.sensitivity import with_sensitivity

        outcomes = [with_sensitivity(o, step) for o in outcomes]
    _refuse_inputs_in_report(args.output, _inputs(paths, [o.source for o in outcomes]))
    from specgen.review import reviews_for_report, status

    written = report.write(outcomes, args.output, date=date, pdf=args.pdf,
                           reviews_for=lambda o: reviews_for_report(o.source.name, o.source),
                           status_for=lambda o: status(o.source.name, o.source, list(o.results.checks)))
    for note in written.notes:
        print(f"note: {escape(note)}", file=sys.stderr)
    for o in outcomes:
        print(headline(o))
        for v in o.variants:  # a failing variant is said, never hidden behind the base design's verdict
            print(escape(f"  variant {v.id}: {v.results.verdict.upper()}  {v.title}"))
    for path in written.files:
        print(f"wrote {escape(path)}")
    return exits.outcomes_status(outcomes, args.strict)


def _refuse_inputs_in_report(outdir: str, inputs: list[Path]) -> None:
    """A report folder never holds an input where a report file goes (index.html, report.pdf)."""
    from specgen.output import refuse_inputs

    root = Path(os.path.realpath(outdir))
    for given in inputs:
        real = Path(os.path.realpath(given))
        if real.name in ("index.html", "report.pdf") and root in (real.parent, real.parent.parent):
            refuse_inputs(real, [given])


def cmd_schema(args) -> int:
    import json

    from specgen.intake.schema import schema

    if args.keys:
        from specgen import keyref

        _emit(keyref.render(), args.output)
        return exits.OK
    _emit(json.dumps(schema(), indent=2) + "\n", args.output)
    return exits.OK


def cmd_init(args) -> int:
    """Write the starter spec, and the JSON Schema beside it for the editor's schema comment."""
    import json

    from specgen.intake.schema import schema
    from specgen.output import write_atomic
    from specgen.starter import SCHEMA_NAME, STARTER

    if Path(args.path).exists() and not args.force:
        raise SpecError([Problem(Location(args.path), "", "already exists; use --force to overwrite it")])
    write_atomic(args.path, STARTER)
    print(f"wrote {escape(args.path)}")
    target = Path(args.path).parent / SCHEMA_NAME
    text = json.dumps(schema(), indent=2) + "\n"
    if target.exists() and not args.force and target.read_text(encoding="utf-8", errors="replace") != text:
        print(f"kept {escape(target)} (it differs from this specgen's schema; --force replaces it)")
    elif not target.exists() or args.force:
        write_atomic(target, text)
        print(f"wrote {escape(target)} (the schema the spec's first line points at, for your editor)")
    return exits.OK


COMMANDS = {"check": cmd_check, "schema": cmd_schema, "init": cmd_init, "diff": cmd_diff, "review": cmd_review,
            "report": cmd_report}


def main(argv: list[str] | None = None) -> int:
    ap = _parser()
    args = ap.parse_args(argv)
    if not args.command:
        ap.print_help()
        return exits.BAD_INPUT
    try:
        return COMMANDS[args.command](args)
    except SpecError as exc:
        for p in exc.problems:
            print(f"error: {p}", file=sys.stderr)
        return exits.BAD_INPUT
    except OSError as exc:
        print(f"error: {escape(exc.filename or '')}: {escape(exc.strerror or exc)}", file=sys.stderr)
        return exits.BAD_INPUT
    except KeyboardInterrupt:
        return exits.INTERRUPTED
    except Exception as exc:  # a bug in specgen: say so in one line, keep the traceback for debugging
        if os.environ.get("SPECGEN_DEBUG"):
            raise
        print(f"internal error: {type(exc).__name__}: {clip(escape(exc))} (set SPECGEN_DEBUG=1 for details)",
              file=sys.stderr)
        return exits.INTERNAL


if __name__ == "__main__":
    sys.exit(main())
