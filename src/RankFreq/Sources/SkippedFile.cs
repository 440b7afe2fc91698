using Microsoft.Extensions.FileSystemGlobbing;

namespace RankFreq.Sources;

/// <summary>A file skipped with the reason.</summary>
public sealed record SkippedFile(string Path, string Reason);
