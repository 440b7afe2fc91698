using System.Collections;
using System.Globalization;
using System.Text;
using System.Text.Json;

namespace RankFreq.Primitives;

/// <summary>
/// Writes the summary shapes used here (dictionaries with string keys, lists, strings, numbers, booleans, null) as
/// JSON without reflection, so the same code runs in ahead-of-time compiled builds and costs no start-up.
/// Non-finite doubles are written as the strings "NaN", "Infinity" and "-Infinity".
/// </summary>
public static class JsonText
{
    /// <summary>The JSON text of <paramref name="value"/>, indented unless <paramref name="indented"/> is false.
    /// Doubles are written in their shortest round-trip form.</summary>
    public static string Write(object? value, bool indented = true)
    {
        var buf = new System.Buffers.ArrayBufferWriter<byte>();
        using (var w = new Utf8JsonWriter(buf, new JsonWriterOptions { Indented = indented }))
            Value(w, value);
        return Encoding.UTF8.GetString(buf.WrittenSpan);
    }

    private static void Value(Utf8JsonWriter w, object? v)
    {
        switch (v)
        {
            case null: w.WriteNullValue(); break;
            case string s: w.WriteStringValue(s); break;
            case bool b: w.WriteBooleanValue(b); break;
            case int i: w.WriteNumberValue(i); break;
            case long l: w.WriteNumberValue(l); break;
            case ulong u: w.WriteNumberValue(u); break;
            case uint u: w.WriteNumberValue(u); break;
            case float f when float.IsFinite(f): w.WriteNumberValue(f); break;
            case double d when double.IsFinite(d): w.WriteNumberValue(d); break;
            case double d: w.WriteStringValue(d.ToString(CultureInfo.InvariantCulture)); break;
            case IDictionary dict:
                w.WriteStartObject();
                foreach (DictionaryEntry e in dict)
                {
                    w.WritePropertyName((string)e.Key);
                    Value(w, e.Value);
                }
                w.WriteEndObject();
                break;
            case IEnumerable items:
                w.WriteStartArray();
                foreach (var x in items) Value(w, x);
                w.WriteEndArray();
                break;
            default: throw new ArgumentException($"no JSON form for {v.GetType().Name}");
        }
    }
}
