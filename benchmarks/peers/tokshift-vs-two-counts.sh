#!/usr/bin/env bash
# Times `rankfreq tokshift FILE --baseline A --candidate B` (one pass: the text read once, each block handed to both
# tokenizers, then both tail fits and the unseen-entry lists) against the two `rankfreq count FILE -t A` and
# `-t B` runs it replaces, side by side in one run, for (words, o200k_base) and (cl100k_base, o200k_base). tokshift
# runs with the lightest fit it allows (--reps 0 --ci-reps 20 --alternatives none): the fits are extra work the two
# counts do not do. Input: the KJV (RANKFREQ_CORPORA) repeated REPEAT times (default 5), or BENCH_INPUT.
set -euo pipefail
cd "$(dirname "$0")/../.."
ROUNDS="${ROUNDS:-3}"; REPEAT="${REPEAT:-5}"; THREADS="${THREADS:-2}"
work=benchmarks/work/tokshift; mkdir -p "$work"
if [[ -n "${BENCH_INPUT:-}" ]]; then input="$BENCH_INPUT"; else
  : "${RANKFREQ_CORPORA:?set RANKFREQ_CORPORA to the corpora folder, or BENCH_INPUT to a file}"
  input="$work/kjv-x$REPEAT.txt"
  [[ -f "$input" ]] || for _ in $(seq 1 "$REPEAT"); do cat "$RANKFREQ_CORPORA/kjv-bible.txt"; done > "$input"
fi
dotnet publish src/RankFreq.Cli -c Release -o benchmarks/work/bin >/dev/null
bin=benchmarks/work/bin/rankfreq
cat "$input" > /dev/null
echo "input $input ($(stat -c %s "$input") bytes), $THREADS threads; $(uptime)"

secs() { local t0 t1; t0=$(date +%s.%N); "$@" > /dev/null; t1=$(date +%s.%N); echo "$t1 - $t0" | bc; }

for r in $(seq 1 "$ROUNDS"); do
  for pair in "words o200k_base" "cl100k_base o200k_base"; do
    set -- $pair
    ts=$(secs "$bin" tokshift "$input" --baseline "$1" --candidate "$2" --threads "$THREADS" --reps 0 --ci-reps 20 \
      --alternatives none --json -q)
    ca=$(secs "$bin" count "$input" -t "$1" -o "$work/a.parquet" --threads "$THREADS" -q)
    cb=$(secs "$bin" count "$input" -t "$2" -o "$work/b.parquet" --threads "$THREADS" -q)
    echo "round $r $1 vs $2: tokshift $ts s; count -t $1 $ca s + count -t $2 $cb s = $(echo "$ca + $cb" | bc) s;" \
      "ratio tokshift / two counts $(echo "scale=3; $ts / ($ca + $cb)" | bc)"
  done
done
echo "after: $(uptime)"
