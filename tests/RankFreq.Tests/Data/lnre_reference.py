#!/usr/bin/env python3
"""Reference values for the LNRE vocabulary models (RankFreq tests, Lexical/LnreModelTests.cs).

Computes, with mpmath 1.3.0 at 30 significant digits, straight from the definitions of a Poisson-sampled LNRE model
(Baayen 2001, "Word Frequency Distributions", ch. 2):
  E[V(N)]   = integral of (1 - exp(-N p)) g(p) dp
  E[V_m(N)] = integral of (N p)^m exp(-N p) / m! g(p) dp
by numerical quadrature (mpmath.quad, split at 1/N, 10/N, 100/N ...), for
  Zipf-Mandelbrot:        g(p) = C p^(-a-1) on (0, B],  C = (1-a)/B^(1-a)                 (Evert 2004, JADT)
  finite Zipf-Mandelbrot: g(p) = C p^(-a-1) on [A, B],  C = (1-a)/(B^(1-a) - A^(1-a))
  GIGP: g(p) = p^(g-1) exp(-p/c - b^2 c/(4p)) / (2 (bc/2)^(g+1) K_(g+1)(b))   (Sichel 1975; Baayen 2001, 3.2)
and the modified Bessel function K_nu(x) (mpmath.besselk). None of this uses the closed forms being tested.
Run: python3 tests/RankFreq.Tests/Data/lnre_reference.py > tests/RankFreq.Tests/Data/lnre-mpmath.csv
"""
import mpmath as mp

mp.mp.dps = 30
print("# kind,model,p1,p2,p3,n,m,value (mpmath %s, dps=30; m = -1 is E[V(N)])" % mp.__version__)

for nu, x in [(0.5, 0.01), (0.5, 3.0), (-0.7, 0.002), (0.3, 0.05), (1.3, 0.05), (2.7, 40.0), (0.8, 250.0), (14.3, 1.5)]:
    print("besselk,,%r,%r,,,,%s" % (nu, x, mp.nstr(mp.besselk(nu, x), 25)))


def breaks(lo, hi, n):
    pts = [mp.mpf(lo)]
    t = mp.mpf(1) / n
    while t < hi:
        if t > lo:
            pts.append(t)
        t *= 10
    pts.append(mp.mpf(hi))
    return pts


def moments(g, lo, hi, n, ms):
    n = mp.mpf(n)
    pts = breaks(lo, hi, n)
    v = mp.quad(lambda p: -mp.expm1(-n * p) * g(p), pts)
    out = [(-1, v)]
    for m in ms:
        out.append((m, mp.quad(lambda p: (n * p) ** m * mp.exp(-n * p) / mp.factorial(m) * g(p), pts)))
    return out


ms = [1, 2, 3, 7, 15]
for a, A, B in [(0.45, 0, 0.01), (0.7, 0, 0.002), (0.55, 1e-7, 0.005), (0.8, 2e-9, 0.05)]:
    a, A, B = mp.mpf(a), mp.mpf(A), mp.mpf(B)
    C = (1 - a) / (B ** (1 - a) - A ** (1 - a))
    g = lambda p: C * p ** (-a - 1)
    for n in (1e4, 1e6, 1e9):
        for m, val in moments(g, A, B, n, ms):
            print("lnre,%s,%s,%s,%s,%s,%d,%s" % ("fzm" if A > 0 else "zm", mp.nstr(a, 10), mp.nstr(A, 10), mp.nstr(B, 10),
                                             mp.nstr(n, 12), m, mp.nstr(val, 20)))

for gam, b, c in [(-0.5, 0.01, 0.001), (-0.7, 0.003, 0.02), (-0.2, 0.05, 1e-4)]:
    gam, b, c = mp.mpf(gam), mp.mpf(b), mp.mpf(c)
    Z = 1 / (2 * (b * c / 2) ** (gam + 1) * mp.besselk(gam + 1, b))
    g = lambda p: Z * p ** (gam - 1) * mp.exp(-p / c - b * b * c / (4 * p))
    for n in (1e4, 1e6, 1e9):
        lo = b * b * c / 4 / 2000
        hi = 300 * c
        for m, val in moments(g, lo, hi, n, ms):
            print("lnre,gigp,%s,%s,%s,%s,%d,%s" % (mp.nstr(gam, 10), mp.nstr(b, 10), mp.nstr(c, 10), mp.nstr(n, 12), m,
                                                  mp.nstr(val, 20)))
