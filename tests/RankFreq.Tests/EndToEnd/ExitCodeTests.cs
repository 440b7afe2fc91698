using RankFreq.Cli;
using RankFreq.Sources;
using Xunit;

namespace RankFreq.Tests.EndToEnd;

/// <summary>Exit codes as the developer guide states them: 1 bad input, 2 usage, 70 a bug, 130 interrupted.</summary>
public class ExitCodeTests
{
    [Fact]
    public void InputErrorsNameTheFileAndTheCliOptionForTheSetting()
    {
        using var d = new TempDir();
        File.WriteAllText(d["big.jsonl"], "{\"text\": \"" + new string('a', 5000) + "\"}\n");
        var (code, _, e) = Cli.Run("count", d["big.jsonl"], "-o", d["t.parquet"], "--max-record", "1K");
        Assert.Equal(1, code);
        Assert.Single(e.Trim().Split('\n'));
        Assert.Contains("big.jsonl:1", e);
        Assert.Contains("(see --max-record)", e);
        Assert.False(File.Exists(d["t.parquet"]));
    }

    [Fact]
    public void ABugIsExitSeventyWithOneLineAndNoStackTrace()
    {
        var err = new StringWriter();
        int code = CliApp.Fail(err, new InvalidOperationException("index went astray"));
        Assert.Equal(CliApp.Internal, code);
        Assert.Equal(70, code);
        var text = err.ToString().Trim();
        Assert.Single(text.Split('\n'));
        Assert.Contains("internal error", text);
        Assert.DoesNotContain(" at ", text); // the detail only under --verbose
    }

    [Fact]
    public void InterruptionIsExit130AndBadDataIsOne()
    {
        Assert.Equal(130, CliApp.Fail(new StringWriter(), new OperationCanceledException()));
        Assert.Equal(1, CliApp.Fail(new StringWriter(), new SourceException("x.gz: corrupt gzip data near byte 9")));
    }

    [Fact]
    public void DecoderFaultsAreBadDataNamingTheFile()
    {
        // a gzip header followed by garbage: the decoder's own fault becomes a one-line error naming the file
        using var d = new TempDir();
        var bytes = new byte[4096];
        new Random(3).NextBytes(bytes);
        bytes[0] = 0x1F; bytes[1] = 0x8B; bytes[2] = 8; bytes[3] = 0;
        File.WriteAllBytes(d["bad.gz"], bytes);
        var (code, _, e) = Cli.Run("count", d["bad.gz"], "-o", d["t.parquet"]);
        Assert.Equal(1, code);
        Assert.Contains("bad.gz", e);
        Assert.Single(e.Trim().Split('\n'));
    }
}
