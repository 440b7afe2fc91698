namespace RankFreq.Fitting;

/// <summary>
/// Spectrum-level discrete power-law fitting: MLE of α at a given xmin (safeguarded Newton on the score),
/// KS distance over the integers of the tail, and the xmin search of Clauset, Shalizi &amp; Newman (2009, §3.3).
/// Works on (value, multiplicity) pairs; suffix sums make each candidate's likelihood O(1) to set up.
/// </summary>
public sealed class TailSearch
{
    /// <summary>Largest α considered; a maximum beyond it is reported as <see cref="FitStatus.Boundary"/>.</summary>
    public const double MaxAlpha = 30;
    private const double MinAlpha = 1 + 1e-9;

    private readonly long[] _v;
    private readonly long[] _m;
    private readonly int _k;
    private readonly long[] _nSuffix;     // Σ_{j≥i} m_j
    private readonly double[] _lnSuffix;  // Σ_{j≥i} m_j ln v_j

    /// <summary>Prepares the suffix sums for a spectrum given as parallel arrays (values strictly increasing, first <paramref name="count"/> used).</summary>
    public TailSearch(long[] values, long[] mult, int count)
    {
        _v = values; _m = mult; _k = count;
        _nSuffix = new long[count + 1];
        _lnSuffix = new double[count + 1];
        for (int i = count - 1; i >= 0; i--)
        {
            _nSuffix[i] = _nSuffix[i + 1] + mult[i];
            _lnSuffix[i] = _lnSuffix[i + 1] + mult[i] * Math.Log(values[i]);
        }
    }

    /// <summary>Number of types.</summary>
    public long Total => _nSuffix[0];

    /// <summary>Index of the first value ≥ x.</summary>
    public int IndexOf(long x)
    {
        int lo = 0, hi = _k;
        while (lo < hi) { int mid = (lo + hi) >> 1; if (_v[mid] < x) lo = mid + 1; else hi = mid; }
        return lo;
    }

    /// <summary>MLE of α for the tail starting at value index <paramref name="i"/> (xmin = its value, or <paramref name="xmin"/> if given).</summary>
    public PowerLawFit FitAt(int i, double warmAlpha = 2, long xmin = 0)
    {
        if (xmin <= 0) xmin = _v[i];
        long n = _nSuffix[i];
        double sumLn = _lnSuffix[i];
        if (n == 0) return new PowerLawFit(double.NaN, double.NaN, double.NaN, xmin, 0, double.NaN, double.NaN, 0, FitStatus.TooFewPoints, "no types at or above xmin");
        double meanLn = sumLn / n;
        double approx = 1 + n / (sumLn - n * Math.Log(xmin - 0.5));
        if (i == _k - 1 || meanLn - Math.Log(xmin) < 1e-12)
            return new PowerLawFit(double.NaN, double.NaN, approx, xmin, n, double.NaN, double.NaN, 0, FitStatus.AllEqual,
                $"every count in the tail equals {xmin}: the likelihood has no finite maximum; lower xmin or use more data");
        // score(α)/n = −meanLn − ζ'/ζ, decreasing in α; keep a bracket [lo, hi] around its root
        double lo = MinAlpha, hi = MaxAlpha;
        double a = double.IsFinite(warmAlpha) && warmAlpha > lo && warmAlpha < hi ? warmAlpha : Math.Clamp(approx, 1.05, hi - 1);
        int it = 0;
        ZetaValue z = default;
        for (; it < 100; it++)
        {
            z = HurwitzZeta.Evaluate(a, xmin);
            double r1 = z.D1 / z.Value;
            double score = -meanLn - r1;
            double info = z.D2 / z.Value - r1 * r1; // −score'
            if (score > 0) lo = a; else hi = a;
            double next = a + score / info;
            if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
            if (Math.Abs(next - a) < 1e-11 * a || hi - lo < 1e-12)
            {
                a = next;
                break;
            }
            a = next;
        }
        z = HurwitzZeta.Evaluate(a, xmin);
        double ratio = z.D1 / z.Value;
        double fisher = n * (z.D2 / z.Value - ratio * ratio);
        double ll = -a * sumLn - n * Math.Log(z.Value);
        var status = FitStatus.Ok;
        string msg = "";
        if (a > MaxAlpha - 1e-6) { status = FitStatus.Boundary; msg = $"α reached the limit {MaxAlpha}: the tail is too short or too steep for a power law"; }
        else if (it >= 100) { status = FitStatus.NotConverged; msg = "Newton iteration did not converge"; }
        return new PowerLawFit(a, 1 / Math.Sqrt(fisher), approx, xmin, n, double.NaN, ll, it + 1, status, msg);
    }

