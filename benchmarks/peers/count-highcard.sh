#!/usr/bin/env bash
# Counting at high cardinality (issue 12), all in one run so the ratios share the machine's load:
#   rankfreq count (native build) at 1 and 2 threads, the awk associative-array count and tr | sort | uniq -c,
#   on seeded synthetic text (`tools make-highcard`: Zipf ranks spelled as letter strings; near-unique strings);
#   then the zipf input under --memory 64MB / 256MB / 1GB, each table checked against the in-memory one
#   (`tools table-hash`: rows, tokens and a hash of every row).
# Peak RSS is the kernel's figure for the child (GNU time %M, KiB). Per-type figures: RSS / types, and
# (RSS - 150 MiB) / types, the issue's "bytes per type above a 150 MB base".
# Environment: TOKENS (default 2e7), ZIPF_S (1.05), UNIQUE_TOKENS (6e6), SKIP_BUILD=1 to reuse the builds,
# BIG=1 to add the 2 GB concatenation under --memory 1GB (slow: minutes), UNIQUE=0 to leave out the near-unique input.
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
tokens=${TOKENS:-2e7}; s=${ZIPF_S:-1.05}; utokens=${UNIQUE_TOKENS:-6e6}
if [ "${SKIP_BUILD:-}" != 1 ]; then
  dotnet publish src/RankFreq.Cli -c Release -p:Native=true -o "$work/native" >/dev/null
  dotnet build benchmarks/RankFreq.Benchmarks -c Release >/dev/null
fi
nat="$work/native/rankfreq"
tools() { dotnet benchmarks/RankFreq.Benchmarks/bin/Release/net10.0/linux-x64/RankFreq.Benchmarks.dll tools "$@"; }
zipf="$work/highcard-zipf-$tokens-$s.txt"; unique="$work/highcard-unique-$utokens.txt"
[ -s "$zipf" ] || tools make-highcard "$zipf" "$tokens" zipf "$s" 1
[ -s "$unique" ] || [ "${UNIQUE:-1}" = 0 ] || tools make-highcard "$unique" "$utokens" unique 1.1 1
echo "date: $(date -u '+%Y-%m-%d %H:%M UTC'); load: $(uptime | sed 's/.*load average: //'); $(nproc) cores;" \
  "awk is $(readlink -f "$(command -v awk)"); sort locale: ${LC_ALL:-${LANG:-unset}}"

# run LABEL CMD...: times one command after reading its input once (page cache warm); sets W (wall s), C (user+sys
# s), R (peak RSS KiB)
run() {
  local label=$1; shift
  cat "$input" > /dev/null
  /usr/bin/time -f '%e %U %S %M' -o "$work/time.txt" "$@" > "$work/out.txt"
  read -r W u sy R < "$work/time.txt"
  C=$(echo "$u + $sy" | bc)
  printf '%-34s %8.2f s %8.2f s %8d MiB' "$label" "$W" "$C" $((R / 1024))
}
perType() { echo "scale=0; $1 * 1024 / $2" | bc; }
above() { echo "scale=0; ($1 - 153600) * 1024 / $2" | bc; }

inputs=("$zipf"); [ "${UNIQUE:-1}" = 0 ] || inputs+=("$unique")
for input in "${inputs[@]}"; do
  echo
  echo "input: $input, $(( $(stat -L -c %s "$input") / 1000000 )) MB"
  printf '%-34s %10s %10s %12s %s\n' contender wall cpu 'peak RSS' '  notes'
  run "rankfreq native, 1 thread" "$nat" count "$input" -o "$work/hc1.parquet" -q --json --threads 1
  types=$(tr -d ' \n' < "$work/out.txt" | grep -o '"types":[0-9]*' | tr -dc 0-9); t1=$W
  echo "   $types types; $(perType "$R" "$types") B/type, $(above "$R" "$types") B/type above 150 MiB"
  run "rankfreq native, 2 threads" "$nat" count "$input" -o "$work/hc2.parquet" -q --json --threads 2; t2=$W
  echo "   $(perType "$R" "$types") B/type, $(above "$R" "$types") B/type above 150 MiB; 1 thread / 2 threads $(echo "scale=2; $t1 / $t2" | bc)×"
  run "awk associative array" awk '{ for (i = 1; i <= NF; i++) c[$i]++ } END { for (k in c) print c[k], k }' "$input"; ta=$W
  echo "   awk / rankfreq-2: $(echo "scale=1; $ta / $t2" | bc)×"
  run "tr | sort | uniq -c" sh -c "tr -cs 'A-Za-z0-9' '\n' < '$input' | tr 'A-Z' 'a-z' | sort | uniq -c"; tp=$W
  echo "   pipeline / rankfreq-2: $(echo "scale=1; $tp / $t2" | bc)×"
  # the zipf input's in-memory table is the reference for the budget runs below
  [ "$input" != "$zipf" ] || cp "$work/hc2.parquet" "$work/hc-ref.parquet"
done

input="$zipf"
echo
tools table-hash "$work/hc-ref.parquet" > "$work/ref.hash"
echo "memory budgets on $zipf (native, 2 threads); in-memory table: $(cat "$work/ref.hash")"
for m in 64MB 256MB 1GB; do
  run "--memory $m" "$nat" count "$input" -o "$work/hcm.parquet" -q --json --threads 2 --memory "$m"
  runs=$(tr -d ' \n' < "$work/out.txt" | grep -o '"spilled_runs":[0-9]*' | tr -dc 0-9)
  same=$([ "$(tools table-hash "$work/hcm.parquet")" = "$(cat "$work/ref.hash")" ] && echo identical || echo DIFFERENT)
  echo "   $runs runs; table $same"
done

if [ "${BIG:-}" = 1 ]; then
  big="$work/highcard-2gb.txt"
  if [ ! -s "$big" ]; then
    for seed in $(seq 1 16); do tools make-highcard "$work/part-$seed.txt" "$tokens" zipf "$s" "$seed" >/dev/null; done
    cat "$work"/part-*.txt | head -c 2000000000 > "$big"; rm -f "$work"/part-*.txt
  fi
  input="$big"
  run "2 GB, --memory 1GB" "$nat" count "$big" -o "$work/hcbig.parquet" -q --json --threads 2 --memory 1GB
  echo "   $(tr -d ' \n' < "$work/out.txt" | grep -o '"t[a-z]*":[0-9]*' | tr '\n' ' ')"
fi
