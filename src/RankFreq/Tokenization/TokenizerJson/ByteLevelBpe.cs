namespace RankFreq.Tokenization;

/// <summary>
/// Byte-level BPE over UTF-8 bytes: each byte starts as its own symbol (the token of its byte-level character), then
/// the adjacent pair whose merge has the lowest rank is merged, the leftmost on ties, until no listed merge applies.
/// </summary>
/// <remarks>
/// This is the merge order of the reference tokenizers library (a priority queue keyed by (rank, position)); with
/// <c>ignore_merges</c> a chunk that is itself a vocabulary token is emitted whole first, as the reference does.
/// Cost O(n log n) per chunk of n bytes, paid once per distinct chunk thanks to the chunk cache. Checked id for id
/// against the reference on real tokenizer files (TokenizerJsonTests).
/// </remarks>
internal sealed class ByteLevelBpe
{
    private readonly int[] _byteId = new int[256];
    private readonly Dictionary<long, long> _merges; // (left id, right id) → (rank, merged id)
    private readonly Dictionary<string, int>? _whole; // ignore_merges: byte-level string → id
    private readonly char[] _alphabet = ByteLevelAlphabet.ByteToChar;

    /// <summary>Builds the merge table; null with a reason when some byte has no token.</summary>
    public static ByteLevelBpe? TryCreate(TokenizerJsonFile f, bool ignoreMerges, out string? reason)
    {
        var bpe = new ByteLevelBpe(f, ignoreMerges);
        for (int b = 0; b < 256; b++)
            if (!f.Vocab.TryGetValue(ByteLevelAlphabet.ByteToChar[b].ToString(), out bpe._byteId[b]))
            {
                reason = $"byte 0x{b:X2} has no token";
                return null;
            }
        reason = null;
        return bpe;
    }

    private ByteLevelBpe(TokenizerJsonFile f, bool ignoreMerges)
    {
        _merges = new Dictionary<long, long>(f.Merges.Count);
        for (int r = 0; r < f.Merges.Count; r++)
        {
            var (a, b, ab) = f.Merges[r];
            _merges[Key(a, b)] = ((long)r << 32) | (uint)ab; // a repeated pair: the last wins, as in the reference
        }
        if (ignoreMerges) _whole = f.Vocab;
    }

    // (a, b) times an odd constant: still one key per pair, and long.GetHashCode (low ^ high word) no longer collides
    // for every pair with the same a ^ b, which made the table's chains long
    private static long Key(int a, int b) => (long)((((ulong)(uint)a << 32) | (uint)b) * 0x9E3779B97F4A7C15UL);

    /// <summary>Appends the ids of one pre-tokenized chunk, given as UTF-8 bytes.</summary>
    public void Encode(ReadOnlySpan<byte> bytes, List<int> ids)
    {
        int n = bytes.Length;
        if (n == 0) return;
        if (n == 1) { ids.Add(_byteId[bytes[0]]); return; }
        if (_whole is not null)
        {
            Span<char> s = n <= 256 ? stackalloc char[n] : new char[n];
            for (int i = 0; i < n; i++) s[i] = _alphabet[bytes[i]];
            if (_whole.GetAlternateLookup<ReadOnlySpan<char>>().TryGetValue(s, out int whole)) { ids.Add(whole); return; }
        }
        var sym = new int[n];
        var next = new int[n];
        var prev = new int[n];
        for (int i = 0; i < n; i++) { sym[i] = _byteId[bytes[i]]; next[i] = i + 1; prev[i] = i - 1; }
        next[n - 1] = -1;
        var queue = new PriorityQueue<(int Pos, int Left, int Right), long>();
        void Offer(int pos)
        {
            if (pos < 0) return;
            int r = next[pos];
            if (r < 0) return;
            if (_merges.TryGetValue(Key(sym[pos], sym[r]), out long m))
                queue.Enqueue((pos, sym[pos], sym[r]), (m & ~0xFFFFFFFFL) | (uint)pos);
        }
        for (int i = 0; i < n - 1; i++) Offer(i);
        while (queue.TryDequeue(out var top, out _))
        {
            int pos = top.Pos, r = next[pos];
            // stale entries: either symbol changed since the pair was offered
            if (sym[pos] != top.Left || r < 0 || sym[r] != top.Right) continue;
            sym[pos] = (int)_merges[Key(top.Left, top.Right)];
            int rr = next[r];
            next[pos] = rr;
            if (rr >= 0) prev[rr] = pos;
            sym[r] = -1;
            Offer(prev[pos]);
            Offer(pos);
        }
        for (int i = 0; i >= 0; i = next[i]) ids.Add(sym[i]);
    }
}

/// <summary>The byte-level alphabet: every byte as a printable character (printable Latin-1 bytes as themselves, the rest from U+0100 on).</summary>
internal static class ByteLevelAlphabet
{
    /// <summary>Byte → character.</summary>
    public static readonly char[] ByteToChar = Build();

    private static char[] Build()
    {
        var map = new char[256];
        int n = 0;
        for (int b = 0; b < 256; b++)
        {
            bool printable = b is >= 33 and <= 126 or >= 161 and <= 172 or >= 174 and <= 255;
            map[b] = printable ? (char)b : (char)(256 + n++);
        }
        return map;
    }

    private static readonly short[] CharToByte = BuildReverse();

    private static short[] BuildReverse()
    {
        var r = new short[512];
        Array.Fill(r, (short)-1);
        for (int b = 0; b < 256; b++) r[ByteToChar[b]] = (short)b;
        return r;
    }

    /// <summary>The bytes a byte-level token string stands for, or null when it uses characters outside the alphabet.</summary>
    public static byte[]? ToBytes(string token)
    {
        var bytes = new byte[token.Length];
        for (int i = 0; i < token.Length; i++)
        {
            int b = token[i] < 512 ? CharToByte[token[i]] : -1;
            if (b < 0) return null;
            bytes[i] = (byte)b;
        }
        return bytes;
    }
}
