namespace RankFreq.Fitting;

/// <summary>Progress of the bootstraps.</summary>
public readonly record struct FitProgress(string Stage, int Done, int Total);
