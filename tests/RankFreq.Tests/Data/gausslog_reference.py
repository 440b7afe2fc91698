#!/usr/bin/env python3
"""Reference values of ln Q(z) = ln(1 - Phi(z)) and ln(Phi(b) - Phi(a)) at 50 digits (RankFreq tests,
Fitting/GaussLogTests.cs). Written with mpmath 1.3.0. Run: python3 gausslog_reference.py > gausslog-mpmath.csv"""
import mpmath
mpmath.mp.dps = 50
Q = lambda z: mpmath.erfc(mpmath.mpf(z) / mpmath.sqrt(2)) / 2
print("# kind,a,b,value (mpmath %s, dps=50): kind q gives ln Q(a); kind d gives ln(Phi(b) - Phi(a)) = ln(Q(a) - Q(b))" % mpmath.__version__)
for z in (-60, -8, -3, -1, -1e-3, 0, 0.5, 2, 4.2, 4.25, 10, 26, 38.5, 60):
    print("q,%r,0,%s" % (float(z), mpmath.nstr(mpmath.log(Q(z)), 20)))
pairs = [(-3, -2.9), (-0.5, 0.5), (0.1, 0.1001), (1, 3), (5, 5.5), (20, 20.001), (37.9, 37.90004), (38, 45), (-45, -38),
         (-1e-4, 1e-4), (4.24, 4.26), (1.5, 1.51), (10, 10.000001)]
for a, b in pairs:
    # Phi(b) - Phi(a) = Q(a) - Q(b) = Q(-b) - Q(-a): the form with small tails, so 50 digits are enough
    d = Q(a) - Q(b) if a + b >= 0 else Q(-b) - Q(-a)
    print("d,%r,%r,%s" % (float(a), float(b), mpmath.nstr(mpmath.log(d), 20)))
