using System.Diagnostics;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Running;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Tokenization;
using RankFreq.Jobs;

// Usage:
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- replicate   spectrum-level vs per-type replicate, one run
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- make-spectrum FILE   10^6 types, α = 2, xmin = 1
//   dotnet run -c Release --project benchmarks/RankFreq.Benchmarks -- bdn [filters]  BenchmarkDotNet kernels
//   ... -- zipf-spectrum TOKENS FILE [s] [seed]   Zipf-like spectrum (value,types lines); flat-spectrum K FILE [seed]
//   ... -- xmin-search FILE [full]   α fits alone, pruned xmin search (and the full reference scan), one run
//   ... -- tail-spectrum CORPUS OUT   words-tokenizer tail spectrum at the chosen xmin (input of the alternatives reference)
//   ... -- replicate-timing FILE N   CPU time of N bootstrap replicates: drawing vs xmin search
//   ... -- words-kernel FILE       words tokenizer alone and with the table, one thread, best of seven
//   ... -- count-phases FILE       whole counting run in process, then the Parquet write, twice
//   ... -- stages FILE / subword-stages FILE   where counting time goes, by stage
//   ... -- encode-whole FILE       the o200k_base baseline: the library's EncodeToIds over the whole text
//   ... -- load-vocab              stages of loading o200k_base
//   ... -- write-cold N flat|zstd|snappy|none [x]   one count-table-shaped file written in a fresh process
if (args.Length > 2 && args[0] is "zipf-spectrum" or "flat-spectrum") { ZipfSpectrum.Run(args); return; }
if (args.Length > 1 && args[0] == "xmin-search") { XminSearchTiming.Run(args[1], args.Length > 2 && args[2] == "full"); return; }
if (args.Length > 2 && args[0] == "tail-spectrum") { TailSpectrum.Run(args[1], args[2]); return; }
if (args.Length > 2 && args[0] == "replicate-timing") { ReplicateTiming.Run(args[1], int.Parse(args[2])); return; }
if (args.Length > 0 && args[0] == "replicate") { ReplicateComparison.Run(); return; }
if (args.Length > 1 && args[0] == "words-kernel")
{
    // the words tokenizer alone and with the table, one thread, 1 MiB blocks; best of seven rounds (noisy machines)
    var bytes = File.ReadAllBytes(args[1]);
    double bestTok = double.MaxValue, bestAll = double.MaxValue;
    long tokens = 0; int types = 0;
    for (int round = 0; round < 7; round++)
    {
        var sw = Stopwatch.StartNew();
        var ns = new NullSink();
        var sess = new WordTokenizer(false).CreateSession(ns);
        for (int i = 0; i < bytes.Length; i += 1 << 20) sess.Feed(bytes.AsSpan(i, Math.Min(1 << 20, bytes.Length - i)), false);
        sess.Feed([], true);
        bestTok = Math.Min(bestTok, sw.Elapsed.TotalSeconds);
        sw.Restart();
        var table = new TokenTable();
        var sess2 = new WordTokenizer(false).CreateSession(new TableOnly(table));
        for (int i = 0; i < bytes.Length; i += 1 << 20) sess2.Feed(bytes.AsSpan(i, Math.Min(1 << 20, bytes.Length - i)), false);
        sess2.Feed([], true);
        bestAll = Math.Min(bestAll, sw.Elapsed.TotalSeconds);
        tokens = ns.N; types = table.Count;
    }
    Console.WriteLine($"best of 7: tokenize {bestTok:F3} s ({tokens:N0} tokens); tokenize + table {bestAll:F3} s ({types:N0} types)");
    return;
}
if (args.Length > 2 && args[0] == "write-cold")
{
    // a cold process writing one count-table-shaped file with Parquet.Net: how much is first-use cost
    int rows = int.Parse(args[1]);
    var tokens = Enumerable.Range(0, rows).Select(i => (string?)("tok" + i)).ToArray();
    var counts = Enumerable.Range(0, rows).Select(i => (long)(rows - i)).ToArray();
    var sw = Stopwatch.StartNew();
    if (args[2] == "flat")
    {
        // the count-table writer, same rows
        using (var fs = File.Create(Path.Combine(Path.GetTempPath(), "write-cold.parquet")))
        using (var fw = new RankFreq.Storage.FlatParquetWriter(fs, [new("token", RankFreq.Storage.FlatType.String, true), new("count", RankFreq.Storage.FlatType.Int64), new("rank", RankFreq.Storage.FlatType.Int64)]))
        {
            fw.WriteRowGroup(rows, [tokens, counts, counts]);
            fw.Finish();
        }
        Console.WriteLine($"{rows} rows, flat writer (zstd 1): {sw.Elapsed.TotalSeconds:F3} s");
        return;
    }
    var tf = new Parquet.Schema.DataField<string>("token", true);
    var cf = new Parquet.Schema.DataField<long>("count");
    var rf = new Parquet.Schema.DataField<long>("rank");
    var opts = new Parquet.ParquetOptions { CompressionMethod = args[2] == "snappy" ? Parquet.CompressionMethod.Snappy : args[2] == "none" ? Parquet.CompressionMethod.None : Parquet.CompressionMethod.Zstd,
        CompressionLevel = System.IO.Compression.CompressionLevel.Optimal, DictionaryEncodingThreshold = args.Length < 4 ? 0.8 : 0 };
    using (var fs = File.Create(Path.Combine(Path.GetTempPath(), "write-cold.parquet")))
    {
        var w = Parquet.ParquetWriter.CreateAsync(new Parquet.Schema.ParquetSchema(tf, cf, rf), fs, opts).GetAwaiter().GetResult();
        using (var rg = w.CreateRowGroup())
        {
            rg.WriteAsync(tf, tokens).GetAwaiter().GetResult();
            rg.WriteAsync<long>(cf, counts).GetAwaiter().GetResult();
            rg.WriteAsync<long>(rf, counts).GetAwaiter().GetResult();
        }
        w.DisposeAsync().AsTask().GetAwaiter().GetResult();
    }
    Console.WriteLine($"{rows} rows, {args[2]}{(args.Length < 4 ? "" : " no-dict")}: {sw.Elapsed.TotalSeconds:F3} s");
    return;
}
if (args.Length > 0 && args[0] == "load-vocab")
{
    // the stages of loading o200k_base from the embedded data, cold process
    var sw = Stopwatch.StartNew();
    var data = System.Reflection.Assembly.Load("Microsoft.ML.Tokenizers.Data.O200kBase");
    string res = data.GetManifestResourceNames().First(n => n.EndsWith("o200k_base.tiktoken.deflate", StringComparison.Ordinal));
    var raw = new MemoryStream();
    using (var s0 = data.GetManifestResourceStream(res)!)
    using (var inflate = new System.IO.Compression.DeflateStream(s0, System.IO.Compression.CompressionMode.Decompress)) inflate.CopyTo(raw);
    double tInflate = sw.Elapsed.TotalSeconds; sw.Restart();
    var b64 = SubwordTokenizer.ParseTiktokenBase64(raw.ToArray());
    double tParse = sw.Elapsed.TotalSeconds; sw.Restart();
    raw.Position = 0;
    var tok = Microsoft.ML.Tokenizers.TiktokenTokenizer.Create(raw, null, normalizer: null, specialTokens: null);
    double tCreate = sw.Elapsed.TotalSeconds; sw.Restart();
    var ids = tok.EncodeToIds("hello world", false, false);
    Console.WriteLine($"inflate {tInflate:F3} s; our base64 parse {tParse:F3} s ({b64.Length:N0}); TiktokenTokenizer.Create {tCreate:F3} s; first encode {sw.Elapsed.TotalSeconds:F3} s");
    return;
}
if (args.Length > 1 && args[0] == "count-phases")
{
    // where a whole `count` goes, in process: counting (2 threads), then the Parquet write, twice each
    for (int round = 0; round < 2; round++)
    {
        var sw = Stopwatch.StartNew();
        using var res = CountJob.Count([args[1]], new CountSettings(Threads: 2));
        double tCount = sw.Elapsed.TotalSeconds;
        sw.Restart();
        string outPath = Path.Combine(Path.GetTempPath(), $"phases-{Environment.ProcessId}.parquet");
        RankFreq.Storage.CountTableFile.WriteAsync(outPath, res.Rows, res.HasTokenIds, RankFreq.Storage.CountTableMetadata.From(res.Summary, 0)).GetAwaiter().GetResult();
        Console.WriteLine($"round {round}: count {tCount:F3} s ({res.Summary.Types:N0} types); write {sw.Elapsed.TotalSeconds:F3} s");
        File.Delete(outPath);
    }
    return;
}
if (args.Length > 1 && args[0] == "encode-whole")
{
    // the baseline for the chunk cache: the library's own o200k_base tokenizer, EncodeToIds over the whole text
    // (timed in process: vocabulary loading and file reading excluded)
    var tok = Microsoft.ML.Tokenizers.TiktokenTokenizer.CreateForEncoding("o200k_base");
    var text = File.ReadAllText(args[1]);
    var sw0 = Stopwatch.StartNew();
    long total = tok.EncodeToIds(text).Count;
    Console.WriteLine($"o200k_base EncodeToIds over the whole text: {sw0.Elapsed.TotalSeconds:F2} s, {total:N0} tokens");
    return;
}
if (args.Length > 1 && args[0] == "subword-stages")
{
    var tok = SubwordTokenizer.Tiktoken("o200k_base");
    var text = File.ReadAllText(args[1]);
    text = text[..Math.Min(text.Length, 20_000_000)];
    var pre = tok.Encoder.PreTokenizer!;
    for (int round = 0; round < 2; round++)
    {
        var sw3 = Stopwatch.StartNew();
        long chunks = 0;
        for (int off = 0; off < text.Length; off += 1 << 20)
        {
            var part = text.Substring(off, Math.Min(1 << 20, text.Length - off));
            foreach (var _ in pre.PreTokenize(part)) chunks++;
        }
        double tPre = sw3.Elapsed.TotalSeconds;
        sw3.Restart();
        long fast = 0; int pp = 0;
        while (pp < text.Length) { int e = O200kSplitter.Match(text, pp); if (e <= pp) { pp++; continue; } fast++; pp = e; }
        Console.WriteLine($"hand-written split {sw3.Elapsed.TotalSeconds:F2} s ({fast:N0} chunks)");
        sw3.Restart();
        var ns = new NullSink();
        var sess = tok.CreateSession(ns);
        var b = System.Text.Encoding.UTF8.GetBytes(text);
        sess.Feed(b, true);
        double tAll = sw3.Elapsed.TotalSeconds;
        sw3.Restart();
        long whole = tok.EncodeWhole(text).Count;
        Console.WriteLine($"20 MB: pre-tokenize {tPre:F2} s ({chunks:N0} chunks); session {tAll:F2} s; EncodeToIds {sw3.Elapsed.TotalSeconds:F2} s ({whole:N0} ids)");
    }
    return;
}
if (args.Length > 1 && args[0] == "stages")
{
    // where counting time goes, one thread, whole file in memory
    var bytes = File.ReadAllBytes(args[1]);
    for (int round = 0; round < 2; round++)
    {
        var sw1 = Stopwatch.StartNew();
        bool valid = System.Text.Unicode.Utf8.IsValid(bytes);
        double tValid = sw1.Elapsed.TotalSeconds;
        sw1.Restart();
        var nullSink = new NullSink();
        var sess = new WordTokenizer(false).CreateSession(nullSink);
        for (int i = 0; i < bytes.Length; i += 1 << 20) sess.Feed(bytes.AsSpan(i, Math.Min(1 << 20, bytes.Length - i)), false);
        sess.Feed([], true);
        double tTok = sw1.Elapsed.TotalSeconds;
        sw1.Restart();
        var table = new TokenTable();
        var ts = new TableOnly(table);
        var sess2 = new WordTokenizer(false).CreateSession(ts);
        for (int i = 0; i < bytes.Length; i += 1 << 20) sess2.Feed(bytes.AsSpan(i, Math.Min(1 << 20, bytes.Length - i)), false);
        sess2.Feed([], true);
        double tAll = sw1.Elapsed.TotalSeconds;
        sw1.Restart();
        var az = System.Buffers.SearchValues.Create("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789"u8);
        long cnt = 0; int p0 = 0; ReadOnlySpan<byte> all = bytes;
        while (true)
        {
            int k = all[p0..].IndexOfAny(az); if (k < 0) break; p0 += k;
            int e = all[p0..].IndexOfAnyExcept(az); cnt++; if (e < 0) break; p0 += e;
        }
        {
            var sw2 = Stopwatch.StartNew();
            var ns = new NullSink();
            var sk = new WordTokenizer(true).CreateSession(ns);
            for (int i = 0; i < bytes.Length; i += 1 << 20) sk.Feed(bytes.AsSpan(i, Math.Min(1 << 20, bytes.Length - i)), false);
            sk.Feed([], true);
            Console.WriteLine($"keep-case tokenize only {sw2.Elapsed.TotalSeconds:F3} s");
            sw2.Restart();
            var sk2 = new WordTokenizer(true).CreateSession(ns);
            sk2.Feed(bytes, true);
            Console.WriteLine($"keep-case one block {sw2.Elapsed.TotalSeconds:F3} s");
        }
        Console.WriteLine($"bare scan {sw1.Elapsed.TotalSeconds:F3} s, {cnt:N0} runs");
        Console.WriteLine($"valid={valid} utf8 check {tValid:F3} s; tokenize only {tTok:F3} s ({nullSink.N:N0} tokens); tokenize+table {tAll:F3} s ({table.Count:N0} types)");
    }
    return;
}
if (args.Length > 1 && args[0] == "make-spectrum") { ReplicateComparison.WriteSpectrum(args[1]); return; }
BenchmarkSwitcher.FromAssembly(typeof(Kernels).Assembly).Run(args.Skip(1).ToArray());

