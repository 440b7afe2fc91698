namespace RankFreq.Fitting;

public sealed partial class TailSearch
{
    /// <summary>Added to the level a screening bound must reach before a candidate is dropped: covers the rounding of
    /// the tail masses and of ζ (~1e-12) and the Newton tolerance of the fitted α (1e-11 relative).</summary>
    private const double ScreenMargin = 1e-9;
    private const int ScreenPoints = 20; // points tried per candidate before it is fitted after all
    private const long QuickFrom = 12;   // values from which the screen takes HurwitzZeta.ScaledQuick

    /// <summary>Where the last screening bounds were reached, per side: the next candidate tries these values first.</summary>
    private struct ScreenMemo
    {
        public int Up, Down, Both;
        public ScreenMemo() { Up = -1; Down = -1; Both = -1; }
    }

    /// <summary>ln(v_j / (v_j − ½)) for the last j asked (screening tries the same few points candidate after candidate).</summary>
    private int _halfJ = -1;
    private double _halfL;

    private double HalfShift(int j)
    {
        if (j != _halfJ) { _halfL = -LogMath.Log1p(-0.5 / _v[j]); _halfJ = j; }
        return _halfL;
    }


    /// <summary>
    /// Exact lower bound on candidate i's KS distance at its fitted α̂, from one ζ evaluation at the Newton start α₀;
    /// the candidate is dropped when the bound reaches <paramref name="giveUp"/> (it could not beat the best so far).
    /// Returns true when dropped; a candidate kept gets in
    /// <paramref name="atStart"/> ln ζ with its ratios at the start when they are the fit's first iteration (else NaN).
    /// </summary>
    /// <remarks>
    /// Proof sketch. (1) The discrete power laws on x ≥ xmin are ordered in α: p_β(x)/p_α(x) ∝ x^(α−β) falls with x for
    /// β &gt; α, so a larger exponent is smaller in likelihood-ratio order, hence stochastically smaller: its CDF
    /// G_β(x) ≥ G_α(x) at every x. (2) The score E_α[ln X] − mean(ln x) falls with α (its derivative is −Var ln X), so
    /// its sign at α₀ says on which side the root α̂ lies (the returned α may be at the cap 30: still on that side).
    /// (3) If α̂ &gt; α₀, D(α̂) ≥ sup_x (G_α̂(x) − F(x)) ≥ G_α₀(x) − F(x) at any tail point x; if α̂ &lt; α₀, D(α̂) ≥
    /// F(x) − G_α₀(x). (4) G_α₀ needs tail masses T(y) = ζ(α₀, y)/ζ(α₀, xmin); with f(t) = t^−α₀ convex, the
    /// trapezoid and midpoint rules bound the sum: ∫_y^∞ f + f(y)/2 ≤ ζ(α₀, y) ≤ ∫_{y−½}^∞ f (relative width about
    /// α₀(α₀−1)/8y²), and the side tested uses the bound that keeps the deviation a lower bound. Each point x = v_j
    /// (and x = v_j − 1, where the empirical CDF is still that of v_{j−1}) is a valid witness, so any subset of points
    /// gives a lower bound. A margin of 1e-9 absorbs rounding and the Newton tolerance. (5) When the start is within a
    /// tiny Newton step of α̂ (the usual case: it is predicted from the neighbour's α − closed-form offset) both sides
    /// count, with a slack for how far G can move between α₀ and α̂ (<see cref="ScreenAt"/>); a step too small to trust
    /// its sign and too large for that slack leaves the candidate to be fitted. So a dropped candidate has a KS distance at
    /// least the best so far (strictly above it for a lower index), and the full scan would not choose it either:
    /// the search returns the same xmin and α (tested against <see cref="SearchFullScan"/> on random spectra).
    /// Below v_i = 12 the evaluation at α₀ is the Newton iteration's first (a candidate that survives costs nothing
    /// more than the points tried); from 12 on the screen sums ζ in fewer divisions and a survivor's fit evaluates its
    /// own. Points are tried where the previous candidate's bound was reached (neighbouring tails share all but one
    /// value), then at offsets 0, 1, 3, 7, … from the candidate, at most <see cref="ScreenPoints"/>.
    /// </remarks>
    private bool Screen(int i, double a0, double giveUp, ref ScreenMemo memo, out LogZeta atStart)
    {
        atStart = new LogZeta(double.NaN, double.NaN, double.NaN);
        if (ScreenAt(i, a0, out var z0, out var p, out double slack))
        {
            double limit = giveUp + ScreenMargin + slack;
            ref int remembered = ref p.Both ? ref memo.Both : ref p.Up ? ref memo.Up : ref memo.Down;
            if (remembered > i && remembered < _k && p.Deviation(remembered) >= limit) return true;
            int tried = 0;
            for (long off = 0; i + off < _k && tried < ScreenPoints; off = 2 * off + 1, tried++)
            {
                int j = (int)(i + off);
                if (j == remembered || p.Deviation(j) < limit) continue;
                remembered = j;
                return true;
            }
        }
        // ln ζ only for a candidate that goes on to be fitted (the values the fit's first iteration computes: from
        // the quick sums of large values the fit evaluates its own, so fitted α are the same to the bit)
        if (_v[i] < QuickFrom) atStart = HurwitzZeta.FromScaled(z0, a0 * _lnV[i]);
        return false;
    }

