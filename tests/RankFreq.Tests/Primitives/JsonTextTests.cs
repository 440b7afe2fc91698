using System.Text.Json;
using RankFreq.Primitives;
using Xunit;

namespace RankFreq.Tests.Primitives;

public class JsonTextTests
{
    [Fact]
    public void WritesTheSummaryShapesAsStandardJson()
    {
        // Read back with System.Text.Json's own parser (the reference): nesting, every number type, escapes,
        // null, and non-finite doubles as named strings.
        var doc = new Dictionary<string, object?>
        {
            ["s"] = "quote \" backslash \\ é 中 \n",
            ["i"] = 42,
            ["l"] = 1L << 40,
            ["u"] = ulong.MaxValue,
            ["d"] = 0.1,
            ["neg"] = -2.5e-300,
            ["nan"] = double.NaN,
            ["inf"] = double.PositiveInfinity,
            ["none"] = null,
            ["t"] = true,
            ["list"] = new List<object?> { 1, "two", null, new Dictionary<string, object?> { ["x"] = 3.0 } },
            ["arr"] = new[] { "a", "b" },
        };
        using var j = JsonDocument.Parse(JsonText.Write(doc));
        var r = j.RootElement;
        Assert.Equal("quote \" backslash \\ é 中 \n", r.GetProperty("s").GetString());
        Assert.Equal(42, r.GetProperty("i").GetInt32());
        Assert.Equal(1L << 40, r.GetProperty("l").GetInt64());
        Assert.Equal(ulong.MaxValue, r.GetProperty("u").GetUInt64());
        Assert.Equal(0.1, r.GetProperty("d").GetDouble());
        Assert.Equal(-2.5e-300, r.GetProperty("neg").GetDouble());
        Assert.Equal("NaN", r.GetProperty("nan").GetString());
        Assert.Equal("Infinity", r.GetProperty("inf").GetString());
        Assert.Equal(JsonValueKind.Null, r.GetProperty("none").ValueKind);
        Assert.True(r.GetProperty("t").GetBoolean());
        Assert.Equal(4, r.GetProperty("list").GetArrayLength());
        Assert.Equal(3.0, r.GetProperty("list")[3].GetProperty("x").GetDouble());
        Assert.Equal(["a", "b"], r.GetProperty("arr").EnumerateArray().Select(e => e.GetString()));
    }

    [Fact]
    public void RefusesAShapeItDoesNotKnow() =>
        Assert.Throws<ArgumentException>(() => JsonText.Write(new Dictionary<string, object?> { ["when"] = DateTime.UnixEpoch }));
}