/// <summary>Kernels timed by BenchmarkDotNet.</summary>
[ShortRunJob]
[MemoryDiagnoser]
public class Kernels
{
    private byte[] _text = [];
    private FrequencySpectrum _spec = null!;

    [GlobalSetup]
    public void Setup()
    {
        var rng = new Random(1);
        var words = Enumerable.Range(0, 5000).Select(i => (i % 7 == 0 ? "Ünï" : "word") + i).ToArray();
        _text = System.Text.Encoding.UTF8.GetBytes(string.Join(' ', Enumerable.Range(0, 400_000).Select(_ => words[(int)(Math.Pow(rng.NextDouble(), 3) * 5000)])));
        _spec = ReplicateComparison.Spectrum(200_000);
    }

    [Benchmark(Description = "words tokenizer + table, 1 thread, 400k words (~3.3 MB, 1 in 7 non-ASCII)")]
    public int WordsCount()
    {
        var t = new TokenTable();
        var sink = new TableSink(t);
        new WordTokenizer(false).CreateSession(sink).Feed(_text, true);
        return t.Count;
    }

    [Benchmark(Description = "Hurwitz zeta with two derivatives")]
    public double Zeta() => HurwitzZeta.Evaluate(2.1, 37).D2;

    [Benchmark(Description = "full xmin search, 2·10^5 types")]
    public double Search() => new TailSearch(_spec.Values, _spec.Types, _spec.Values.Length).Search(50).Alpha;

