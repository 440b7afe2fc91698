using BenchmarkDotNet.Running;
using RankFreq.Benchmarks;

// Usage (see benchmarks/README.md):
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- --list flat          the benchmarks
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- --filter '*Kernels*' run some (BenchmarkDotNet)
//   RANKFREQ_BENCH_INPUT=FILE ... -- --filter '*WordsOverFile*'   benchmarks over a user-given text
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- tools make-spectrum FILE   not a benchmark
//   ... -- zipf-spectrum TOKENS FILE [s] [seed]   Zipf-like spectrum (value,types lines); flat-spectrum K FILE [seed]
//   ... -- xmin-search FILE [full]   α fits alone, pruned xmin search (and the full reference scan), one run
//   ... -- tail-spectrum CORPUS OUT   words-tokenizer tail spectrum at the chosen xmin (alternatives reference input)
//   ... -- replicate-timing FILE N   CPU time of N bootstrap replicates: drawing vs xmin search
//   ... -- duckdb-recipe merge|spectrum|spectrum-direct OUT INPUT...   one step of docs/scale-out.md on DuckDB
//   ... -- search-profile FILE N   the xmin search of N replicates: whole, α fits alone, KS distances alone
//   ... -- alternatives-profile FILE   CPU time of each alternative family's fit on the KS-chosen tail
if (args is ["tools", .. var rest]) return BenchmarkTools.Run(rest);
if (args.Length > 2 && args[0] is "zipf-spectrum" or "flat-spectrum") { ZipfSpectrum.Run(args); return 0; }
if (args.Length > 1 && args[0] == "xmin-search") { XminSearchTiming.Run(args[1], args.Length > 2 && args[2] == "full"); return 0; }
if (args.Length > 2 && args[0] == "tail-spectrum") { TailSpectrum.Run(args[1], args[2]); return 0; }
if (args.Length > 2 && args[0] == "search-profile") { SearchProfile.Run(args[1], int.Parse(args[2])); return 0; }
if (args.Length > 2 && args[0] == "replicate-timing") { ReplicateTiming.Run(args[1], int.Parse(args[2])); return 0; }
if (args.Length > 3 && args[0] == "replicate-loop")
{
    ReplicateLoop.Run(args[1], int.Parse(args[2]), args[3], args.Length > 4 ? int.Parse(args[4]) : 2);
    return 0;
}
if (args.Length > 1 && args[0] == "alternatives-profile") { AlternativesProfile.Run(args[1]); return 0; }
if (args.Length > 0 && args[0] == "duckdb-recipe") return DuckDbRecipe.Run(args[1..]);
BenchmarkSwitcher.FromAssembly(typeof(Kernels).Assembly).Run(args);
return 0;
