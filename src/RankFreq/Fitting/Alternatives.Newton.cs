namespace RankFreq.Fitting;

/// <summary>
/// Negative log-likelihoods of the two-parameter alternatives with analytic gradients and Hessians, for
/// <see cref="Newton2"/>: one pass over the tail per evaluation.
/// </summary>
/// <remarks>
/// <para>Discrete lognormal, in (μ, s = ln σ): a cell's ℓ = ln(Φ(b) − Φ(a)), a = (ln(x−½) − μ)/σ, b = (ln(x+½) − μ)/σ.
/// With r_z = φ(z)/(Φ(b) − Φ(a)) (formed in logs) and z_μ = −1/σ, z_s = −z: ℓ_μ = −(r_b − r_a)/σ,
/// ℓ_s = −(b r_b − a r_a), ℓ_μμ = −(b r_b − a r_a)/σ² − ℓ_μ², ℓ_μs = (r_b(1 − b²) − r_a(1 − a²))/σ − ℓ_μℓ_s,
/// ℓ_ss = r_b(b − b³) − r_a(a − a³) − ℓ_s² (from φ' = −zφ). For a narrow cell, where <see cref="GaussLog.LogDiff"/>
/// uses its Taylor form ℓ = −m²/2 − ln√(2π) + ln h + ln(1 + c(m, h)) (m the midpoint, h the width), the derivatives
/// are those of that form, so no difference of nearly equal φ ratios is formed. The normaliser −n ln Q(z₀) is the
/// case b = ∞.</para>
/// <para>Discrete Weibull, in (u = ln λ, v = ln β): ℓ = −λA + E(λS), A = x^β − xmin^β, S = (x+1)^β − x^β,
/// E(y) = ln(1 − e^−y), E' = 1/expm1(y), E'' = −E'(1 + E'); A, S and their β-derivatives are written without
/// differences of nearly equal powers (A = xmin^β expm1(β ln(x/xmin)), S = x^β expm1(β log1p(1/x))).</para>
/// Tested against central differences of the value (Fitting/AlternativesNewtonTests.cs) and, through the fits, against
/// the simplex maxima and the mpmath reference (AlternativesReferenceTests).
/// </remarks>
public static partial class Alternatives
{
    private static readonly double LnSqrt2Pi = 0.5 * Math.Log(2 * Math.PI);

    /// <summary>One-sided 5% point of the standard normal: below it the lognormal's curvature is not told from 0.</summary>
    private const double CurvatureZ = 1.6448536269514722;

    /// <summary>
    /// Wald statistic z = κ̂ / SE(κ̂) of the lognormal's curvature κ = 1/(2σ²) against its power-law limit κ = 0. In the
    /// natural parameters (η, κ) the (continuous) lognormal is an exponential family with sufficient statistics
    /// (ln x, −(ln x)²), whose Fisher information is n·Cov(T); estimated by the tail's own covariance, the information
    /// on κ with η profiled out is n·RV, RV = Var(D²) − Cov(D, D²)² / Var(D), D = ln x − mean ln x (the residual
    /// variance of (ln x)² given ln x), so SE(κ̂) = 1/√(n·RV).
    /// </summary>
    /// <remarks>
    /// Why this rule: ln p(x) of the lognormal is −κ(ln x)² + (μ/σ² − 1) ln x + const, so the family reaches the power
    /// law (a straight line in ln x) as κ → 0 with μ → −∞; κ = 0 is the edge of its range. When the data cannot tell κ̂
    /// from 0 at the one-sided 5% level (Wald test of a boundary value, common practice), the fitted "lognormal" is
    /// that limit in all but name: its likelihood ratio with the discrete power law then measures only the difference
    /// between cells ∫_{x−½}^{x+½} t^−α dt and x^−α, not any curvature, and Vuong's test on it says nothing about the
    /// lognormal. Such a fit is reported <see cref="FitStatus.AtBound"/> with no verdict. On the 10^9-token spectrum
    /// (417,391 tail points; σ ≈ 81 at the maximum, 53.5 where the simplex stopped) z ≈ 0.1–0.3; on the KJV tail
    /// (μ ≈ −10.1, σ ≈ 4.5) it is about 3.
    /// </remarks>
    internal static double LognormalCurvatureZ(LognormalTail t, double sigma)
    {
        double mean = 0;
        for (int i = 0; i < t.Mid.Length; i++) mean += t.M[i] * t.Mid[i];
        mean /= t.N;
        double v2 = 0, v3 = 0, v4 = 0;
        for (int i = 0; i < t.Mid.Length; i++)
        {
            double d = t.Mid[i] - mean, d2 = d * d;
            v2 += t.M[i] * d2; v3 += t.M[i] * d2 * d; v4 += t.M[i] * d2 * d2;
        }
        v2 /= t.N; v3 /= t.N; v4 /= t.N;
        double rv = v4 - v2 * v2 - (v2 > 0 ? v3 * v3 / v2 : 0);
        return rv > 0 ? 0.5 / (sigma * sigma) * Math.Sqrt(t.N * rv) : double.PositiveInfinity;
    }