    /// <summary>
    /// Exact lower bound on candidate i's KS distance for every α &gt; 1 at once, from the jump of the empirical CDF at
    /// the largest value: no ζ evaluation. True when it reaches <paramref name="giveUp"/> (the candidate is dropped).
    /// </summary>
    /// <remarks>
    /// Proof sketch. Let j = k − 1 (the largest value; every candidate has i &lt; j) and x = v_j. Both x − 1 ≥ v_i and x
    /// are points of candidate i's tail. Between them the empirical CDF rises by m_j/n_i and the model's G by
    /// p(x) = x^−α/ζ(α, v_i); with A = F(x) − G(x) and B = F(x − 1) − G(x − 1), A − B = m_j/n_i − p(x), so the KS
    /// distance D ≥ max(|A|, |B|) ≥ (m_j/n_i − p(x))/2. As t^−α decreases, ζ(α, v) ≥ ∫_v^∞ t^−α dt = v^{1−α}/(α − 1),
    /// so p(x) ≤ β e^{−βL}/x with β = α − 1 &gt; 0 and L = ln(x/v_i) &gt; 0, whose largest value over β (at β = 1/L) is
    /// 1/(e·x·L): for every α, the fitted one whatever its status. The candidate is dropped when
    /// (m_j/n_i − 1/(e·x·L))/2 reaches the give-up level plus <see cref="ScreenMargin"/> (rounding of these few
    /// operations ~1e-16 relative, of the KS walk's tail masses ~1e-13), so its distance is at least the best so far
    /// (strictly above it for a lower index, the level then being the next double) and the full scan would not choose
    /// it either. It bites where 1/n_i exceeds twice the best distance: on a large spectrum the last few hundred
    /// candidates, whose tails hold a few hundred types and which the screen at α₀ would drop one ζ evaluation each.
    /// Tested against the full scan with the other screens (SearchScreenTests) and against every candidate's distance
    /// (<see cref="JumpBound"/>).
    /// </remarks>
    private bool JumpDrops(int i, double giveUp)
    {
        // 1/n_i alone too small to reach the level: most candidates stop here, before the logarithm
        if (!(_m[_k - 1] >= _nSuffix[i] * 2 * (giveUp + ScreenMargin))) return false;
        return JumpLower(i) >= giveUp + ScreenMargin; // halving is exact: the same test as on twice the level
    }

    /// <summary>The jump bound (m_j/n_i − 1/(e·x·L))/2 of <see cref="JumpDrops"/> for candidate i, NaN where it does not
    /// apply (i not below the largest value). Written once, for the search and its test hook.</summary>
    private double JumpLower(int i)
    {
        int j = _k - 1;
        double l = _lnV[j] - _lnV[i];
        if (i >= j || !(l > 0)) return double.NaN;
        return (_m[j] / (double)_nSuffix[i] - 1 / (Math.E * _v[j] * l)) / 2;
    }

    /// <summary>Test hook: candidates dropped by <see cref="JumpDrops"/> since this search was made.</summary>
    internal long JumpDropped { get; private set; }

    /// <summary>Test hook: the bound of <see cref="JumpDrops"/> for candidate i (margin taken off), NaN where it does
    /// not apply; it must never exceed the KS distance at the fitted α.</summary>
    internal double JumpBound(int i) => JumpLower(i) - ScreenMargin;

