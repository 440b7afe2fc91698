namespace RankFreq.Sources;

/// <summary>Compression formats recognised by their magic bytes.</summary>
public enum CompressionKind
{
    /// <summary>Not compressed.</summary>
    None,
    /// <summary>gzip (RFC 1952), 1F 8B.</summary>
    Gzip,
    /// <summary>Zstandard (RFC 8878), 28 B5 2F FD.</summary>
    Zstd,
    /// <summary>bzip2, "BZh".</summary>
    Bzip2,
    /// <summary>xz, FD 37 7A 58 5A 00.</summary>
    Xz,
}
