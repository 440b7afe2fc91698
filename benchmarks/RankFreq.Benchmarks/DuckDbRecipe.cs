using System.Diagnostics;
using DuckDB.NET.Data;

namespace RankFreq.Benchmarks;

/// <summary>
/// The scale-out recipe of docs/scale-out.md run on the embedded DuckDB engine, one step per process so that
/// /usr/bin/time can take each step's peak memory from outside. Not a benchmark class: the script
/// benchmarks/scale-out/shards-1gb.sh times it beside <c>rankfreq merge</c>.
/// </summary>
/// <remarks>
/// Steps: <c>merge OUT SHARD...</c> sums the shards' counts by token into a (token, count) table;
/// <c>spectrum OUT TABLE</c> turns a merged table into (frequency, types); <c>spectrum-direct OUT SHARD...</c> goes from
/// the shards to the spectrum without writing the token strings anywhere (the "bring only the spectrum" path).
/// SUM over BIGINT is a 128-bit integer in DuckDB, so it is cast back to BIGINT (a count table's int64).
/// </remarks>
public static class DuckDbRecipe
{
    /// <summary>Runs one step; prints its wall time and the rows written.</summary>
    public static int Run(string[] args)
    {
        if (args.Length < 3)
        {
            Console.Error.WriteLine("usage: duckdb-recipe merge|spectrum|spectrum-direct OUT INPUT... "
                + "(env DUCKDB_THREADS, DUCKDB_MEMORY, DUCKDB_TEMP)");
            return 2;
        }
        string step = args[0], output = args[1];
        string inputs = "[" + string.Join(", ", args[2..].Select(Quote)) + "]";
        string sql = step switch
        {
            "merge" => $"SELECT token, SUM(count)::BIGINT AS count FROM read_parquet({inputs}) GROUP BY token",
            "spectrum" => $"SELECT count AS frequency, COUNT(*) AS types FROM read_parquet({inputs}) GROUP BY count ORDER BY frequency",
            "spectrum-direct" => "SELECT count AS frequency, COUNT(*) AS types FROM (SELECT SUM(count)::BIGINT AS count "
                + $"FROM read_parquet({inputs}) GROUP BY token) GROUP BY count ORDER BY frequency",
            _ => throw new ArgumentException($"unknown step '{step}'"),
        };
        var sw = Stopwatch.StartNew();
        using var con = new DuckDBConnection("DataSource=:memory:");
        con.Open();
        Exec(con, $"SET threads = {Environment.GetEnvironmentVariable("DUCKDB_THREADS") ?? "2"}");
        if (Environment.GetEnvironmentVariable("DUCKDB_MEMORY") is { Length: > 0 } mem) Exec(con, $"SET memory_limit = {Quote(mem)}");
        if (Environment.GetEnvironmentVariable("DUCKDB_TEMP") is { Length: > 0 } tmp) Exec(con, $"SET temp_directory = {Quote(tmp)}");
        Exec(con, $"COPY ({sql}) TO {Quote(output)} (FORMAT parquet, COMPRESSION zstd)");
        using var cmd = con.CreateCommand();
        cmd.CommandText = $"SELECT COUNT(*) FROM read_parquet({Quote(output)})";
        long rows = Convert.ToInt64(cmd.ExecuteScalar(), System.Globalization.CultureInfo.InvariantCulture);
        Console.WriteLine($"duckdb {step}: {sw.Elapsed.TotalSeconds:F2} s, {rows:N0} rows -> {output}");
        return 0;
    }

    private static void Exec(DuckDBConnection con, string sql)
    {
        using var cmd = con.CreateCommand();
        cmd.CommandText = sql;
        cmd.ExecuteNonQuery();
    }

    private static string Quote(string s) => "'" + s.Replace("'", "''") + "'";
}
