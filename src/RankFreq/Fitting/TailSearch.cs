namespace RankFreq.Fitting;

/// <summary>
/// Spectrum-level discrete power-law fitting: MLE of α at a given xmin (safeguarded Newton on the score),
/// KS distance over the integers of the tail, and the xmin search of Clauset, Shalizi &amp; Newman (2009, §3.3).
/// Works on (value, multiplicity) pairs; suffix sums make each candidate's likelihood O(1) to set up.
/// </summary>
/// <remarks>
/// Everything is computed in log space: ln ζ(α, x) (<see cref="HurwitzZeta.Log"/>) and model tail masses
/// P(X ≥ x) = exp(ln ζ(α, x) − ln ζ(α, xmin)), so counts near 10^12 (where ζ(α, xmin) underflows) are fitted the same
/// way as small ones.
/// <para>Cost. The full scan evaluates every candidate's KS distance point by point; its cost is O(k²) in the number k
/// of distinct values wherever the early stops do not bite (42 s for 10^5 values). <see cref="Ks"/> walks the first
/// values one by one, then keeps the rest as blocks of consecutive values, splitting the block with the largest bound
/// first, and stops when no open block can raise the distance. Proof sketch that the pruning is exact: on the integers
/// of a block [v_a, v_{b+1} − 1] both CDFs are non-decreasing, the empirical F between F(v_a) and F(v_b) and the model
/// G between G(v_a) and G(v_{b+1} − 1); so every |F(x) − G(x)| in the block is at most
/// U = max(F(v_b) − G(v_a), G(v_{b+1} − 1) − F(v_a)). A block with U ≤ d (the largest distance already seen at real
/// points) cannot change the supremum; every other block is split until single values, whose points are evaluated.
/// So the returned supremum equals the full scan's up to the rounding of the tail masses (~1e-13).
/// The search visits every stride-th candidate first (stride √(candidates)) and then the rest, abandoning a candidate as
/// soon as its distance reaches the best so far; a candidate of lower index than the current best is abandoned only
/// strictly above it, and equal distances go to the lower index, which is the full scan's rule (first strict minimum)
/// — so the chosen xmin is the full scan's, and α is the same Newton root (to its 1e-11 relative tolerance, as the
/// warm starts differ). Costs: a candidate's α fit is O(1) zeta evaluations; its KS walk O(log k) per block that
/// cannot be pruned, and only blocks whose CDF change is comparable to d survive, so in practice the search is
/// close to O(k log k). <see cref="SearchFullScan"/> keeps the point-by-point scan as the reference.</para>
/// <para>Before a candidate is fitted, an exact lower bound on its KS distance from one ζ evaluation at the predicted
/// Newton start drops it when it cannot beat the best so far (TailSearch.Screen.cs, with its proof sketch). Before
/// that, runs of consecutive candidates are tried with one bound for all of them (TailSearch.Blocks.cs, with its proof
/// sketch): two ζ'/ζ sums per run instead of one ζ sum per candidate.</para>
/// <para>A KS walk with a give-up level first evaluates the two points at the value where the previous walk of the
/// same search peaked; the deviation at any point of the tail is a lower bound on the supremum, so when it reaches the
/// level by more than 1e-9 the candidate is abandoned there (it could not have beaten the best), and otherwise nothing
/// of the probe is kept, so the walk computes the same distance to the bit. Bootstrap replicates visit the data's
/// xmin first (<see cref="Search(int, long, long)"/>): the order does not change the choice (smallest distance, ties
/// to the lower index) and only moves the warm starts, so α agrees to the Newton tolerance.</para>
/// <para>Goodness-of-fit replicates need only whether the search's distance reaches the data's:
/// <see cref="ReachesLevel"/> runs the search with that level as its best distance from the start, which spares the
/// fits and complete KS walks of every new best candidate (proof sketch in its remarks).</para>
/// </remarks>
public sealed partial class TailSearch
{
    /// <summary>Largest α considered; a likelihood still rising there is reported as <see cref="FitStatus.AtBound"/>
    /// or <see cref="FitStatus.NoMaximum"/>.</summary>
    public const double MaxAlpha = 30;
    private const double MinAlpha = 1 + 1e-9;
    private const int Prefix = 8; // values walked one by one before the blocks take over
    private const long DenseSpan = 16; // runs of integers this short are stepped through term by term

    private readonly long[] _v;
    private readonly long[] _m;
    private readonly int _k;
    private readonly long[] _nSuffix;     // Σ_{j≥i} m_j
    private readonly double[] _lnSuffix;  // Σ_{j≥i} m_j ln v_j
    private readonly double[] _lnV;       // ln v_j
    private readonly int _firstAtCapRisk = int.MaxValue; // lowest index whose tail might fit at the α cap (NoneAtCap)

    /// <summary>Prepares the suffix sums for a spectrum given as parallel arrays (values strictly increasing, first <paramref name="count"/> used).</summary>
    public TailSearch(long[] values, long[] mult, int count) : this(values, mult, count, null) { }