    /// <summary>The lognormal's tail data: ln(x ± ½), the cell midpoints and widths in ln x, multiplicities.</summary>
    internal sealed class LognormalTail
    {
        public readonly double[] Lo, Hi, Mid, Width, M;
        public readonly double N, LnX0;

        public LognormalTail(long[] x, long[] m, long xmin)
        {
            Lo = new double[x.Length]; Hi = new double[x.Length]; Mid = new double[x.Length]; Width = new double[x.Length];
            M = new double[x.Length];
            for (int i = 0; i < x.Length; i++)
            {
                Lo[i] = Math.Log(x[i] - 0.5); Hi[i] = Math.Log(x[i] + 0.5);
                Mid[i] = 0.5 * (Lo[i] + Hi[i]);
                Width[i] = LogMath.Log1p(1 / (x[i] - 0.5));
                M[i] = m[i]; N += m[i];
            }
            LnX0 = Math.Log(xmin - 0.5);
        }
    }

    /// <summary>−ln L of the discrete lognormal at (μ, s = ln σ) with gradient and Hessian (+∞ outside the range).</summary>
    internal static Quadratic2 LognormalNll(LognormalTail t, double mu, double s)
    {
        double sigma = Math.Exp(s);
        if (!(sigma > MinSigma && sigma < MaxSigma) || Math.Abs(mu) > MaxAbsMu) return new Quadratic2(double.PositiveInfinity, 0, 0, 0, 0, 0);
        double inv = 1 / sigma, inv2 = inv * inv;
        double ll = 0, gm = 0, gs = 0, hmm = 0, hms = 0, hss = 0;
        for (int i = 0; i < t.Lo.Length; i++)
        {
            double a = (t.Lo[i] - mu) * inv, b = (t.Hi[i] - mu) * inv;
            double l = GaussLog.LogDiff(a, b);
            double m = 0.5 * (a + b), h = b - a;
            double lm, ls, lmm, lms, lss;
            if (h * Math.Max(1, Math.Abs(m)) < 0.02)
            {
                // derivatives of GaussLog's Taylor form F(m, h) = −m²/2 − ln√(2π) + ln h + ln(1 + c)
                double m2 = m * m, h2 = h * h, q4 = m2 * m2 - 6 * m2 + 3, q3 = 4 * m2 * m - 12 * m;
                double d = 1 + (m2 - 1) * h2 / 24 + q4 * h2 * h2 / 1920;
                double cm = m * h2 / 12 + q3 * h2 * h2 / 1920;
                double ch = (m2 - 1) * h / 12 + q4 * h2 * h / 480;
                double cmm = h2 / 12 + (12 * m2 - 12) * h2 * h2 / 1920;
                double cmh = m * h / 6 + q3 * h2 * h / 480;
                double chh = (m2 - 1) / 12 + q4 * h2 / 160;
                double fm = -m + cm / d;
                double fmm = -1 + cmm / d - cm * cm / (d * d);
                double fmh = cmh / d - cm * ch / (d * d);
                double hfh = 1 + h * ch / d;                                  // h·F_h
                double hfhPlusH2fhh = h * ch / d + h2 * (chh / d - ch * ch / (d * d)); // h·F_h + h²·F_hh
                lm = -fm * inv;
                ls = -m * fm - hfh;
                lmm = fmm * inv2;
                lms = (fm + m * fmm + h * fmh) * inv;
                lss = m * fm + m2 * fmm + 2 * m * h * fmh + hfhPlusH2fhh;
            }
            else
            {
                double ra = Math.Exp(-0.5 * a * a - LnSqrt2Pi - l), rb = Math.Exp(-0.5 * b * b - LnSqrt2Pi - l);
                lm = -(rb - ra) * inv;
                ls = -(b * rb - a * ra);
                lmm = -(b * rb - a * ra) * inv2 - lm * lm;
                lms = (rb * (1 - b * b) - ra * (1 - a * a)) * inv - lm * ls;
                lss = rb * (b - b * b * b) - ra * (a - a * a * a) - ls * ls;
            }
            double w = t.M[i];
            ll += w * l; gm += w * lm; gs += w * ls; hmm += w * lmm; hms += w * lms; hss += w * lss;
        }
        // normaliser ln Q(z0): the cell [z0, ∞)
        double z0 = (t.LnX0 - mu) * inv;
        double lq = GaussLog.LogQ(z0);
        double r0 = Math.Exp(-0.5 * z0 * z0 - LnSqrt2Pi - lq);
        double qm = r0 * inv, qs = z0 * r0;
        double qmm = z0 * r0 * inv2 - qm * qm, qms = -r0 * (1 - z0 * z0) * inv - qm * qs, qss = -r0 * (z0 - z0 * z0 * z0) - qs * qs;
        double n = t.N;
        double f = -(ll - n * lq);
        if (!double.IsFinite(f)) return new Quadratic2(double.PositiveInfinity, 0, 0, 0, 0, 0);
        return new Quadratic2(f, -(gm - n * qm), -(gs - n * qs), -(hmm - n * qmm), -(hms - n * qms), -(hss - n * qss));
    }

