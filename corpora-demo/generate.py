#!/usr/bin/env python3
"""Deterministic generator of the RankFreq demo corpus (invented data; fixed seed; standard library only).

Scenario: the archive of Gullhaven Coast Radio, a fictional weather-and-shipping radio service on the
invented Merrow Isles, 1960-2019. Three document sets, one JSON Lines file each, in corpus/:
  bulletins.jsonl  shipping bulletins: formal, repetitive; the fewest types
  letters.jsonl    listener letters: everyday speech; a wider vocabulary
  tales.jsonl      tales told in the islands' old tongue: the richest vocabulary, long compound words
                   with unusual letter clusters (more subword pieces per word)
Every record is {"id", "set", "year", "text"}; records are in year order within a file.

Words come from a two-level Pitman-Yor process (a hierarchical Chinese restaurant). Each set is a restaurant
with discount d and concentration theta; a new table takes its word from the shared island lexicon (itself a
Pitman-Yor restaurant, so common words are shared between sets) with probability `shared`, otherwise a new
word of the set's own. New word forms are built from syllables, so the vocabulary is unbounded and keeps
growing (Heaps-like, types ~ N^d). The frequency spectrum of a Pitman-Yor sample falls as k^-(1+d), so a
larger discount gives a larger tail exponent alpha.

Burstiness: a word drawn into a record recurs in it with probability `burst`, 1 + Geometric(mean `repeat`)
times in all (a topic word of a letter is used again in that letter). This thins out the rarest counts
(fewer hapaxes, as in real text) and bends the spectrum below a few times `repeat`, so the power-law tail
starts in the tens, as it does for real corpora. Planted drift: `burst` falls linearly over the years
(from burst + 0.2 in 1960 to burst - 0.2 in 2019), so later years are less repetitive: more types per token.

Run: python3 corpora-demo/generate.py [OUTPUT_FOLDER]   (default: corpus/ beside this script)
The output depends only on SEED: one random.Random stream, no hashing of strings, no iteration over sets.
"""
import json
import math
import os
import random
import sys

SEED = 20261202
FIRST_YEAR, LAST_YEAR = 1960, 2019  # three 20-year bins: 1960-1979, 1980-1999, 2000-2019
TOKENS_PER_YEAR = 3500  # per set: every set has the same size, so their figures compare at equal N
REPEAT = 8.0            # mean extra uses of a bursting word in its record
BURST_DRIFT = -0.40     # change of the burst probability from the first year to the last

# The shared island lexicon: the first words created are the most used, and they are short.
SHARED = dict(d=0.6, theta=50.0)

# name, discount d, concentration theta, share of new tables taken from the shared lexicon, burst probability
# (mid-period), words per record (range), sentence length (range), syllable style of the set's own words
SETS = [
    dict(name="bulletins", d=0.45, theta=50.0, shared=0.4, burst=0.6, doc=(60, 140), sentence=(5, 12),
         style="plain"),
    dict(name="letters", d=0.60, theta=50.0, shared=0.4, burst=0.6, doc=(90, 260), sentence=(6, 18),
         style="plain"),
    dict(name="tales", d=0.75, theta=50.0, shared=0.4, burst=0.6, doc=(250, 600), sentence=(8, 24),
         style="old"),
]

# Syllables. "plain": open, English-like syllables that byte-level subword vocabularies hold whole.
PLAIN_ONSETS = ["b", "d", "f", "g", "h", "k", "l", "m", "n", "p", "r", "s", "t", "v", "w", "br", "st", "tr", "sh"]
PLAIN_VOWELS = ["a", "e", "i", "o", "u", "ea", "ai", "oo"]
PLAIN_CODAS = ["", "", "", "n", "r", "l", "s", "t", "nd", "rt", "ng"]
# "old": clusters and letters (some outside ASCII) that such vocabularies split into many pieces.
OLD_ONSETS = ["kv", "hj", "tl", "zd", "gn", "fj", "sv", "þ", "ð", "kh", "vr", "sk", "dv", "hl", "x", "q"]
OLD_VOWELS = ["ø", "å", "æ", "y", "ei", "au", "uo", "ä", "ë", "i", "o"]
OLD_CODAS = ["", "ŋ", "rk", "lð", "xt", "mb", "q", "þ", "kk", "dl", "rn"]