    /// <summary>
    /// KS distance between the tail's empirical CDF and the fitted model, supremum over every integer x ≥ xmin.
    /// Between two observed values the empirical CDF is flat while the model rises, so both ends of each gap are checked.
    /// Stops early when the distance already exceeds <paramref name="giveUpAbove"/> or when the remaining mass of both
    /// CDFs is below the distance found so far (nothing later can exceed it).
    /// </summary>
    public double Ks(int i, double alpha, double giveUpAbove = double.PositiveInfinity, long xmin = 0)
    {
        if (xmin <= 0) xmin = _v[i];
        double n = _nSuffix[i];
        double z0 = HurwitzZeta.Value(alpha, xmin);
        double inv = 1 / z0;
        double d = 0;
        long cum = 0;
        // model tail mass above x is ζ(α, x+1)/ζ(α, xmin); walk the observed values
        long x = xmin;
        double zx = z0; // ζ(α, x)
        if (_v[i] > xmin)
        {
            // empirical CDF is 0 on [xmin, v_i): the largest gap is at v_i − 1
            double zAt = HurwitzZeta.Value(alpha, _v[i]);
            d = 1 - zAt * inv;
            x = _v[i]; zx = zAt;
        }
        for (int j = i; j < _k; j++)
        {
            long v = _v[j];
            if (v != x)
            {
                zx = v - x <= 8 ? StepDown(zx, alpha, x, v) : HurwitzZeta.Value(alpha, v);
                x = v;
            }
            cum += _m[j];
            double s = cum / n;
            double zNext = zx - Math.Exp(-alpha * Math.Log(v)); // ζ(α, v+1)
            double p = 1 - zNext * inv;                          // model CDF at v
            double diff = Math.Abs(s - p);
            if (diff > d) d = diff;
            if (j + 1 < _k && _v[j + 1] > v + 1)
            {
                // model CDF at v_{j+1} − 1 while the empirical CDF stays at s
                double zGap = HurwitzZeta.Value(alpha, _v[j + 1]);
                double pg = 1 - zGap * inv;
                diff = Math.Abs(s - pg);
                if (diff > d) d = diff;
                zx = zGap; x = _v[j + 1];
            }
            else { zx = zNext; x = v + 1; }
            if (d >= giveUpAbove) return d;
            if (1 - s < d && zNext * inv < d) break;
        }
        return d;
    }

    private static double StepDown(double z, double alpha, long from, long to)
    {
        for (long t = from; t < to; t++) z -= Math.Exp(-alpha * Math.Log(t));
        return z;
    }

    /// <summary>
    /// The full fit: xmin minimising the KS distance over candidates (observed values with at least <paramref name="minTail"/>
    /// tail points), or the given <paramref name="fixedXmin"/>.
    /// </summary>
    public PowerLawFit Search(int minTail, long fixedXmin = 0)
    {
        if (fixedXmin > 0)
        {
            int i = IndexOf(fixedXmin);
            if (i >= _k) return new PowerLawFit(double.NaN, double.NaN, double.NaN, fixedXmin, 0, double.NaN, double.NaN, 0, FitStatus.TooFewPoints, $"no types with count ≥ xmin = {fixedXmin}");
            var f = FitAt(i, 2, fixedXmin);
            if (f.Status is FitStatus.AllEqual) return f;
            return f with { KsDistance = Ks(i, f.Alpha, double.PositiveInfinity, fixedXmin) };
        }
        PowerLawFit? best = null;
        double bestD = double.PositiveInfinity;
        double warm = 2;
        for (int i = 0; i < _k - 1 && _nSuffix[i] >= minTail; i++)
        {
            var f = FitAt(i, warm);
            if (f.Status != FitStatus.Ok) continue;
            warm = f.Alpha;
            double d = Ks(i, f.Alpha, bestD);
            if (d < bestD) { bestD = d; best = f with { KsDistance = d }; }
        }
        if (best is null)
        {
            long top = _k > 0 ? _v[_k - 1] : 0;
            return new PowerLawFit(double.NaN, double.NaN, double.NaN, 0, _nSuffix[0], double.NaN, double.NaN, 0, FitStatus.TooFewPoints,
                _nSuffix[0] < minTail
                    ? $"only {_nSuffix[0]} types; at least {minTail} tail points are needed (--min-tail)"
                    : $"no xmin candidate with {minTail} or more tail points gives a usable fit (largest count {top})");
        }
        return best;
    }
}