    private sealed class TableSink(TokenTable t) : ITokenSink
    {
        public void AddToken(ReadOnlySpan<byte> utf8) => t.Add(utf8, 1, 0);
        public void AddPackedTokens(ReadOnlySpan<PackedToken> tokens) => t.AddPacked(tokens, 0);
        public void AddId(int id) { }
    }
}

sealed class NullSink : ITokenSink
{
    public long N;
    public void AddToken(ReadOnlySpan<byte> utf8) { N++; }
    public void AddPackedTokens(ReadOnlySpan<PackedToken> tokens) { N += tokens.Length; }
    public void AddId(int id) { }
}

sealed class TableOnly(TokenTable t) : ITokenSink
{
    public void AddToken(ReadOnlySpan<byte> utf8) => t.Add(utf8, 1, 0);
    public void AddPackedTokens(ReadOnlySpan<PackedToken> tokens) => t.AddPacked(tokens, 0);
    public void AddId(int id) { }
}

/// <summary>One goodness-of-fit replicate done two ways on the same 10^6-type power law: as a spectrum, and per type.</summary>
public static class ReplicateComparison
{
    public static FrequencySpectrum Spectrum(long n, ulong seed = 1)
    {
        var buf = new SpectrumBuffer();
        Synthetic.PowerLawTail(new Xoshiro(seed), 2.0, 1, n, buf);
        return new FrequencySpectrum(buf.Values[..buf.Count], buf.Mult[..buf.Count]);
    }

