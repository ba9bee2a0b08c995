#!/usr/bin/env bash
# The README's test command and the one .ci/run executes must be the same text, and the README's
# demo command must only use files that exist.
set -euo pipefail
src=$2
readme_cmd=$(grep -E '^    apt-get update .*ctest --test-dir build' "$src/README.md" | sed 's/^    //')
ci_cmd=$(grep -E '^apt-get update .*ctest --test-dir build' "$src/.ci/run")
[ -n "$readme_cmd" ] || { echo "README has no test command"; exit 1; }
[ "$readme_cmd" = "$ci_cmd" ] || { echo "README and .ci/run differ:"; echo "$readme_cmd"; echo "$ci_cmd"; exit 1; }
demo=$(grep -E '^    apt-get update .*pinchwise fit' "$src/README.md")
for f in $(grep -oE 'datasets/[A-Za-z0-9_./-]+\.csv' <<<"$demo"); do
  [ -f "$src/$f" ] || { echo "README demo uses missing $f"; exit 1; }
done
echo "README commands consistent"