    /// <summary>As the public constructor, with the suffix arrays (and the KS walk's heap) taken from
    /// <paramref name="scratch"/>: a bootstrap thread reuses them replicate after replicate instead of allocating three
    /// large-object-heap arrays each time. The search must be done before the scratch is used again.</summary>
    internal TailSearch(long[] values, long[] mult, int count, SearchScratch? scratch)
    {
        _v = values; _m = mult; _k = count;
        if (scratch is null)
        {
            _nSuffix = new long[count + 1];
            _lnSuffix = new double[count + 1];
            _lnV = new double[count];
        }
        else
        {
            scratch.Ensure(count + 1);
            (_nSuffix, _lnSuffix, _lnV, _heap) = (scratch.NSuffix, scratch.LnSuffix, scratch.LnV, scratch.Heap);
        }
        _nSuffix[count] = 0;
        _lnSuffix[count] = 0;
        // one pass from the top (a bootstrap replicate makes a search of ~10^4 values each time): running sums and the
        // cap check in locals, over spans of exactly count values, so nothing is reloaded or spilled per value
        var lnSmall = LnSmall;
        var capSmall = CapLimitSmall;
        var vs = values.AsSpan(0, count);
        var ms = mult.AsSpan(0, count);
        var lnV = _lnV.AsSpan(0, count);
        var nSuffix = _nSuffix.AsSpan(0, count);
        var lnSuffix = _lnSuffix.AsSpan(0, count);
        long nRun = 0;
        double lnRun = 0;
        int atRisk = int.MaxValue;
        for (int i = count - 1; i >= 0; i--)
        {
            long x = vs[i];
            double l = (ulong)x < (ulong)lnSmall.Length ? lnSmall[x] : Math.Log(x);
            lnV[i] = l;
            nRun += ms[i];
            lnRun += ms[i] * l;
            nSuffix[i] = nRun;
            lnSuffix[i] = lnRun;
            // the cap check of NoneAtCap without a division: mean excess of ln x over ln v_i against its bound
            double n = nRun;
            double limit = (ulong)x < (ulong)capSmall.Length ? capSmall[x] : CapLimitLarge;
            if (!(lnRun - n * l > n * limit)) atRisk = i;
        }
        _firstAtCapRisk = atRisk;
    }

    /// <summary>ln k for k &lt; 2^15, the same values as Math.Log (a replicate's spectrum is mostly such values; one
    /// table read instead of a logarithm per value and replicate).</summary>
    private static readonly double[] LnSmall = BuildLnSmall();

