#!/usr/bin/env bash
# Throughput of `rankfreq count -t words` on non-ASCII text (the slow path of the words rule): the Russian UDHR
# translation from $RANKFREQ_CORPORA repeated 1,500 times (~31 MB of Cyrillic), native build, 2 threads.
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
src="${RANKFREQ_CORPORA:?set RANKFREQ_CORPORA (e.g. ../shared/corpora)}/udhr/rus.txt"
big="$work/rus-1500.txt"
[ -s "$big" ] || for i in $(seq 1500); do cat "$src"; done > "$big"
[ -x "$work/native/rankfreq" ] || dotnet publish src/RankFreq.Cli -c Release -p:Native=true -o "$work/native" >/dev/null
for r in 1 2 3; do
  cat "$big" > /dev/null
  /usr/bin/time -f "round $r: %e s wall" "$work/native/rankfreq" count "$big" -o "$work/r.parquet" -q --threads 2
done
