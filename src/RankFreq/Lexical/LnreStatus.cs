namespace RankFreq.Lexical;

/// <summary>Outcome of an LNRE model fit.</summary>
public enum LnreStatus
{
    /// <summary>Fitted.</summary>
    Ok,
    /// <summary>The minimiser did not converge.</summary>
    NotConverged,
    /// <summary>Too few types or tokens to fit anything.</summary>
    TooFewTypes,
    /// <summary>Every type occurs once: the spectrum says nothing about how types repeat.</summary>
    AllHapax,
    /// <summary>No type occurs once: LNRE models describe samples with rare types, and this one has none.</summary>
    NoHapax,
    /// <summary>Fewer low spectrum elements with at least 5 types than the model has parameters.</summary>
    TooFewSpectrumElements,
    /// <summary>No parameter values reproduce the observed number of types.</summary>
    NoSolution,
    /// <summary>Not fitted: another model was asked for.</summary>
    Skipped,
}

/// <summary>The written form of an <see cref="LnreStatus"/>: snake_case in JSON, Parquet and the console.</summary>
public static class LnreStatusNames
{
    /// <summary>"ok", "not_converged", "too_few_types", "all_hapax", "no_hapax", "too_few_spectrum_elements",
    /// "no_solution", "skipped".</summary>
    public static string Of(LnreStatus s) => s switch
    {
        LnreStatus.Ok => "ok",
        LnreStatus.NotConverged => "not_converged",
        LnreStatus.TooFewTypes => "too_few_types",
        LnreStatus.AllHapax => "all_hapax",
        LnreStatus.NoHapax => "no_hapax",
        LnreStatus.TooFewSpectrumElements => "too_few_spectrum_elements",
        LnreStatus.Skipped => "skipped",
        _ => "no_solution",
    };
}
