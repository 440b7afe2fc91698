using RankFreq.Primitives;
using System.Runtime.CompilerServices;
using System.Buffers;
using System.Text;
using System.Text.Unicode;

namespace RankFreq.Sources;

/// <summary>
/// Passes valid UTF-8 through and replaces each maximal invalid subsequence with U+FFFD (the W3C/WHATWG
/// "replacement per maximal subpart" practice that .NET's decoder also follows), holding back a sequence
/// cut by a block edge until the next block completes it.
/// </summary>
internal sealed class Utf8Sanitizer(ITextSink sink)
{
    private readonly HoldBack<byte> _held = new();
    private bool _atStart = true;

    /// <summary>Bytes replaced so far.</summary>
    public long ReplacedBytes { get; private set; }

    /// <summary>Feeds raw bytes; <paramref name="final"/> ends the document (a dangling partial sequence is replaced).</summary>
    public void Write(ReadOnlySpan<byte> data, bool final)
        => Process(_held.Join(data), final);

    /// <summary>Call at the start of each new file so a byte-order mark there is skipped.</summary>
    public void Reset() { _atStart = true; _held.Clear(); }

    private void Process(ReadOnlySpan<byte> s, bool final)
    {
        if (_atStart)
        {
            if (s.Length < 3 && !final && s.Length > 0 && s[0] == 0xEF) { Hold(s); return; }
            if (s.StartsWith((ReadOnlySpan<byte>)[0xEF, 0xBB, 0xBF])) s = s[3..];
            if (s.Length > 0 || final) _atStart = false;
        }
        int tail = final ? 0 : IncompleteTail(s);
        var body = s[..^tail];
        if (Utf8.IsValid(body)) sink.Write(body, final && tail == 0);
        else WriteRepaired(body, final && tail == 0);
        if (tail > 0) Hold(s[^tail..]);
    }

    private void Hold(ReadOnlySpan<byte> b) => _held.Hold(b);

    /// <summary>Length of a trailing lead byte plus continuation bytes that could still become a valid sequence.</summary>
    private static int IncompleteTail(ReadOnlySpan<byte> s)
    {
        int n = s.Length;
        for (int k = 1; k <= Math.Min(3, n); k++)
        {
            byte b = s[n - k];
            if ((b & 0xC0) == 0x80) continue; // continuation byte
            int len = b >= 0xF0 ? 4 : b >= 0xE0 ? 3 : b >= 0xC0 ? 2 : 1;
            return len > k ? k : 0;
        }
        return 0;
    }

    private void WriteRepaired(ReadOnlySpan<byte> s, bool final)
    {
        var outBuf = ArrayPool<byte>.Shared.Rent(s.Length * 3 + 16);
        try
        {
            int o = 0, i = 0;
            while (i < s.Length)
            {
                var st = Rune.DecodeFromUtf8(s[i..], out _, out int len);
                if (st == OperationStatus.Done) { s.Slice(i, len).CopyTo(outBuf.AsSpan(o)); o += len; }
                else
                {
                    outBuf[o++] = 0xEF; outBuf[o++] = 0xBF; outBuf[o++] = 0xBD;
                    ReplacedBytes += len;
                }
                i += len;
            }
            sink.Write(outBuf.AsSpan(0, o), final);
        }
        finally { ArrayPool<byte>.Shared.Return(outBuf); }
    }
}
