using System.Buffers.Binary;
using System.Text;
using ZstdSharp;

namespace RankFreq.Storage;

/// <summary>A column of a flat table: strings may be nullable; numbers are required. <paramref name="Delta"/>: a 64-bit
/// column written DELTA_BINARY_PACKED (for sorted columns; see <see cref="DeltaBinaryPacked"/>), else PLAIN.</summary>
internal sealed record FlatColumn(string Name, FlatType Type, bool Nullable = false, bool Delta = false);
