#!/usr/bin/env python3
"""Reference log-likelihood ratios for the alternative families (RankFreq tests, Fitting/AlternativesReferenceTests.cs).

Reads tail spectra ("value,types" lines, a "# xmin=..." header) of the KJV Bible and the addresses corpus counted with
RankFreq's default words tokenizer at the KS-chosen xmin (made by
`dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- tail-spectrum CORPUS OUT`), and for each family
  discrete_lognormal  p(x) = (Q(z(x-1/2)) - Q(z(x+1/2))) / Q(z(xmin-1/2)),  z(t) = (ln t - mu)/sigma, Q = erfc(z/sqrt2)/2
  geometric           p(x) = (1 - e^-lam) e^(-lam (x - xmin))
  discrete_weibull    p(x) = (e^(-lam x^b) - e^(-lam (x+1)^b)) / e^(-lam xmin^b)
  power_law_cutoff    p(x) = x^-a e^(-lam x) / sum_{k>=xmin} k^-a e^(-lam k)
maximises the likelihood with a plain Nelder-Mead written here (same parameterisations and bounds as RankFreq) and
evaluates every log-likelihood with mpmath at 25 significant digits: erfc, zeta and the sums never underflow there.
The power law's alpha is the root of the score (mpmath.findroot on d/da of -a sum ln x - n ln zeta(a, xmin)).
Output (stdout, CSV): corpus,family,params (name=value;...),ll_alt,ll_power_law,llr. Also one row per corpus at fixed
lognormal parameters far in the normal tail (mu=-1344, sigma=35.6) to check the far-tail arithmetic.
Written with mpmath 1.3.0 (Python 3.11). Run:
  cd tests/RankFreq.Tests/Data && (python3 alternatives_reference.py --header;
    python3 alternatives_reference.py kjv-bible.txt tail-kjv-words.csv sotu.jsonl tail-sotu-words.csv) > alternatives-reference.csv
"""
import math, sys
import mpmath

mpmath.mp.dps = 25


def read(path):
    xmin, rows = None, []
    for line in open(path):
        if line.startswith("#"):
            xmin = int(line.split("xmin=")[1].split()[0])
        elif line.strip():
            v, t = line.split(",")
            rows.append((int(v), int(t)))
    return xmin, rows


def ll_powerlaw(rows, xmin):
    n = sum(t for _, t in rows)
    s = mpmath.fsum(t * mpmath.log(v) for v, t in rows)
    a = mpmath.findroot(lambda a: -s - n * mpmath.zeta(a, xmin, 1) / mpmath.zeta(a, xmin), 1.9)
    return a, -a * s - n * mpmath.log(mpmath.zeta(a, xmin))


def Q(z):
    return mpmath.erfc(z / mpmath.sqrt(2)) / 2


def ll_lognormal(rows, xmin, mu, sigma):
    mu, sigma = mpmath.mpf(mu), mpmath.mpf(sigma)
    z = lambda t: (mpmath.log(t) - mu) / sigma
    norm = mpmath.log(Q(z(mpmath.mpf(xmin) - 0.5)))
    return mpmath.fsum(t * (mpmath.log(Q(z(v - mpmath.mpf(0.5))) - Q(z(v + mpmath.mpf(0.5)))) - norm) for v, t in rows)


def ll_geometric(rows, xmin, lam):
    lam = mpmath.mpf(lam)
    c = mpmath.log(-mpmath.expm1(-lam))
    return mpmath.fsum(t * (c - lam * (v - xmin)) for v, t in rows)


def ll_weibull(rows, xmin, lam, b):
    lam, b = mpmath.mpf(lam), mpmath.mpf(b)
    cb = mpmath.mpf(xmin) ** b
    return mpmath.fsum(t * (-lam * (mpmath.mpf(v) ** b - cb) + mpmath.log(-mpmath.expm1(-lam * ((v + 1) ** b - mpmath.mpf(v) ** b))))
                       for v, t in rows)


def ll_cutoff(rows, xmin, a, lam):
    a, lam = mpmath.mpf(a), mpmath.mpf(lam)
    # sum_{k>=xmin} k^-a e^(-lam k) = e^(-lam xmin) Lerch Phi(e^-lam, a, xmin); nsum's extrapolation is wrong in the
    # third digit for lam ~ 1e-5 (checked against a direct sum to 2e6 plus the integral of the remainder)
    c = mpmath.exp(-lam * xmin) * mpmath.lerchphi(mpmath.exp(-lam), a, xmin)
    return mpmath.fsum(t * (-a * mpmath.log(v) - lam * v - mpmath.log(c)) for v, t in rows)


