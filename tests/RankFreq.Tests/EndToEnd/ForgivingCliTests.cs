using System.Diagnostics;
using System.Text;
using System.Text.Json;
using System.Text.RegularExpressions;
using RankFreq.Cli;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.EndToEnd;

/// <summary>
/// The command line as a new user meets it: slips of the keyboard get a usage line with a suggestion (exit 2),
/// inputs in the shapes people have at hand are read, and every refusal names the file and the place.
/// </summary>
public class ForgivingCliTests
{
    /// <summary>60,000 tokens drawn from 3,000 invented words with Zipf-like weights (seeded).</summary>
    private static string ZipfText(int tokens = 60_000, int seed = 3)
    {
        var rng = new Random(seed);
        var cum = new double[3000];
        double s = 0;
        for (int i = 0; i < cum.Length; i++) cum[i] = s += Math.Pow(i + 1, -1.1);
        var sb = new StringBuilder();
        for (int t = 0; t < tokens; t++)
        {
            int k = Array.BinarySearch(cum, rng.NextDouble() * s);
            sb.Append("w").Append(k < 0 ? ~k : k).Append(t % 20 == 19 ? '\n' : ' ');
        }
        return sb.ToString();
    }

    private static JsonElement Json(string text) => JsonDocument.Parse(text).RootElement.Clone();

    // ---- misspelt options and commands -------------------------------------------------------------------------

