namespace RankFreq.Fitting;

/// <summary>Outcome of a numerical procedure.</summary>
public enum FitStatus
{
    /// <summary>Converged.</summary>
    Ok,
    /// <summary>Fewer tail points than the minimum.</summary>
    TooFewPoints,
    /// <summary>Every tail value is the same: no finite maximum of the likelihood.</summary>
    AllEqual,
    /// <summary>The maximum lies at the edge of the allowed range.</summary>
    Boundary,
    /// <summary>The iteration did not converge.</summary>
    NotConverged,
}
