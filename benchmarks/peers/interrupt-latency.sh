#!/usr/bin/env bash
# Time from SIGINT / SIGTERM to exit for every verb that reads a corpus, each stopped 1.5 s into its work (counting a
# large file, fitting, thinning, or a read blocked on a pipe that stays open), with the exit code and whether anything
# was left under the final name or as a temporary. Usage: benchmarks/peers/interrupt-latency.sh [ROUNDS]
set -euo pipefail
cd "$(dirname "$0")/../.."
rounds=${1:-3}
work=benchmarks/work/interrupt; rm -rf "$work"; mkdir -p "$work"
dotnet publish src/RankFreq.Cli -c Release -o benchmarks/work/bin >/dev/null
exe=$PWD/benchmarks/work/bin/rankfreq
# invented words with a Zipf-like mix, 40 MB of text and the same as JSON Lines with a group field
python3 - "$work" <<'PY'
import json, random, sys
random.seed(11)
syl = ["ka", "lo", "mi", "ren", "tu", "sa", "vel", "or", "di", "pa", "ne", "qua"]
words = ["".join(random.choice(syl) for _ in range(random.randint(1, 4))) for _ in range(50000)]
weights = [1 / (r + 1) for r in range(len(words))]
with open(f"{sys.argv[1]}/big.txt", "w") as t, open(f"{sys.argv[1]}/big.jsonl", "w") as j:
    for i in range(40000):
        line = " ".join(random.choices(words, weights, k=150))
        t.write(line + "\n")
        if i < 8000:
            j.write(json.dumps({"text": line, "party": "north" if i % 2 else "south"}) + "\n")
PY
python3 - "$exe" "$work" "$rounds" <<'PY'
import os, subprocess, sys, time, signal, glob
exe, work, rounds = sys.argv[1], sys.argv[2], int(sys.argv[3])
verbs = {
    "count":          (["count", f"{work}/big.txt", "-o", f"{work}/out.parquet", "-q"], f"{work}/out.parquet", None),
    "count (pipe)":   (["count", "-", "-o", f"{work}/out.parquet", "-q"], f"{work}/out.parquet", b"alpha beta " * 1000),
    "profile":        (["profile", f"{work}/big.jsonl", "-o", f"{work}/p", "-q", "--reps", "5000"], f"{work}/p", None),
    "contrast":       (["contrast", f"{work}/big.jsonl", "--by", "field:party", "-o", f"{work}/c", "-q", "--reps", "2000"], f"{work}/c", None),
    "tokshift":       (["tokshift", f"{work}/big.txt", "--baseline", "words", "--candidate", "cl100k_base", "-o", f"{work}/s", "-q"], f"{work}/s", None),
    "fit":            (["fit", f"{work}/t.parquet", "--reps", "20000", "-o", f"{work}/f.parquet", "-q"], f"{work}/f.parquet", None),
    "forecast":       (["forecast", f"{work}/t.parquet", "--reps", "5000", "-o", f"{work}/fc", "-q"], f"{work}/fc", None),
}
subprocess.run([exe, "count", f"{work}/big.txt", "-o", f"{work}/t.parquet", "-q"], check=True)
print(f"{'verb':<14} {'signal':<8} {'exit':>4} {'stop s':>7}  left behind")
for name, (args, out, feed) in verbs.items():
    for sig in (signal.SIGINT, signal.SIGTERM):
        for r in range(rounds):
            p = subprocess.Popen([exe] + args, stdin=subprocess.PIPE if feed else subprocess.DEVNULL,
                                 stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
            if feed:
                p.stdin.write(feed); p.stdin.flush()
            time.sleep(1.5)
            if p.poll() is not None:
                print(f"{name:<14} {sig.name:<8} finished before the signal"); continue
            t0 = time.monotonic(); p.send_signal(sig); code = p.wait(); dt = time.monotonic() - t0
            left = [x for x in glob.glob(f"{work}/**", recursive=True) + glob.glob(f"{work}/.*") if "rankfreq-tmp" in x]
            left += [out] if os.path.exists(out) else []
            print(f"{name:<14} {sig.name:<8} {code:>4} {dt:>7.3f}  {len(left)}")
            if feed: p.stdin.close()
PY
