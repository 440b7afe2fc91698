using Microsoft.Extensions.FileSystemGlobbing;

namespace RankFreq.Sources;

/// <summary>One input file (or standard input) with what was learned from its first bytes.</summary>
/// <param name="Path">Path as given or found ("-" for standard input).</param>
/// <param name="Length">Stored size in bytes (0 for standard input).</param>
/// <param name="Compression">Compression detected from magic bytes.</param>
/// <param name="Format">Format chosen (never Auto).</param>
public sealed record InputFile(string Path, long Length, CompressionKind Compression, InputFormat Format)
{
    /// <summary>Whether this is standard input.</summary>
    public bool IsStdin => Path == "-";
    internal byte[]? StdinPeek { get; init; }
}
