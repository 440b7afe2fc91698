namespace RankFreq.Fitting;

/// <summary>The one written form of a <see cref="FitStatus"/>: snake_case, the same in JSON, Parquet and the console.</summary>
public static class FitStatusNames
{
    /// <summary>"ok", "too_few_points", "all_equal", …: the enum name in snake_case.</summary>
    public static string Of(FitStatus status)
    {
        var name = status.ToString();
        var sb = new System.Text.StringBuilder(name.Length + 4);
        for (int i = 0; i < name.Length; i++)
        {
            if (char.IsUpper(name[i]) && i > 0) sb.Append('_');
            sb.Append(char.ToLowerInvariant(name[i]));
        }
        return sb.ToString();
    }
}