    /// <summary>
    /// <see cref="LognormalNll"/> in the natural parameters (η = μ/σ², κ = 1/(2σ²)) of ln p ∝ −κ(ln x)² + (η − 1) ln x,
    /// where the ridge towards the power-law limit (κ → 0 at fixed η) is straight and the continuous family's
    /// log-likelihood is concave (an exponential family); in (μ, ln σ) that ridge is the parabola μ ∝ −σ² and Newton
    /// steps along it are short. Gradient and Hessian by the chain rule through μ = η/(2κ), s = −½ ln(2κ).
    /// </summary>
    internal static Quadratic2 LognormalNllNatural(LognormalTail t, double eta, double kappa)
    {
        if (!(kappa > 0)) return new Quadratic2(double.PositiveInfinity, 0, 0, 0, 0, 0);
        double mu = eta / (2 * kappa), s = -0.5 * Math.Log(2 * kappa);
        var q = LognormalNll(t, mu, s);
        if (!double.IsFinite(q.F)) return q;
        double me = 1 / (2 * kappa), mk = -eta / (2 * kappa * kappa), sk = -1 / (2 * kappa);
        double mek = -1 / (2 * kappa * kappa), mkk = eta / (kappa * kappa * kappa), skk = 1 / (2 * kappa * kappa);
        return new Quadratic2(q.F, me * q.G0, mk * q.G0 + sk * q.G1,
            me * me * q.H00,
            me * (mk * q.H00 + sk * q.H01) + q.G0 * mek,
            mk * mk * q.H00 + 2 * mk * sk * q.H01 + sk * sk * q.H11 + q.G0 * mkk + q.G1 * skk);
    }

    /// <summary><see cref="WeibullNll"/> in (w = ln λβ, v = ln β): as β → 0 the law tends to the power law with
    /// exponent λβ + 1, so its ridge runs along v at fixed w. u = w − v is linear, so the Hessian maps exactly.</summary>
    internal static Quadratic2 WeibullNllSlope(long[] x, long[] m, long xmin, double w, double v)
    {
        var q = WeibullNll(x, m, xmin, w - v, v);
        return new Quadratic2(q.F, q.G0, q.G1 - q.G0, q.H00, q.H01 - q.H00, q.H11 - 2 * q.H01 + q.H00);
    }

    /// <summary>−ln L of the discrete Weibull at (u = ln λ, v = ln β) with gradient and Hessian (+∞ outside the range).</summary>
    internal static Quadratic2 WeibullNll(long[] x, long[] m, long xmin, double u, double v)
    {
        double lambda = Math.Exp(u), beta = Math.Exp(v);
        if (!(beta >= MinBeta && beta < MaxBeta)) return new Quadratic2(double.PositiveInfinity, 0, 0, 0, 0, 0);
        double l0 = Math.Log(xmin), p0 = Math.Exp(beta * l0);
        double ll = 0, gl = 0, gb = 0, hll = 0, hlb = 0, hbb = 0;
        for (int i = 0; i < x.Length; i++)
        {
            double lx = Math.Log(x[i]), px = Math.Exp(beta * lx);
            double L = LogMath.Log1p(1.0 / x[i]), ebl = Math.Exp(beta * L);
            double A = p0 * LogMath.Expm1(beta * (lx - l0));
            double Ab = lx * A + p0 * (lx - l0), Abb = lx * lx * A + p0 * (lx - l0) * (lx + l0);
            double S = px * LogMath.Expm1(beta * L);
            double Sb = lx * S + px * ebl * L, Sbb = lx * Sb + L * px * ebl * (lx + L);
            double y = lambda * S, em1 = LogMath.Expm1(y);
            double e1 = 1 / em1, e2 = -e1 * (1 + e1);
            double l = -lambda * A + Math.Log(-LogMath.Expm1(-y));
            double w = m[i];
            ll += w * l;
            gl += w * (-A + S * e1);
            gb += w * (-lambda * Ab + lambda * Sb * e1);
            hll += w * (S * S * e2);
            hlb += w * (-Ab + Sb * e1 + lambda * S * Sb * e2);
            hbb += w * (-lambda * Abb + lambda * Sbb * e1 + lambda * lambda * Sb * Sb * e2);
        }
        if (!double.IsFinite(ll)) return new Quadratic2(double.PositiveInfinity, 0, 0, 0, 0, 0);
        // chain rule to (u, v): ∂/∂u = λ∂/∂λ, ∂²/∂u² = λ²∂²/∂λ² + λ∂/∂λ, and likewise for v with β
        return new Quadratic2(-ll, -lambda * gl, -beta * gb,
            -(lambda * lambda * hll + lambda * gl), -(lambda * beta * hlb), -(beta * beta * hbb + beta * gb));
    }
}
