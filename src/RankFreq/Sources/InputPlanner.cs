using Microsoft.Extensions.FileSystemGlobbing;

namespace RankFreq.Sources;

/// <summary>Expands input arguments into files, detects compression and format, and plans the work units.</summary>
public static class InputPlanner
{
    private const int PeekBytes = 8192;

    /// <summary>
    /// Files, folders (recursive, filtered by include/exclude globs) and "-" for standard input, in sorted path
    /// order; missing inputs are errors, files with NUL bytes in their first 8 KiB are skipped.
    /// </summary>
    public static (IReadOnlyList<InputFile> Files, IReadOnlyList<SkippedFile> Skipped) Expand(IEnumerable<string> inputs, SourceOptions options)
    {
        var paths = new List<string>();
        bool stdin = false;
        foreach (var input in inputs)
        {
            if (input == "-") { stdin = true; continue; }
            if (Directory.Exists(input))
            {
                var found = FolderFiles(input, options);
                foreach (var f in found)
                    paths.Add(System.IO.Path.GetRelativePath(Environment.CurrentDirectory, f) is var rel && !rel.StartsWith("..") ? rel : f);
            }
            else if (File.Exists(input)) paths.Add(input);
            else throw new SourceException($"{input}: no such file or folder");
        }
        paths = paths.Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();

        var files = new List<InputFile>();
        var skipped = new List<SkippedFile>();
        if (stdin)
        {
            var head = ReadHead(Console.OpenStandardInput(), out var peek);
            files.Add(Classify("-", 0, head.kind, head.text, options) with { StdinPeek = peek });
        }
        foreach (var p in paths)
        {
            long len;
            (CompressionKind kind, byte[] text) head;
            try
            {
                len = new FileInfo(p).Length;
                using var fs = new FileStream(p, FileMode.Open, FileAccess.Read, FileShare.Read, 1, FileOptions.None);
                head = ReadHead(fs, out _);
            }
            catch (UnauthorizedAccessException) { throw new SourceException($"{p}: permission denied"); }
            catch (DecoderFaultException e)
            {
                throw new SourceException($"{p}: corrupt {DescribeCompression(p)} data at the start of the file ({e.Message})");
            }
            catch (IOException e) when (e is not FileNotFoundException) { throw new SourceException($"{p}: cannot read ({e.Message})"); }
            var f = Classify(p, len, head.kind, head.text, options);
            if (f.Format != InputFormat.Parquet && Array.IndexOf(head.text, (byte)0) >= 0)
            {
                skipped.Add(new SkippedFile(p, "binary file: NUL bytes in its first 8 KiB"));
                continue;
            }
            files.Add(f);
        }
        return (files, skipped);
    }

    /// <summary>
    /// The files under <paramref name="folder"/> that the include and exclude globs select, leaving out the
    /// <see cref="SourceOptions.SkipPaths"/>. A glob without a '/' matches file names at any depth, as people
    /// expect of <c>*.txt</c>; one with a '/' is relative to the folder. Throws when nothing is selected, saying why.
    /// </summary>
    private static List<string> FolderFiles(string folder, SourceOptions options)
    {
        static IEnumerable<string> AnyDepth(IEnumerable<string> globs) =>
            globs.Select(g => g.Contains('/') ? g.TrimStart('/') : "**/" + g);
        var skip = (options.SkipPaths ?? [])
            .Select(d => System.IO.Path.TrimEndingDirectorySeparator(System.IO.Path.GetFullPath(d))).ToList();
        bool Kept(string f) =>
            !skip.Any(d => f == d || f.StartsWith(d + System.IO.Path.DirectorySeparatorChar, StringComparison.Ordinal));
        var m = new Matcher(StringComparison.Ordinal);
        if (options.Include is { Count: > 0 } inc) m.AddIncludePatterns(AnyDepth(inc)); else m.AddInclude("**/*");
        if (options.Exclude is { Count: > 0 } exc) m.AddExcludePatterns(AnyDepth(exc));
        var files = m.GetResultsInFullPath(folder).Where(Kept).ToList();
        if (files.Count > 0) return files;
        int all = Directory.EnumerateFiles(folder, "*", SearchOption.AllDirectories)
            .Count(f => Kept(System.IO.Path.GetFullPath(f)));
        string globs = string.Join(" ", (options.Include ?? []).Select(g => $"--include '{g}'")
            .Concat((options.Exclude ?? []).Select(g => $"--exclude '{g}'")));
        throw new SourceException(all == 0
            ? $"{folder}: the folder holds no files"
            : $"{folder}: none of its {all} file{(all == 1 ? "" : "s")} matched {globs}");
    }

    private static string DescribeCompression(string p)
    {
        try
        {
            using var fs = File.OpenRead(p);
            Span<byte> b = stackalloc byte[8];
            int n = fs.Read(b);
            var k = Decompression.Detect(b[..n]);
            return k == CompressionKind.None ? "" : k.ToString().ToLowerInvariant();
        }
        catch { return ""; }
    }

    /// <summary>Reads the first raw bytes and the first decompressed bytes.</summary>
    private static (CompressionKind kind, byte[] text) ReadHead(Stream s, out byte[] rawPeek)
    {
        var raw = new byte[PeekBytes];
        int n = ReadFully(s, raw);
        rawPeek = raw[..n];
        var kind = Decompression.Detect(rawPeek);
        if (kind == CompressionKind.None) return (kind, rawPeek);
        var text = new byte[PeekBytes];
        int m = 0;
        try
        {
            using var d = Decompression.Open(new PrefixStream(rawPeek, Stream.Null), kind, peek: true);
            m = ReadFully(d, text);
        }
        catch (DecoderFaultException e) when (e.InnerException is EndOfStreamException) { }
        catch (DecoderFaultException) when (n < PeekBytes) { throw; }
        catch (DecoderFaultException) { /* the peek may end mid-block; the full read reports real corruption */ }
        return (kind, text[..m]);
    }

