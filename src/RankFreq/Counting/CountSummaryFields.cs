using RankFreq.Primitives;

namespace RankFreq.Counting;

/// <summary>The figures of a counting run, listed once for every output.</summary>
public static class CountSummaryFields
{
    /// <summary>The counting figures.</summary>
    public static readonly IReadOnlyList<ResultField<CountSummary>> All =
    [
        new("tokenizer", FieldKind.Text, s => s.TokenizerSpec, "tokenizer"),
        new("tokens", FieldKind.Integer, s => s.Tokens, "tokens"),
        new("types", FieldKind.Integer, s => s.Types, "types"),
        new("bytes", FieldKind.Integer, s => s.StoredBytes, "bytes read"),
        new("text_bytes", FieldKind.Integer, s => s.TextBytes, "bytes of text", Shown: false),
        new("replaced_bytes", FieldKind.Integer, s => s.ReplacedBytes, "invalid UTF-8 bytes replaced"),
        new("records", FieldKind.Integer, s => s.Records, "records", Shown: false),
        new("malformed_records", FieldKind.Integer, s => s.MalformedRecords, "malformed records skipped"),
        new("missing_field", FieldKind.Integer, s => s.MissingField, "records without the text field"),
        new("skipped_files", FieldKind.Nested, s => s.SkippedFiles.Select(f => new Dictionary<string, object?>
            { ["path"] = f.Path, ["reason"] = f.Reason }).ToList(), "skipped files", Shown: false),
        new("files", FieldKind.Integer, s => s.Inputs.Count, "files"),
        new("threads", FieldKind.Integer, s => s.Threads, "threads"),
        new("spilled_runs", FieldKind.Integer, s => s.SpilledRuns, "runs spilled to disk"),
        new("seconds", FieldKind.Real, s => Math.Round(s.Seconds, 3), "seconds", "F2"),
    ];
}
