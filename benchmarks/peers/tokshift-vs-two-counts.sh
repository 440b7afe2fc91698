#!/usr/bin/env bash
# Times `rankfreq tokshift FILE --baseline A --candidate B` (one pass: the text read once, each block handed to both
# tokenizers, then both tail fits and the unseen-entry lists) against the two `rankfreq count FILE -t A` and
# `-t B` runs it replaces, side by side in one run, for (words, o200k_base) and (cl100k_base, o200k_base). tokshift
# runs with the lightest fit it allows (--reps 0 --ci-reps 0 --alternatives none: one xmin search per side, extra
# work the two counts do not do; they write count tables instead). Inputs: the KJV (RANKFREQ_CORPORA) repeated REPEAT
# times (default 5) as plain text, and sotu.jsonl twice, gzip-compressed (text field "text"); or BENCH_INPUT alone.
# Each command's wall time and CPU time (user + system, from /usr/bin/time) are printed: on a loaded machine the CPU
# time is the steadier figure. tokshift runs with --verbose, so its phase times (tokenizer loads, the paired count, the
# fits, writing) are printed on stderr before each round's line.
set -euo pipefail
cd "$(dirname "$0")/../.."
ROUNDS="${ROUNDS:-3}"; REPEAT="${REPEAT:-5}"; THREADS="${THREADS:-2}"
work=benchmarks/work/tokshift; mkdir -p "$work"
if [[ -n "${BENCH_INPUT:-}" ]]; then inputs=("$BENCH_INPUT"); else
  : "${RANKFREQ_CORPORA:?set RANKFREQ_CORPORA to the corpora folder, or BENCH_INPUT to a file}"
  kjv="$work/kjv-x$REPEAT.txt"; sotu="$work/sotu-x2.jsonl.gz"
  [[ -f "$kjv" ]] || for _ in $(seq 1 "$REPEAT"); do cat "$RANKFREQ_CORPORA/kjv-bible.txt"; done > "$kjv"
  [[ -f "$sotu" ]] || cat "$RANKFREQ_CORPORA/sotu.jsonl" "$RANKFREQ_CORPORA/sotu.jsonl" | gzip -6 > "$sotu"
  inputs=("$kjv" "$sotu")
fi
dotnet publish src/RankFreq.Cli -c Release -o benchmarks/work/bin >/dev/null
bin=benchmarks/work/bin/rankfreq
for input in "${inputs[@]}"; do cat "$input" > /dev/null; echo "input $input ($(stat -c %s "$input") bytes)"; done
echo "$THREADS threads; $(uptime)"

# "wall cpu" of one command, cpu = user + system
run() { /usr/bin/time -f "%e %U %S" -o "$work/time" "$@" > /dev/null; awk '{printf "%.2f %.2f", $1, $2 + $3}' "$work/time"; }

for r in $(seq 1 "$ROUNDS"); do
  for input in "${inputs[@]}"; do
    for pair in "words o200k_base" "cl100k_base o200k_base"; do
      set -- $pair
      read -r tw tc <<< "$(run "$bin" tokshift "$input" --baseline "$1" --candidate "$2" --threads "$THREADS" --reps 0 \
        --ci-reps 0 --alternatives none --json -q --verbose)"
      read -r aw ac <<< "$(run "$bin" count "$input" -t "$1" -o "$work/a.parquet" --threads "$THREADS" -q)"
      read -r bw bc_ <<< "$(run "$bin" count "$input" -t "$2" -o "$work/b.parquet" --threads "$THREADS" -q)"
      echo "round $r $(basename "$input") $1 vs $2: tokshift ${tw} s (cpu ${tc} s); counts ${aw} + ${bw} s" \
        "(cpu ${ac} + ${bc_} s); wall ratio $(echo "scale=2; $tw / ($aw + $bw)" | bc)," \
        "cpu ratio $(echo "scale=2; $tc / ($ac + $bc_)" | bc)"
    done
  done
done
echo "after: $(uptime)"
