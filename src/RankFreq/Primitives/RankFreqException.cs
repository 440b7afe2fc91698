namespace RankFreq.Primitives;

/// <summary>
/// The base of every error that bad input, a bad setting or the environment (disk, memory) can cause: its message
/// names the file and place where there is one and says what to do. Anything else that escapes the library is a bug.
/// </summary>
public abstract class RankFreqException(string message, Exception? inner = null) : Exception(message, inner)
{
    /// <summary>The file the error is about, where there is one.</summary>
    public string? File { get; init; }

    /// <summary>The 1-based line in <see cref="File"/>, where known.</summary>
    public long? Line { get; init; }

    /// <summary>The byte offset in <see cref="File"/>, where known and no line is.</summary>
    public long? Offset { get; init; }

    /// <summary>The settings property (e.g. <c>MaxRecordBytes</c>) whose change would help, if any; front ends name
    /// their own option for it, so library messages never name command-line flags.</summary>
    public string? Setting { get; init; }
}
