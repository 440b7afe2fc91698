#!/usr/bin/env bash
# Times `rankfreq count -t words` against awk associative-array word counts and `tr | sort | uniq -c` on
# ~120 MB of real English (the machine's man pages), alternating in one run; then o200k_base counting with the
# chunk cache against plain EncodeToIds over the same text, with their token totals.
# rankfreq is timed in both builds: the native one (-p:Native=true, ahead-of-time compiled) and the
# framework-dependent ReadyToRun one that `dotnet publish` gives by default.
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
corpus="$work/man.txt"
if [ ! -s "$corpus" ]; then zcat /usr/share/man/man*/*.gz > "$corpus" 2>/dev/null || true; fi
echo "corpus: $corpus, $(( $(stat -c %s "$corpus") / 1000000 )) MB; awk is $(readlink -f "$(command -v awk)")"
dotnet publish src/RankFreq.Cli -c Release -o "$work/bin" >/dev/null
dotnet publish src/RankFreq.Cli -c Release -p:Native=true -o "$work/native" >/dev/null
dotnet build benchmarks/RankFreq.Benchmarks -c Release >/dev/null
rf="$work/bin/rankfreq"; nat="$work/native/rankfreq"
# the page cache on these machines is sometimes emptied: every timed command starts with the corpus read once
t() { local s e; cat "$corpus" > /dev/null; s=$(date +%s.%N); "$@" >/dev/null; e=$(date +%s.%N); echo "$e - $s" | bc; }
med() { tr ' ' '\n' | sed '/^$/d' | sort -g | awk '{ v[NR] = $1 } END { print (NR % 2) ? v[(NR + 1) / 2] : (v[NR / 2] + v[NR / 2 + 1]) / 2 }'; }
A=""; A2=""; B=""; C=""; D=""
ratio() { echo "scale=1; $1 / $2" | bc; }
rounds=${ROUNDS:-3}
printf '%-6s %8s %8s %11s %10s %13s %7s %7s %7s\n' round native r2r awk-fields awk-words tr-sort-uniq f/nat w/nat p/nat
for r in $(seq "$rounds"); do
  a=$(t "$nat" count "$corpus" -o "$work/c.parquet" -q --threads 2)
  a2=$(t "$rf" count "$corpus" -o "$work/c.parquet" -q --threads 2)
  b=$(t awk '{ for (i = 1; i <= NF; i++) c[$i]++ } END { for (k in c) print c[k], k }' "$corpus")
  c=$(t awk '{ $0 = tolower($0); n = split($0, w, /[^a-z0-9]+/); for (i = 1; i <= n; i++) if (w[i] != "") c[w[i]]++ }
       END { for (k in c) print c[k], k }' "$corpus")
  d=$(t sh -c "tr -cs 'A-Za-z0-9' '\n' < '$corpus' | tr 'A-Z' 'a-z' | sort | uniq -c")
  printf '%-6s %8.2f %8.2f %11.2f %10.2f %13.2f %7s %7s %7s\n' "$r" "$a" "$a2" "$b" "$c" "$d" "$(ratio "$b" "$a")" "$(ratio "$c" "$a")" "$(ratio "$d" "$a")"
  A="$A $a"; A2="$A2 $a2"; B="$B $b"; C="$C $c"; D="$D $d"
done
ma=$(echo "$A" | med); mb=$(echo "$B" | med); mc=$(echo "$C" | med); md=$(echo "$D" | med)
printf '%-6s %8.2f %8.2f %11.2f %10.2f %13.2f %7s %7s %7s\n' median "$ma" "$(echo "$A2" | med)" "$mb" "$mc" "$md" \
  "$(ratio "$mb" "$ma")" "$(ratio "$mc" "$ma")" "$(ratio "$md" "$ma")"
echo "peak RSS: native $(/usr/bin/time -f %M "$nat" count "$corpus" -o "$work/c.parquet" -q --threads 2 2>&1 >/dev/null | tail -1) KiB," \
     "r2r $(/usr/bin/time -f %M "$rf" count "$corpus" -o "$work/c.parquet" -q --threads 2 2>&1 >/dev/null | tail -1) KiB"
for r in $(seq "$rounds"); do
  cat "$corpus" > /dev/null
  s=$(date +%s.%N)
  tok=$("$nat" count "$corpus" -o "$work/o.parquet" -t o200k_base --json -q --threads 2 | grep '"tokens"' | tr -dc 0-9)
  e=$(date +%s.%N)
  echo "o200k_base rankfreq count (native, chunk cache, 2 threads, vocabulary load included): $(echo "$e - $s" | bc) s, $tok tokens"
  RANKFREQ_BENCH_INPUT="$(readlink -f "$corpus")" dotnet benchmarks/RankFreq.Benchmarks/bin/Release/net10.0/linux-x64/RankFreq.Benchmarks.dll \
    --filter '*O200kWholeText*' > "$work/encode-whole.log"
  echo "o200k_base EncodeToIds over the whole text: $(awk '/^WorkloadResult/ { printf "%.2f s", $5 / 1e9 }' "$work/encode-whole.log")," \
    "$(grep -o '[0-9,]* tokens' "$work/encode-whole.log" | tail -1)"
done
cat "$corpus" > /dev/null
s=$(date +%s.%N); "$nat" count "$corpus" -o "$work/o.parquet" -t o200k_base -q --threads 1; e=$(date +%s.%N)
echo "o200k_base rankfreq count on one thread (native, vocabulary load included): $(echo "$e - $s" | bc) s"
