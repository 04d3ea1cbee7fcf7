"""Command line: parse arguments, call the pipeline, decide the exit status in one place.

Exit status: 0 all checks pass (warnings allowed unless --strict); 1 a check fails (or warns
with --strict); 2 the input is invalid or a file cannot be read or written.
"""

from __future__ import annotations

import argparse
import os
import sys
from pathlib import Path

from specgen import __version__
from specgen.errors import Location, Problem, SpecError

EXIT_OK, EXIT_CHECKS, EXIT_INPUT = 0, 1, 2


def spec_paths(args: list[str]) -> list[str]:
    """Expand folders to the YAML specs inside them (sorted, so runs are repeatable)."""
    out = []
    for a in args:
        p = Path(a)
        if p.is_dir() and any(p.glob("*.y*ml")):
            out += sorted(str(f) for f in p.rglob("*.y*ml") if f.suffix in (".yaml", ".yml"))
        else:
            out.append(a)
    return out


def _parser() -> argparse.ArgumentParser:
    ap = argparse.ArgumentParser(prog="specgen", description="Check hydraulic rotary drive specs and report them for review.")
    ap.add_argument("--version", action="version", version=f"specgen {__version__}")
    sub = ap.add_subparsers(dest="command", metavar="COMMAND")
    c = sub.add_parser("check", help="validate, compute and check specs; print the results")
    c.add_argument("specs", nargs="+", metavar="SPEC", help="spec files or folders of specs")
    c.add_argument("--format", choices=["text", "json"], default="text")
    c.add_argument("--strict", action="store_true", help="count warnings as failures")
    c.add_argument("-q", "--quiet", action="store_true", help="print only the verdict, failures and warnings")
    c.add_argument("-o", "--output", metavar="FILE", help="write the output to FILE instead of standard output")
    s = sub.add_parser("schema", help="print the spec's JSON Schema (for editors)")
    s.add_argument("-o", "--output", metavar="FILE")
    i = sub.add_parser("init", help="write a starter spec")
    i.add_argument("path", nargs="?", default="machine.yaml")
    i.add_argument("--force", action="store_true", help="overwrite an existing file")
    return ap


def _emit(text: str, output: str | None) -> None:
    if output:
        from specgen.output import write_atomic

        write_atomic(output, text)
    else:
        sys.stdout.write(text)


def verdict_status(outcomes, strict: bool) -> int:
    worst = {o.results.verdict for o in outcomes}
    if "fail" in worst or (strict and "warn" in worst):
        return EXIT_CHECKS
    return EXIT_OK


def _evaluate_all(paths: list[str]):
    from specgen.pipeline import run_file

    outcomes, problems = [], []
    for path in paths:
        try:
            outcomes.append(run_file(path))
        except SpecError as exc:
            problems += exc.problems
    return outcomes, problems


def cmd_check(args) -> int:
    outcomes, problems = _evaluate_all(spec_paths(args.specs))
    if problems:
        raise SpecError(problems)
    if args.format == "json":
        from specgen.present import json_out

        _emit(json_out.render(outcomes), args.output)
    else:
        from specgen.present import text

        _emit("\n".join(text.render(o, quiet=args.quiet) for o in outcomes), args.output)
    return verdict_status(outcomes, args.strict)


def cmd_schema(args) -> int:
    import json

    from specgen.spec.validate import schema

    _emit(json.dumps(schema(), indent=2) + "\n", args.output)
    return EXIT_OK


def cmd_init(args) -> int:
    from specgen.output import write_atomic
    from specgen.starter import STARTER

    if Path(args.path).exists() and not args.force:
        raise SpecError([Problem(Location(args.path), "", "already exists; use --force to overwrite it")])
    write_atomic(args.path, STARTER)
    print(f"wrote {args.path}")
    return EXIT_OK


COMMANDS = {"check": cmd_check, "schema": cmd_schema, "init": cmd_init}


def main(argv: list[str] | None = None) -> int:
    ap = _parser()
    args = ap.parse_args(argv)
    if not args.command:
        ap.print_help()
        return EXIT_INPUT
    try:
        return COMMANDS[args.command](args)
    except SpecError as exc:
        for p in exc.problems:
            print(f"error: {p}", file=sys.stderr)
        return EXIT_INPUT
    except OSError as exc:
        print(f"error: {exc.filename or ''}: {exc.strerror or exc}", file=sys.stderr)
        return EXIT_INPUT
    except KeyboardInterrupt:
        return 130
    except Exception as exc:  # a bug in specgen: say so in one line, keep the traceback for debugging
        if os.environ.get("SPECGEN_DEBUG"):
            raise
        print(f"internal error: {type(exc).__name__}: {exc} (set SPECGEN_DEBUG=1 for details)", file=sys.stderr)
        return 3


if __name__ == "__main__":
    sys.exit(main())
