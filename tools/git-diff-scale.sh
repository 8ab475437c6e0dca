#!/usr/bin/env bash
# A git diff driver for .scale files: `git diff` (and `git log -p --ext-diff`, `git show
# --ext-diff`) show what changed point by point (scalegen diff) instead of changed lines.
# Set it up once per clone:
#
#   echo '*.scale diff=scale' >> .gitattributes
#   git config diff.scale.command "$PWD/tools/git-diff-scale.sh"
#
# `git diff --no-ext-diff` still shows the plain lines.
#
# git calls the driver with seven arguments: path old-file old-hex old-mode new-file new-hex
# new-mode (old-file or new-file is /dev/null when the file is added or deleted).
# The other .scale files in the same folder (from the working tree) are compiled into both
# versions, so a file that uses cards and profiles declared next to it compiles on its own.
# When scalegen cannot compare the two versions (a version has errors), the driver prints
# why and falls back to a plain unified diff, so `git diff` never stops halfway.
#
# Which scalegen runs: $SCALEGEN if set (e.g. SCALEGEN="dotnet /opt/scalegen/ScaleGen.Cli.dll"),
# else `scalegen` on the PATH, else the build in this checkout, else `dotnet run`.
set -uo pipefail

if [ "$#" -lt 7 ]; then
  echo "usage: git-diff-scale.sh PATH OLD-FILE OLD-HEX OLD-MODE NEW-FILE NEW-HEX NEW-MODE (git calls it)" >&2
  exit 2
fi
path=$1 old=$2 new=$5
checkout=$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)

if [ -n "${SCALEGEN:-}" ]; then
  read -r -a scalegen <<<"$SCALEGEN"
elif command -v scalegen >/dev/null 2>&1; then
  scalegen=(scalegen)
else
  scalegen=()
  for config in Release Debug; do
    dll="$checkout/src/ScaleGen.Cli/bin/$config/net10.0/ScaleGen.Cli.dll"
    if [ -f "$dll" ]; then scalegen=(dotnet "$dll"); break; fi
  done
  [ "${#scalegen[@]}" -gt 0 ] || scalegen=(dotnet run --project "$checkout/src/ScaleGen.Cli" -v q --)
fi

# The rest of the plant: the other .scale files beside this one.
with=()
folder=$(dirname "$path")
for sibling in "$folder"/*.scale; do
  [ -f "$sibling" ] || continue
  [ "$(basename "$sibling")" = "$(basename "$path")" ] && continue
  with+=("$sibling")
done

echo "scalegen diff a/$path b/$path"
errors=$(mktemp)
trap 'rm -f "$errors"' EXIT
if [ "${#with[@]}" -gt 0 ]; then
  changes=$("${scalegen[@]}" diff "$old" "$new" --with "${with[@]}" 2>"$errors")
else
  changes=$("${scalegen[@]}" diff "$old" "$new" 2>"$errors")
fi
status=$?
if [ "$status" -eq 0 ]; then
  if [ -n "$changes" ]; then printf '%s\n' "$changes"; else echo "no point or plant setting changed (comments or layout only)"; fi
else
  sed 's/^/# /' "$errors"
  echo "# scalegen could not compare the two versions (exit $status); plain diff follows"
  diff -u --label "a/$path" --label "b/$path" "$old" "$new"
fi
exit 0
