namespace RankFreq.Sources;

/// <summary>Receives decoded text from a source: valid UTF-8, in blocks that never end inside a character.</summary>
public interface ITextSink
{
    /// <summary>A block of text; <paramref name="endOfDocument"/> marks the end of a file, record or cell.</summary>
    void Write(ReadOnlySpan<byte> utf8, bool endOfDocument);
}
