#!/usr/bin/env bash
# Renders an HTML file to a PNG screenshot with headless Chromium, to look at a generated
# page (e.g. report.html) the way a browser shows it.
#
#   tools/render-html.sh IN.html OUT.png [WIDTHxHEIGHT]     (default 1200x3000)
#
# Installs chromium with apt-get when it is missing (needs root). The browser runs with a
# throwaway profile and no network features; the page itself must be self-contained.
set -euo pipefail

if [ "$#" -lt 2 ]; then
  echo "usage: tools/render-html.sh IN.html OUT.png [WIDTHxHEIGHT]" >&2
  exit 2
fi
in=$1 out=$2 size=${3:-1200x3000}
if [ ! -f "$in" ]; then
  echo "render-html: no such file: $in" >&2
  exit 2
fi
width=${size%x*} height=${size#*x}

browser=""
for candidate in chromium chromium-browser; do
  if command -v "$candidate" >/dev/null 2>&1; then browser=$candidate; break; fi
done
if [ -z "$browser" ]; then
  echo "render-html: chromium not found; installing it with apt-get" >&2
  apt-get update -qq && apt-get install -y -qq chromium >/dev/null
  browser=chromium
fi

profile=$(mktemp -d)
trap 'rm -rf "$profile"' EXIT
in_abs=$(cd "$(dirname "$in")" && pwd)/$(basename "$in")
out_abs=$(cd "$(dirname "$out")" && pwd)/$(basename "$out")

"$browser" --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
  --disable-background-networking --disable-component-update --disable-sync \
  --user-data-dir="$profile" --screenshot="$out_abs" --window-size="$width,$height" \
  --hide-scrollbars "file://$in_abs" >/dev/null 2>&1

if [ ! -s "$out_abs" ]; then
  echo "render-html: chromium wrote no screenshot to $out" >&2
  exit 1
fi
echo "$out"
