using System.CommandLine;
using System.Globalization;
using System.Numerics;

namespace RankFreq.Cli;

/// <summary>
/// Options that take a whole number: a value that is not one (a word, a sign, a fraction, below the minimum) is a
/// usage error worded for people ("--reps expects a whole number ≥ 0, not 'abc'") instead of a .NET type name.
/// </summary>
internal static class WholeNumber
{
    public static Option<T> Option<T>(string name, long min, string description, T? defaultValue = null,
        params string[] aliases) where T : struct, IBinaryInteger<T>
    {
        var o = new Option<T>(name, aliases)
        {
            Description = description,
            CustomParser = r =>
            {
                string s = r.Tokens.Count > 0 ? r.Tokens[0].Value : "";
                if (T.TryParse(s.Replace("_", ""), NumberStyles.AllowThousands, CultureInfo.InvariantCulture, out var v)
                    && long.CreateSaturating(v) >= min)
                    return v;
                r.AddError($"{name} expects a whole number ≥ {min}, not '{s}'");
                return default;
            },
        };
        if (defaultValue is { } d) o.DefaultValueFactory = _ => d;
        return o;
    }
}
