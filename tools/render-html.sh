#!/usr/bin/env bash
# Renders an HTML file in headless Chromium, to see what a generated page looks like.
#
#   tools/render-html.sh IN.html OUT.png          screenshot at A4 width (794 x 1123 px, 96 dpi)
#   tools/render-html.sh --pdf IN.html OUT.png    also print to OUT.pdf on A4 (the page's own
#                                                 @page rules) and rasterise each printed page
#                                                 to OUT-<page>.png at 60 dpi (needs pdftoppm)
#
# Needs /usr/bin/chromium (Debian: apt-get update && apt-get install -y chromium poppler-utils).
# Nothing is fetched from the network: the flags turn off every background connection.
set -euo pipefail

pdf=0
if [[ "${1:-}" == "--pdf" ]]; then pdf=1; shift; fi
if [[ $# -ne 2 ]]; then
  echo "usage: $0 [--pdf] IN.html OUT.png" >&2
  exit 2
fi
in="$1"
out="$2"
if [[ ! -f "$in" ]]; then echo "$0: no such file: $in" >&2; exit 2; fi
chromium="${CHROMIUM:-/usr/bin/chromium}"
if [[ ! -x "$chromium" ]]; then
  echo "$0: $chromium not found; install it with: apt-get update && apt-get install -y chromium" >&2
  exit 2
fi

in_abs="$(realpath "$in")"
out_abs="$(realpath -m "$out")"
mkdir -p "$(dirname "$out_abs")"
profile="$(mktemp -d)"
log="$(mktemp)"
trap 'rm -rf "$profile" "$log"' EXIT

common=(--headless --no-sandbox --disable-gpu --disable-quic --no-first-run
  --disable-background-networking --disable-component-update --disable-sync
  --user-data-dir="$profile" --hide-scrollbars)

run() {
  if ! timeout 120 "$chromium" "${common[@]}" "$@" "file://$in_abs" >"$log" 2>&1; then
    cat "$log" >&2
    echo "$0: chromium failed" >&2
    exit 1
  fi
}

run --screenshot="$out_abs" --window-size=794,1123
echo "$out_abs"

if [[ $pdf -eq 1 ]]; then
  if ! command -v pdftoppm >/dev/null; then
    echo "$0: pdftoppm not found; install it with: apt-get install -y poppler-utils" >&2
    exit 2
  fi
  pdf_out="${out_abs%.png}.pdf"
  run --print-to-pdf="$pdf_out" --no-pdf-header-footer
  echo "$pdf_out"
  # 60 dpi is enough to judge layout and clipping; A4 at 60 dpi is 496 x 702 px.
  pdftoppm -png -r 60 "$pdf_out" "${out_abs%.png}"
  ls "${out_abs%.png}"-*.png
fi
