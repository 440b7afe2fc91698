using System.CommandLine;
using System.Globalization;
using RankFreq.Counting;
using RankFreq.Sources;
using RankFreq.Storage;
using RankFreq.Tokenization;

namespace RankFreq.Cli;

/// <summary>A usage error found after parsing (exit code 2).</summary>
internal sealed class UsageException(string message) : Exception(message);
