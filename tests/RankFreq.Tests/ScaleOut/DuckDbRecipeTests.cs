using System.Globalization;
using DuckDB.NET.Data;
using RankFreq.Storage;
using Xunit;

namespace RankFreq.Tests.ScaleOut;

/// <summary>
/// The recipe of docs/scale-out.md run on an embedded engine: DuckDB (NuGet DuckDB.NET.Data.Full, the reference
/// implementation of the SQL side here) sums the shard tables of `count --shard K/N` by token and groups the result
/// into a spectrum. Its tables must equal what `merge` makes, and `fit` must give the same figures on all of them.
/// </summary>
public class DuckDbRecipeTests
{
    private const string FitArgs = "--reps 60 --ci-reps 40 --seed 11 --json";

    [CorpusFact]
    public async Task SqlMergeOfShardsEqualsMergeAndFitsIdentically()
    {
        using var d = new TempDir();
        string[] inputs = [Corpora.File("kjv-bible.txt"), Corpora.File("reina-valera-1909.txt"), Corpora.File("sotu.jsonl")];
        var shards = CountShards(d, inputs, 3, "words");
        Ok(Cli.Run(["merge", .. shards, "-o", d["merged.parquet"], "-q"]));

        using var con = Open();
        // the shards agree on their tokenizer, and their footers' token totals add up to the SQL sum (a check the
        // recipe makes before trusting a merge that reads no footers)
        Assert.Equal(["words"], Strings(con, $"SELECT DISTINCT decode(value) FROM parquet_kv_metadata({List(shards)}) "
            + "WHERE decode(key) = 'rankfreq.tokenizer'"));
        long footerTokens = Long(con, $"SELECT SUM(decode(value)::BIGINT)::BIGINT FROM parquet_kv_metadata({List(shards)}) "
            + "WHERE decode(key) = 'rankfreq.tokens'");
        Assert.Equal(footerTokens, Long(con, $"SELECT SUM(count)::BIGINT FROM read_parquet({List(shards)})"));

        Exec(con, $"COPY (SELECT token, SUM(count)::BIGINT AS count FROM read_parquet({List(shards)}) GROUP BY token) "
            + $"TO {Q(d["sql-merged.parquet"])} (FORMAT parquet)");
        Exec(con, $"COPY (SELECT count AS frequency, COUNT(*) AS types FROM read_parquet({Q(d["sql-merged.parquet"])}) "
            + $"GROUP BY count ORDER BY frequency) TO {Q(d["sql-spectrum.parquet"])} (FORMAT parquet)");
        // a cluster writes a table as a folder of parts: the same merge in four files
        Directory.CreateDirectory(d["parts"]);
        Exec(con, $"COPY (SELECT token, SUM(count)::BIGINT AS count FROM read_parquet({List(shards)}) GROUP BY token) "
            + $"TO {Q(d["parts"])} (FORMAT parquet, PER_THREAD_OUTPUT true, OVERWRITE_OR_IGNORE true)");
        Assert.NotEmpty(Directory.GetFiles(d["parts"], "*.parquet"));

        // the rows: DuckDB's merge equals merge's, token for token
        var mine = new Dictionary<string, long>(StringComparer.Ordinal);
        await using (var r = await CountTableFile.OpenAsync(d["merged.parquet"]))
            foreach (var b in r.Batches())
                for (int i = 0; i < b.Counts.Length; i++) mine.Add(b.Tokens[i]!, b.Counts[i]);
        var sql = Pairs(con, $"SELECT token, count FROM read_parquet({Q(d["sql-merged.parquet"])})");
        Assert.Equal(mine.Count, sql.Count);
        foreach (var (token, count) in sql) Assert.True(mine.TryGetValue(token, out var c) && c == count, token);

        // the spectrum: DuckDB's GROUP BY equals the spectrum of merge's table
        var (spectrum, _, _) = await SpectrumInput.LoadAsync(d["merged.parquet"]);
        var sqlSpectrum = Pairs(con, $"SELECT frequency::VARCHAR, types FROM read_parquet({Q(d["sql-spectrum.parquet"])}) ORDER BY frequency");
        Assert.Equal(spectrum.Values, sqlSpectrum.Select(p => long.Parse(p.Key, CultureInfo.InvariantCulture)));
        Assert.Equal(spectrum.Types, sqlSpectrum.Select(p => p.Value));

        // the fits: identical JSON (xmin, alpha, intervals, p, alternatives) for one seed, whichever table is read
        string reference = Ok(Cli.Run(["fit", d["merged.parquet"], .. FitArgs.Split(' ')]));
        Assert.Contains("\"xmin\"", reference);
        foreach (var other in new[] { d["sql-merged.parquet"], d["sql-spectrum.parquet"], d["parts"] })
            Assert.Equal(reference, Ok(Cli.Run(["fit", other, .. FitArgs.Split(' ')])));
    }

