using System.IO.Hashing;
using System.Numerics;
using System.Runtime.InteropServices;
using System.Text;
using System.Text.Json;

namespace RankFreq.Tokenization;

/// <summary>
/// A tokenizer.json vocabulary keyed by the tokens' UTF-8 bytes: one byte arena, entries in insertion order and an
/// open-addressing table of (64-bit hash, entry) slots.
/// </summary>
/// <remarks>
/// Why not <c>Dictionary&lt;string, int&gt;</c>: resolving 280,000 merges of a large file takes three lookups each,
/// and through the dictionary's span lookup those cost ~270 ns apiece (a chain walk and a string compare, each a cache
/// miss), most of a file's load time (measured with perf on the Llama 3 file, native build). Here a lookup reads one
/// slot whose full hash rejects every other key and which holds the id, then compares the bytes once in the arena. No string is made
/// per entry; <see cref="Text"/> makes one on demand. A repeated key keeps its last id, as a JSON object read into a
/// dictionary does.
/// </remarks>
internal sealed class Utf8Vocabulary
{
    // everything a lookup needs sits in the slot, so a hit reads the slot and the key's bytes: two cache lines
    private struct Slot
    {
        public ulong Hash;
        public int Start;
        public int Length;
        public int Id;
        public int Entry; // entry index + 1; 0 = empty
    }

    private byte[] _arena;
    private int _used;
    private int[] _start;
    private int[] _length;
    private int[] _id;
    private int _count;
    private Slot[] _slots;
    private int _mask;

    /// <summary>An empty vocabulary sized for about <paramref name="capacity"/> entries.</summary>
    public Utf8Vocabulary(int capacity = 1024)
    {
        capacity = Math.Max(capacity, 16);
        _arena = new byte[capacity * 8];
        _start = new int[capacity];
        _length = new int[capacity];
        _id = new int[capacity];
        int slots = (int)Math.Min(1L << 30, (long)BitOperations.RoundUpToPowerOf2((uint)capacity) * 2);
        _slots = new Slot[slots];
        _mask = slots - 1;
    }

    /// <summary>Number of distinct keys.</summary>
    public int Count => _count;

    /// <summary>The UTF-8 bytes of entry <paramref name="entry"/> (0 ≤ entry &lt; <see cref="Count"/>).</summary>
    public ReadOnlySpan<byte> Key(int entry) => _arena.AsSpan(_start[entry], _length[entry]);

    /// <summary>The id of entry <paramref name="entry"/>.</summary>
    public int Id(int entry) => _id[entry];

    /// <summary>The token of entry <paramref name="entry"/> as a string.</summary>
    public string Text(int entry) => Encoding.UTF8.GetString(Key(entry));

    /// <summary>Sets the id of <paramref name="key"/>, replacing an earlier one.</summary>
    public void Set(ReadOnlySpan<byte> key, int id) => Put(key, id, replace: true);

    /// <summary>Adds <paramref name="key"/> unless present (an earlier id is kept).</summary>
    public void TryAdd(ReadOnlySpan<byte> key, int id) => Put(key, id, replace: false);

    private void Put(ReadOnlySpan<byte> key, int id, bool replace)
    {
        ulong h = XxHash3.HashToUInt64(key);
        int i = (int)h & _mask;
        while (true)
        {
            ref var s = ref _slots[i];
            if (s.Entry == 0) break;
            if (s.Hash == h && key.SequenceEqual(_arena.AsSpan(s.Start, s.Length)))
            {
                if (replace) _id[s.Entry - 1] = s.Id = id;
                return;
            }
            i = (i + 1) & _mask;
        }
        if (_count == _start.Length) GrowEntries();
        if (_used + key.Length > _arena.Length) Array.Resize(ref _arena, Math.Max(_arena.Length * 2, _used + key.Length));
        key.CopyTo(_arena.AsSpan(_used));
        _start[_count] = _used;
        _length[_count] = key.Length;
        _id[_count] = id;
        _used += key.Length;
        _count++;
        _slots[i] = new Slot { Hash = h, Start = _used - key.Length, Length = key.Length, Id = id, Entry = _count };
        if (_count * 2 > _slots.Length) GrowSlots();
    }

    /// <summary>The id of <paramref name="key"/>, if present.</summary>
    public bool TryGet(ReadOnlySpan<byte> key, out int id)
    {
        ulong h = XxHash3.HashToUInt64(key);
        int i = (int)h & _mask;
        while (true)
        {
            ref var s = ref _slots[i];
            if (s.Entry == 0) { id = -1; return false; }
            if (s.Hash == h && key.SequenceEqual(_arena.AsSpan(s.Start, s.Length))) { id = s.Id; return true; }
            i = (i + 1) & _mask;
        }
    }

    /// <summary>The id of <paramref name="key"/> given as UTF-16 text, if present.</summary>
    public bool TryGet(ReadOnlySpan<char> key, out int id)
    {
        int max = Encoding.UTF8.GetMaxByteCount(key.Length);
        Span<byte> buf = max <= 512 ? stackalloc byte[max] : new byte[max];
        return TryGet(buf[..Encoding.UTF8.GetBytes(key, buf)], out id);
    }

    /// <summary>Whether any key satisfies <paramref name="test"/> (keys as text; for rare, whole-vocabulary checks).</summary>
    public bool Any(Func<string, bool> test)
    {
        for (int e = 0; e < _count; e++)
            if (test(Text(e))) return true;
        return false;
    }

    /// <summary>The largest id, or -1 when empty.</summary>
    public int MaxId()
    {
        int max = -1;
        for (int e = 0; e < _count; e++) max = Math.Max(max, _id[e]);
        return max;
    }

    private void GrowEntries()
    {
        int n = _start.Length * 2;
        Array.Resize(ref _start, n);
        Array.Resize(ref _length, n);
        Array.Resize(ref _id, n);
    }

    private void GrowSlots()
    {
        var old = _slots;
        _slots = new Slot[old.Length * 2];
        _mask = _slots.Length - 1;
        foreach (var s in old)
        {
            if (s.Entry == 0) continue;
            int i = (int)s.Hash & _mask;
            while (_slots[i].Entry != 0) i = (i + 1) & _mask;
            _slots[i] = s;
        }
    }

    /// <summary>The unescaped UTF-8 bytes of a JSON string element (no copy when the file wrote it without escapes).
    /// </summary>
    public static ReadOnlySpan<byte> StringBytes(JsonElement e)
    {
        var raw = JsonMarshal.GetRawUtf8Value(e);
        if (raw.Length >= 2 && raw[0] == (byte)'"') raw = raw[1..^1];
        return raw.IndexOf((byte)'\\') < 0 ? raw : Encoding.UTF8.GetBytes(e.GetString()!);
    }

    /// <summary>The unescaped UTF-8 bytes of a JSON property's name.</summary>
    public static ReadOnlySpan<byte> NameBytes(JsonProperty p)
    {
        var raw = JsonMarshal.GetRawUtf8PropertyName(p);
        if (raw.Length >= 2 && raw[0] == (byte)'"') raw = raw[1..^1];
        return raw.IndexOf((byte)'\\') < 0 ? raw : Encoding.UTF8.GetBytes(p.Name);
    }
}
