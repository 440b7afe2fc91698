using System.Collections;

namespace RankFreq.Comparison;

/// <summary>
/// The vocabulary entries a text never produced, in id order, with each readable form made only when the entry is
/// read: a run that writes no review list (no output folder) skips decoding hundreds of thousands of display strings.
/// </summary>
/// <param name="ids">Unseen ids, increasing.</param>
/// <param name="display">The tokenizer's readable form of an id.</param>
public sealed class UnseenList(int[] ids, Func<int, string> display) : IReadOnlyList<UnseenEntry>
{
    /// <inheritdoc/>
    public int Count => ids.Length;

    /// <inheritdoc/>
    public UnseenEntry this[int index] => new(ids[index], display(ids[index]));

    /// <inheritdoc/>
    public IEnumerator<UnseenEntry> GetEnumerator()
    {
        foreach (int id in ids) yield return new UnseenEntry(id, display(id));
    }

    IEnumerator IEnumerable.GetEnumerator() => GetEnumerator();
}
