using System.Globalization;
using Parquet;
using Parquet.Schema;
using RankFreq.Counting;

namespace RankFreq.Storage;

/// <summary>Footer metadata of a count table (keys under the prefix <c>rankfreq.</c>). A <c>CreatedUtc</c> of
/// <c>default</c> means no creation time is recorded (a reproducible table: the same inputs give the same bytes).</summary>
public sealed record CountTableMetadata(
    string Tokenizer,
    string Normalization,
    string CaseRule,
    long Tokens,
    long Types,
    IReadOnlyList<InputInfo> Inputs,
    string ToolVersion,
    DateTime CreatedUtc,
    long RedactedBelow)
{
    /// <summary>The version of this library.</summary>
    public static string CurrentVersion => typeof(CountTableMetadata).Assembly.GetName().Version?.ToString(3) ?? "0";

    /// <summary>The metadata of a table written now from a counting run.</summary>
    public static CountTableMetadata From(CountSummary s, long redactBelow) =>
        new(s.TokenizerSpec, s.Normalization, s.CaseRule, s.Tokens, s.Types, s.Inputs, CurrentVersion, DateTime.UtcNow, redactBelow);

    /// <summary>The same metadata without a creation time, so that the table's bytes depend on its content only.</summary>
    public CountTableMetadata WithoutCreationTime() => this with { CreatedUtc = default };

    internal Dictionary<string, string> ToFooter()
    {
        var footer = Footer();
        if (CreatedUtc == default) footer.Remove("rankfreq.created_utc");
        return footer;
    }

    private Dictionary<string, string> Footer() => new()
    {
        ["rankfreq.tokenizer"] = Tokenizer,
        ["rankfreq.normalization"] = Normalization,
        ["rankfreq.case"] = CaseRule,
        ["rankfreq.tokens"] = Tokens.ToString(CultureInfo.InvariantCulture),
        ["rankfreq.types"] = Types.ToString(CultureInfo.InvariantCulture),
        ["rankfreq.inputs"] = InputsJson(),
        ["rankfreq.version"] = ToolVersion,
        ["rankfreq.created_utc"] = CreatedUtc.ToString("yyyy-MM-ddTHH:mm:ssZ", CultureInfo.InvariantCulture),
        ["rankfreq.redacted_below"] = RedactedBelow.ToString(CultureInfo.InvariantCulture),
    };

    /// <summary>The inputs as a JSON array of {path, bytes}, written directly (no reflection-based serializer on this path).</summary>
    private string InputsJson()
    {
        var buf = new System.Buffers.ArrayBufferWriter<byte>();
        using (var w = new System.Text.Json.Utf8JsonWriter(buf))
        {
            w.WriteStartArray();
            foreach (var i in Inputs)
            {
                w.WriteStartObject();
                w.WriteString("path", i.Path);
                w.WriteNumber("bytes", i.Bytes);
                w.WriteEndObject();
            }
            w.WriteEndArray();
        }
        return System.Text.Encoding.UTF8.GetString(buf.WrittenSpan);
    }

    internal static CountTableMetadata FromFooter(IReadOnlyDictionary<string, string> f, string path)
    {
        try
        {
            return Parse(f, path);
        }
        catch (Exception e) when (e is FormatException or OverflowException or System.Text.Json.JsonException
            or KeyNotFoundException or InvalidOperationException or ArgumentException)
        {
            // a damaged footer whose Thrift structure survived: the values themselves are garbled
            throw new StorageException($"{path}: damaged count table footer (rankfreq.* metadata: {e.Message.Split('\n')[0]})", e);
        }
    }

    private static CountTableMetadata Parse(IReadOnlyDictionary<string, string> f, string path)
    {
        string Get(string k) => f.TryGetValue("rankfreq." + k, out var v) && v is not null
            ? v
            : throw new StorageException($"{path}: not a RankFreq count table (footer key rankfreq.{k} missing)");
        var inputs = new List<InputInfo>();
        if (f.TryGetValue("rankfreq.inputs", out var js))
            using (var doc = System.Text.Json.JsonDocument.Parse(js))
                foreach (var e in doc.RootElement.EnumerateArray())
                    inputs.Add(new InputInfo(e.GetProperty("path").GetString() ?? "", e.GetProperty("bytes").GetInt64()));
        return new CountTableMetadata(Get("tokenizer"), Get("normalization"), Get("case"),
            long.Parse(Get("tokens"), CultureInfo.InvariantCulture), long.Parse(Get("types"), CultureInfo.InvariantCulture), inputs,
            f.GetValueOrDefault("rankfreq.version", "?"),
            f.TryGetValue("rankfreq.created_utc", out var created)
                ? DateTime.Parse(created, CultureInfo.InvariantCulture, DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal)
                : default,
            long.Parse(f.GetValueOrDefault("rankfreq.redacted_below", "0"), CultureInfo.InvariantCulture));
    }
}
