using BenchmarkDotNet.Configs;

namespace RankFreq.Benchmarks;

/// <summary>Configuration of the benchmarks that read the file named by <see cref="BenchInput.Variable"/>.</summary>
public sealed class InputFileConfig : ManualConfig
{
    public InputFileConfig() => AddValidator(InputFileValidator.Instance);
}
