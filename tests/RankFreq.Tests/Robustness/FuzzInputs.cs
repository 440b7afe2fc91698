using System.IO.Compression;
using System.Text;
using ParquetSharp;
using SharpCompress.Compressors.BZip2;
using Encoding = System.Text.Encoding;

namespace RankFreq.Tests.Robustness;

/// <summary>One damaged or odd input and the verbs that read it.</summary>
/// <param name="Path">The file.</param>
/// <param name="Kind">What was done to it (for the failure list and the tally).</param>
/// <param name="Verbs">Verbs run over it.</param>
/// <param name="Extra">Extra arguments for the corpus verbs (a format, --strict).</param>
/// <param name="Replaced">Whether the file holds raw invalid UTF-8 that a successful count must report as replaced.</param>
public sealed record FuzzCase(string Path, string Kind, string[] Verbs, string[] Extra, bool Replaced = false);

/// <summary>
/// Makes the inputs of the fuzz campaign from one seeded <see cref="Random"/>: compressed corpora truncated and
/// bit-flipped, random bytes, invalid UTF-8 of every class, odd JSON Lines, damaged Parquet corpora and count tables,
/// count lists with junk, group files with junk. The same seed makes the same files.
/// </summary>
public sealed class FuzzInputs(Random rng, string dir)
{
    private int _n;

    // An xz file of invented text (our own words, made once with the xz tool at -9e, CRC64 check) so that the campaign
    // needs no xz encoder at test time; the pristine copy must count cleanly.
    private const string XzSeed =
        "/Td6WFoAAATm1rRGAgAhARwAAAAQz1jM4AtZA45dADWYSL6sjYsYikmev08QPR4qToou0q8hDLl/quVl0GO1cbcshiTxvTbVFfy0"
        + "Y1MQujtGsIhLdioefnszd+Btyqc1Jg24w7pbc1I4FlI2/Ls+s5ezpV7Rc19Qy7OewhT7EkJH2r4zIjsn2+Us81z4nhXpwpHcpXmm"
        + "gqALD9ntoSYNdwza8P9fmddOArqxUG9mUycNENhY/WAvrFKOYC67WcuQKzkuGxu+tAmqDJZWO41OHoWWQM1bZV0WhaVW5bfpDJ7c"
        + "XxdhV427uI1dKV6c7N3d8qn/InwxH0hl5BAFgjupOqPiP0uwZwQokpKdPm/sH3qAifaANNYIoh+WhU+RvmSfD4L5J6qqeDPWRMQD"
        + "pXusofo/CmN8G5sd6vO6g3zY65bVx4gu/vhDR0BvVBXNvJSp4Dy97AzUW/LlTR71YiNS6CXWABS7Ny+k+5k3bmucDLA1FYqPBrNJ"
        + "DNw0tJ5Gt1xwNUx1uhsiDw6vOmmBVp+yXZsWFZ7wu6up0b0rHzq/ypZlJEyQIPYfEnjiXTJPiygYiuANSsutQ8xChAHFVBxlxI8r"
        + "GfI3I8qRfBmyEKxPydA+nLlcz0o0EXAxjWPDPIVJHB0QEuHVE4gESV1kW+agE4OjyXPp3o0X18CyZFPGvzSp04JiuRrHB5rcXGgg"
        + "3l0FIQNKrvMOOzdSZVgraO9Z5QbphfHlSCbUY2oTirOmqIl0orSzlFtiZ3unOhIFGH51co7v9Wmuk/ewy0ym/uD0Rz+c97xgXgUe"
        + "S5PKeXNJjFIkM3UedUAF+mmved7vda4Iz/2VR5eqOqat4cpzH+gAhMglMCcS7a9icPuvFLTS3jw6xAAfDR7GmyqPQ02ZvLgMPdNq"
        + "cDphqR1Bsav2D6XHd+afSVsNwSHvAL67aNsmp6xPKZBc3XGn2T+/oVa0V/5VNJPCeAZGWUspU+6D7OtEkd3l2crlXSA9kS6Qy3pi"
        + "OjZfkz02DM5b1GInlR8phVxBZ0E1gLVGlPjMdWaL2O+axmO0o8iqIQUoB8Tswi5Roowd1wFxZBXspH284nS1sWS7n5HgEZkT8IbD"
        + "cDG56yy3jJuhfxvft953oskbsW8DOlFpYFIo26Jy8YghOjEdwEmigTcoC1BKmvNW/fXdPL0La7A1Nbu7Z9C9LuhnpMzF4URdyBOg"
        + "405uCFhaskIapq29ATggly07oUhW1dCmFnjbs2M+tnO0LEoWvdrjg54AAABwcwb3+HaVeQABqgfaFgAAerywmLHEZ/sCAAAAAARZ"
        + "Wg==";

