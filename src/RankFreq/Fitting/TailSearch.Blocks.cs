namespace RankFreq.Fitting;

public sealed partial class TailSearch
{
    private const long BlockFrom = 64;      // smallest value a block may start at
    private const int MinBlock = 4, FirstBlock = 16, MaxBlock = 64;
    private const double BlockStep = 1e-4;  // how far the bracket's ends are moved out from the predicted roots
    private const double ScoreMargin = 1e-9; // a verified score sign must clear the rounding of ζ'/ζ by this much

    /// <summary>Adaptive length and remembered witness of the block screen (<see cref="BlockScreen"/>).</summary>
    private struct BlockMemo
    {
        public int Len, Resume, Witness, Backoff;
        public BlockMemo() { Len = FirstBlock; Resume = 0; Witness = -1; Backoff = 0; }
    }

    /// <summary>
    /// Exact lower bound on the KS distance of every candidate in the run a..b of consecutive indices at once, from two
    /// ζ sums for the whole run and closed forms at a witness point; true when all of them are dropped (each one's
    /// distance provably reaches <paramref name="giveUp"/>, the largest give-up level in the run).
    /// </summary>
    /// <remarks>
    /// Proof sketch. Write n_i for the tail count at candidate i, m_i for its mean of ln x, T_{α,v}(x) = ζ(α, x)/ζ(α, v)
    /// for the model's tail mass P(X ≥ x | X ≥ v). (1) α bracket for the whole run: candidate i's fitted α̂_i is the
    /// root of the score E_α[ln X | X ≥ v_i] − m_i, which falls with α (its derivative is −Var ln X). Conditioning on
    /// X ≥ v' ≥ v makes any law stochastically larger, so E_α[ln X | X ≥ v_i] lies between its values at v_a and v_b.
    /// Hence if E_{αL}[ln X | X ≥ v_a] ≥ max_i m_i then every score is ≥ 0 at αL and α̂_i ≥ αL; if
    /// E_{αU}[ln X | X ≥ v_b] ≤ min_i m_i then α̂_i ≤ αU (the fit never returns more than the cap, so αU = 30 needs no
    /// check). αL and αU are predicted from the closed form (Clauset et al. eq. 3.7) at the run's ends plus the last fit's
    /// offset, moved out by 1e-4, and both inequalities are verified with ζ'/ζ (HurwitzZeta.ScaledQuick, ~1e-12
    /// relative) by a margin of 1e-9; α̂ returned by Newton is within 1e-11 relative of its root, so the bracket is
    /// widened by 1e-9 relative. (2) At a witness value v_j, j &gt; b: the empirical CDF of candidate i is
    /// F_i(v_j − 1) = 1 − n_j/n_i and F_i(v_j) = 1 − n_{j+1}/n_i, the model's G_i(x) = 1 − T_{α̂_i,v_i}(x + 1). T falls with α
    /// (the laws are stochastically ordered in α, TailSearch.Screen.cs (1)) and rises with v (ζ(α, v) falls), so over the
    /// run T_{α̂_i,v_i}(v_j) ≤ T_{αL,v_b}(v_j) and T_{α̂_i,v_i}(v_j + 1) ≥ T_{αU,v_a}(v_j + 1); with n_b ≤ n_i ≤ n_a,
    /// D_i ≥ G_i(v_j − 1) − F_i(v_j − 1) ≥ n_j/n_a − T_{αL,v_b}(v_j) and D_i ≥ F_i(v_j) − G_i(v_j) ≥
    /// T_{αU,v_a}(v_j + 1) − n_{j+1}/n_b. (3) The two T are bounded by closed forms: t^−α is convex and decreasing, so
    /// ∫_y^∞ + y^−α/2 ≤ ζ(α, y) ≤ ∫_{y−½}^∞ (trapezoid and midpoint rules), giving
    /// T_{α,v}(x) ≤ ((x − ½)/v)^{1−α} / (1 + (α − 1)/2v) and T_{α,v}(x) ≥ (x/(v − ½))^{1−α} (1 + (α − 1)/2x).
    /// Either bound reaching the give-up level plus 1e-9 (rounding of the tail masses and of the KS walk) drops every
    /// candidate of the run; the full scan would not have chosen any of them (strictly above the best for a lower index
    /// when the level is taken as the next double above it). Tested against <see cref="SearchFullScan"/> on random
    /// spectra (XminSearchTests, SearchScreenTests) and the bound against every candidate's distance
    /// (<see cref="BlockBound"/>).
    /// </remarks>
    private bool BlockScreen(int a, int b, double giveUp, double offset, ref BlockMemo memo, ref ScreenMemo points)
    {
        if (!BlockBracket(a, b, offset, out double aL, out double aU)) return false;
        double limit = giveUp + ScreenMargin;
        var w = new BlockWitness(this, a, b, aL, aU);
        // where the last run was dropped, where the last single candidates were, then tail quantiles of the run's first
        // candidate (where its model and empirical tails are both of fair size); the memo keeps the one that worked
        if (TryWitness(in w, memo.Witness, b, limit)) return true;
        if (TryWitness(in w, points.Both, b, limit)) { memo.Witness = points.Both; return true; }
        if (TryWitness(in w, points.Up, b, limit)) { memo.Witness = points.Up; return true; }
        if (TryWitness(in w, points.Down, b, limit)) { memo.Witness = points.Down; return true; }
        for (int t = 0; t < QuantileWitnesses.Length; t++)
        {
            int j = IndexAtTail(b + 1, (long)(_nSuffix[a] * QuantileWitnesses[t]));
            if (j == memo.Witness || !(j > b && j < _k)) continue;
            if (w.Deviation(j) >= limit) { memo.Witness = j; return true; }
        }
        return false;
    }