    private static double[] BuildLnSmall()
    {
        var t = new double[1 << 15];
        for (int k = 1; k < t.Length; k++) t[k] = Math.Log(k);
        t[0] = double.NegativeInfinity;
        return t;
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

    /// <summary>
    /// MLE of α for the tail starting at value index <paramref name="i"/> (xmin = its value, or <paramref name="xmin"/> if
    /// given). Status <see cref="FitStatus.AtBound"/> with α = <see cref="MaxAlpha"/> when the likelihood still rises there.
    /// </summary>
    public PowerLawFit FitAt(int i, double warmAlpha = 2, long xmin = 0) => FitCore(i, warmAlpha, xmin, null, out _);

    /// <summary>Where the Newton iteration for α starts: the warm start if it lies inside the range, else the closed-form
    /// approximation kept away from the ends.</summary>
    private static double StartAlpha(double warmAlpha, double approx) =>
        double.IsFinite(warmAlpha) && warmAlpha > MinAlpha && warmAlpha < MaxAlpha ? warmAlpha : Math.Clamp(approx, 1.05, MaxAlpha - 1);

    /// <summary>Closed-form approximation of α for the tail at index i with cut-off xmin (Clauset et al. 2009, eq. 3.7).</summary>
    private double Approx(int i, long xmin) =>
        1 + _nSuffix[i] / (_lnSuffix[i] - _nSuffix[i] * ((ulong)xmin < (ulong)LnHalf.Length ? LnHalf[xmin] : Math.Log(xmin - 0.5)));

    /// <summary>ln(k − ½) for 1 ≤ k &lt; 2^15, the same values as Math.Log (one table read per candidate's closed form).</summary>
    private static readonly double[] LnHalf = BuildLnHalf();

    private static double[] BuildLnHalf()
    {
        var t = new double[1 << 15];
        for (int k = 1; k < t.Length; k++) t[k] = Math.Log(k - 0.5);
        t[0] = double.NaN;
        return t;
    }

    /// <summary><see cref="FitAt"/>, optionally given ln ζ with its ratios already evaluated at the start (the same values
    /// the first iteration would compute); returns ln ζ(α, xmin) at the α returned (NaN when no α is).</summary>
    private PowerLawFit FitCore(int i, double warmAlpha, long xmin, LogZeta? first, out double lnZeta)
    {
        lnZeta = double.NaN;
        if (xmin <= 0) xmin = _v[i];
        long n = _nSuffix[i];
        double sumLn = _lnSuffix[i];
        if (n == 0)
        {
            return new PowerLawFit(double.NaN, double.NaN, double.NaN, xmin, 0, double.NaN, double.NaN, 0,
                FitStatus.TooFewPoints, "no types at or above xmin");
        }
        double meanLn = sumLn / n;
        double lnXmin = xmin == _v[i] ? _lnV[i] : Math.Log(xmin);
        double approx = Approx(i, xmin);
        if (i == _k - 1)
            return new PowerLawFit(double.NaN, double.NaN, approx, xmin, n, double.NaN, double.NaN, 0, FitStatus.AllEqual,
                _v[i] == xmin
                    ? $"all {n:N0} counts at or above xmin = {xmin:N0} equal it: the likelihood has no finite maximum "
                        + "(it rises with α without bound); use a lower xmin"
                    : $"all {n:N0} counts at or above xmin = {xmin:N0} equal {_v[i]:N0}: a single value has no tail shape to fit");
        // score(α)/n = E_α[ln X] − meanLn = −ζ'/ζ − meanLn, decreasing in α; keep a bracket [lo, hi] around its root
        double lo = MinAlpha, hi = MaxAlpha;
        double a = StartAlpha(warmAlpha, approx);
        int it = 0;
        bool capTried = false, atCap = false;
        LogZeta z = default;
        double evaluated = double.NaN; // where z was taken
        for (; it < 100; it++)
        {
            z = it == 0 && first is { } f0 ? f0 : HurwitzZeta.LogAt(a, xmin, lnXmin, true);
            evaluated = a;
            double score = -meanLn - z.R1;
            double info = z.R2 - z.R1 * z.R1; // −score'
            if (score > 0) lo = a; else hi = a;
            double next = a + score / info;
            if (!(next > lo && next < hi))
            {
                if (hi == MaxAlpha && !capTried)
                {
                    // the step leaves the range upwards: is the likelihood still rising at the cap?
                    capTried = true;
                    var zc = HurwitzZeta.Log(MaxAlpha, xmin, derivatives: true);
                    if (-meanLn - zc.R1 >= 0) { a = MaxAlpha; atCap = true; break; }
                }
                next = 0.5 * (lo + hi);
            }
            // converged: a is within the last (tiny) step of the root; keep it, where z was evaluated
            if (Math.Abs(next - a) < 1e-11 * a || hi - lo < 1e-12) break;
            a = next;
        }
        var zf = a == evaluated ? z : HurwitzZeta.LogAt(a, xmin, lnXmin, true);
        lnZeta = zf.Ln;
        double fisher = n * (zf.R2 - zf.R1 * zf.R1);
        double ll = -a * sumLn - n * zf.Ln;
        var status = FitStatus.Ok;
        string msg = "";
        if (atCap)
        {
            status = FitStatus.AtBound;
            msg = $"the likelihood still rises at α = {MaxAlpha} (the largest exponent considered) for xmin = {xmin:N0}";
        }
        else if (it >= 100) { status = FitStatus.NotConverged; msg = $"Newton iteration for α did not converge at xmin = {xmin:N0}"; }
        return new PowerLawFit(a, 1 / Math.Sqrt(fisher), approx, xmin, n, double.NaN, ll, it + 1, status, msg);
    }

    /// <summary>
    /// KS distance between the tail's empirical CDF and the fitted model, supremum over every integer x ≥ xmin.
    /// Between two observed values the empirical CDF is flat while the model rises, so both ends of each gap count.
    /// Returns as soon as the distance reaches <paramref name="giveUpAbove"/> (the value returned is then only a lower
    /// bound); blocks of values that provably cannot raise the distance are skipped (see the type's remarks).
    /// </summary>
    public double Ks(int i, double alpha, double giveUpAbove = double.PositiveInfinity, long xmin = 0) =>
        KsGiven(i, alpha, giveUpAbove, xmin, double.NaN);

    /// <summary><see cref="Ks"/> given ln ζ(α, xmin) when already known (NaN: computed here).</summary>
    private double KsGiven(int i, double alpha, double giveUpAbove, long xmin, double lnZeta)
    {
        var w = new KsWalk(this, i, alpha, xmin, giveUpAbove, lnZeta);
        // where the last walk's distance was reached: neighbouring tails tend to peak at the same value, and a candidate
        // that cannot beat the best then stops after one ζ evaluation (any tail point gives a lower bound)
        int h = _ksHint;
        if (h > i && h < _k && double.IsFinite(giveUpAbove) && w.Probe(h)) return w.D;
        // the first values one by one (cheap steps; most poor candidates fail here), then the blocks, largest bound first
        int j = i;
        int end = Math.Min(_k, i + Prefix);
        for (; j < end; j++)
            if (w.Leaf(j) || w.Done) { _ksHint = w.Arg; return w.D; }
        if (j < _k) w.Blocks(j, _k - 1, w.T, _heap ??= new BlockHeap());
        _ksHint = w.Arg;
        return w.D;
    }

    private BlockHeap? _heap; // scratch of Ks: an instance is used by one thread at a time
    private int _ksHint = -1; // value index w whose points v_w − 1, v_w gave the last walk's distance

    /// <summary>Reference: the same distance by visiting every value (with the early stops of the old scan).</summary>
    internal double KsFullScan(int i, double alpha, double giveUpAbove = double.PositiveInfinity, long xmin = 0)
    {
        var w = new KsWalk(this, i, alpha, xmin, giveUpAbove, double.NaN);
        for (int j = i; j < _k; j++)
        {
            if (w.Leaf(j) || w.Done) break;
            // nothing later can exceed d once both remaining masses are below it
            if (1 - w.C / w.N < w.D && w.T < w.D) break;
        }
        return w.D;
    }

    /// <summary>State of one KS walk: model tail masses T(x) = P(X ≥ x) in log space, empirical cumulative count C.</summary>
    private struct KsWalk
    {
        private readonly TailSearch _s;
        private readonly double _alpha, _lnZ0, _giveUp;
        public readonly double N;
        public double D, C, T;   // distance so far; empirical count through the last leaf; model mass at its next value
        public bool Done;        // reached giveUp
        public int Arg;          // value index w such that D was reached at v_w − 1 or v_w (−1: not at such a point)
        private long _x;         // T = P(X ≥ _x)

        public KsWalk(TailSearch s, int i, double alpha, long xmin, double giveUp, double lnZeta)
        {
            _s = s; _alpha = alpha; _giveUp = giveUp;
            if (xmin <= 0) xmin = s._v[i];
            _lnZ0 = double.IsNaN(lnZeta) ? HurwitzZeta.LogValue(alpha, xmin) : lnZeta;
            N = s._nSuffix[i];
            D = 0; C = 0; T = 1; _x = xmin; Done = false; Arg = -1;
            if (s._v[i] > xmin)
            {
                // the empirical CDF is 0 on [xmin, v_i): the largest gap is at v_i − 1
                T = Tail(i);
                _x = s._v[i];
                Raise(1 - T);
            }
        }

        /// <summary>P(X ≥ v_j), ln v_j from the table (the same bits as HurwitzZeta.LogValue, one logarithm fewer).</summary>
        private readonly double Tail(int j) => Math.Exp(HurwitzZeta.LogAt(_alpha, _s._v[j], _s._lnV[j], false).Ln - _lnZ0);
        private readonly double Pmf(double lnX) => Math.Exp(-_alpha * lnX - _lnZ0);

        private void Raise(double diff)
        {
            if (diff > D) D = diff;
            if (D >= _giveUp) Done = true;
        }

        /// <summary><see cref="Raise(double)"/> at v_w − 1 or v_w, remembering w when the distance grows.</summary>
        private void Raise(double diff, int w)
        {
            if (diff > D) { D = diff; Arg = w; }
            if (D >= _giveUp) Done = true;
        }

        /// <summary>Evaluates the points v_w − 1 and v_w (w beyond the first value of the tail) before the walk; true
        /// (and D set) when the distance there reaches the give-up level by more than <see cref="ScreenMargin"/>. Else
        /// nothing is kept, so a walk that goes on computes every point as before (the same distance to the bit).</summary>
        public bool Probe(int w)
        {
            double tw = Tail(w);                                   // P(X ≥ v_w)
            double below = (N - _s._nSuffix[w]) / N;                      // F at v_w − 1 (≥ v_i)
            double at = (N - _s._nSuffix[w + 1]) / N;                     // F at v_w
            double d = Math.Max(Math.Abs(below - (1 - tw)), Math.Abs(at - (1 - tw + Pmf(_s._lnV[w]))));
            if (!(d >= _giveUp + ScreenMargin)) return false;
            D = d; Arg = w; Done = true;
            return true;
        }

        /// <summary>Model mass P(X ≥ v_jv) from P(X ≥ x) = tx, stepping when the gap is short (ln t from the table
        /// where it has it: the same values as Math.Log).</summary>
        private readonly double TailAt(int jv, double tx, long x)
        {
            long v = _s._v[jv];
            if (v == x) return tx;
            if (v - x > DenseSpan) return Tail(jv);
            var lnSmall = LnSmall;
            for (long t = x; t < v; t++) tx -= Pmf((ulong)t < (ulong)lnSmall.Length ? lnSmall[t] : Math.Log(t));
            return tx;
        }

        /// <summary>Evaluates the points x = v_j and x = v_{j+1} − 1; true when the walk can stop (both masses spent).</summary>
        public bool Leaf(int j)
        {
            long v = _s._v[j];
            T = TailAt(j, T, _x);
            _x = v;
            C += _s._m[j];
            double f = C / N;
            double next = T - Pmf(_s._lnV[j]);    // P(X ≥ v + 1)
            Raise(Math.Abs(f - (1 - next)), j);
            if (Done) return true;
            if (j + 1 < _s._k && _s._v[j + 1] > v + 1)
            {
                // model CDF at v_{j+1} − 1 while the empirical CDF stays at f
                T = TailAt(j + 1, next, v + 1);
                _x = _s._v[j + 1];
                Raise(Math.Abs(f - (1 - T)), j + 1);
            }
            else { T = next; _x = v + 1; }
            return Done || j + 1 == _s._k;
        }

        /// <summary>Empirical CDF at v_j.</summary>
        private readonly double F(int j) => (N - _s._nSuffix[j + 1]) / N;

        /// <summary>Bound on |F − G| over the integers of values a..b, from P(X ≥ v_a) = ta and P(X ≥ v_{b+1}) = tb.</summary>
        private readonly double Bound(int a, int b, double ta, double tb) =>
            Math.Max(F(b) - (1 - ta + Pmf(_s._lnV[a])), (1 - tb) - F(a));

        /// <summary>
        /// The values a..k−1 (a after the walked prefix, <see cref="T"/> = P(X ≥ v_a)): blocks are split largest bound
        /// first; every split evaluates the point just before its right half exactly; the walk ends when no open
        /// block's bound exceeds the distance found (or the distance reaches the give-up level).
        /// </summary>
        public void Blocks(int a, int last, double ta, BlockHeap heap)
        {
            heap.Clear();
            heap.Push(new OpenBlock(Bound(a, last, ta, 0), a, last, ta, 0));
            while (heap.Count > 0 && !Done)
            {
                var blk = heap.Pop();
                if (blk.U <= D) break; // every open block is bounded by its U ≤ D
                long span = (blk.B + 1 < _s._k ? _s._v[blk.B + 1] : _s._v[blk.B] + 1) - _s._v[blk.A];
                if (blk.A == blk.B || span <= DenseSpan)
                {
                    // one value, or a short run of them: every point in it, stepping the tail mass down term by term
                    double t = blk.Ta;
                    for (int j = blk.A; j <= blk.B; j++)
                    {
                        double f = F(j);
                        t -= Pmf(_s._lnV[j]);
                        Raise(Math.Abs(f - (1 - t)), j);                                  // the point v_j
                        long next = j + 1 < _s._k ? _s._v[j + 1] : _s._v[j] + 1;
                        if (next > _s._v[j] + 1)
                        {
                            t = j == blk.B ? blk.Tb : TailAt(j + 1, t, _s._v[j] + 1);
                            Raise(Math.Abs(f - (1 - t)), j + 1);                          // v_{j+1} − 1
                        }
                    }
                    continue;
                }
                int mid = (blk.A + blk.B) >> 1;
                long vm = _s._v[mid + 1];
                double tm = vm - _s._v[blk.A] <= DenseSpan ? TailAt(mid + 1, blk.Ta, _s._v[blk.A]) : Tail(mid + 1);
                // x = v_{mid+1} − 1 is a point of the tail (v_mid itself when there is no gap): F = F(v_mid), G = 1 − tm
                Raise(Math.Abs(F(mid) - (1 - tm)), mid + 1);
                double ul = Bound(blk.A, mid, blk.Ta, tm), ur = Bound(mid + 1, blk.B, tm, blk.Tb);
                if (ul > D) heap.Push(new OpenBlock(ul, blk.A, mid, blk.Ta, tm));
                if (ur > D) heap.Push(new OpenBlock(ur, mid + 1, blk.B, tm, blk.Tb));
            }
        }
    }

    /// <summary>Arrays a bootstrap thread lends to one <see cref="TailSearch"/> after another.</summary>
    internal sealed class SearchScratch
    {
        public long[] NSuffix = [];
        public double[] LnSuffix = [], LnV = [];
        public readonly BlockHeap Heap = new();

        public void Ensure(int n)
        {
            if (NSuffix.Length >= n) return;
            int size = Math.Max(n, NSuffix.Length * 2);
            NSuffix = new long[size]; LnSuffix = new double[size]; LnV = new double[size];
        }
    }

    /// <summary>A block of values a..b not yet shown to stay within the distance, with its bound and tail masses.</summary>
    internal readonly record struct OpenBlock(double U, int A, int B, double Ta, double Tb);

    /// <summary>Max-heap of open blocks by bound.</summary>
    internal sealed class BlockHeap
    {
        private OpenBlock[] _a = new OpenBlock[64];
        public int Count;
        public void Clear() => Count = 0;

        public void Push(OpenBlock b)
        {
            if (Count == _a.Length) Array.Resize(ref _a, Count * 2);
            int i = Count++;
            while (i > 0)
            {
                int p = (i - 1) >> 1;
                if (_a[p].U >= b.U) break;
                _a[i] = _a[p]; i = p;
            }
            _a[i] = b;
        }

        public OpenBlock Pop()
        {
            var top = _a[0];
            var last = _a[--Count];
            int i = 0;
            while (true)
            {
                int c = 2 * i + 1;
                if (c >= Count) break;
                if (c + 1 < Count && _a[c + 1].U > _a[c].U) c++;
                if (_a[c].U <= last.U) break;
                _a[i] = _a[c]; i = c;
            }
            if (Count > 0) _a[i] = last;
            return top;
        }
    }

    /// <summary>
    /// The full fit: xmin minimising the KS distance over candidates (observed values with at least <paramref name="minTail"/>
    /// tail points and three distinct values), or the given <paramref name="fixedXmin"/>.
    /// </summary>
    public PowerLawFit Search(int minTail, long fixedXmin = 0) => SearchCore(minTail, fixedXmin, full: false)!;

    /// <summary><see cref="Search(int, long)"/> visiting the candidate at <paramref name="firstXmin"/> (the first value at or above
    /// it) before all others: a bootstrap replicate's KS-best xmin is usually near the data's, so the best distance is
    /// small from the start and the other candidates are screened instead of fitted. The result is the same candidate
    /// (the choice is the smallest distance, ties to the lower index, whatever the order), with α the same Newton root
    /// to its tolerance (the warm starts follow the order).</summary>
    internal PowerLawFit Search(int minTail, long fixedXmin, long firstXmin) => SearchCore(minTail, fixedXmin, full: false, firstXmin)!;

    /// <summary>Reference implementation of <see cref="Search(int, long)"/>: every candidate's KS distance point by point.</summary>
    internal PowerLawFit SearchFullScan(int minTail, long fixedXmin = 0) => SearchCore(minTail, fixedXmin, full: true)!;

    /// <summary>What a goodness-of-fit replicate needs of <see cref="Search(int, long, long)"/> (free xmin): whether the
    /// search would give status ok, and whether its KS distance then reaches <paramref name="level"/> — found without
    /// fitting the replicate's best candidate whenever it can be (see the remarks).</summary>
    /// <remarks>
    /// The p-value counts replicates whose search is ok with distance ≥ the data's. The search's distance is the
    /// smallest over the candidates whose fit is ok or at the cap, and its status that of the candidate reaching it.
    /// (1) When no candidate can have its α at the cap (<see cref="NoneAtCap"/>), the candidate reaching the smallest
    /// distance is ok (the search skips candidates whose Newton run did not converge), so the status is ok as soon as
    /// one candidate's fit is ok (the first candidate is fitted to show it when nothing else was), and only "is the
    /// smallest distance below the level" is asked.
    /// (2) That is the search itself started with the level as its best distance and no best candidate: every candidate
    /// with distance ≥ the level is screened out or abandoned at the level exactly as a candidate at or above a best
    /// distance is (the screen and the KS walk only ever drop what cannot go below it), and the first candidate whose
    /// walk ends below the level answers "below" at once. So the answer equals that of comparing the full search's
    /// distance with the level, except where the two differ by the rounding of a warm-started Newton root (~1e-15
    /// relative), as between two visiting orders of the search itself. Without (1) the full search runs.
    /// </remarks>
    internal ReplicateVerdict ReachesLevel(int minTail, long firstXmin, double level)
    {
        if (!(level >= 0) || !NoneAtCap(minTail))
        {
            var f = Search(minTail, 0, firstXmin);
            return f.Status != FitStatus.Ok ? ReplicateVerdict.Invalid
                : f.KsDistance >= level ? ReplicateVerdict.AtOrAbove : ReplicateVerdict.Below;
        }
        if (SearchCore(minTail, 0, full: false, firstXmin, level) is not null) return ReplicateVerdict.Below;
        // nothing below the level: the full search's status is ok when any candidate's fit is (step (1)); one fit
        // shows it
        if (FitAt(0).Status == FitStatus.Ok) return ReplicateVerdict.AtOrAbove;
        var g = Search(minTail, 0, firstXmin);
        return g.Status != FitStatus.Ok ? ReplicateVerdict.Invalid
            : g.KsDistance >= level ? ReplicateVerdict.AtOrAbove : ReplicateVerdict.Below;
    }

    /// <summary>
    /// True when there is at least one xmin candidate and none can have its likelihood still rising at α = 30 (a fit at
    /// the cap): for each, the tail's mean of ln x − ln v_i exceeds an upper bound on E_30[ln X − ln v_i] over x ≥ v_i.
    /// </summary>
    /// <remarks>
    /// A mean above E_30[ln X] makes the score at the cap negative, so the fit's root lies below 30. With v = v_i,
    /// ln(X/v) = Σ_{k≥1} 1{X ≥ v+k} ln((v+k)/(v+k−1)), so E[ln(X/v)] = Σ_{k≥1} P(X ≥ v+k) ln(1 + 1/(v+k−1)), where
    /// P(X ≥ v+k) = ζ(30, v+k)/ζ(30, v). Bounding the sums by integrals of the decreasing x^−30: from v = 64 on,
    /// ζ(30, v+k) ≤ (v+k−1)^−29/29 and ζ(30, v) ≥ v^−29/29 give P ≤ (1 + (k−1)/v)^−29, and with ln(1 + t) ≤ t and
    /// X/v − 1 = Σ_k 1{X ≥ v+k}/v the bound E ≤ (1 + Σ_{j≥1} (1 + j/v)^−29)/v ≤ 1/v + 1/28 ≤ 1/64 + 1/28 (the constant
    /// used, so the check needs no division; it is made for every tail in the constructor). Below 64 (where that is
    /// loose) <see cref="CapBoundSmall"/> sums min(1, (v/(v+k))^30 (1 + (v+k)/29)) ln(1 + 1/(v+k−1)) over k, from
    /// ζ(30, q) ≤ q^−30 + q^−29/29 and ζ(30, v) ≥ v^−30. Power-law-like tails have a mean excess ≈ 1/(α − 1) ≫ 1/28.
    /// </remarks>
    private bool NoneAtCap(int minTail)
    {
        int candidates = CandidateCount(minTail);
        // each tail checked as the suffix sums are made (the constructor), lowest failing index kept
        return candidates > 0 && _firstAtCapRisk >= candidates;
    }

    /// <summary>The xmin candidates: the first indices, at most k − 2 of them (three distinct values left), whose tails
    /// hold at least <paramref name="minTail"/> types — found by binary search, as the tail counts fall with the index
    /// (every multiplicity is at least 1), where a replicate's search had stepped through ~10^4 of them twice.</summary>
    private int CandidateCount(int minTail)
    {
        int lo = 0, hi = Math.Max(0, _k - 2);
        while (lo < hi) { int mid = (lo + hi) >> 1; if (_nSuffix[mid] >= minTail) lo = mid + 1; else hi = mid; }
        return lo;
    }

    /// <summary>Upper bound on E_30[ln(X/v)] for the power law with α = 30 on x ≥ v (see <see cref="NoneAtCap"/>); from
    /// v = 64 on the constant 1/64 + 1/28 (≥ 1/v + 1/28), so that no division is needed.</summary>
    internal static double CapExcessBound(long v) =>
        (ulong)v < (ulong)CapBoundSmall.Length ? CapBoundSmall[v] : 1.0 / 64 + 1.0 / 28;

    /// <summary><see cref="CapExcessBound"/> plus a margin of 1e-9 for the rounding of the suffix sums, from v = 64
    /// on (below, <see cref="CapLimitSmall"/>); the constructor checks every tail against it.</summary>
    private const double CapLimitLarge = 1.0 / 64 + 1.0 / 28 + 1e-9;


    /// <summary>Upper bounds on E_30[ln(X/v)] over x ≥ v for v &lt; 64 (see <see cref="NoneAtCap"/>): the sum, with a
    /// relative margin of 1e-6 for rounding and for the terms left out (each below 1e-30, falling like k^−29), or the
    /// large-v bound where that is smaller.</summary>
    private static readonly double[] CapBoundSmall = BuildCapBoundSmall();

    // after CapBoundSmall: static fields are initialised in the order written
    private static readonly double[] CapLimitSmall = CapBoundSmall.Select(b => b + 1e-9).ToArray();

    private static double[] BuildCapBoundSmall()
    {
        var t = new double[64];
        t[0] = double.PositiveInfinity;
        for (int v = 1; v < t.Length; v++)
        {
            double sum = 0;
            for (int k = 1; ; k++)
            {
                double q = v + k;
                double p = Math.Min(1, Math.Pow(v / q, 30) * (1 + q / 29));
                double term = p * Math.Log(1 + 1.0 / (q - 1));
                sum += term;
                if (term < 1e-30 && k > 64) break;
            }
            // both are bounds; the sum is the tighter one for small v
            t[v] = Math.Min(sum * (1 + 1e-6) + 1e-300, 1.0 / v + 1.0 / 28);
        }
        return t;
    }

    /// <summary>Answer of <see cref="ReachesLevel"/>.</summary>
    internal enum ReplicateVerdict
    {
        /// <summary>The search's status is not ok (the replicate is left out of the p-value).</summary>
        Invalid,
        /// <summary>Status ok with a KS distance below the level.</summary>
        Below,
        /// <summary>Status ok with a KS distance at or above the level.</summary>
        AtOrAbove,
    }

    /// <summary>The search; with a finite <paramref name="level"/> (free xmin, pruned only) the level acts as the best
    /// distance before any candidate is fitted, the first candidate below it is returned at once, and null means none
    /// is below it (<see cref="ReachesLevel"/>).</summary>
    private PowerLawFit? SearchCore(int minTail, long fixedXmin, bool full, long firstXmin = 0,
        double level = double.PositiveInfinity)
    {
        long total = _nSuffix[0];
        if (total == 1)
            return Fail(FitStatus.TooFewPoints, fixedXmin, total, $"a single count ({_v[0]:N0}): nothing to fit");
        if (_k == 1)
            return Fail(FitStatus.AllEqual, fixedXmin, total,
                $"all {total:N0} counts are equal ({_v[0]:N0}): a single value has no tail shape to fit");
        if (fixedXmin > 0)
        {
            int i = IndexOf(fixedXmin);
            if (i >= _k) return Fail(FitStatus.TooFewPoints, fixedXmin, 0, $"no types with count ≥ xmin = {fixedXmin:N0} (largest count {_v[_k - 1]:N0})");
            var f = FitAt(i, 2, fixedXmin);
            if (f.Status is FitStatus.AllEqual or FitStatus.TooFewPoints or FitStatus.NotConverged) return f;
            double d = full ? KsFullScan(i, f.Alpha, double.PositiveInfinity, fixedXmin) : Ks(i, f.Alpha, double.PositiveInfinity, fixedXmin);
            f = f with { KsDistance = d };
            return f.Status == FitStatus.AtBound ? NoMaximum(f, fixedXmin) : f;
        }
        PowerLawFit? best = null;
        double bestD = level;
        bool decide = double.IsFinite(level);
        int bestI = -1;
        bool anyInterior = false;
        int candidates = CandidateCount(minTail);
        // Full scan: candidates in order, each abandoned once its distance reaches the best so far. Pruned: a sample of
        // every stride-th candidate first, so that the best distance is small early and the rest are abandoned sooner;
        // ties go to the lower index as in the full scan (a lower-index candidate is abandoned only above the best).
        // (with a fixed level there is no best distance to lower early: one pass in order, which keeps the screen's
        // remembered witness points useful from one candidate to the next)
        int stride = full || decide ? 1 : Math.Max(1, (int)Math.Sqrt(candidates));
        // pass 0 visits only the candidate asked for first (if any), pass 1 the sample, pass 2 the rest
        int first0 = full || firstXmin <= 0 ? -1 : IndexOf(firstXmin);
        if (first0 >= candidates) first0 = -1;
        // Pruned search only: candidates whose KS distance provably reaches the best so far are dropped after one ζ
        // evaluation (TailSearch.Screen.cs); their interior status is then not recorded on either side (a drop below
        // the start would be an interior fit the full scan counts), so an at-cap best with none seen takes the full scan
        bool screened = false;
        var memo = new ScreenMemo();
        var blocks = new BlockMemo();
        for (int pass = first0 >= 0 ? 0 : 1; pass < (stride > 1 ? 3 : 2); pass++)
        {
            double warm = best?.Alpha ?? 2;
            double offset = double.NaN; // α − closed-form approximation at the last interior fit: predicts the next start
            // pass 1 steps through the sample, pass 2 through the rest (rem = i mod stride, kept without a division)
            int step = pass == 1 && stride > 1 ? stride : 1;
            for (int i = pass == 0 ? first0 : 0, rem = 0; i < (pass == 0 ? first0 + 1 : candidates);
                i += step, rem = step > 1 || rem + 1 == stride ? 0 : rem + 1)
            {
                if (pass > 0 && (i == first0 || pass == 2 && rem == 0)) continue;
                double giveUp = i < bestI ? Math.BitIncrement(bestD) : bestD;
                // the last candidates (a few hundred types in the tail) at once from one jump of the CDF, no ζ
                // (TailSearch.Screen.cs, JumpDrops)
                if (!full && double.IsFinite(bestD) && JumpDrops(i, giveUp)) { screened = true; JumpDropped++; continue; }
                // runs of consecutive candidates dropped at once (TailSearch.Blocks.cs); the run may hold candidates
                // already visited (the sample, the first): a bound that holds for all drops nothing they decided
                if (!full && step == 1 && i >= blocks.Resume && _v[i] >= BlockFrom && double.IsFinite(bestD))
                {
                    int b = Math.Min(i + blocks.Len, pass == 0 ? first0 + 1 : candidates) - 1;
                    // a run over which the tail count moves by more than 1/256 is too coarse for the bound
                    long most = _nSuffix[i] - (_nSuffix[i] >> 8);
                    while (b - i + 1 >= MinBlock && _nSuffix[b] < most) b = i + (b - i + 1) / 2 - 1;
                    if (b - i + 1 >= MinBlock)
                    {
                        if (BlockScreen(i, b, giveUp, offset, ref blocks, ref memo))
                        {
                            // the run's fits are not known to be interior: an at-cap best then takes the full scan
                            screened = true;
                            BlockDropped += b - i + 1;
                            blocks.Len = Math.Min(MaxBlock, 2 * blocks.Len);
                            blocks.Backoff = 0;
                            if (stride > 1) rem = (rem + (b - i)) % stride;
                            i = b; // the loop steps to b + 1 (and rem with it)
                            continue;
                        }
                        // the run's candidates one by one, then a shorter run
                        // (after failures at the shortest length, the next try waits longer each time)
                        if (blocks.Len == MinBlock) blocks.Backoff = Math.Min(256, Math.Max(8, 2 * blocks.Backoff));
                        blocks.Resume = b + 1 + blocks.Backoff;
                        blocks.Len = Math.Max(MinBlock, blocks.Len / 2);
                    }
                }
                PowerLawFit f;
                double lnZeta = double.NaN;
                if (full) f = FitAt(i, warm);
                else
                {
                    double approx = Approx(i, _v[i]);
                    double start = StartAlpha(double.IsNaN(offset) ? warm : approx + offset, approx);
                    LogZeta? first = null;
                    if (double.IsFinite(bestD) && i < _k - 1)
                    {
                        if (Screen(i, start, giveUp, ref memo, out var atStart)) { screened = true; continue; }
                        if (!double.IsNaN(atStart.Ln)) first = atStart;
                    }
                    f = FitCore(i, start, 0, first, out lnZeta);
                }
                if (f.Status is not (FitStatus.Ok or FitStatus.AtBound)) continue;
                if (f.Status == FitStatus.Ok)
                {
                    anyInterior = true; warm = f.Alpha;
                    offset = f.Alpha - f.AlphaApprox;
                }
                double d = full ? KsFullScan(i, f.Alpha, giveUp) : KsGiven(i, f.Alpha, giveUp, 0, lnZeta);
                if (d < bestD || d == bestD && i < bestI)
                {
                    bestD = d; bestI = i; best = f with { KsDistance = d };
                    if (decide) return best;
                }
            }
        }
        if (decide) return null;
        // a screened candidate above its start might have had an interior fit: decide anyInterior exactly
        if (best?.Status == FitStatus.AtBound && !anyInterior && screened) return SearchCore(minTail, fixedXmin, full: true)!;
        if (best is null)
        {
            if (total < minTail)
                return Fail(FitStatus.TooFewPoints, 0, total, $"only {total:N0} types; at least {minTail} tail points are needed (--min-tail)");
            if (_k == 2)
                return Fail(FitStatus.TooFewPoints, 0, total,
                    $"only 2 distinct counts ({_v[0]:N0} and {_v[1]:N0}): at least 3 are needed to fit a tail shape");
            return Fail(FitStatus.NotConverged, 0, total, $"the α iteration did not converge at any of {candidates} xmin candidates");
        }
        if (best.Status == FitStatus.AtBound)
        {
            if (!anyInterior) return NoMaximum(best, 0);
            return best with
            {
                Message = $"the KS-best xmin = {best.Xmin:N0} has α at the cap {MaxAlpha} with the likelihood still rising: "
                    + "the tail there is too steep or too short for a power law; try a fixed lower --xmin or a larger --min-tail",
            };
        }
        return best;
    }

    private PowerLawFit NoMaximum(PowerLawFit f, long fixedXmin)
    {
        int i = IndexOf(f.Xmin);
        long lo = _v[i], hi = _v[_k - 1];
        double spread = _lnV[_k - 1] - _lnV[i];
        return f with
        {
            Status = FitStatus.NoMaximum,
            Message = $"no maximum of the likelihood below α = {MaxAlpha} {(fixedXmin > 0 ? $"at xmin = {fixedXmin:N0}" : "at any xmin candidate")}: "
                + $"the tail counts ({lo:N0} … {hi:N0}, ln(max/min) = {spread:G3}) are too close together for their size to show a power law",
        };
    }

    private static PowerLawFit Fail(FitStatus status, long xmin, long nTail, string message) =>
        new(double.NaN, double.NaN, double.NaN, xmin, nTail, double.NaN, double.NaN, 0, status, message);
}
