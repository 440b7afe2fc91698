using System.Buffers.Binary;
using System.Text;
using ZstdSharp;

namespace RankFreq.Storage;

/// <summary>A column of a flat table: strings may be nullable; numbers are required.</summary>
internal sealed record FlatColumn(string Name, FlatType Type, bool Nullable = false);
