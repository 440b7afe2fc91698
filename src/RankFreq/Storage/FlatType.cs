using System.Buffers.Binary;
using System.Text;
using ZstdSharp;

namespace RankFreq.Storage;

/// <summary>Physical type of a column of a flat table.</summary>
internal enum FlatType { Int32 = 1, Int64 = 2, String = 6 }
