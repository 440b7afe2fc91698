using RankFreq.Tokenization;

namespace RankFreq.Benchmarks;

/// <summary>Feeds a text to a tokenizer session in 1 MiB blocks, as the counting engine's readers do.</summary>
internal static class Blocks
{
    public const int Size = 1 << 20;

    public static void Feed(ITokenizerSession session, byte[] text)
    {
        for (int i = 0; i < text.Length; i += Size) session.Feed(text.AsSpan(i, Math.Min(Size, text.Length - i)), false);
        session.Feed([], true);
    }
}
