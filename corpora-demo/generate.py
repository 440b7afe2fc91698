#!/usr/bin/env python3
"""Deterministic generator of the RankFreq demo corpus (invented data; fixed seed).

Scenario: the archive of Gullhaven Coast Radio, a fictional weather-and-shipping radio
service on the invented Merrow Isles. Three document sets that differ in style:
  bulletins/  formal forecasts: small, repetitive vocabulary (plain .txt, one file per month)
  letters.jsonl  listener letters: wide, personal vocabulary (JSON Lines, fields set/year/text)
  logs/duty-log.txt.gz  terse duty logs with call signs and numbers (gzip-compressed text)
Words come from an invented lexicon (syllable-built names plus plain English function and
weather words) drawn with Zipf-like weights, so the sets have visibly different tails.
Run: python3 corpora-demo/generate.py   (rewrites the files in corpora-demo/)
"""
import gzip, json, os, random

SEED = 20261201
HERE = os.path.dirname(os.path.abspath(__file__))
rng = random.Random(SEED)

SYL = ["gar", "mor", "lin", "ska", "ven", "tor", "bel", "wyn", "ash", "dun", "fel", "rho",
       "kel", "mar", "osk", "thi", "ule", "bra", "cor", "dal", "eth", "hol", "ivo", "nes"]

def coin(n_syl):
    return "".join(rng.choice(SYL) for _ in range(n_syl))

def zipf_pick(words, s=1.1):
    # weight of rank r proportional to r^-s, rank order fixed by the list
    weights = [1.0 / (r + 1) ** s for r in range(len(words))]
    return lambda: rng.choices(words, weights)[0]

PLACES = sorted({coin(2).capitalize() + rng.choice(["", " Point", " Sound", " Skerry", " Head"]) for _ in range(120)})
VESSELS = sorted({coin(2).capitalize() + " " + rng.choice(["Star", "Gull", "Dawn", "Tern", "Wake"]) for _ in range(300)})
PEOPLE = sorted({coin(2).capitalize() + " " + coin(3).capitalize() for _ in range(2500)})
INVENTED = sorted({coin(rng.randint(2, 4)) for _ in range(20000)})

WEATHER = ["wind", "rain", "fog", "swell", "gale", "squall", "drizzle", "visibility", "pressure",
           "sea", "moderate", "rough", "slight", "good", "poor", "occasionally", "backing", "veering",
           "increasing", "decreasing", "falling", "rising", "slowly", "later", "becoming"]
FUNCTION = ["the", "and", "of", "to", "a", "in", "we", "it", "was", "for", "on", "with", "at",
            "our", "my", "is", "that", "your", "from", "this", "all", "by", "as", "but", "so"]
LETTER_WORDS = ["listen", "every", "morning", "radio", "kitchen", "grandmother", "harbour",
                "thank", "voice", "storm", "remember", "boat", "winter", "lamp", "nets", "songs",
                "children", "school", "ferry", "island", "weather", "night", "quiet", "music"]
LOG_WORDS = ["ack", "relay", "chan", "sig", "wx", "obs", "tx", "rx", "qsl", "pos", "hdg", "eta",
             "logged", "check", "nil", "aerial", "battery", "gen", "watch", "handover"]

place = zipf_pick(PLACES, 0.9)
vessel = zipf_pick(VESSELS, 0.8)
person = zipf_pick(PEOPLE, 0.7)
invented = zipf_pick(INVENTED, 1.05)
letter_word = zipf_pick(LETTER_WORDS + WEATHER + FUNCTION, 1.0)
log_word = zipf_pick(LOG_WORDS, 1.2)

def bulletin():
    areas = rng.sample(PLACES, 3)
    parts = []
    for a in areas:
        parts.append(f"{a}. {rng.choice(['Southwest', 'Northwest', 'West', 'North', 'East'])} "
                     f"{rng.randint(3, 9)}, {rng.choice(['backing', 'veering', 'increasing', 'decreasing'])} "
                     f"{rng.randint(4, 10)} later. {rng.choice(['Rain', 'Showers', 'Fog patches', 'Drizzle'])}. "
                     f"{rng.choice(['Good', 'Moderate', 'Poor'])}, occasionally {rng.choice(['good', 'poor', 'very poor'])}.")
    return "Gullhaven Coast Radio, shipping bulletin. " + " ".join(parts)

def letter():
    n = rng.randint(40, 160)
    words = []
    for _ in range(n):
        r = rng.random()
        words.append(invented() if r < 0.25 else letter_word() if r < 0.9 else place().split()[0])
    text = " ".join(words).capitalize() + "."
    return f"Dear Coast Radio, {text} With thanks, {person()}."

def log_line(t):
    return (f"{t // 60:02d}{t % 60:02d} {log_word().upper()} {vessel()} {log_word()} "
            f"{rng.randint(1, 99)} {place()} {log_word()} {invented() if rng.random() < 0.3 else ''}").strip()

def main():
    os.makedirs(os.path.join(HERE, "bulletins"), exist_ok=True)
    os.makedirs(os.path.join(HERE, "logs"), exist_ok=True)
    for month in range(1, 13):
        with open(os.path.join(HERE, "bulletins", f"bulletins-{month:02d}.txt"), "w", encoding="utf-8") as f:
            for day in range(1, 29):
                for slot in ("0048", "0520", "1201", "1754"):
                    f.write(f"{slot} day {day}. {bulletin()}\n")
    with open(os.path.join(HERE, "letters.jsonl"), "w", encoding="utf-8") as f:
        for i in range(4200):
            f.write(json.dumps({"id": i + 1, "set": "letters", "year": 1961 + i % 60, "text": letter()}, ensure_ascii=False) + "\n")
    with gzip.GzipFile(os.path.join(HERE, "logs", "duty-log.txt.gz"), "wb", mtime=0) as f:
        t = 0
        for _ in range(60000):
            t = (t + rng.randint(1, 20)) % 1440
            f.write((log_line(t) + "\n").encode("utf-8"))

if __name__ == "__main__":
    main()