    /// <summary>
    /// ln ζ at the start, the deviations to test (null when the side of α̂ cannot be trusted) and the slack to add to
    /// the give-up level: when the start is within a tiny Newton step δ of α̂ both sides count, less what G can move
    /// over |α̂ − α₀| ≤ 2δ + 1e-10·α₀ (|∂G(x)/∂α| = |Cov(1{X ≤ x}, ln X)| ≤ ½ sd ln X; taken as sd ln X for the change
    /// of the variance along the step).
    /// </summary>
    private bool ScreenAt(int i, double a0, out ZetaValue z0, out ScreenPoint points, out double slack)
    {
        points = default; slack = 0;
        // ζ·v_i^α₀ and its derivatives (no logarithm: the bound points need 1/ζ·v_i^α₀ only); in fewer divisions from
        // v_i = 12 on, where a few 1e-16 of difference are far inside the margin
        // 1/(α₀ − 1) is shared with the quick sums; the ratios and the bound points take one reciprocal of the sum
        // (rounding differences of a few 1e-16 against dividing each, far inside the margin)
        double invA = 1 / (a0 - 1);
        z0 = _v[i] >= QuickFrom ? HurwitzZeta.ScaledQuick(a0, _v[i], _lnV[i], invA)
            : HurwitzZeta.ScaledAt(a0, _v[i], _lnV[i], true);
        double invZ = 1 / z0.Value;
        double r1 = z0.D1 * invZ, r2 = z0.D2 * invZ;   // ζ'/ζ and ζ''/ζ
        double score = -_lnSuffix[i] / _nSuffix[i] - r1;
        double info = r2 - r1 * r1;
        if (!(info > 0)) return false;
        double step = score / info;
        if (!double.IsFinite(step)) return false;
        double sl = Math.Sqrt(info) * (2 * Math.Abs(step) + 1e-10 * a0);
        bool both = sl <= 1e-6;
        if (!both && !(Math.Abs(step) > 1e-9 * a0)) return false;
        points = new ScreenPoint(this, i, a0, invZ, invA, both, score > 0);
        slack = both ? sl : 0;
        return true;
    }

    /// <summary>e^x for x ≥ 0: its Taylor series through x^7/7! below 0.02 (truncation &lt; 1e-18 relative; the usual
    /// case, x ≈ α/2y far from the head), else Math.Exp.</summary>
    private static double ExpSmall(double x) =>
        x < 0.02 ? 1 + x * (1 + x * (0.5 + x * (1.0 / 6 + x * (1.0 / 24 + x * (1.0 / 120 + x * (1.0 / 720 + x * (1.0 / 5040)))))))
            : Math.Exp(x);

    /// <summary>Test hook: the largest screening bound over every point of the tail at start α₀, margins taken off
    /// (NaN when the screen would not be applied); it must never exceed the KS distance at the fitted α.</summary>
    internal double ScreenBound(int i, double a0)
    {
        if (!ScreenAt(i, a0, out _, out var p, out double slack)) return double.NaN;
        double b = double.NegativeInfinity;
        for (int j = i; j < _k; j++) b = Math.Max(b, p.Deviation(j));
        return b - ScreenMargin - slack;
    }

    /// <summary>One-sided deviations of the tail at index i from the law at α₀, as lower bounds (see <see cref="Screen"/>).</summary>
    private readonly struct ScreenPoint(TailSearch s, int i, double a0, double invScaledZ, double invA, bool both,
        bool up)
    {
        /// <summary>Both sides count (the start is within a tiny step of α̂).</summary>
        public bool Both => both;

        /// <summary>α̂ lies above the start: G − F is the side tested.</summary>
        public bool Up => up;

        private readonly double _invN = 1.0 / s._nSuffix[i];

        /// <summary>Lower bound on G − F (up) or F − G (down) at x = v_j and, for j &gt; i, at x = v_j − 1.</summary>
        public double Deviation(int j)
        {
            double n = s._nSuffix[i];
            double fAt = (n - s._nSuffix[j + 1]) * _invN;  // empirical CDF at v_j
            // p(v_j) = v_j^−α₀/ζ = (v_j/v_i)^−α₀ / (ζ·v_i^α₀)
            double pmf = Math.Exp(-a0 * (s._lnV[j] - s._lnV[i])) * invScaledZ;
            double tLo, tHi;                                // bounds on T(v_j) = P(X ≥ v_j)
            if (j == i) { tLo = 1; tHi = 1; }
            else
            {
                // y^(1−α)/((α−1)ζ) = p(y)·y/(α−1) and (y−½)^(1−α)/((α−1)ζ) = p(y)·(y−½)/(α−1)·e^(α ln(y/(y−½)))
                double y = s._v[j];
                tLo = pmf * (y * invA + 0.5);
                tHi = pmf * (y - 0.5) * invA * ExpSmall(a0 * s.HalfShift(j));
            }
            double down = fAt - (1 - tLo + pmf);             // F − G at v_j, G(v_j) = 1 − T(v_j) + p(v_j)
            if (!up && !both) return down;
            double dev = 1 - tHi + pmf - fAt;                // G − F at v_j
            if (j > i) dev = Math.Max(dev, 1 - tHi - (n - s._nSuffix[j]) * _invN); // at v_j − 1
            return both ? Math.Max(dev, down) : dev;
        }
    }
}
