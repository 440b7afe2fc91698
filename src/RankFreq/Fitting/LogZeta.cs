namespace RankFreq.Fitting;

/// <summary>ln ζ(s, q) with the ratios ζ'/ζ and ζ''/ζ (derivatives in s; the ratios are 0 unless requested).</summary>
public readonly record struct LogZeta(double Ln, double R1, double R2);
