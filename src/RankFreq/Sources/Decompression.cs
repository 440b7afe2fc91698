using System.IO.Compression;
using SharpCompress.Compressors;
using SharpCompress.Compressors.BZip2;
using SharpCompress.Compressors.Xz;
using ZstdSharp;

namespace RankFreq.Sources;

/// <summary>Detects compression by content and opens a decompressing stream.</summary>
public static class Decompression
{
    /// <summary>Recognises a compression format from the first bytes of a stream.</summary>
    public static CompressionKind Detect(ReadOnlySpan<byte> head)
    {
        if (head.Length >= 2 && head[0] == 0x1F && head[1] == 0x8B) return CompressionKind.Gzip;
        if (head.Length >= 4 && head[0] == 0x28 && head[1] == 0xB5 && head[2] == 0x2F && head[3] == 0xFD) return CompressionKind.Zstd;
        if (head.Length >= 4 && head.StartsWith("BZh"u8) && head[3] is >= (byte)'1' and <= (byte)'9') return CompressionKind.Bzip2;
        if (head.StartsWith((ReadOnlySpan<byte>)[0xFD, 0x37, 0x7A, 0x58, 0x5A, 0x00])) return CompressionKind.Xz;
        return CompressionKind.None;
    }

    /// <summary>Wraps <paramref name="raw"/> in the decompressor for <paramref name="kind"/>; its faults surface as
    /// <see cref="DecoderFaultException"/>.</summary>
    public static Stream Open(Stream raw, CompressionKind kind) => Open(raw, kind, peek: false);

    /// <summary>As <see cref="Open(Stream, CompressionKind)"/>; with <paramref name="peek"/>, <paramref name="raw"/> holds
    /// only the first bytes of a file, so a decoder that reads a whole block as it starts (bzip2) accepts the cut.</summary>
    /// <remarks>Some decoders read and check data when they are created (bzip2 decodes its first block): a fault there
    /// is a <see cref="DecoderFaultException"/> too.</remarks>
    internal static Stream Open(Stream raw, CompressionKind kind, bool peek)
    {
        try
        {
            return kind switch
            {
                CompressionKind.None => raw,
                CompressionKind.Gzip => new DecoderGuardStream(new GZipStream(raw, System.IO.Compression.CompressionMode.Decompress)),
                CompressionKind.Zstd => new DecoderGuardStream(new DecompressionStream(raw)),
                CompressionKind.Bzip2 => new DecoderGuardStream(BZip2Stream.Create(raw, SharpCompress.Compressors.CompressionMode.Decompress,
                    decompressConcatenated: true, leaveOpen: false, tolerateTruncatedStream: peek)),
                CompressionKind.Xz => new DecoderGuardStream(new XZStream(raw)),
                _ => raw,
            };
        }
        catch (Exception e) when (e is not OperationCanceledException and not DecoderFaultException)
        {
            throw new DecoderFaultException(e);
        }
    }

    /// <summary>File name extensions that mark compression, stripped before guessing the format.</summary>
    public static string StripExtension(string name)
    {
        foreach (var ext in new[] { ".gz", ".zst", ".zstd", ".bz2", ".xz" })
            if (name.EndsWith(ext, StringComparison.OrdinalIgnoreCase)) return name[..^ext.Length];
        return name;
    }
}
