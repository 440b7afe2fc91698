using System.IO.Hashing;
using System.Text;
using RankFreq.Storage;

namespace RankFreq.Benchmarks;

/// <summary>
/// `tools table-hash TABLE`: one line with the rows, the token total and an XxHash64 over every (rank, token, count)
/// row in order, so scripts can check that two count tables (say, with and without a memory budget) are identical
/// without comparing the files (whose footers carry the creation time).
/// </summary>
internal static class TableHash
{
    public const string Usage = "tools table-hash TABLE   (rows, tokens and a hash of every row of a count table)";

    public static int Run(string path)
    {
        try
        {
            using var table = CountTableFile.OpenAsync(path).GetAwaiter().GetResult();
            var hash = new XxHash64();
            long rows = 0, tokens = 0;
            Span<byte> num = stackalloc byte[16];
            foreach (var b in table.Batches())
                for (int i = 0; i < b.Counts.Length; i++)
                {
                    BitConverter.TryWriteBytes(num, b.FirstRank + i);
                    BitConverter.TryWriteBytes(num[8..], b.Counts[i]);
                    hash.Append(num);
                    hash.Append(Encoding.UTF8.GetBytes(b.Tokens[i] ?? "\0"));
                    rows++;
                    tokens += b.Counts[i];
                }
            Console.WriteLine($"rows {rows} tokens {tokens} hash {hash.GetCurrentHashAsUInt64():x16}");
            return 0;
        }
        catch (StorageException e)
        {
            Console.Error.WriteLine(e.Message);
            return 1;
        }
    }
}
