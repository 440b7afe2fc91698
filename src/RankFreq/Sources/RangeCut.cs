namespace RankFreq.Sources;

/// <summary>Where a tokenizer allows a long plain-text file to be cut into ranges counted in parallel.</summary>
public enum RangeCut
{
    /// <summary>Never: the file is read whole by one worker.</summary>
    None,
    /// <summary>After any newline (no token spans a newline).</summary>
    AnyNewline,
    /// <summary>After a newline followed by an ASCII letter (a chunk boundary of the r50k, cl100k and o200k rules).</summary>
    NewlineBeforeAsciiLetter,
    /// <summary>After a newline that follows a printable ASCII character and precedes an ASCII letter (r50k: its
    /// rule splits a run of whitespace before a letter one character short, so a range must not end in such a run).
    /// </summary>
    NewlineAfterVisibleBeforeAsciiLetter,
}