    public static void WriteSpectrum(string path)
    {
        var s = Spectrum(1_000_000);
        File.WriteAllLines(path, s.Values.Zip(s.Types, (v, m) => $"{v},{m}"));
        Console.WriteLine($"{path}: {s.TypeCount:N0} types, {s.Values.Length:N0} distinct values");
    }

    public static void Run()
    {
        var s = Spectrum(1_000_000);
        var fit = new TailSearch(s.Values, s.Types, s.Values.Length).Search(50);
        Console.WriteLine($"data: {s.TypeCount:N0} types, {s.Values.Length:N0} distinct values, fit α = {fit.Alpha:F4}, xmin = {fit.Xmin}");
        // spectrum-level: the replicate the fitter runs
        var buf = new SpectrumBuffer();
        int reps = 200;
        var sw = Stopwatch.StartNew();
        for (int r = 0; r < reps; r++)
        {
            var rng = new Xoshiro(7, 1, (ulong)r);
            buf.Clear();
            Synthetic.PowerLawTail(rng, fit.Alpha, fit.Xmin, s.TypeCount, buf);
            new TailSearch(buf.Values, buf.Mult, buf.Count).Search(50);
        }
        double spectrumMs = sw.Elapsed.TotalMilliseconds / reps;
        // per type: one sampled value per type, sorted array, each candidate's MLE and KS over the sorted values
        sw.Restart();
        int naiveReps = 1;
        for (int r = 0; r < naiveReps; r++) NaiveReplicate(new Xoshiro(7, 1, (ulong)r), fit.Alpha, fit.Xmin, s.TypeCount);
        double naiveMs = sw.Elapsed.TotalMilliseconds / naiveReps;
        Console.WriteLine($"spectrum-level replicate: {spectrumMs:F3} ms (mean of {reps})");
        Console.WriteLine($"per-type replicate:       {naiveMs:F1} ms (mean of {naiveReps})");
        Console.WriteLine($"ratio: {naiveMs / spectrumMs:F0}x");
    }