def nelder_mead(f, x0, step, iters=400, tol=1e-12):
    pts = [list(x0)] + [[x0[j] + (step[j] if j == i else 0) for j in range(len(x0))] for i in range(len(x0))]
    vals = [f(p) for p in pts]
    for _ in range(iters):
        order = sorted(range(len(pts)), key=lambda i: vals[i])
        pts, vals = [pts[i] for i in order], [vals[i] for i in order]
        if abs(vals[-1] - vals[0]) <= tol * (1 + abs(vals[0])):
            break
        c = [sum(p[j] for p in pts[:-1]) / (len(pts) - 1) for j in range(len(x0))]
        refl = [c[j] + (c[j] - pts[-1][j]) for j in range(len(x0))]
        fr = f(refl)
        if fr < vals[0]:
            exp = [c[j] + 2 * (c[j] - pts[-1][j]) for j in range(len(x0))]
            fe = f(exp)
            pts[-1], vals[-1] = (exp, fe) if fe < fr else (refl, fr)
        elif fr < vals[-2]:
            pts[-1], vals[-1] = refl, fr
        else:
            con = [c[j] + 0.5 * (pts[-1][j] - c[j]) for j in range(len(x0))]
            fc = f(con)
            if fc < vals[-1]:
                pts[-1], vals[-1] = con, fc
            else:
                for i in range(1, len(pts)):
                    pts[i] = [pts[0][j] + 0.5 * (pts[i][j] - pts[0][j]) for j in range(len(x0))]
                    vals[i] = f(pts[i])
    i = min(range(len(pts)), key=lambda i: vals[i])
    return pts[i], -vals[i]


def guard(g):
    def f(p):
        try:
            v = g(p)
            return float(-v) if mpmath.isfinite(v) else 1e300
        except (ValueError, ZeroDivisionError, OverflowError):
            return 1e300
    return f


def main():
    if len(sys.argv) > 1 and sys.argv[1] == "--header":
        print("# corpus,family,params,ll_alt,ll_power_law,llr  (mpmath %s, dps=25; see the script's docstring)" % mpmath.__version__)
        return
    for name, path in zip(sys.argv[1::2], sys.argv[2::2]):
        xmin, rows = read(path)
        a, llp = ll_powerlaw(rows, xmin)
        n = sum(t for _, t in rows)
        lnx = [(math.log(v), t) for v, t in rows]
        mu0 = sum(l * t for l, t in lnx) / n
        s0 = math.sqrt(max(sum(t * (l - mu0) ** 2 for l, t in lnx) / n, 1e-4))
        mean = sum(v * t for v, t in rows) / n
        out = []
        p, ll = nelder_mead(guard(lambda p: ll_lognormal(rows, xmin, p[0], math.exp(p[1]))
                                  if 1e-6 < math.exp(p[1]) < 1e3 and abs(p[0]) <= 1e4 else mpmath.mpf("-inf")),
                            [mu0, math.log(s0)], [1, 0.5])
        out.append(("discrete_lognormal", {"mu": p[0], "sigma": math.exp(p[1])}, ll))
        lam = math.log1p(1 / (mean - xmin))
        out.append(("geometric", {"lambda": lam}, ll_geometric(rows, xmin, lam)))
        p, ll = nelder_mead(guard(lambda p: ll_weibull(rows, xmin, math.exp(p[0]), math.exp(p[1]))
                                  if 1e-4 < math.exp(p[1]) < 20 else mpmath.mpf("-inf")),
                            [-0.5 * math.log(mean), math.log(0.5)], [1, 0.5])
        out.append(("discrete_weibull", {"lambda": math.exp(p[0]), "beta": math.exp(p[1])}, ll))
        p, ll = nelder_mead(guard(lambda p: ll_cutoff(rows, xmin, p[0], math.exp(p[1])) if abs(p[0]) <= 50 else mpmath.mpf("-inf")),
                            [float(a), math.log(1 / (100 * mean))], [0.2, 2], iters=150)
        out.append(("power_law_cutoff", {"alpha": p[0], "lambda": math.exp(p[1])}, ll))
        out.append(("discrete_lognormal@fixed", {"mu": -1344.0, "sigma": 35.6}, ll_lognormal(rows, xmin, -1344.0, 35.6)))
        for fam, pars, ll in out:
            ps = ";".join("%s=%s" % (k, repr(float(v))) for k, v in pars.items())
            print("%s,%s,%s,%s,%s,%s" % (name, fam, ps, mpmath.nstr(ll, 17), mpmath.nstr(llp, 17), mpmath.nstr(llp - ll, 12)))
        sys.stdout.flush()


main()
