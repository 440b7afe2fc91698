using System.Text;
using RankFreq.Primitives;
using Xunit;

namespace RankFreq.Tests.Primitives;

public class HoldBackTests
{
    [Fact]
    public void HeldTailComesBackInFrontOfTheNextBlock()
    {
        var h = new HoldBack<byte>();
        var block = "abc def"u8.ToArray();
        Assert.True(h.Join(block) == block.AsSpan()); // nothing held: the block itself, no copy
        h.Hold(block.AsSpan(4));
        Assert.Equal("def", Encoding.UTF8.GetString(h.Held));
        var joined = h.Join(" ghi"u8);
        Assert.Equal("def ghi", Encoding.UTF8.GetString(joined));
        Assert.Equal(0, h.Length);
        h.Hold(joined[4..]);                           // a tail of the joined span itself
        Assert.Equal("ghi", Encoding.UTF8.GetString(h.Join([])));
    }

    [Fact]
    public void AppendGrowsAndConsumeKeepsTheRest()
    {
        var h = new HoldBack<char>();
        var big = new string('x', 1000) + "tail";
        h.Append(big.AsSpan(0, 600));
        int n = big.AsSpan(600).ToArray().Length;
        big.AsSpan(600).CopyTo(h.AppendSpan(n));
        h.Advance(n);
        Assert.Equal(big, new string(h.Held));
        h.Consume(1000);
        Assert.Equal("tail", new string(h.Held));
    }
}
