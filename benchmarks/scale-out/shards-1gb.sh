#!/usr/bin/env bash
# The scale-out recipe (docs/scale-out.md) on one machine, timed step by step: a seeded high-cardinality text of
# SIZE_MB megabytes (default 1000) in FILES files, counted as SHARDS shards by PARALLEL concurrent `count --shard K/N`
# processes (one thread each), then merged two ways: `rankfreq merge` and DuckDB (embedded, through DuckDB.NET, one
# step per process). Each step runs under /usr/bin/time -v: wall time and peak resident memory are taken from outside.
# Finally `fit` on the merged table and on DuckDB's spectrum must agree (same xmin, alpha, p for one seed), and the
# DuckDB table must hold the same spectrum as the merged one.
# Usage: benchmarks/scale-out/shards-1gb.sh        (env: SIZE_MB FILES SHARDS PARALLEL MEMORY WORK)
set -euo pipefail
cd "$(dirname "$0")/../.."
size=${SIZE_MB:-1000}; files=${FILES:-16}; shards=${SHARDS:-4}; par=${PARALLEL:-2}; mem=${MEMORY:-4G}
work=${WORK:-benchmarks/work/scale-out}; mkdir -p "$work/text" "$work/shards"
echo "date: $(date -u +%Y-%m-%dT%H:%MZ); machine: $(nproc) cores, $(free -g | awk '/Mem:/ { print $2 }') GiB; load: $(uptime | sed 's/.*load/load/')"
if [ ! -s "$work/text/part-$(printf %04d "$files").txt" ]; then
  python3 benchmarks/scale-out/make-highcard.py "$work/text" "$size" "$files"
fi
echo "input: $(du -sb "$work/text" | cut -f1) bytes in $files files"
dotnet publish src/RankFreq.Cli -c Release -o "$work/bin" >/dev/null
dotnet build benchmarks/RankFreq.Benchmarks -c Release >/dev/null
rf="$work/bin/rankfreq"
duck=(dotnet benchmarks/RankFreq.Benchmarks/bin/Release/net10.0/linux-x64/RankFreq.Benchmarks.dll duckdb-recipe)
# one line per step: name, wall seconds, peak RSS in MiB (from /usr/bin/time -v)
step() {
  local name=$1; shift
  /usr/bin/time -v -o "$work/$name.time" "$@" > "$work/$name.log" 2>&1
  printf '%-26s %9.1f s %8d MiB\n' "$name" \
    "$(awk -F': ' '/Elapsed/ { n = split($2, p, ":"); s = 0; for (i = 1; i <= n; i++) s = s * 60 + p[i]; print s }' "$work/$name.time")" \
    "$(( $(awk -F': ' '/Maximum resident/ { print $2 }' "$work/$name.time") / 1024 ))"
}
export -f step; export work rf
start=$(date +%s.%N)
seq "$shards" | xargs -P "$par" -I{} bash -c \
  "step count-shard-{}-of-$shards \"\$rf\" count \"\$work/text\" --shard {}/$shards --threads 1 --memory $mem -q -o \"\$work/shards/shard-{}.parquet\""
echo "all shards counted: $(echo "$(date +%s.%N) - $start" | bc) s wall with $par at a time"
ls -l "$work"/shards/*.parquet | awk '{ s += $5 } END { print "shard tables: " s " bytes" }'
step rankfreq-merge "$rf" merge "$work"/shards/shard-*.parquet --memory "$mem" -q -o "$work/merged.parquet"
DUCKDB_THREADS=2 DUCKDB_MEMORY=$mem DUCKDB_TEMP="$work/duck-tmp" step duckdb-merge "${duck[@]}" merge "$work/duck-table.parquet" "$work"/shards/shard-*.parquet
DUCKDB_THREADS=2 step duckdb-spectrum "${duck[@]}" spectrum "$work/duck-spectrum.parquet" "$work/duck-table.parquet"
DUCKDB_THREADS=2 DUCKDB_MEMORY=$mem DUCKDB_TEMP="$work/duck-tmp" step duckdb-spectrum-direct "${duck[@]}" \
  spectrum-direct "$work/duck-direct.parquet" "$work"/shards/shard-*.parquet
ls -l "$work/merged.parquet" "$work/duck-table.parquet" "$work/duck-spectrum.parquet" "$work/duck-direct.parquet" | awk '{ print $5, $9 }'
# fit's figures that must agree; each fit is also timed (the spectrum is kilobytes, the tables are not)
fit() { step "$1" "$rf" fit "$2" --reps 200 --ci-reps 0 --alternatives none --seed 7 --threads 2 --json >&2
  tr -d ' \n' < "$work/$1.log" | grep -o '"\(xmin\|alpha\|gof_p\|n_tail\|n_types\)":[^,}]*' | tr '\n' ' '; }
a=$(fit fit-merged-table "$work/merged.parquet")
b=$(fit fit-duckdb-table "$work/duck-table.parquet")
c=$(fit fit-duckdb-spectrum "$work/duck-spectrum.parquet")
echo "fit merged table:    $a"; echo "fit DuckDB table:    $b"; echo "fit DuckDB spectrum: $c"
[ "$a" = "$b" ] && [ "$a" = "$c" ] && echo "fits identical" || { echo "FITS DIFFER"; exit 1; }
if [ "${ONE_RUN:-1}" = 1 ]; then
  step count-one-run "$rf" count "$work/text" --threads 2 --memory "$mem" -q -o "$work/one-run.parquet"
  d=$(fit fit-one-run "$work/one-run.parquet")
  echo "fit one run:         $d"; [ "$a" = "$d" ] && echo "one run equals shards + merge" || { echo "ONE RUN DIFFERS"; exit 1; }
fi
echo "load after: $(uptime | sed 's/.*load/load/')"