class Forms:
    """Makes new word forms, unique across the whole corpus. Early (frequent) words are short."""

    def __init__(self, rng, used):
        self.rng, self.used = rng, used

    def syllable(self, style):
        r = self.rng
        if style == "old":
            return r.choice(OLD_ONSETS) + r.choice(OLD_VOWELS) + r.choice(OLD_CODAS)
        return r.choice(PLAIN_ONSETS) + r.choice(PLAIN_VOWELS) + r.choice(PLAIN_CODAS)

    def new(self, style, index, stems=None):
        """A new word; `stems` (the set's earlier simple words) allows compounds of two of them."""
        r = self.rng
        while True:
            compound = stems is not None and len(stems) > 50 and r.random() < 0.3
            if compound:
                w = r.choice(stems) + r.choice(["a", "s", ""]) + r.choice(stems)
            else:
                n = 1 + int(math.log10(index + 1) * 0.5) + (1 if r.random() < 0.3 else 0)
                w = "".join(self.syllable(style) for _ in range(n))
            if w not in self.used:
                self.used.add(w)
                if stems is not None and not compound:
                    stems.append(w)
                return w


class Restaurant:
    """A Pitman-Yor Chinese restaurant: tables with customer counts, each serving one dish (word)."""

    def __init__(self, theta):
        self.theta = theta
        self.customers = []  # table index of every customer, in arrival order
        self.count = []      # customers per table
        self.dish = []       # word of each table

    def seat(self, rng, d, new_dish):
        n, k = len(self.customers), len(self.count)
        if n == 0 or rng.random() * (n + self.theta) < self.theta + d * k:
            self.count.append(0)
            self.dish.append(new_dish())
            t = k
        else:
            # a table with probability (n_t - d) / (n - d k): draw a customer uniformly (probability n_t / n)
            # and keep the table with probability 1 - d / n_t (exact rejection; acceptance at least 1 - d)
            while True:
                t = self.customers[int(rng.random() * n)]
                if rng.random() * self.count[t] >= d:
                    break
        self.count[t] += 1
        self.customers.append(t)
        return self.dish[t]


def geometric(rng, mean):
    """Failures before a success, with the given mean (inversion)."""
    return int(math.log(1.0 - rng.random()) / math.log(mean / (1.0 + mean)))


def generate(out_dir):
    rng = random.Random(SEED)
    forms = Forms(rng, set())
    shared = Restaurant(SHARED["theta"])
    shared_word = lambda: forms.new("plain", len(shared.count))
    os.makedirs(out_dir, exist_ok=True)
    for spec in SETS:
        own_words, stems = [], ([] if spec["style"] == "old" else None)

        def own_word(spec=spec, own_words=own_words, stems=stems):
            w = forms.new(spec["style"], len(own_words), stems)
            own_words.append(w)
            return w

        def base(spec=spec, own_word=own_word):
            if rng.random() < spec["shared"]:
                return shared.seat(rng, SHARED["d"], shared_word)
            return own_word()

        table = Restaurant(spec["theta"])
        path = os.path.join(out_dir, spec["name"] + ".jsonl")
        records = 0
        with open(path, "w", encoding="utf-8", newline="\n") as f:
            for year in range(FIRST_YEAR, LAST_YEAR + 1):
                burst = spec["burst"] + BURST_DRIFT * ((year - FIRST_YEAR) / (LAST_YEAR - FIRST_YEAR) - 0.5)
                budget = TOKENS_PER_YEAR
                while budget > 0:
                    n = min(budget, rng.randint(*spec["doc"]))
                    budget -= n
                    words = []
                    while len(words) < n:
                        w = table.seat(rng, spec["d"], base)
                        # a bursting word recurs in its record: 1 + Geometric(mean REPEAT) uses in all
                        words.extend([w] * (1 + geometric(rng, REPEAT) if rng.random() < burst else 1))
                    del words[n:]
                    rng.shuffle(words)
                    sentences, i = [], 0
                    while i < n:
                        m = rng.randint(*spec["sentence"])
                        s = " ".join(words[i:i + m])
                        sentences.append(s[:1].upper() + s[1:] + ".")
                        i += m
                    records += 1
                    rec = {"id": f"{spec['name']}-{records:05d}", "set": spec["name"], "year": year,
                           "text": " ".join(sentences)}
                    f.write(json.dumps(rec, ensure_ascii=False) + "\n")


if __name__ == "__main__":
    here = os.path.dirname(os.path.abspath(__file__))
    generate(sys.argv[1] if len(sys.argv) > 1 else os.path.join(here, "corpus"))
