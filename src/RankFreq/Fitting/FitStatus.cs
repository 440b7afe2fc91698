namespace RankFreq.Fitting;

/// <summary>
/// Outcome of a numerical procedure. Written everywhere in snake_case through <see cref="FitStatusNames.Of"/>:
/// ok, too_few_points, all_equal, at_bound, no_maximum, not_converged. Every status but <see cref="Ok"/> comes with a
/// message saying what was found and what to try.
/// </summary>
public enum FitStatus
{
    /// <summary>Converged to an interior maximum of the likelihood.</summary>
    Ok,
    /// <summary>Too few tail points, or too few distinct tail values, for the fit to mean anything.</summary>
    TooFewPoints,
    /// <summary>Every count (in the tail) is the same value: there is no shape to fit.</summary>
    AllEqual,
    /// <summary>A parameter ended on a bound of its allowed range (e.g. a discrete Weibull β at its floor, the
    /// power-law α at its cap for the KS-chosen xmin): the value is a constrained maximum, not an estimate.</summary>
    AtBound,
    /// <summary>The likelihood has no maximum inside the allowed range: the power-law likelihood still rises at the α cap
    /// for every xmin considered (counts far too close together for their size).</summary>
    NoMaximum,
    /// <summary>The iteration did not converge.</summary>
    NotConverged,
}
