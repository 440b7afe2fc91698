using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Primitives;

namespace RankFreq.Reporting;

/// <summary>The JSON document of a contrast (<c>contrast --json</c> and <c>summary.json</c>), from the field lists of <see cref="ContrastFields"/>.</summary>
public static class ContrastSummary
{
    /// <summary>
    /// <c>groups</c> (each: the raw fields, and <c>matched</c> with the size-matched figures or null), <c>pairs</c>
    /// (each: <c>a</c>, <c>b</c>, <c>basis</c>, the headline difference, <c>raw</c> and <c>matched</c>), the findings,
    /// cautions, figure list with size sensitivity, counting figures and settings.
    /// </summary>
    public static Dictionary<string, object?> Build(ContrastResult r, CountSummary count, string groupKey, long badGroupValues,
        IReadOnlyList<string> cautions)
    {
        var o = r.Options;
        return new Dictionary<string, object?>
        {
            ["group_key"] = groupKey,
            ["tokenizer"] = count.TokenizerSpec,
            ["tokens"] = count.Tokens,
            ["records"] = count.Records,
            ["missing_field"] = count.MissingField,
            ["bad_group_values"] = badGroupValues,
            ["target_tokens"] = r.TargetTokens,
            ["groups"] = r.Groups.Select(g =>
            {
                var d = ResultFields.ToMap(ContrastFields.Group, g);
                d["matched"] = g.Matched is { } m ? ResultFields.ToMap(ContrastFields.Matched, m) : null;
                return d;
            }).ToList(),
            ["pairs"] = r.Pairs.Select(p =>
            {
                var d = new Dictionary<string, object?> { ["a"] = p.A, ["b"] = p.B, ["basis"] = p.Basis };
                foreach (var kv in ResultFields.ToMap(ContrastFields.Difference, p.Headline)) d[kv.Key] = kv.Value;
                d["raw"] = ResultFields.ToMap(ContrastFields.Difference, p.Raw);
                d["matched"] = p.Matched is { } m ? ResultFields.ToMap(ContrastFields.Difference, m) : null;
                return d;
            }).ToList(),
            ["findings"] = r.Findings.ToList(),
            ["cautions"] = cautions.ToList(),
            ["figures"] = ContrastFigures.All.Select(f => new Dictionary<string, object?>
            {
                ["name"] = f.Name,
                ["description"] = f.Description,
                ["size_sensitive"] = f.SizeSensitive,
            }).ToList(),
            ["settings"] = new Dictionary<string, object?>
            {
                ["reps"] = o.Reps,
                ["boot_reps"] = o.BootReps,
                ["thin_reps"] = o.ThinReps,
                ["matched"] = o.Matched,
                ["min_tail"] = o.MinTail,
                ["renyi_order"] = o.RenyiOrder,
                ["level"] = o.Level,
                ["seed"] = o.Seed,
                ["threads"] = o.EffectiveThreads,
            },
            ["seconds_counting"] = Math.Round(count.Seconds, 3),
            ["seconds_fitting"] = Math.Round(r.SecondsFitting, 3),
            ["seconds_matching"] = Math.Round(r.SecondsMatching, 3),
            ["inputs"] = count.Inputs.Select(i => new Dictionary<string, object> { ["path"] = i.Path, ["bytes"] = i.Bytes }).ToList(),
            ["version"] = Storage.CountTableMetadata.CurrentVersion,
        };
    }
}
