#!/usr/bin/env python3
"""Reference values for the power-law MLE check (RankFreq tests, Fitting/PowerLawTests.cs).

Makes a small count list with Python's seeded random module (written to alpha-reference-counts.txt),
then, for several fixed xmin, finds the alpha that maximises the discrete power-law likelihood
L(a) = -a * sum(ln x) - n * ln zeta(a, xmin) with a general-purpose root finder (mpmath.findroot on
dL/da, using mpmath.zeta and its derivative), at 30 significant digits. Written with mpmath 1.3.0.
Run: python3 tests/RankFreq.Tests/Data/alpha_reference.py
"""
import math, os, random
import mpmath

mpmath.mp.dps = 30
here = os.path.dirname(os.path.abspath(__file__))
rng = random.Random(424242)
# counts from a continuous Pareto (alpha = 2.2) rounded down: not an exact discrete power law, which is fine
counts = [max(1, int((1 - rng.random()) ** (-1 / 1.2))) for _ in range(3000)]
with open(os.path.join(here, "alpha-reference-counts.txt"), "w") as f:
    f.write("\n".join(map(str, counts)) + "\n")

print("# xmin,n_tail,alpha_mle (mpmath %s findroot on the score, dps=30)" % mpmath.__version__)
for xmin in (1, 2, 3, 5, 10):
    tail = [x for x in counts if x >= xmin]
    n = len(tail)
    s = mpmath.fsum(mpmath.log(x) for x in tail)
    score = lambda a: -s - n * mpmath.zeta(a, xmin, 1) / mpmath.zeta(a, xmin)
    a = mpmath.findroot(score, 2.0)
    print("%d,%d,%s" % (xmin, n, mpmath.nstr(a, 20)))