    /// <summary>Every case, in a fixed order.</summary>
    public List<FuzzCase> All(string cleanTable)
    {
        var cases = new List<FuzzCase>();
        cases.AddRange(Compressed());
        cases.AddRange(RandomBytes());
        cases.AddRange(InvalidUtf8());
        cases.AddRange(JsonLines());
        cases.AddRange(ParquetCorpora());
        cases.AddRange(CountTables(cleanTable));
        cases.AddRange(CountLists());
        cases.AddRange(GroupFiles());
        return cases;
    }

    /// <summary>Invented words in a Zipf-like mix.</summary>
    public string Text(int lines)
    {
        string[] syl = ["ka", "lo", "mi", "ren", "tu", "sa", "vel", "or", "di", "pa", "ne", "qua", "zé", "ñu", "ök"];
        var words = Enumerable.Range(0, 300).Select(_ => string.Concat(Enumerable.Range(0, rng.Next(1, 4)).Select(_ => syl[rng.Next(syl.Length)])))
            .ToArray();
        var sb = new StringBuilder();
        for (int l = 0; l < lines; l++)
        {
            int n = rng.Next(4, 16);
            for (int i = 0; i < n; i++)
            {
                // rank r drawn with weight about 1/r
                int r = (int)Math.Min(words.Length - 1, Math.Floor(Math.Exp(rng.NextDouble() * Math.Log(words.Length))) - 1);
                sb.Append(words[r]).Append(i + 1 < n ? " " : "\n");
            }
        }
        return sb.ToString();
    }

    private string Jsonl(int records)
    {
        var sb = new StringBuilder();
        for (int i = 0; i < records; i++)
            sb.Append("{\"text\": ").Append(System.Text.Json.JsonSerializer.Serialize(Text(2).TrimEnd()))
                .Append(", \"party\": \"").Append(i % 2 == 0 ? "north" : "south").Append("\", \"year\": ").Append(1900 + i).Append("}\n");
        return sb.ToString();
    }

    private string Write(string name, byte[] bytes)
    {
        string p = System.IO.Path.Combine(dir, $"f{_n++:D4}-{name}");
        File.WriteAllBytes(p, bytes);
        return p;
    }

    /// <summary>Truncates, flips bits or overwrites a range, chosen by the generator.</summary>
    private byte[] Damage(byte[] clean, out string how, int from = 0, int to = -1)
    {
        var b = (byte[])clean.Clone();
        if (to < 0) to = b.Length;
        switch (rng.Next(3))
        {
            case 0:
                int keep = rng.Next(from > 0 ? from : 1, to);
                how = $"truncated at {keep} of {b.Length}";
                return b[..keep];
            case 1:
                int flips = rng.Next(1, 17);
                for (int i = 0; i < flips; i++) b[rng.Next(from, to)] ^= (byte)(1 << rng.Next(8));
                how = $"{flips} bits flipped";
                return b;
            default:
                int at = rng.Next(from, to), len = Math.Min(to - at, rng.Next(1, 64));
                rng.NextBytes(b.AsSpan(at, len));
                how = $"{len} bytes overwritten at {at}";
                return b;
        }
    }

    private static byte[] Gzip(byte[] data)
    {
        var ms = new MemoryStream();
        using (var z = new GZipStream(ms, CompressionLevel.Fastest, leaveOpen: true)) z.Write(data);
        return ms.ToArray();
    }

    private static byte[] Zstd(byte[] data) => new ZstdSharp.Compressor(3).Wrap(data).ToArray();

    private static byte[] Bzip2(byte[] data)
    {
        var ms = new MemoryStream();
        using (var z = BZip2Stream.Create(ms, SharpCompress.Compressors.CompressionMode.Compress, false, leaveOpen: true)) z.Write(data);
        return ms.ToArray();
    }

    /// <summary>The pristine xz file of invented text.</summary>
    public static byte[] Xz => Convert.FromBase64String(XzSeed);

    private static readonly string[] CorpusVerbs = ["count"];

    /// <summary>Which corpus verbs read case <paramref name="i"/>: every one counts; some also profile, tokshift, contrast.</summary>
    private static string[] Spread(int i) => (i % 40) switch
    {
        3 => ["count", "profile"],
        13 or 33 => ["count", "tokshift"],
        23 => ["count", "contrast"],
        _ => CorpusVerbs,
    };