    internal static int ReadFully(Stream s, Span<byte> buf)
    {
        int total = 0;
        while (total < buf.Length)
        {
            int r = s.Read(buf[total..]);
            if (r <= 0) break;
            total += r;
        }
        return total;
    }

    private static InputFile Classify(string path, long len, CompressionKind kind, byte[] head, SourceOptions o)
    {
        var fmt = o.Format;
        if (fmt == InputFormat.Auto)
        {
            string name = Decompression.StripExtension(System.IO.Path.GetFileName(path)).ToLowerInvariant();
            bool parquetMagic = head.Length >= 4 && head[0] == 'P' && head[1] == 'A' && head[2] == 'R' && head[3] == '1';
            if (kind == CompressionKind.None && parquetMagic) fmt = InputFormat.Parquet;
            else if (name.EndsWith(".jsonl") || name.EndsWith(".ndjson")) fmt = InputFormat.JsonLines;
            else if (name.EndsWith(".parquet")) fmt = InputFormat.Parquet;
            else if (LooksLikeJsonLines(head)) fmt = InputFormat.JsonLines;
            else fmt = InputFormat.Text;
        }
        if (fmt == InputFormat.Parquet && (kind != CompressionKind.None || path == "-"))
            throw new SourceException($"{path}: Parquet input must be an uncompressed file (Parquet compresses its own pages)");
        return new InputFile(path, len, kind, fmt);
    }

    private static bool LooksLikeJsonLines(byte[] head)
    {
        int nl = Array.IndexOf(head, (byte)'\n');
        if (nl < 0) return false;
        var line = head.AsSpan(0, nl).Trim((byte)' ').TrimEnd((byte)'\r');
        if (line.StartsWith((ReadOnlySpan<byte>)[0xEF, 0xBB, 0xBF])) line = line[3..];
        if (line.Length < 2 || line[0] != '{' || line[^1] != '}') return false;
        try { using var _ = System.Text.Json.JsonDocument.Parse(line.ToArray()); return true; }
        catch (System.Text.Json.JsonException) { return false; }
    }

    /// <summary>
    /// Work units in corpus order; an uncompressed plain text file over <paramref name="splitAbove"/> bytes is cut
    /// into up to <paramref name="parts"/> ranges at positions the tokenizer's <paramref name="cut"/> rule allows, and
    /// an uncompressed JSON Lines file at record boundaries; the cuts are found here once, so neighbouring ranges agree.
    /// </summary>
    public static IReadOnlyList<WorkUnit> Plan(IReadOnlyList<InputFile> files, RangeCut cut, int parts, long splitAbove = 16L << 20)
    {
        var units = new List<WorkUnit>();
        foreach (var f in files)
        {
            // JSON Lines records are documents of their own and never hold a raw newline: any newline is a cut
            var fileCut = f.Format == InputFormat.JsonLines ? RangeCut.AnyNewline : f.Format == InputFormat.Text ? cut : RangeCut.None;
            if (fileCut != RangeCut.None && !f.IsStdin && f.Compression == CompressionKind.None && f.Length > splitAbove && parts > 1)
            {
                int k = (int)Math.Min(parts, Math.Max(1, f.Length / Math.Max(1, splitAbove / 4)));
                long step = f.Length / k;
                var cuts = new List<long> { 0 };
                using (var fs = new FileStream(f.Path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16))
                    for (int i = 1; i < k; i++)
                    {
                        long c = FindCut(fs, Math.Max(i * step, cuts[^1]), fileCut);
                        if (c > cuts[^1] && c < f.Length) cuts.Add(c);
                    }
                cuts.Add(f.Length);
                for (int i = 0; i + 1 < cuts.Count; i++) units.Add(new WorkUnit(units.Count, f, cuts[i], cuts[i + 1]));
            }
            else units.Add(new WorkUnit(units.Count, f, 0, -1));
        }
        return units;
    }

    /// <summary>The first position p ≥ <paramref name="from"/> where a range may start: after a newline (followed by an
    /// ASCII letter, for that rule).</summary>
    internal static long FindCut(Stream s, long from, RangeCut rule)
    {
        if (from <= 0) return 0;
        s.Seek(from - 1, SeekOrigin.Begin);
        var buf = new byte[1 << 16];
        long pos = from - 1;      // position of buf[0]
        bool afterNewline = false;
        // for the strictest rule the newline must follow a printable ASCII byte (read from the byte before from - 1)
        bool strict = rule == RangeCut.NewlineAfterVisibleBeforeAsciiLetter;
        byte prev = 0;
        if (strict && from >= 2)
        {
            s.Seek(from - 2, SeekOrigin.Begin);
            prev = (byte)s.ReadByte();
        }
        while (true)
        {
            int n = s.Read(buf, 0, buf.Length);
            if (n <= 0) return s.Length;
            for (int i = 0; i < n; i++)
            {
                byte b = buf[i];
                if (afterNewline && (rule == RangeCut.AnyNewline || char.IsAsciiLetter((char)b))) return pos + i;
                afterNewline = b == (byte)'\n' && (!strict || prev is > 0x20 and < 0x7F);
                prev = b;
            }
            pos += n;
        }
    }
}
