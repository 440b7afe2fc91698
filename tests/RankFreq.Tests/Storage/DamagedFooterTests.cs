using System.Buffers.Binary;
using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Primitives;
using RankFreq.Storage;
using Xunit;

namespace RankFreq.Tests.Storage;

/// <summary>
/// Damaged footers of count tables: refused in one error naming the file, never a hang or another exception. The
/// Parquet decoder takes the end of a footer as 0xFF bytes, so a footer damaged near its end once looped for ever
/// (found by the fuzz campaign); <see cref="ParquetFooterCheck"/> walks it first.
/// </summary>
public class DamagedFooterTests
{
    private static readonly TimeSpan Hang = TimeSpan.FromSeconds(120);

    private static async Task<(string Path, byte[] Bytes, int FooterStart)> Table(TempDir d)
    {
        File.WriteAllText(d["a.txt"], string.Join(' ', Enumerable.Range(0, 3000).Select(i => "t" + (i * 7919 % 211))));
        using var r = CountJob.Count([d["a.txt"]], new CountSettings());
        await CountTableFile.WriteAsync(d["t.parquet"], r.Rows, false, CountTableMetadata.From(r.Summary, 0));
        var bytes = File.ReadAllBytes(d["t.parquet"]);
        int footer = BinaryPrimitives.ReadInt32LittleEndian(bytes.AsSpan(bytes.Length - 8));
        return (d["t.parquet"], bytes, bytes.Length - 8 - footer);
    }

    [Fact]
    public async Task FootersOfOtherWritersAndOursWalkCleanly()
    {
        using var d = new TempDir();
        var (path, _, _) = await Table(d);
        Assert.Null(ParquetFooterCheck.Problem(path));
        // an independent writer: ParquetSharp (the Apache Arrow C++ Parquet implementation), with key-value metadata
        var other = d["other.parquet"];
        var columns = new ParquetSharp.Column[] { new ParquetSharp.Column<string>("token"), new ParquetSharp.Column<long>("count") };
        using (var w = new ParquetSharp.ParquetFileWriter(other, columns,
            keyValueMetadata: new Dictionary<string, string> { ["k"] = "välue" }))
        {
            using var rg = w.AppendRowGroup();
            using (var c = rg.NextColumn().LogicalWriter<string>()) c.WriteBatch(["a", "b", "c"]);
            using (var c = rg.NextColumn().LogicalWriter<long>()) c.WriteBatch([3L, 2L, 1L]);
            w.Close();
        }
        Assert.Null(ParquetFooterCheck.Problem(other));
    }

    [Fact]
    public async Task FooterEndOverwrittenIsRefusedNotAHang()
    {
        using var d = new TempDir();
        var (path, bytes, _) = await Table(d);
        bytes.AsSpan(bytes.Length - 8 - 24, 24).Fill(0xFF);
        File.WriteAllBytes(path, bytes);
        Assert.NotNull(ParquetFooterCheck.Problem(path));
        var open = Task.Run(() => CountTableFile.OpenAsync(path));
        Assert.Same(open, await Task.WhenAny(open, Task.Delay(Hang)));
        var e = await Assert.ThrowsAsync<StorageException>(() => open);
        Assert.StartsWith(path + ": ", e.Message);
        Assert.DoesNotContain('\n', e.Message);
    }

    [Fact]
    public async Task EveryBitFlipOfTheFooterOpensOrIsRefusedInOneLine()
    {
        using var d = new TempDir();
        var (path, bytes, footerStart) = await Table(d);
        var work = Task.Run(async () =>
        {
            int opened = 0, refused = 0, metadata = 0;
            var damaged = d["damaged.parquet"];
            for (int at = footerStart; at < bytes.Length - 8; at++)
                for (int bit = 0; bit < 8; bit++)
                {
                    var b = (byte[])bytes.Clone();
                    b[at] ^= (byte)(1 << bit);
                    File.WriteAllBytes(damaged, b);
                    try
                    {
                        await using var r = await CountTableFile.OpenAsync(damaged);
                        opened++;
                    }
                    catch (StorageException e)
                    {
                        Assert.StartsWith(damaged + ": ", e.Message);
                        Assert.DoesNotContain('\n', e.Message);
                        refused++;
                        if (e.Message.Contains("damaged count table footer")) metadata++;
                    }
                }
            return (opened, refused, metadata);
        });
        Assert.Same(work, await Task.WhenAny(work, Task.Delay(Hang)));
        var (opened, refused, garbled) = await work;
        Assert.True(refused > 0 && opened > 0, $"opened {opened}, refused {refused}");
        // flips inside the rankfreq.* values (numbers, dates, the inputs' JSON) reach the metadata parse
        Assert.True(garbled > 0, $"no flip reached the metadata parse (opened {opened}, refused {refused})");
    }
}
