namespace RankFreq.Fitting;

/// <summary>Value, gradient and Hessian of a function of two parameters.</summary>
internal readonly record struct Quadratic2(double F, double G0, double G1, double H00, double H01, double H11);

/// <summary>
/// Damped Newton minimisation in two parameters with analytic gradient and Hessian (Nocedal &amp; Wright 2006,
/// "Numerical Optimization", §3.4: Hessian modification by adding τI until positive definite, backtracking line search
/// with the Armijo condition). Used for the alternatives' maximum likelihood, where one evaluation is one pass over the
/// tail's spectrum and a simplex search needed hundreds to thousands of them.
/// </summary>
/// <remarks>
/// Stops when the Newton decrement gᵀH⁻¹g/2 (the predicted gain in the objective) is below 1e-10 + r·|f| (r = 1e-9
/// unless the caller asks for less, as the Weibull fit does on its flat ridge towards β → 0), or when
/// no step along the modified Newton direction lowers f (then converged if the decrement is below 1e3 times that). For
/// a log-likelihood summed over 10^4–10^5 cells the rounding of f itself is about 1e-12·|f| and more where the sums
/// cancel (a lognormal near its power-law limit), so a tighter stop would chase rounding; 1e-9·|f| keeps the maximum
/// within 1e-9 relative, a thousand times inside the 1e-6 the fits are checked to, and well-posed maxima converge
/// quadratically far below it. Points where the function is not finite count as infinitely bad, so a step never leaves
/// the parameter range.
/// </remarks>
internal static class Newton2
{
    /// <summary>Minimises <paramref name="eval"/> from (x0, x1) subject to x1 ≥ <paramref name="lo1"/>; null when it did
    /// not converge in 200 iterations or the start is not finite.</summary>
    /// <remarks>The bound is handled by projection (Bertsekas 1982, projected Newton): x1 on the bound with the
    /// gradient pushing outwards is held there and the step is a Newton step in x0 alone; trial points are projected
    /// onto x1 ≥ lo1.</remarks>
    public static (double X0, double X1, Quadratic2 At, int Iterations)? Minimize(Func<double, double, Quadratic2> eval, double x0, double x1,
        double lo1 = double.NegativeInfinity, double relTol = 1e-9)
    {
        x1 = Math.Max(x1, lo1);
        var q = eval(x0, x1);
        if (!double.IsFinite(q.F)) return null;
        for (int it = 1; it <= 200; it++)
        {
            if (!(double.IsFinite(q.G0) && double.IsFinite(q.G1))) return null;
            // modified Newton direction d = −(H + τI)⁻¹ g with the smallest τ ≥ 0 (tried on a ladder) that makes it positive definite
            double scale = Math.Max(Math.Abs(q.H00), Math.Abs(q.H11)) + 1e-300;
            double tau = 0, d0 = 0, d1 = 0, dec = 0;
            bool held = x1 <= lo1 && q.G1 > 0;
            for (int k = 0; k < 40 && held; k++)
            {
                double a = q.H00 + tau;
                if (a > 0) { d0 = -q.G0 / a; dec = 0.5 * q.G0 * q.G0 / a; break; }
                tau = tau == 0 ? 1e-8 * scale : tau * 10;
            }
            for (int k = 0; k < 40 && !held; k++)
            {
                double a = q.H00 + tau, c = q.H11 + tau, det = a * c - q.H01 * q.H01;
                if (a > 0 && det > 1e-14 * a * c)
                {
                    d0 = -(c * q.G0 - q.H01 * q.G1) / det;
                    d1 = -(a * q.G1 - q.H01 * q.G0) / det;
                    dec = -0.5 * (q.G0 * d0 + q.G1 * d1);
                    break;
                }
                tau = tau == 0 ? 1e-8 * scale : tau * 10;
            }
            if (!(dec > 0)) return dec == 0 && q.G0 == 0 && q.G1 == 0 ? (x0, x1, q, it) : null;
            double tol = 1e-10 + relTol * Math.Abs(q.F);
            if (dec < tol) return (x0, x1, q, it);
            double t = 1;
            Quadratic2 next = default;
            bool moved = false;
            for (int ls = 0; ls < 60; ls++, t *= 0.5)
            {
                double y0 = x0 + t * d0, y1 = Math.Max(lo1, x1 + t * d1);
                next = eval(y0, y1);
                if (double.IsFinite(next.F) && next.F <= q.F - 1e-4 * (q.G0 * (x0 - y0) + q.G1 * (x1 - y1))) { x0 = y0; x1 = y1; moved = true; break; }
            }
            if (!moved)
            {
                // nothing lowers f beyond its rounding: converged if the predicted gain is of that size too
                return dec < 1e3 * tol ? (x0, x1, q, it) : null;
            }
            q = next;
        }
        return null;
    }
}
