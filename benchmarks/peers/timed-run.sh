#!/usr/bin/env bash
# One timed command on a shared machine: wall, user and sys time (/usr/bin/time) with the load average before the run
# and, over the run, the machine's steal and idle ticks and all CPUs' busy ticks (/proc/stat, 100 ticks a second per
# CPU). Steal is time the hypervisor gave to other guests; idle ticks during a two-thread run show serial work.
# Usage: benchmarks/peers/timed-run.sh LABEL COMMAND [ARGS...]   (the command's stdout is discarded)
set -euo pipefail
label=$1; shift
read -r _ u n s i _ _ _ st _ < <(grep '^cpu ' /proc/stat)
l0=$(cut -d' ' -f1 /proc/loadavg)
tmp=$(mktemp)
/usr/bin/time -f "%e %U %S" -o "$tmp" "$@" > /dev/null
read -r _ u2 n2 s2 i2 _ _ _ st2 _ < <(grep '^cpu ' /proc/stat)
read -r e us sy < "$tmp"
rm -f "$tmp"
echo "$label: ${e} s wall, ${us} user, ${sy} sys; load $l0; steal $((st2 - st)) ticks, idle $((i2 - i)) ticks," \
  "busy $(((u2 - u) + (n2 - n) + (s2 - s))) ticks (all CPUs)"
