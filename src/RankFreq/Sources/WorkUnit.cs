using Microsoft.Extensions.FileSystemGlobbing;

namespace RankFreq.Sources;

/// <summary>A part of the work: a whole file, or a byte range of a plain uncompressed text file.</summary>
/// <param name="Index">Position in corpus order (files in sorted path order, ranges in file order).</param>
/// <param name="File">The input.</param>
/// <param name="Start">First byte of the range.</param>
/// <param name="End">End of the range (exclusive), or -1 for the whole file.</param>
public sealed record WorkUnit(int Index, InputFile File, long Start, long End);
