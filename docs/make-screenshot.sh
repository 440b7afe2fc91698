#!/usr/bin/env bash
# Regenerates docs/report-demo.png, the README's picture of a report: profiles the demo corpus and takes a
# screenshot of the top of report.html with headless Chromium (Debian package chromium) at 1280 px.
# Usage: docs/make-screenshot.sh   (from anywhere; RANKFREQ_CHROMIUM overrides the browser path)
set -euo pipefail
cd "$(dirname "$0")/.."
browser="${RANKFREQ_CHROMIUM:-$(command -v chromium || command -v chromium-browser || true)}"
[ -n "$browser" ] || { echo "make-screenshot: chromium not found (apt-get install chromium)" >&2; exit 1; }
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
dotnet run --project src/RankFreq.Cli -c Release -- profile corpora-demo/corpus -o "$work/profile" -q
"$browser" --headless --no-sandbox --disable-gpu --hide-scrollbars --no-first-run --disable-background-networking \
  --user-data-dir="$work/browser" --window-size=1280,1450 --screenshot="$work/shot.png" \
  "file://$work/profile/report.html" >/dev/null 2>&1
[ -s "$work/shot.png" ] || { echo "make-screenshot: chromium wrote no screenshot" >&2; exit 1; }
mv "$work/shot.png" docs/report-demo.png
echo "docs/report-demo.png written"
