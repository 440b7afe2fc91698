using System.Globalization;
using Parquet;
using Parquet.Schema;
using RankFreq.Fitting;

namespace RankFreq.Storage;

/// <summary>Writes fit results: one row per group (alpha … seed) and a second table with one row per (group, alternative).</summary>
public static class FitTableFile
{
    /// <summary>The alternatives table written beside a fit table: <c>X.parquet</c> → <c>X.alternatives.parquet</c>.</summary>
    public static string AlternativesPath(string fitPath) =>
        Path.Combine(Path.GetDirectoryName(Path.GetFullPath(fitPath))!, Path.GetFileNameWithoutExtension(fitPath) + ".alternatives.parquet");

    /// <summary>Writes the fit table and the alternatives table atomically.</summary>
    public static async Task WriteAsync(string path, IReadOnlyList<(string Group, TailFitResult Fit)> fits, CancellationToken ct = default)
    {
        var opts = new ParquetOptions { CompressionMethod = CompressionMethod.Zstd, CompressionLevel = System.IO.Compression.CompressionLevel.Optimal };
        var g = new DataField<string>("group");
        var dbl = new[] { "alpha", "alpha_se", "alpha_approx", "alpha_sd", "alpha_lo", "alpha_hi", "xmin_lo", "xmin_hi", "n_tail_sd", "ks_distance", "gof_p", "zipf_s", "zipf_s_se", "lsq_slope" }
            .Select(n => new DataField<double>(n)).ToArray();
        var xmin = new DataField<long>("xmin");
        var nTail = new DataField<long>("n_tail");
        var nTypes = new DataField<long>("n_types");
        var reps = new DataField<int>("gof_reps");
        var ciReps = new DataField<int>("ci_reps");
        var seed = new DataField<long>("seed");
        var status = new DataField<string>("status");
        var fields = new List<Field> { g };
        fields.AddRange(dbl);
        fields.AddRange([xmin, nTail, nTypes, reps, ciReps, seed, status]);
        await AtomicFile.WriteAsync(path, async s =>
        {
            await using var w = await ParquetWriter.CreateAsync(new ParquetSchema(fields), s, opts, cancellationToken: ct);
            w.CustomMetadata = new Dictionary<string, string> { ["rankfreq.table"] = "fit", ["rankfreq.version"] = CountTableMetadata.CurrentVersion };
            using var rg = w.CreateRowGroup();
            await rg.WriteAsync(g, fits.Select(f => f.Group).ToArray());
            var cols = new Func<TailFitResult, double>[]
            {
                f => f.PowerLaw.Alpha, f => f.PowerLaw.AlphaSe, f => f.PowerLaw.AlphaApprox, f => f.AlphaSd, f => f.AlphaLo, f => f.AlphaHi,
                f => f.XminLo, f => f.XminHi, f => f.NTailSd, f => f.PowerLaw.KsDistance, f => f.GofP, f => f.ZipfS, f => f.ZipfSSe, f => f.LsqSlope,
            };
            for (int i = 0; i < dbl.Length; i++) await rg.WriteAsync<double>(dbl[i], fits.Select(f => cols[i](f.Fit)).ToArray());
            await rg.WriteAsync<long>(xmin, fits.Select(f => f.Fit.PowerLaw.Xmin).ToArray());
            await rg.WriteAsync<long>(nTail, fits.Select(f => f.Fit.PowerLaw.NTail).ToArray());
            await rg.WriteAsync<long>(nTypes, fits.Select(f => f.Fit.NTypes).ToArray());
            await rg.WriteAsync<int>(reps, fits.Select(f => f.Fit.GofReps).ToArray());
            await rg.WriteAsync<int>(ciReps, fits.Select(f => f.Fit.CiReps).ToArray());
            await rg.WriteAsync<long>(seed, fits.Select(f => unchecked((long)f.Fit.Seed)).ToArray());
            await rg.WriteAsync(status, fits.Select(f => f.Fit.PowerLaw.Status == FitStatus.Ok ? "ok" : $"{f.Fit.PowerLaw.Status}: {f.Fit.PowerLaw.Message}").ToArray());
        });

        var rows = fits.SelectMany(f => f.Fit.Alternatives.Select(a => (f.Group, a))).ToList();
        var ag = new DataField<string>("group");
        var name = new DataField<string>("name");
        var pars = new DataField<string>("parameters");
        var adbl = new[] { "log_likelihood", "llr", "normalized_llr", "p" }.Select(n => new DataField<double>(n)).ToArray();
        var fav = new DataField<string>("favours");
        var ast = new DataField<string>("status");
        var afields = new List<Field> { ag, name, pars };
        afields.AddRange(adbl);
        afields.AddRange([fav, ast]);
        await AtomicFile.WriteAsync(AlternativesPath(path), async s =>
        {
            await using var w = await ParquetWriter.CreateAsync(new ParquetSchema(afields), s, opts, cancellationToken: ct);
            w.CustomMetadata = new Dictionary<string, string> { ["rankfreq.table"] = "alternatives", ["rankfreq.version"] = CountTableMetadata.CurrentVersion };
            using var rg = w.CreateRowGroup();
            await rg.WriteAsync(ag, rows.Select(r => r.Group).ToArray());
            await rg.WriteAsync(name, rows.Select(r => r.a.Name).ToArray());
            await rg.WriteAsync(pars, rows.Select(r => ParameterText(r.a.Parameters)).ToArray());
            var acols = new Func<AlternativeComparison, double>[] { a => a.LogLikelihood, a => a.Llr, a => a.NormalizedLlr, a => a.P };
            for (int i = 0; i < adbl.Length; i++) await rg.WriteAsync<double>(adbl[i], rows.Select(r => acols[i](r.a)).ToArray());
            await rg.WriteAsync(fav, rows.Select(r => r.a.Favours).ToArray());
            await rg.WriteAsync(ast, rows.Select(r => r.a.Status == FitStatus.Ok ? "ok" : $"{r.a.Status}: {r.a.Message}").ToArray());
        });
    }

    /// <summary>Parameters as "name=value" pairs, invariant culture.</summary>
    public static string ParameterText(IReadOnlyDictionary<string, double> p) =>
        string.Join(", ", p.Select(kv => $"{kv.Key}={kv.Value.ToString("G6", CultureInfo.InvariantCulture)}"));
}