    [CorpusFact]
    public void SubwordShardsMergeByTokenIdInSql()
    {
        // subword tables carry token_id; the SQL merge groups by it (and keeps the display string beside it)
        using var d = new TempDir();
        string folder = Path.Combine(Path.GetDirectoryName(Corpora.File("kjv-bible.txt"))!, "udhr");
        var udhr = Directory.GetFiles(folder, "*.txt").Order(StringComparer.Ordinal).Take(40).ToArray();
        Assert.Equal(40, udhr.Length);
        var shards = CountShards(d, udhr, 4, "cl100k_base");
        Ok(Cli.Run(["merge", .. shards, "-o", d["merged.parquet"], "-q"]));
        using var con = Open();
        Exec(con, $"COPY (SELECT token_id, any_value(token) AS token, SUM(count)::BIGINT AS count FROM read_parquet({List(shards)}) "
            + $"GROUP BY token_id) TO {Q(d["sql.parquet"])} (FORMAT parquet)");
        // same (id, token, count) rows both ways; an id never has two display strings
        Assert.Equal(0, Long(con, $"SELECT COUNT(*) FROM (SELECT token_id, COUNT(DISTINCT token) AS n FROM read_parquet({List(shards)}) "
            + "GROUP BY token_id) WHERE n > 1"));
        string a = $"SELECT token_id, token, count FROM read_parquet({Q(d["merged.parquet"])})";
        string b = $"SELECT token_id, token, count FROM read_parquet({Q(d["sql.parquet"])})";
        Assert.Equal(Long(con, $"SELECT COUNT(*) FROM ({a})"), Long(con, $"SELECT COUNT(*) FROM ({b})"));
        Assert.Equal(0, Long(con, $"SELECT COUNT(*) FROM ({a} EXCEPT {b})"));
        Assert.Equal(0, Long(con, $"SELECT COUNT(*) FROM ({b} EXCEPT {a})"));
        Assert.Equal(Ok(Cli.Run(["fit", d["merged.parquet"], .. FitArgs.Split(' ')])), Ok(Cli.Run(["fit", d["sql.parquet"], .. FitArgs.Split(' ')])));
    }

    [Theory]
    // the integer widths engines write: DuckDB INTEGER is INT32, BIGINT INT64, UBIGINT UINT64, DECIMAL(38,0) what
    // Spark's SUM over decimals gives, and a nullable column (every engine's default)
    [InlineData("INTEGER")]
    [InlineData("BIGINT")]
    [InlineData("SMALLINT")]
    [InlineData("UBIGINT")]
    [InlineData("DECIMAL(38,0)")]
    [InlineData("DECIMAL(18,0)")]
    public void FitReadsEngineTablesOfAnyIntegerWidth(string type)
    {
        using var d = new TempDir();
        using var con = Open();
        // a Zipf-like table: count ⌊5000 / r⌋ for ranks 1..2000, built in SQL; the reference is the same counts as text
        Exec(con, $"COPY (SELECT 't' || r AS token, (5000 // r)::{type} AS count FROM range(1, 2001) t(r)) TO {Q(d["c.parquet"])} (FORMAT parquet)");
        Exec(con, $"COPY (SELECT count::{type} AS frequency, COUNT(*)::{type} AS types FROM read_parquet({Q(d["c.parquet"])}) GROUP BY count) "
            + $"TO {Q(d["s.parquet"])} (FORMAT parquet)");
        File.WriteAllLines(d["c.txt"], Enumerable.Range(1, 2000).Select(r => (5000 / r).ToString(CultureInfo.InvariantCulture)));
        string reference = Ok(Cli.Run(["fit", d["c.txt"], .. FitArgs.Split(' ')]));
        Assert.Equal(reference, Ok(Cli.Run(["fit", d["c.parquet"], .. FitArgs.Split(' ')])));
        Assert.Equal(reference, Ok(Cli.Run(["fit", d["s.parquet"], .. FitArgs.Split(' ')])));
        // the spectrum as DuckDB writes CSV: a header line "frequency,types", then value,types lines
        Exec(con, $"COPY (SELECT * FROM read_parquet({Q(d["s.parquet"])})) TO {Q(d["s.csv"])} (HEADER)");
        Assert.StartsWith("frequency,types", File.ReadAllText(d["s.csv"]));
        Assert.Equal(reference, Ok(Cli.Run(["fit", d["s.csv"], .. FitArgs.Split(' ')])));
    }

