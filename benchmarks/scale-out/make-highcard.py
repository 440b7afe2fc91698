#!/usr/bin/env python3
"""Seeded high-cardinality text for the scale-out benchmark (invented words, standard library only).

Usage: make-highcard.py FOLDER TOTAL_MB FILES [SEED]

Writes FILES plain-text files part-0001.txt ... holding about TOTAL_MB megabytes together. Tokens are lower-case
letter strings: most are drawn from a Zipf-like vocabulary of 2^20 invented words (weight 1/rank^1.05), and one in
eight is a vocabulary word with a hexadecimal serial number glued on, so new types keep appearing at any size (the
high-cardinality case a bounded-memory merge is for). For speed a pool of 2^20 drawn tokens is reused, each block
rotated by a seeded offset, and the serials are fresh in every block. The same arguments give the same bytes.
"""
import itertools
import random
import sys

SYLLABLES = [c + v for c in "bdfgklmnprstvz" for v in "aeiou"] + ["qua", "tri", "sho", "ven", "lor"]


def word(i):
    """The i-th invented word: its base-75 digits spelled as syllables (distinct for distinct i)."""
    parts = []
    i += 1
    while i:
        i, d = divmod(i, len(SYLLABLES))
        parts.append(SYLLABLES[d])
    return "".join(parts)


def main():
    folder, total_mb, files = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
    seed = int(sys.argv[4]) if len(sys.argv) > 4 else 2026
    rng = random.Random(seed)
    vocab = [word(i) for i in range(1 << 20)]
    cum = list(itertools.accumulate(1.0 / (r + 1) ** 1.05 for r in range(len(vocab))))
    per_file = total_mb * 1_000_000 // files
    pool = rng.choices(vocab, cum_weights=cum, k=1 << 20)
    serial = 0
    for f in range(files):
        written = 0
        with open(f"{folder}/part-{f + 1:04d}.txt", "w", encoding="ascii", newline="\n") as out:
            while written < per_file:
                r = rng.randrange(len(pool))
                batch = pool[r:] + pool[:r]
                batch[::8] = [f"{w}{serial + k:x}" for k, w in enumerate(batch[::8], 1)]
                serial += len(batch[::8])
                text = "\n".join(" ".join(batch[k:k + 12]) for k in range(0, len(batch), 12)) + "\n"
                out.write(text)
                written += len(text)

if __name__ == "__main__":
    main()
