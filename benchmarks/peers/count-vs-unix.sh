#!/usr/bin/env bash
# Times `rankfreq count -t words` against an awk associative-array count and `tr | sort | uniq -c`
# on ~110 MB of real English (the machine's man pages), alternating, in one run; also o200k_base with the
# chunk cache against plain EncodeToIds over the same text. Prints a table to paste into benchmarks/README.md.
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
corpus="$work/man.txt"
if [ ! -s "$corpus" ]; then zcat /usr/share/man/man*/*.gz > "$corpus" 2>/dev/null || true; fi
bytes=$(stat -c %s "$corpus"); echo "corpus: $corpus, $((bytes / 1000000)) MB"
dotnet publish src/RankFreq.Cli -c Release -o "$work/bin" >/dev/null
rf="$work/bin/rankfreq"
t() { local s e; s=$(date +%s.%N); "$@" >/dev/null; e=$(date +%s.%N); echo "$e - $s" | bc; }
peak() { /usr/bin/time -f "%M" "$@" 2>&1 >/dev/null | tail -1; }
rounds=${ROUNDS:-3}
for r in $(seq "$rounds"); do
  a=$(t "$rf" count "$corpus" -o "$work/c.parquet" -q --threads 2)
  b=$(t awk '{ $0 = tolower($0); n = split($0, w, /[^a-z0-9]+/); for (i = 1; i <= n; i++) if (w[i] != "") c[w[i]]++ } END { for (k in c) print c[k], k }' "$corpus")
  c=$(t sh -c "tr -cs 'A-Za-z0-9' '\n' < '$corpus' | tr 'A-Z' 'a-z' | sort | uniq -c")
  echo "round $r: rankfreq $a s, awk $b s, tr|sort|uniq $c s, awk/rankfreq $(echo "$b / $a" | bc -l | cut -c1-5)x, pipeline/rankfreq $(echo "$c / $a" | bc -l | cut -c1-5)x"
done
echo "rankfreq peak RSS: $(peak "$rf" count "$corpus" -o "$work/c.parquet" -q --threads 2) KiB"
o=$(t "$rf" count "$corpus" -o "$work/o.parquet" -q -t o200k_base --json)
echo "o200k_base with chunk cache: $o s"
dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- encode-whole "$corpus" 2>/dev/null || echo "(whole-text EncodeToIds timing: see benchmarks/README.md)"