    private IEnumerable<FuzzCase> Compressed()
    {
        var kinds = new (string Ext, Func<byte[], byte[]> Pack)[] { (".gz", Gzip), (".zst", Zstd), (".bz2", Bzip2), (".xz", _ => Xz) };
        int i = 0;
        foreach (var (ext, pack) in kinds)
        {
            for (int k = 0; k < 95; k++, i++)
            {
                bool json = ext != ".xz" && k % 3 == 1;
                var clean = pack(Encoding.UTF8.GetBytes(json ? Jsonl(30) : Text(40)));
                string name = (json ? "c.jsonl" : "c.txt") + ext;
                if (k == 0) { yield return new FuzzCase(Write(name, clean), $"{ext} pristine", Spread(i), []); continue; }
                // damage the header as often as the body: the first 32 bytes hold magic, flags and sizes
                var bad = Damage(clean, out var how, k % 4 == 0 ? 0 : Math.Min(clean.Length - 1, 12));
                yield return new FuzzCase(Write(name, bad), $"{ext} {how}", Spread(i), []);
            }
        }
    }

    private IEnumerable<FuzzCase> RandomBytes()
    {
        byte[][] magics = [[0x1F, 0x8B], [0x28, 0xB5, 0x2F, 0xFD], "BZh9"u8.ToArray(), [0xFD, 0x37, 0x7A, 0x58, 0x5A, 0x00], "PAR1"u8.ToArray(), []];
        for (int k = 0; k < 110; k++)
        {
            var magic = magics[k % magics.Length];
            var b = new byte[magic.Length + rng.Next(0, k % 10 == 0 ? 40000 : 3000)];
            rng.NextBytes(b);
            magic.CopyTo(b, 0);
            string[] verbs = k % 5 == 0 ? ["count", "fit"] : k % 5 == 1 ? ["forecast"] : k % 5 == 2 ? ["merge"] : ["count"];
            string kind = $"random bytes ({b.Length}, magic {magic.Length})";
            yield return new FuzzCase(Write(k % 2 == 0 ? "random.bin" : "random.txt", b), kind, verbs, []);
        }
        yield return new FuzzCase(Write("empty.txt", []), "empty file", ["count", "fit", "forecast", "merge", "profile"], []);
    }

    // Ill-formed UTF-8 by class (Unicode 15, chapter 3, table 3-7 gives the well-formed ranges; everything else here
    // is outside them): lone continuation bytes, a lead byte cut short, overlong forms, surrogates, code points past
    // U+10FFFF, bytes never used (C0, C1, F5-FF), a sequence cut by the end of the file.
    private static readonly byte[][] BadUtf8 =
    [
        [0x80], [0xBF], [0x80, 0x80, 0x80], [0xC3], [0xE2, 0x82], [0xF0, 0x9F, 0x98], [0xC0, 0x80], [0xC1, 0xBF],
        [0xE0, 0x80, 0x80], [0xE0, 0x9F, 0xBF], [0xF0, 0x80, 0x80, 0x80], [0xF0, 0x8F, 0xBF, 0xBF], [0xED, 0xA0, 0x80],
        [0xED, 0xBF, 0xBF], [0xED, 0xA0, 0x80, 0xED, 0xB0, 0x80], [0xF4, 0x90, 0x80, 0x80], [0xF5, 0x80, 0x80, 0x80],
        [0xF8, 0x88, 0x80, 0x80, 0x80], [0xFC, 0x84, 0x80, 0x80, 0x80, 0x80], [0xFE], [0xFF], [0xFF, 0xFE],
        [0xE2, 0x28, 0xA1], [0xC3, 0x28], [0xF0, 0x28, 0x8C, 0xBC],
    ];

    private IEnumerable<FuzzCase> InvalidUtf8()
    {
        for (int k = 0; k < 150; k++)
        {
            var bad = BadUtf8[k % BadUtf8.Length];
            var text = Encoding.UTF8.GetBytes(Text(6));
            var b = new List<byte>(text);
            int times = 1 + rng.Next(4);
            for (int t = 0; t < times; t++) b.InsertRange(k % 3 == 0 ? (t == 0 ? 0 : b.Count) : rng.Next(b.Count + 1), bad);
            bool json = k % 4 == 3;
            if (json)
            {
                // raw bad bytes inside a JSON string
                var rec = new List<byte>("{\"text\": \"abc "u8.ToArray());
                rec.AddRange(bad);
                rec.AddRange(" def\"}\n"u8.ToArray());
                rec.AddRange(Encoding.UTF8.GetBytes(Jsonl(2)));
                b = rec;
            }
            string kind = $"invalid UTF-8 class {k % BadUtf8.Length}" + (json ? " in JSON" : "");
            yield return new FuzzCase(Write(json ? "u.jsonl" : "u.txt", b.ToArray()), kind,
                k % 30 == 5 ? ["count", "profile"] : ["count"], [], Replaced: !json);
        }
    }

