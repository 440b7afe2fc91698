namespace RankFreq.Tokenization;

/// <summary>
/// A token of 1 to 16 UTF-8 bytes: <see cref="Lo"/> holds bytes 0–7 and <see cref="Hi"/> bytes 8–15, little-endian,
/// zero past <see cref="Length"/>.
/// </summary>
/// <param name="Lo">Bytes 0–7.</param>
/// <param name="Hi">Bytes 8–15.</param>
/// <param name="Length">Length in bytes (1–16).</param>
public readonly record struct PackedToken(ulong Lo, ulong Hi, int Length);