    private static readonly double[] QuantileWitnesses = [0.5, 0.2, 0.8, 0.05];

    /// <summary>Test hook: candidates dropped by the block screen since this search was made.</summary>
    internal long BlockDropped { get; private set; }

    /// <summary>The first index j ≥ from whose tail count n_j is at most <paramref name="count"/> (k when none).</summary>
    private int IndexAtTail(int from, long count)
    {
        int lo = from, hi = _k;
        while (lo < hi) { int mid = (lo + hi) >> 1; if (_nSuffix[mid] > count) lo = mid + 1; else hi = mid; }
        return lo;
    }

    private bool TryWitness(in BlockWitness w, int j, int b, double limit) => j > b && j < _k && w.Deviation(j) >= limit;

    /// <summary>The verified α bracket of a run (step (1) of <see cref="BlockScreen"/>'s proof), widened for the Newton
    /// tolerance; false when it cannot be verified.</summary>
    private bool BlockBracket(int a, int b, double offset, out double aL, out double aU)
    {
        // the run's largest and smallest mean of ln x (never NaN: every candidate's tail holds types)
        double mx = double.NegativeInfinity, mn = double.PositiveInfinity;
        var lnSuffix = _lnSuffix.AsSpan(a, b - a + 1);
        var nSuffix = _nSuffix.AsSpan(a, lnSuffix.Length);
        for (int t = 0; t < lnSuffix.Length; t++)
        {
            double mean = lnSuffix[t] / nSuffix[t];
            if (mean > mx) mx = mean;
            if (mean < mn) mn = mean;
        }
        double off = double.IsNaN(offset) ? 0 : offset;
        aL = 1 + 1 / (mx - LnHalfOf(_v[a])) + off - BlockStep;
        aU = 1 + 1 / (mn - LnHalfOf(_v[b])) + off + BlockStep;
        if (!(aL > 1 + 1e-6 && aL < MaxAlpha && aU > aL)) return false; // NaN fails too
        if (!(MeanLnAbove(aL, a) >= mx + ScoreMargin)) return false;
        if (aU >= MaxAlpha) aU = MaxAlpha;
        else if (!(MeanLnAbove(aU, b) <= mn - ScoreMargin)) return false;
        aL *= 1 - 1e-9;
        aU *= 1 + 1e-9;
        return true;
    }

    /// <summary>E_α[ln X | X ≥ v_i] = −ζ'(α, v_i)/ζ(α, v_i) (v_i ≥ 12).</summary>
    private double MeanLnAbove(double alpha, int i)
    {
        var z = HurwitzZeta.ScaledQuick(alpha, _v[i], _lnV[i], 1 / (alpha - 1));
        return -z.D1 / z.Value;
    }

    private static double LnHalfOf(long x) => (ulong)x < (ulong)LnHalf.Length ? LnHalf[x] : Math.Log(x - 0.5);

    /// <summary>The two bounds of step (2)–(3) of <see cref="BlockScreen"/>'s proof at a witness index.</summary>
    private readonly struct BlockWitness
    {
        private readonly TailSearch _s;
        private readonly double _invNa, _invNb, _aL, _aU, _lnVb, _lnVaHalf, _cL;

        public BlockWitness(TailSearch s, int a, int b, double aL, double aU)
        {
            _s = s;
            _invNa = 1.0 / s._nSuffix[a];
            _invNb = 1.0 / s._nSuffix[b];
            _aL = aL; _aU = aU;
            _lnVb = s._lnV[b];
            _lnVaHalf = LnHalfOf(s._v[a]);
            _cL = 1 / (1 + (aL - 1) / (2.0 * s._v[b]));
        }

        /// <summary>max(n_j/n_a − T_{αL,v_b}(v_j), T_{αU,v_a}(v_j + 1) − n_{j+1}/n_b) with T by its closed-form bounds.</summary>
        public double Deviation(int j)
        {
            double x = _s._v[j];
            double tUp = Math.Exp((1 - _aL) * (LnHalfOf(_s._v[j]) - _lnVb)) * _cL;
            double up = _s._nSuffix[j] * _invNa - tUp;
            double x1 = x + 1;
            // ln(v_j + 1) from the table where it has it (the same values as Math.Log)
            long v1 = _s._v[j] + 1;
            double lnX1 = (ulong)v1 < (ulong)LnSmall.Length ? LnSmall[v1] : Math.Log(x1);
            double tDown = Math.Exp((1 - _aU) * (lnX1 - _lnVaHalf)) * (1 + (_aU - 1) / (2 * x1));
            double down = tDown - _s._nSuffix[j + 1] * _invNb;
            return Math.Max(up, down);
        }
    }

    /// <summary>Test hook: the block screen's bound for the run a..b at its best witness (margins taken off), NaN when
    /// its bracket cannot be verified; it must never exceed the KS distance of any candidate in the run.</summary>
    internal double BlockBound(int a, int b, double offset)
    {
        if (!BlockBracket(a, b, offset, out double aL, out double aU)) return double.NaN;
        var w = new BlockWitness(this, a, b, aL, aU);
        double best = double.NegativeInfinity;
        for (int j = b + 1; j < _k; j++) best = Math.Max(best, w.Deviation(j));
        return best - ScreenMargin;
    }
}