    private IEnumerable<FuzzCase> JsonLines()
    {
        var odd = new List<Func<string>>
        {
            () => new string('[', rng.Next(10, 100000)) + "\n" + Jsonl(2),
            () => "{\"text\": " + new string('[', rng.Next(60, 5000)) + "\"deep\"" + new string(']', 10) + "}\n" + Jsonl(2),
            () => "{\"a\":" + string.Concat(Enumerable.Repeat("{\"a\":", rng.Next(60, 3000))) + "1" + new string('}', 5) + "\n" + Jsonl(1),
            () => "{\"text\": 12345}\n{\"text\": null}\n{\"text\": true}\n{\"text\": [\"a\", 1]}\n{\"text\": {\"b\": \"c\"}}\n" + Jsonl(2),
            () => Jsonl(3) + "{\"text\": \"never closed",
            () => Jsonl(3) + "{\"text\": \"no brace\"\n" + Jsonl(1),
            () => "{\"text\": \"lone \\ud800 surrogate \\udfff and \\u0000 nul\"}\n" + Jsonl(1),
            () => "{\"text\": \"bad escape \\x41 \\u12\"}\n" + Jsonl(1),
            () => "\uFEFF" + Jsonl(3).Replace("\n", "\r\n"),
            () => Jsonl(2) + "\n\n   \n" + Jsonl(1) + "\0\0\0\n",
            () => "{\"text\": \"a\", \"text\": \"dup\"}\n{\"text\": \"x\",}\n" + Jsonl(1),
            () => "{\"text\": 1e999999, \"year\": 123456789012345678901234567890}\n" + Jsonl(1),
            () => "[1, 2, 3]\n\"just a string\"\n42\nnull\n" + Jsonl(1),
            () => "{\"text\": \"" + new string('w', rng.Next(1000, 200000)) + "\"}\n",
            () => Jsonl(2).Replace("\"party\": \"north\"", "\"party\": 17").Replace("\"year\": 19", "\"year\": \"x19"),
            () => "{\"other\": \"no text field\"}\n" + Jsonl(1),
            () => "{" + string.Concat(Enumerable.Range(0, 2000).Select(i => $"\"k{i}\": {i}, ")) + "\"text\": \"many keys\"}\n",
            () => "}{\n][\n{\"text\":\n\"x\"}\n",
        };
        for (int k = 0; k < 160; k++)
        {
            int which = k % odd.Count;
            string body = odd[which]();
            string[] extra = k % 5 == 4 ? ["--strict"] : [];
            string[] verbs = k % 12 == 2 ? ["count", "contrast"] : k % 9 == 4 ? ["count", "tokshift"] : ["count"];
            string kind = $"JSON Lines oddity {which}" + (extra.Length > 0 ? " --strict" : "");
            yield return new FuzzCase(Write("j.jsonl", Encoding.UTF8.GetBytes(body)), kind,
                verbs, extra);
        }
    }

    /// <summary>A Parquet corpus with a text column and a group column, written by the Arrow C++ writer (ParquetSharp).</summary>
    public byte[] ParquetCorpus(int rows)
    {
        string p = System.IO.Path.Combine(dir, $"clean-{_n++}.parquet");
        var texts = Enumerable.Range(0, rows).Select(_ => Text(2)).ToArray();
        var groups = Enumerable.Range(0, rows).Select(i => i % 2 == 0 ? "north" : "south").ToArray();
        using (var w = new ParquetFileWriter(p, new Column[] { new Column<string>("text"), new Column<string>("grp") }))
        {
            using var rg = w.AppendRowGroup();
            using (var c = rg.NextColumn().LogicalWriter<string>()) c.WriteBatch(texts);
            using (var c = rg.NextColumn().LogicalWriter<string>()) c.WriteBatch(groups);
            w.Close();
        }
        var bytes = File.ReadAllBytes(p);
        File.Delete(p);
        return bytes;
    }

