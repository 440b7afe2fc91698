namespace RankFreq.Tokenization;

/// <summary>How a tokenizer identifies its types.</summary>
public enum TokenIdentity
{
    /// <summary>Types are byte strings (word rules).</summary>
    Bytes,
    /// <summary>Types are vocabulary ids (subword vocabularies).</summary>
    Ids,
}