    /// <summary>The straightforward procedure: an array of one value per type, sorted; for every distinct candidate
    /// xmin, the MLE by Newton on sums over the tail values, and the KS distance over the sorted tail.</summary>
    private static double NaiveReplicate(Xoshiro rng, double alpha, long xmin, long n)
    {
        var x = new long[n];
        for (long i = 0; i < n; i++) x[i] = Samplers.PowerLaw(rng, alpha, xmin);
        Array.Sort(x);
        double best = double.PositiveInfinity;
        int start = 0;
        while (start < n - 50)
        {
            long c = x[start];
            double sumLn = 0;
            for (long i = start; i < n; i++) sumLn += Math.Log(x[i]);
            long nt = n - start;
            double a = 2;
            for (int it = 0; it < 50; it++)
            {
                var z = HurwitzZeta.Evaluate(a, c);
                double r1 = z.D1 / z.Value, score = -sumLn / nt - r1, info = z.D2 / z.Value - r1 * r1;
                double next = Math.Max(1.0001, a + score / info);
                if (Math.Abs(next - a) < 1e-10) { a = next; break; }
                a = next;
            }
            double z0 = HurwitzZeta.Value(a, c), d = 0;
            for (long i = start; i < n; i++)
            {
                if (i + 1 < n && x[i + 1] == x[i]) continue;
                double emp = (i - start + 1) / (double)nt, model = 1 - HurwitzZeta.Value(a, x[i] + 1) / z0;
                d = Math.Max(d, Math.Abs(emp - model));
            }
            best = Math.Min(best, d);
            while (start < n && x[start] == c) start++;
        }
        return best;
    }
}
