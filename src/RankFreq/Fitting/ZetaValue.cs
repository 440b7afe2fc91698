namespace RankFreq.Fitting;

/// <summary>Value of ζ(s, q) with its first two derivatives in s.</summary>
public readonly record struct ZetaValue(double Value, double D1, double D2);
