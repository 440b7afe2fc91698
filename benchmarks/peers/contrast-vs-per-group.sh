#!/usr/bin/env bash
# Times `rankfreq contrast sotu.jsonl --by field:year/20` (one grouped counting pass, fits, bootstraps, thinning)
# against the same figures made the long way: the addresses split into one file per 20-year bin, then
# `rankfreq count` and `rankfreq fit` run once per group. Both sides use 200 goodness-of-fit and 200 bootstrap
# replicates and two threads; contrast also does its size matching (50 thinnings per group, and a thinned refit in
# every bootstrap replicate), which the long way has no equivalent for. Needs RANKFREQ_CORPORA and python3.
set -euo pipefail
cd "$(dirname "$0")/../.."
: "${RANKFREQ_CORPORA:?set RANKFREQ_CORPORA to the corpora folder}"
ROUNDS="${ROUNDS:-3}"
sotu="$RANKFREQ_CORPORA/sotu.jsonl"
work=benchmarks/work/contrast; mkdir -p "$work"
dotnet publish src/RankFreq.Cli -c Release -o benchmarks/work/bin >/dev/null
bin=benchmarks/work/bin/rankfreq
cat "$sotu" > /dev/null

split_groups() {
  rm -rf "$work/split"; mkdir -p "$work/split"
  python3 - "$sotu" "$work/split" <<'PY'
import json, sys
out = {}
for line in open(sys.argv[1], encoding="utf-8"):
    y = json.loads(line)["year"] // 20 * 20
    out.setdefault(y, []).append(line)
for y, lines in out.items():
    open(f"{sys.argv[2]}/{y}.jsonl", "w", encoding="utf-8").writelines(lines)
PY
}

for r in $(seq 1 "$ROUNDS"); do
  t0=$(date +%s.%N)
  "$bin" contrast "$sotu" --by field:year/20 --threads 2 --reps 200 --boot-reps 200 --thin-reps 50 --json -q > "$work/contrast.json"
  tc=$(date +%s.%N)
  "$bin" contrast "$sotu" --by field:year/20 --threads 2 --reps 200 --boot-reps 200 --no-match --json -q > "$work/raw.json"
  tn=$(date +%s.%N)
  t1=$(date +%s.%N)
  split_groups
  t2=$(date +%s.%N)
  for f in "$work"/split/*.jsonl; do
    "$bin" count "$f" -o "${f%.jsonl}.parquet" --threads 2 -q
    "$bin" fit "${f%.jsonl}.parquet" --threads 2 --reps 200 --ci-reps 200 --alternatives none -q
  done
  t3=$(date +%s.%N)
  python3 - "$work/contrast.json" "$t0" "$tc" "$t1" "$t2" "$t3" "$r" "$tn" <<'PY'
import json, sys
j = json.load(open(sys.argv[1]))
t0, tc, t1, t2, t3 = map(float, sys.argv[2:7])
nomatch = float(sys.argv[8]) - tc
c, s, g = tc - t0, t2 - t1, t3 - t2
inner = j["seconds_counting"] + j["seconds_fitting"] + j["seconds_matching"]
print(f"round {sys.argv[7]}: contrast {c:.2f} s ({len(j['groups'])} groups; counting {j['seconds_counting']:.2f} s, "
      f"fits and bootstraps {j['seconds_fitting']:.2f} s, thinning and refitting {j['seconds_matching']:.2f} s + "
      f"the thinned refits inside the bootstraps); split {s:.2f} s; count+fit per group {g:.2f} s; "
      f"ratio {(g) / c:.2f}x (with the split {(s + g) / c:.2f}x); matching share of contrast's own time "
      f"{j['seconds_matching'] / inner:.0%}; contrast --no-match {nomatch:.2f} s, so size matching costs {(c - nomatch) / c:.0%} of the wall time")
PY
done