    [Theory]
    [InlineData("SELECT 'a' AS token, SUM(x)::HUGEINT AS count FROM range(1, 4) t(x)", "count", "")]
    [InlineData("SELECT 'a' AS token, 2.5::DOUBLE AS count", "count", "BIGINT")]
    [InlineData("SELECT 'a' AS token, 2.5::DECIMAL(9,2) AS count", "count", "fractional")]
    [InlineData("SELECT 'a' AS token, '7' AS count", "count", "BIGINT")]
    [InlineData("SELECT * FROM (VALUES ('a', 3::BIGINT), ('b', NULL)) t(token, count)", "row 2", "null")]
    [InlineData("SELECT * FROM (VALUES ('a', 3::BIGINT), ('b', 0)) t(token, count)", "row 2", "positive")]
    [InlineData("SELECT 1::BIGINT AS frequency, -4::BIGINT AS types", "types", "positive")]
    [InlineData("SELECT 'x' AS \"group\", 'a' AS token, 3::BIGINT AS count", "group", "one group at a time")]
    [InlineData("SELECT 'a' AS token, 3::BIGINT AS n", "no column count", "")]
    public void EngineTablesFitCannotReadFailOnOneLineNamingFileAndColumn(string select, string place, string why)
    {
        using var d = new TempDir();
        using var con = Open();
        Exec(con, $"COPY ({select}) TO {Q(d["bad.parquet"])} (FORMAT parquet)");
        var (code, _, err) = Cli.Run("fit", d["bad.parquet"], "--reps", "0");
        Assert.Equal(1, code);
        Assert.Single(err.Trim().Split('\n'));
        Assert.Contains("bad.parquet", err);
        Assert.Contains(place, err);
        Assert.Contains(why, err);
    }

    [Fact]
    public void FolderOfRankFreqShardsIsRefusedUntilMerged()
    {
        // summing the spectra of shards would count a type once per shard it occurs in
        using var d = new TempDir();
        Directory.CreateDirectory(d["shards"]);
        File.WriteAllText(d["a.txt"], "one two two");
        File.WriteAllText(d["b.txt"], "two three");
        Ok(Cli.Run("count", d["a.txt"], "-o", Path.Combine(d["shards"], "a.parquet"), "-q"));
        Ok(Cli.Run("count", d["b.txt"], "-o", Path.Combine(d["shards"], "b.parquet"), "-q"));
        var (code, _, err) = Cli.Run("fit", d["shards"], "--reps", "0");
        Assert.Equal(1, code);
        Assert.Contains("merge", err);
        Assert.Single(err.Trim().Split('\n'));
    }

    internal static string[] CountShards(TempDir d, string[] inputs, int n, string tokenizer) =>
        Enumerable.Range(1, n).Select(k =>
        {
            string path = d[$"shard-{k}.parquet"];
            Ok(Cli.Run(["count", .. inputs, "--shard", $"{k}/{n}", "-t", tokenizer, "-o", path, "-q"]));
            return path;
        }).ToArray();

    internal static string Ok((int Code, string Out, string Err) r)
    {
        Assert.True(r.Code == 0, r.Err);
        return r.Out;
    }

    internal static DuckDBConnection Open()
    {
        var con = new DuckDBConnection("DataSource=:memory:");
        con.Open();
        Exec(con, "SET threads = 2");
        return con;
    }

    internal static void Exec(DuckDBConnection con, string sql)
    {
        using var cmd = con.CreateCommand();
        cmd.CommandText = sql;
        cmd.ExecuteNonQuery();
    }

    private static long Long(DuckDBConnection con, string sql)
    {
        using var cmd = con.CreateCommand();
        cmd.CommandText = sql;
        return Convert.ToInt64(cmd.ExecuteScalar(), CultureInfo.InvariantCulture);
    }

    private static List<string> Strings(DuckDBConnection con, string sql)
    {
        using var cmd = con.CreateCommand();
        cmd.CommandText = sql;
        using var r = cmd.ExecuteReader();
        var list = new List<string>();
        while (r.Read()) list.Add(r.GetString(0));
        return list;
    }

    private static List<KeyValuePair<string, long>> Pairs(DuckDBConnection con, string sql)
    {
        using var cmd = con.CreateCommand();
        cmd.CommandText = sql;
        using var r = cmd.ExecuteReader();
        var list = new List<KeyValuePair<string, long>>();
        while (r.Read()) list.Add(new(r.GetString(0), r.GetInt64(1)));
        return list;
    }

    internal static string Q(string s) => "'" + s.Replace("'", "''") + "'";

    private static string List(IEnumerable<string> paths) => "[" + string.Join(", ", paths.Select(Q)) + "]";
}