    private IEnumerable<FuzzCase> ParquetCorpora()
    {
        var clean = ParquetCorpus(40);
        yield return new FuzzCase(Write("p.parquet", clean), "Parquet corpus pristine", ["count", "profile", "contrast"], []);
        int footer = BitConverter.ToInt32(clean, clean.Length - 8);
        int footerStart = clean.Length - 8 - footer;
        for (int k = 0; k < 130; k++)
        {
            // a third damage the footer (schema, row groups, offsets), a third the pages, a third anywhere
            int from = k % 3 == 0 ? footerStart : k % 3 == 1 ? 4 : 0, to = k % 3 == 1 ? footerStart : -1;
            var bad = Damage(clean, out var how, from, to);
            string part = k % 3 == 0 ? "footer" : k % 3 == 1 ? "pages" : "anywhere";
            yield return new FuzzCase(Write("p.parquet", bad), $"Parquet corpus, {part}: {how}", Spread(k), []);
        }
    }

    private IEnumerable<FuzzCase> CountTables(string cleanTable)
    {
        var clean = File.ReadAllBytes(cleanTable);
        int footer = BitConverter.ToInt32(clean, clean.Length - 8);
        int footerStart = clean.Length - 8 - footer;
        for (int k = 0; k < 120; k++)
        {
            var bad = k % 2 == 0 ? Damage(clean, out var how, footerStart) : Damage(clean, out how, 4, footerStart);
            string[] verbs = (k % 4) switch { 0 => ["fit", "merge"], 1 => ["forecast"], 2 => ["merge"], _ => ["fit"] };
            yield return new FuzzCase(Write("t.parquet", bad), $"count table, {(k % 2 == 0 ? "footer" : "pages")}: {how}", verbs, []);
        }
    }

    private IEnumerable<FuzzCase> CountLists()
    {
        string[] junk =
        [
            "-5", "0", "NaN", "Infinity", "1e400", "99999999999999999999999", "3.7", "word", "word 12", "12 word", "5 3 2", "\t7\t",
            "#comment", "count", "frequency types", "  ", "\u00A07", "٣", "0x1F", "+4", "1,000", "9223372036854775807",
            "9223372036854775807 9223372036854775807", "2 -1", "\0", "\uFEFF5",
        ];
        for (int k = 0; k < 170; k++)
        {
            var lines = new List<string>();
            bool spectrum = k % 2 == 1;
            int n = rng.Next(0, 60);
            for (int i = 0; i < n; i++)
                lines.Add(spectrum ? $"{i + 1} {rng.Next(1, 500)}" : $"{(int)Math.Max(1, 2000 / (i + 1.0))}");
            int bad = k % 7 == 0 ? 0 : rng.Next(1, 4);
            for (int i = 0; i < bad; i++) lines.Insert(rng.Next(lines.Count + 1), junk[rng.Next(junk.Length)]);
            string sep = k % 5 == 0 ? "\r\n" : "\n";
            var text = string.Join(sep, lines) + (k % 3 == 0 ? "" : sep);
            var bytes = Encoding.UTF8.GetBytes(text);
            if (k % 11 == 0 && bytes.Length > 2) bytes[rng.Next(bytes.Length)] = (byte)rng.Next(0x80, 0x100);
            string[] verbs = k % 3 == 0 ? ["fit", "forecast"] : ["fit"];
            string kind = $"{(spectrum ? "spectrum" : "count list")} with {bad} junk line(s)";
            yield return new FuzzCase(Write(spectrum ? "spectrum.txt" : "counts.txt", bytes), kind,
                verbs, []);
        }
    }

    private IEnumerable<FuzzCase> GroupFiles()
    {
        for (int k = 0; k < 40; k++)
        {
            var sb = new StringBuilder();
            string[] shapes =
            [
                "{A}\tnorth\n{B}\tsouth\n", "{A}\n{B}\n", "{A}\tnorth\textra\n{B}\tsouth\n", "nosuchfile.txt\tnorth\n{B}\tsouth\n",
                "\0\0\0", "{A}\t\n{B}\t\n", "# only a comment\n", "{A},north\n{B},south\n", "{A}\tnorth\n{A}\tsouth\n{B}\tsouth\n",
                "{A}\t" + new string('g', 5000) + "\n{B}\tsouth\n",
            ];
            sb.Append(shapes[k % shapes.Length]);
            var bytes = Encoding.UTF8.GetBytes(sb.ToString());
            if (k >= shapes.Length && bytes.Length > 0) bytes[rng.Next(bytes.Length)] ^= (byte)(1 << rng.Next(8));
            string kind = $"groups file shape {k % shapes.Length}" + (k >= shapes.Length ? " bit-flipped" : "");
            yield return new FuzzCase(Write("groups.tsv", bytes), kind,
                ["contrast-groups"], []);
        }
    }
}
