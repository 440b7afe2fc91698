namespace RankFreq.Lexical;

/// <summary>
/// The Zipf–Mandelbrot LNRE model (Evert 2004, JADT): type density g(π) = C π^(−α−1) for 0 ≤ π ≤ B, 0 &lt; α &lt; 1,
/// C = (1 − α)/B^(1−α); infinitely many types in the population. The formulas are those of
/// <see cref="FiniteZipfMandelbrotModel"/> with A = 0: E[V_m(N)] = (C N^α/m!) Γ(m − α) P(m − α, NB),
/// E[V(N)] = (C/α) [N^α Γ(1 − α) P(1 − α, NB) − (1 − e^(−NB)) B^(−α)]; for large NB, E[V_1]/E[V] → α.
/// </summary>
/// <param name="Alpha">α.</param>
/// <param name="B">B, the largest type probability.</param>
public sealed record ZipfMandelbrotModel(double Alpha, double B) : LnreModel
{
    private readonly FiniteZipfMandelbrotModel _inner = new(Alpha, 0, B);

    /// <inheritdoc/>
    public override string Name => "zm";

    /// <inheritdoc/>
    public override IReadOnlyDictionary<string, double> Parameters =>
        new Dictionary<string, double> { ["alpha"] = Alpha, ["B"] = B };

    /// <inheritdoc/>
    public override int ParameterCount => 2;

    /// <inheritdoc/>
    public override double PopulationTypes => double.PositiveInfinity;

    /// <inheritdoc/>
    public override double ExpectedTypes(double n) => _inner.ExpectedTypes(n);

    /// <inheritdoc/>
    public override double[] ExpectedSpectrum(double n, int maxM) => _inner.ExpectedSpectrum(n, maxM);

    /// <inheritdoc/>
    public override double LogDensity(double p) => _inner.LogDensity(p);

    /// <inheritdoc/>
    public override (double Lo, double Hi) Support => _inner.Support;

    /// <inheritdoc/>
    public override double PopulationCoverageTypes(double q) => _inner.PopulationCoverageTypes(q);
}
