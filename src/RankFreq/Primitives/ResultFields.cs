namespace RankFreq.Primitives;

/// <summary>Generates the machine forms of a result from its field list.</summary>
public static class ResultFields
{
    /// <summary>The fields as an ordered name → value map (JSON objects are written from this).</summary>
    public static Dictionary<string, object?> ToMap<T>(IEnumerable<ResultField<T>> fields, T item)
    {
        var map = new Dictionary<string, object?>();
        foreach (var f in fields) map[f.Name] = f.Stored(item);
        return map;
    }

    /// <summary>Several results as a list of maps.</summary>
    public static List<Dictionary<string, object?>> ToMaps<T>(IEnumerable<ResultField<T>> fields, IEnumerable<T> items)
    {
        var list = fields.ToList();
        return items.Select(i => ToMap(list, i)).ToList();
    }

    /// <summary>(label, displayed value) pairs of the fields meant for people, in list order.</summary>
    public static List<(string Label, string Value)> ForPeople<T>(IEnumerable<ResultField<T>> fields, T item) =>
        fields.Where(f => f.Shown).Select(f => (f.Label, f.Display(item))).ToList();
}
