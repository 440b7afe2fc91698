using BenchmarkDotNet.Running;
using RankFreq.Benchmarks;

// Usage (see benchmarks/README.md):
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- --list flat          the benchmarks
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- --filter '*Kernels*' run some (BenchmarkDotNet)
//   RANKFREQ_BENCH_INPUT=FILE ... -- --filter '*WordsOverFile*'   benchmarks over a user-given text
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- tools make-spectrum FILE   not a benchmark
if (args is ["tools", .. var rest]) return BenchmarkTools.Run(rest);
BenchmarkSwitcher.FromAssembly(typeof(Kernels).Assembly).Run(args);
return 0;
