#!/usr/bin/env bash
# Times the quick start's `rankfreq profile corpora-demo/corpus` with default settings (2,500 goodness-of-fit and
# 1,000 bootstrap replicates, all cores), process start included, and the whole command through
# `dotnet run` as the README gives it. Prints the machine load beside each run: these machines are shared.
set -euo pipefail
cd "$(dirname "$0")/../.."
work=benchmarks/work; mkdir -p "$work"
dotnet publish src/RankFreq.Cli -c Release -o "$work/bin" >/dev/null
for r in 1 2 3; do
  rm -rf "$work/profile-demo"
  echo "load $(cut -d' ' -f1 /proc/loadavg)"
  /usr/bin/time -f "profile corpora-demo/corpus: %e s wall, %U s user, %S s sys, %M KiB peak" "$work/bin/rankfreq" profile corpora-demo/corpus \
    -o "$work/profile-demo" -q
done
rm -rf "$work/profile-demo"
/usr/bin/time -f "dotnet run ... profile corpora-demo/corpus (build up to date): %e s wall" \
  dotnet run --project src/RankFreq.Cli -c Release -- profile corpora-demo/corpus -o "$work/profile-demo" -q