    [Theory]
    [InlineData("--thread", "1", "--threads")]
    [InlineData("--tokeniser", "words", "--tokenizer")]
    [InlineData("--memroy", "1G", "--memory")]
    public void A_misspelt_option_is_a_usage_error_naming_the_real_one(string typo, string value, string meant)
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two");
        var (code, _, e) = Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], typo, value);
        Assert.Equal(CliApp.Usage, code);
        Assert.Contains($"unknown option {typo} (did you mean {meant}?)", e);
        Assert.DoesNotContain("no such file", e);
        Assert.False(File.Exists(d["t.parquet"]));
    }

    [Fact]
    public void A_misspelt_fit_option_is_caught_before_its_value_is_taken_for_an_input()
    {
        using var d = new TempDir();
        File.WriteAllText(d["c.txt"], "5\n3\n");
        var (code, _, e) = Cli.Run("fit", d["c.txt"], "--repz", "5");
        Assert.Equal(CliApp.Usage, code);
        Assert.StartsWith("rankfreq: unknown option --repz (did you mean --reps?)", e);
        Assert.Contains("rankfreq fit --help", e);
    }

    [Fact]
    public void A_name_after_double_dash_is_an_input_even_if_it_starts_with_a_dash()
    {
        using var d = new TempDir();
        var (code, _, e) = Cli.Run("count", "-o", d["t.parquet"], "--", "-no-such-file.txt");
        Assert.Equal(CliApp.Error, code);
        Assert.Contains("-no-such-file.txt: no such file or folder", e);
        Assert.Equal(CliApp.Usage, Cli.Run("count", "-o", d["t.parquet"], "-no-such-file.txt").Code);
    }

    [Fact]
    public void A_misspelt_command_gets_one_line_with_the_nearest_command()
    {
        var (code, _, e) = Cli.Run("cout", "x.txt");
        Assert.Equal(CliApp.Usage, code);
        var lines = e.Trim().Split('\n');
        Assert.Equal("rankfreq: unknown command 'cout'; did you mean 'count'?", lines[0]);
        Assert.Equal(2, lines.Length);                       // the message and where to look, no parser noise
        Assert.Contains("did you mean 'profile'?", Cli.Run("proflie").Err);
        var far = Cli.Run("frobnicate");
        Assert.Equal(CliApp.Usage, far.Code);
        Assert.Contains("the commands are count, merge, fit, ", far.Err);
        foreach (var verb in new[] { "profile", "contrast", "tokshift", "forecast" }) Assert.Contains(verb, far.Err);
        Assert.Equal(CliApp.Usage, Cli.Run().Code);
    }

    [Theory]
    [InlineData("--reps", "abc", "--reps expects a whole number ≥ 0")]
    [InlineData("--seed", "-1", "--seed expects a whole number ≥ 0")]
    [InlineData("--xmin", "2.5", "--xmin expects a whole number ≥ 1")]
    [InlineData("--min-tail", "1", "--min-tail expects a whole number ≥ 2")]
    [InlineData("--threads", "-2", "--threads expects a whole number ≥ 0")]
    public void A_number_option_says_what_it_expects(string option, string value, string message)
    {
        using var d = new TempDir();
        File.WriteAllText(d["c.txt"], "5\n3\n");
        var (code, _, e) = Cli.Run("fit", d["c.txt"], option, value);
        Assert.Equal(CliApp.Usage, code);
        Assert.Contains(message, e);
        Assert.DoesNotContain("System.", e);
    }

    [Fact]
    public void An_unknown_tokenizer_is_a_usage_error_but_a_missing_vocabulary_file_is_an_input_error()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "words here");
        var (code, _, e) = Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "-t", "foo");
        Assert.Equal(CliApp.Usage, code);
        Assert.Contains("unknown tokenizer 'foo'", e);
        Assert.Equal(CliApp.Error, Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "-t", "wordpiece:nope.txt").Code);
    }

    [Fact]
    public void Threads_zero_means_all_cores_and_the_help_says_so()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two");
        var (code, o, e) = Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "--threads", "0", "--json");
        Assert.True(code == 0, e);
        Assert.Equal(Environment.ProcessorCount, Json(o).GetProperty("threads").GetInt32());
        Assert.Matches(@"--threads\s.*0 or left out: all cores", Cli.Run("count", "--help").Out);
    }

    // ---- fit inputs ------------------------------------------------------------------------------------------

    [Fact]
    public void Fit_reads_count_token_lines_with_a_header_as_sort_uniq_c_prints_them()
    {
        // POSIX uniq -c: each line is preceded by its count and a space; our sort | uniq -c is rebuilt here
        using var d = new TempDir();
        var counts = ZipfText().Split([' ', '\n'], StringSplitOptions.RemoveEmptyEntries)
            .GroupBy(w => w).Select(g => (Word: g.Key, Count: g.Count())).OrderByDescending(x => x.Count).ToList();
        File.WriteAllLines(d["plain.txt"], counts.Select(x => x.Count.ToString()));
        File.WriteAllLines(d["uniq.txt"], counts.Select(x => $"{x.Count,7} {x.Word}").Prepend("count token"));
        var plain = Cli.Run("fit", d["plain.txt"], "--reps", "0", "--ci-reps", "0", "--alternatives", "none", "--json");
        var (code, o, e) = Cli.Run("fit", d["uniq.txt"], "--reps", "0", "--ci-reps", "0", "--alternatives", "none", "--json");
        Assert.True(code == 0, e);
        Assert.Contains("uniq.txt:1: 'count token' read as a header and skipped", e);
        Assert.Equal(counts.Count, Json(o).GetProperty("n_types").GetInt64());
        Assert.Equal(Json(plain.Out).GetProperty("alpha").GetDouble(), Json(o).GetProperty("alpha").GetDouble());
    }

    [Fact]
    public void Fit_adds_the_counts_of_a_token_listed_twice_and_tells_so()
    {
        using var d = new TempDir();
        // uniq -c of unsorted input lists a token once per run; "42" is a token here, not a number of types
        File.WriteAllText(d["u.txt"], "   3 the\n   2 42\n   4 the\n   1 cat\n");
        var (code, o, e) = Cli.Run("fit", d["u.txt"], "--reps", "0", "--ci-reps", "0", "--alternatives", "none", "--json");
        Assert.True(code == 0, e);
        Assert.Equal(3, Json(o).GetProperty("n_types").GetInt64());
        Assert.Contains("'the' on lines 1 and 3", e);
        // with no token that is not a number, two numbers are still a spectrum line: value 3 held by 2 types
        File.WriteAllText(d["s.txt"], "3 2\n1 5\n");
        var s = Cli.Run("fit", d["s.txt"], "--reps", "0", "--ci-reps", "0", "--alternatives", "none", "--json");
        Assert.Equal(7, Json(s.Out).GetProperty("n_types").GetInt64());
    }

    [Fact]
    public void Fit_refuses_a_binary_file_without_echoing_it()
    {
        using var d = new TempDir();
        var bytes = new byte[4096];
        new Random(1).NextBytes(bytes);
        "\u007fELF"u8.ToArray().CopyTo(bytes, 0);
        bytes[10] = 0;
        File.WriteAllBytes(d["prog"], bytes);
        var (code, _, e) = Cli.Run("fit", d["prog"]);
        Assert.Equal(CliApp.Error, code);
        Assert.Equal($"rankfreq: error: {d["prog"]}: not a text list of counts (binary file)", e.Trim());
    }

    [Fact]
    public void Fit_reads_the_spectrum_table_a_profile_writes_with_the_same_result_as_its_count_table()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], ZipfText());
        var p = Cli.Run("profile", d["a.txt"], "-o", d["out"], "--reps", "0", "--ci-reps", "0", "--alternatives", "none", "-q");
        Assert.True(p.Code == 0, p.Err);
        string[] fit = ["--reps", "0", "--ci-reps", "0", "--alternatives", "none", "--json"];
        var fromSpectrum = Cli.Run([.. new[] { "fit", Path.Combine(d["out"], "spectrum.parquet") }, .. fit]);
        var fromCounts = Cli.Run([.. new[] { "fit", Path.Combine(d["out"], "counts.parquet") }, .. fit]);
        Assert.True(fromSpectrum.Code == 0, fromSpectrum.Err);
        foreach (var k in new[] { "alpha", "xmin", "n_tail", "n_types" })
            Assert.Equal(Json(fromCounts.Out).GetProperty(k).GetRawText(), Json(fromSpectrum.Out).GetProperty(k).GetRawText());
        Assert.Contains("spectrum table", Cli.Run("fit", Path.Combine(d["out"], "spectrum.parquet"), "--reps", "0", "--ci-reps", "0").Out);
    }

    [Fact]
    public void Fit_json_has_null_where_a_value_is_undefined_integer_xmin_bounds_and_snake_case_statuses()
    {
        using var d = new TempDir();
        File.WriteAllText(d["few.txt"], "5\n3\n1\n");
        var few = Json(Cli.Run("fit", d["few.txt"], "--reps", "0", "--ci-reps", "0", "--json").Out);
        Assert.Equal(JsonValueKind.Null, few.GetProperty("xmin").ValueKind);
        Assert.Equal(JsonValueKind.Null, few.GetProperty("alpha").ValueKind);
        Assert.Equal("too_few_points", few.GetProperty("status").GetString());

        File.WriteAllText(d["a.txt"], ZipfText());
        var p = Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "-q");
        Assert.True(p.Code == 0, p.Err);
        var ok = Json(Cli.Run("fit", d["t.parquet"], "--reps", "0", "--ci-reps", "40", "--alternatives", "none", "--json").Out);
        Assert.Equal("ok", ok.GetProperty("status").GetString());
        foreach (var k in new[] { "xmin", "xmin_lo", "xmin_hi", "n_tail", "n_types" })
            Assert.True(ok.GetProperty(k).TryGetInt64(out _), $"{k} = {ok.GetProperty(k).GetRawText()} is not an integer");
        Assert.True(ok.GetProperty("xmin_lo").GetInt64() <= ok.GetProperty("xmin_hi").GetInt64());
    }

    [Fact]
    public void Fit_progress_shows_time_elapsed_and_left()
    {
        // 64 done at the stage's first report, 564 ten seconds later: 50 a second, so the other 1,936 take 38.7 s
        var p = new FitProgress("goodness of fit", 564, 2500);
        string line = FitConsoleProgress.Line(p, TimeSpan.FromSeconds(75), TimeSpan.FromSeconds(10), from: 64);
        Assert.Equal("goodness of fit: 564 of 2,500 replicates, 1:15 elapsed, about 0:38 left", line);
        Assert.DoesNotContain("left", FitConsoleProgress.Line(p with { Done = 64 }, TimeSpan.Zero, TimeSpan.Zero, from: 64));
    }

    // ---- corpus inputs ---------------------------------------------------------------------------------------

    [Fact]
    public void Include_without_a_slash_matches_at_any_depth_and_no_match_is_said()
    {
        using var d = new TempDir();
        Directory.CreateDirectory(d["corpus/sub/deeper"]);
        File.WriteAllText(d["corpus/top.txt"], "one two");
        File.WriteAllText(d["corpus/sub/deeper/low.txt"], "three four five");
        File.WriteAllText(d["corpus/sub/notes.md"], "six");
        var (code, o, e) = Cli.Run("count", d["corpus"], "--include", "*.txt", "-o", d["t.parquet"], "--json");
        Assert.True(code == 0, e);
        Assert.Equal(5, Json(o).GetProperty("tokens").GetInt64());
        var sub = Cli.Run("count", d["corpus"], "--include", "sub/**/*.txt", "-o", d["t.parquet"], "--json");
        Assert.Equal(3, Json(sub.Out).GetProperty("tokens").GetInt64());
        var none = Cli.Run("count", d["corpus"], "--include", "*.csv", "-o", d["t.parquet"]);
        Assert.Equal(CliApp.Error, none.Code);
        Assert.Contains("none of its 3 files matched --include '*.csv'", none.Err);
    }

    [Fact]
    public void An_empty_shard_says_shards_split_by_file()
    {
        using var d = new TempDir();
        File.WriteAllText(d["one.txt"], "one two");
        var (code, _, e) = Cli.Run("count", d["one.txt"], "--shard", "2/2", "-o", d["t.parquet"]);
        Assert.Equal(CliApp.Error, code);
        Assert.Contains("shard 2/2 has no files: shards split by file", e);
        Assert.Equal(0, Cli.Run("count", d["one.txt"], "--shard", "1/2", "-o", d["t.parquet"], "-q").Code);
    }

    [Fact]
    public void A_text_field_no_record_has_is_counted_and_the_fields_seen_are_listed()
    {
        using var d = new TempDir();
        File.WriteAllLines(d["r.jsonl"], Enumerable.Range(0, 4200)
            .Select(i => $"{{\"id\":{i},\"set\":\"a\",\"year\":{1900 + i % 50},\"text\":\"w{i % 7} x\"}}"));
        var (code, _, e) = Cli.Run("count", d["r.jsonl"], "--text-field", "body", "-o", d["t.parquet"]);
        Assert.Equal(CliApp.Error, code);
        Assert.Contains("4,200 records lack a text field 'body' (fields seen: id, set, year, text)", e);
    }

    [Fact]
    public void A_strict_json_error_gives_the_files_own_line_and_column()
    {
        using var d = new TempDir();
        File.WriteAllText(d["bad.jsonl"], "{\"text\": \"fine\"}\n{\"text\": \"ok\"}\n{\"text\": \"x\",, \"n\": 1}\n");
        var (code, _, e) = Cli.Run("count", d["bad.jsonl"], "--strict", "-o", d["t.parquet"]);
        Assert.Equal(CliApp.Error, code);
        var m = Regex.Match(e, @"bad\.jsonl:3:(\d+): malformed JSON record \(");
        Assert.True(m.Success, e);
        // {"text": "x",, — the stray comma is the 14th character of the line
        Assert.Equal(14, int.Parse(m.Groups[1].Value));
        Assert.DoesNotContain("LineNumber", e);
        Assert.DoesNotContain("BytePositionInLine", e);
    }

    // ---- outputs ---------------------------------------------------------------------------------------------

    [Fact]
    public void Merging_a_table_twice_warns_and_the_summary_counts_tables_in_words()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two");
        Assert.Equal(0, Cli.Run("count", d["a.txt"], "-o", d["b.parquet"], "-q").Code);
        var (code, o, e) = Cli.Run("merge", d["b.parquet"], d["b.parquet"], "-o", d["m.parquet"]);
        Assert.True(code == 0, e);
        Assert.Contains("b.parquet is given 2 times; its counts are added 2 times", e);
        Assert.Contains("merged 2 tables: 6 tokens", o);
        Assert.Contains("merged 1 table: 3 tokens", Cli.Run("merge", d["b.parquet"], "-o", d["m1.parquet"]).Out);
    }

    [Fact]
    public void A_count_table_named_other_than_parquet_is_written_with_a_warning()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two");
        var (code, _, e) = Cli.Run("count", d["a.txt"], "-o", d["x.txt"], "-q");
        Assert.Equal(0, code);
        Assert.Contains("x.txt: the count table is written as Parquet, but the name does not end in .parquet", e);
        Assert.Equal("PAR1"u8.ToArray(), File.ReadAllBytes(d["x.txt"])[..4]);
        Assert.DoesNotContain("warning", Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "-q").Err);
    }

    [Fact]
    public void A_second_profile_into_a_folder_inside_its_input_leaves_its_own_output_out()
    {
        using var d = new TempDir();
        Directory.CreateDirectory(d["corpus"]);
        File.WriteAllText(d["corpus/a.txt"], ZipfText(4000));
        string outDir = Path.Combine(d["corpus"], "out");
        string[] args = ["profile", d["corpus"], "-o", outDir, "--reps", "0", "--ci-reps", "0", "--alternatives", "none", "--json"];
        var first = Cli.Run(args);
        Assert.True(first.Code == 0, first.Err);
        var second = Cli.Run(args);
        Assert.True(second.Code == 0, second.Err);
        Assert.Equal(Json(first.Out).GetProperty("tokens").GetInt64(), Json(second.Out).GetProperty("tokens").GetInt64());
        Assert.Single(Json(second.Out).GetProperty("inputs").EnumerateArray());
    }

    [Fact]
    public void A_count_table_written_into_the_folder_it_counts_is_not_counted_the_next_time()
    {
        using var d = new TempDir();
        Directory.CreateDirectory(d["corpus"]);
        File.WriteAllText(d["corpus/a.txt"], "one two two");
        string table = Path.Combine(d["corpus"], "t.parquet");
        var first = Cli.Run("count", d["corpus"], "-o", table, "--json");
        Assert.True(first.Code == 0, first.Err);
        var second = Cli.Run("count", d["corpus"], "-o", table, "--json");
        Assert.True(second.Code == 0, second.Err);
        Assert.Equal(1, Json(second.Out).GetProperty("files").GetInt32());
        Assert.Equal(3, Json(second.Out).GetProperty("tokens").GetInt64());
    }

    // ---- standard input (a separate process: the in-process runner cannot feed it) -----------------------------

    [Fact]
    public void Fit_dash_reads_standard_input_as_count_does()
    {
        using var d = new TempDir();
        var counts = string.Join("\n", Enumerable.Range(1, 300).Select(i => (int)(5000 / Math.Pow(i, 1.1)) + 1));
        File.WriteAllText(d["c.txt"], counts);
        string[] fit = ["--reps", "0", "--ci-reps", "0", "--alternatives", "none", "--json"];
        var (code, o, e) = Process(Encoding.UTF8.GetBytes(counts), ["fit", "-", .. fit]);
        Assert.True(code == 0, e);
        var fromFile = Cli.Run(["fit", d["c.txt"], .. fit]);
        Assert.Equal(Json(fromFile.Out).GetProperty("alpha").GetDouble(), Json(o).GetProperty("alpha").GetDouble());
        Assert.Equal(300, Json(o).GetProperty("n_types").GetInt64());
    }

    [Fact]
    public void Profile_dash_is_titled_standard_input_with_its_real_size()
    {
        using var d = new TempDir();
        var text = Encoding.UTF8.GetBytes(ZipfText(5000));
        var (code, o, e) = Process(text, ["profile", "-", "-o", d["out"], "--reps", "0", "--ci-reps", "0", "--alternatives", "none", "--json"]);
        Assert.True(code == 0, e);
        var input = Assert.Single(Json(o).GetProperty("inputs").EnumerateArray());
        Assert.Equal(text.Length, input.GetProperty("bytes").GetInt64());
        string html = File.ReadAllText(Path.Combine(d["out"], "report.html"));
        Assert.Contains("<title>standard input", html);
        Assert.Contains($"standard input ({text.Length:N0} bytes)", html);
    }

    // ---- help and completion ---------------------------------------------------------------------------------

    [Theory]
    [InlineData("count")]
    [InlineData("merge")]
    [InlineData("fit")]
    [InlineData("profile")]
    [InlineData("tokenizers")]
    [InlineData("completion")]
    public void Every_command_help_ends_with_examples_of_that_command(string verb)
    {
        var (code, o, _) = Cli.Run(verb, "--help");
        Assert.Equal(0, code);
        int at = o.IndexOf("Examples:", StringComparison.Ordinal);
        Assert.True(at > 0, o);
        Assert.Contains($"rankfreq {verb}", o[at..]);
    }

    [Fact]
    public void Completion_scripts_list_every_command_and_option_and_bash_parses_its_own()
    {
        var (code, bash, e) = Cli.Run("completion", "bash");
        Assert.True(code == 0, e);
        foreach (var w in new[] { "count", "merge", "fit", "profile", "tokenizers", "--threads", "--text-field", "--ci-reps", "o200k_base" })
            Assert.Contains(w, bash);
        var zsh = Cli.Run("completion", "zsh").Out;
        Assert.Contains("bashcompinit", zsh);
        Assert.EndsWith(bash[bash.IndexOf("_rankfreq()", StringComparison.Ordinal)..], zsh);
        var fish = Cli.Run("completion", "fish").Out;
        Assert.Contains("__fish_seen_subcommand_from fit' -l reps", fish);
        Assert.Equal(CliApp.Usage, Cli.Run("completion", "powershell").Code);

        using var d = new TempDir();
        File.WriteAllText(d["c.bash"], bash);
        // bash -n reads the script without running it: a syntax error fails here (common practice)
        var (bc, _, be) = Run("bash", ["-n", d["c.bash"]], null);
        Assert.True(bc == 0, be);
        // and the function completes: "rankfreq fit --re" offers --reps
        File.WriteAllText(d["t.bash"], $"source {d["c.bash"]}\nCOMP_WORDS=(rankfreq fit --re); COMP_CWORD=2; _rankfreq; echo \"${{COMPREPLY[*]}}\"\n");
        var (tc, to, te) = Run("bash", [d["t.bash"]], null);
        Assert.True(tc == 0, te);
        Assert.Equal("--reps", to.Trim());
    }

    private static (int Code, string Out, string Err) Process(byte[] stdin, string[] args) =>
        Run(Path.Combine(AppContext.BaseDirectory, "rankfreq"), args, stdin);

    private static (int Code, string Out, string Err) Run(string exe, string[] args, byte[]? stdin)
    {
        var psi = new ProcessStartInfo(exe) { RedirectStandardInput = true, RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var a in args) psi.ArgumentList.Add(a);
        using var p = System.Diagnostics.Process.Start(psi)!;
        var o = p.StandardOutput.ReadToEndAsync();
        var e = p.StandardError.ReadToEndAsync();
        if (stdin is not null) p.StandardInput.BaseStream.Write(stdin);
        p.StandardInput.Close();
        p.WaitForExit();
        return (p.ExitCode, o.Result, e.Result);
    }
}
