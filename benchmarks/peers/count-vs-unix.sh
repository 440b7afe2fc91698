#!/usr/bin/env bash
# Times `rankfreq count -t words` against awk associative-array word counts and `tr | sort | uniq -c` on
# ~120 MB of real English (the machine's man pages), alternating in one run; then o200k_base counting with the
# chunk cache against plain EncodeToIds over the same text, with their token totals.
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
corpus="$work/man.txt"
if [ ! -s "$corpus" ]; then zcat /usr/share/man/man*/*.gz > "$corpus" 2>/dev/null || true; fi
echo "corpus: $corpus, $(( $(stat -c %s "$corpus") / 1000000 )) MB; awk is $(readlink -f "$(command -v awk)")"
dotnet publish src/RankFreq.Cli -c Release -o "$work/bin" >/dev/null
dotnet build benchmarks/RankFreq.Benchmarks -c Release >/dev/null
rf="$work/bin/rankfreq"
t() { local s e; s=$(date +%s.%N); "$@" >/dev/null; e=$(date +%s.%N); echo "$e - $s" | bc; }
ratio() { echo "scale=1; $1 / $2" | bc; }
rounds=${ROUNDS:-3}
printf '%-6s %10s %12s %12s %14s %8s %8s %8s\n' round rankfreq awk-fields awk-words tr-sort-uniq f/rf w/rf p/rf
for r in $(seq "$rounds"); do
  a=$(t "$rf" count "$corpus" -o "$work/c.parquet" -q --threads 2)
  b=$(t awk '{ for (i = 1; i <= NF; i++) c[$i]++ } END { for (k in c) print c[k], k }' "$corpus")
  c=$(t awk '{ $0 = tolower($0); n = split($0, w, /[^a-z0-9]+/); for (i = 1; i <= n; i++) if (w[i] != "") c[w[i]]++ } END { for (k in c) print c[k], k }' "$corpus")
  d=$(t sh -c "tr -cs 'A-Za-z0-9' '\n' < '$corpus' | tr 'A-Z' 'a-z' | sort | uniq -c")
  printf '%-6s %10.2f %12.2f %12.2f %14.2f %8s %8s %8s\n' "$r" "$a" "$b" "$c" "$d" "$(ratio "$b" "$a")" "$(ratio "$c" "$a")" "$(ratio "$d" "$a")"
done
echo "rankfreq peak RSS: $(/usr/bin/time -f %M "$rf" count "$corpus" -o "$work/c.parquet" -q --threads 2 2>&1 >/dev/null | tail -1) KiB"
for r in $(seq "$rounds"); do
  s=$(date +%s.%N)
  tok=$("$rf" count "$corpus" -o "$work/o.parquet" -t o200k_base --json --threads 2 | grep '"tokens"' | tr -dc 0-9)
  e=$(date +%s.%N)
  echo "o200k_base rankfreq count (chunk cache, 2 threads): $(echo "$e - $s" | bc) s, $tok tokens"
  dotnet benchmarks/RankFreq.Benchmarks/bin/Release/net10.0/linux-x64/RankFreq.Benchmarks.dll encode-whole "$corpus"
done
