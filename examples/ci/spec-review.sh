#!/usr/bin/env bash
# Check every spec, build their reports, and write the markdown diff of each changed spec against
# the target branch, ready to post as a review comment. Run from anywhere inside the repository.
#
# Usage: spec-review.sh BASE [SPEC_DIR] [OUT_DIR]
#   BASE      the target branch or revision, e.g. origin/main; specs are compared with the merge
#             base of BASE and HEAD, so only this change's own edits show
#   SPEC_DIR  folder holding the specs, from the repository's top folder [specs]
#   OUT_DIR   where the outputs go [build/spec-review]: check.txt, check.xml (JUnit),
#             annotations.txt (GitHub Actions commands), reports/, diff.md (the comment, cut to fit),
#             diff-full.md (every diff in full)
# Environment:
#   FAIL_ON=warn|fail   a check that got worse and now stands at this status fails the run [fail]
#   REQUIRE_REVIEW=1    a spec whose content changed since its last recorded review fails the run
#   SKIP_REPORTS=1      do not build the HTML reports (a quick local run)
# Exit status: 0 all good; 1 a check fails, a check got worse, or a review is missing; 2 bad input.
set -uo pipefail

base_ref=${1:?usage: spec-review.sh BASE [SPEC_DIR] [OUT_DIR]}
specs=${2:-specs}
out=${3:-build/spec-review}
fail_on=${FAIL_ON:-fail}
status=0
worst() { if [ "$1" -gt "$status" ]; then status=$1; fi; }

cd "$(git rev-parse --show-toplevel)" || exit 2
base=$(git merge-base "$base_ref" HEAD) || { echo "spec-review: no common history with '$base_ref'" >&2; exit 2; }
base=$(git rev-parse --short=12 "$base")
mkdir -p "$out"

# 1. Every spec: validate, compute and check. Failing checks are never hidden.
review_opt=""
if [ "${REQUIRE_REVIEW:-0}" = 1 ]; then review_opt="--require-review"; fi
specgen check --quiet $review_opt "$specs" > "$out/check.txt"
worst $?
cat "$out/check.txt"
# The same checks for the CI's own pages: JUnit XML for a test-report view, and error/warning
# commands that mark each spec's line in the pull request (printed only on a GitHub runner).
specgen check --format junit "$specs" > "$out/check.xml"
specgen check --format github "$specs" > "$out/annotations.txt"
if [ "${GITHUB_ACTIONS:-}" = true ]; then cat "$out/annotations.txt"; fi

# 2. The review reports, kept as the run's artefacts.
if [ "${SKIP_REPORTS:-0}" != 1 ]; then
  specgen report "$specs" -o "$out/reports"
  worst $?
fi

# 3. What changed against the target branch, spec by spec, as one markdown comment that fits a
#    pull-request comment (each spec's diff gets its share of 60,000 characters; the full diffs are
#    in diff-full.md in the artefact).
{
  echo "## Spec changes against ${base_ref} (${base})"
  echo
} > "$out/diff.md"
changed=$(git diff --name-only --no-renames --diff-filter=AM "$base" -- "$specs" \
          | grep -E '\.ya?ml$' | grep -Ev '\.reviews\.ya?ml$' || true)
if [ -z "$changed" ]; then
  echo "No spec changed." >> "$out/diff.md"
fi
cp "$out/diff.md" "$out/diff-full.md"
count=$(printf '%s\n' "$changed" | grep -c . || true)
share=$(( 58000 / (count > 0 ? count : 1) ))
if [ "$share" -lt 4000 ]; then share=4000; fi
while IFS= read -r f; do
  [ -n "$f" ] || continue
  if git cat-file -e "$base:$f" 2>/dev/null; then
    specgen diff "$base:$f" "$f" --format markdown --max-chars 0 --fail-on "$fail_on" >> "$out/diff-full.md"
    specgen diff "$base:$f" "$f" --format markdown --max-chars "$share" --fail-on "$fail_on" >> "$out/diff.md"
    worst $?
  else
    printf '### %s\n\nA new spec: no earlier revision to compare with; see its report.\n' "$f" \
      | tee -a "$out/diff-full.md" >> "$out/diff.md"
  fi
  echo | tee -a "$out/diff-full.md" >> "$out/diff.md"
done <<< "$changed"

echo "spec-review: wrote $out (exit status $status)"
exit "$status"
