using System.Text.Json;
using Hf = Tokenizers.DotNet;

namespace RankFreq.Tokenization;

/// <summary>
/// The exact fallback for tokenizer.json files the fast engine does not cover (byte-fallback BPE with Metaspace as in
/// Gemma 3, Llama 2 and Mistral; Unigram; WordPiece; WordLevel; unusual normalizers or pre-tokenizers): each document
/// is encoded by the reference tokenizers library itself, through the Tokenizers.DotNet binding (NuGet, MIT).
/// </summary>
/// <remarks>
/// The binding always adds special tokens and matches added tokens, so it is given a copy of the file whose special
/// added tokens match nothing and which has no post-processor: special-token text then counts as ordinary text and
/// nothing is added. Whatever the empty document still encodes to is subtracted as a prefix. No chunk cache: these models'
/// pre-tokenizers often leave a whole document as one piece. Throughput is the library's (about 2–9 MB/s per thread
/// on English), in parallel over documents.
/// </remarks>
public sealed class ReferenceJsonTokenizer : TokenizerJsonTokenizer, IDisposable
{
    private readonly Hf.Tokenizer _reference;
    private readonly uint[] _empty;

    internal ReferenceJsonTokenizer(TokenizerJsonFile f, bool cutSafe, bool byteLevel, string why)
        : base(f.Path, "as the file's normalizer", cutSafe, f, byteLevel, $"reference library ({why})")
    {
        if (!NativeLoads())
            throw new TokenizerException($"{f.Path}: this file needs the reference tokenizers library ({why}), but its " +
                                         "native file libhf_tokenizers.so was not found beside the program");
        string tmp = Path.Combine(Path.GetTempPath(), $"rankfreq-{Environment.ProcessId}-{Guid.NewGuid():N}.json");
        try
        {
            File.WriteAllBytes(tmp, WithoutSpecials(f.Root, f.ParseSpecials));
            _reference = new Hf.Tokenizer(tmp);
        }
        catch (Exception e) when (e is not TokenizerException)
        {
            throw new TokenizerException($"{f.Path}: the reference tokenizers library cannot load this file ({OneLine(e.Message)})", e);
        }
        finally
        {
            try { File.Delete(tmp); } catch (IOException) { }
        }
        _empty = _reference.Encode("");
    }

    private static bool NativeLoads()
    {
        try
        {
            return System.Runtime.InteropServices.NativeLibrary.TryLoad("hf_tokenizers", typeof(ReferenceJsonTokenizer).Assembly, null, out _);
        }
        catch (Exception)
        {
            return false;
        }
    }

    private static string OneLine(string s) => s.ReplaceLineEndings(" ").Trim();

    /// <summary>The file's JSON without a post-processor and, unless <paramref name="keepSpecials"/>, with its special
    /// added tokens made unmatchable.</summary>
    internal static byte[] WithoutSpecials(JsonElement root, bool keepSpecials = false)
    {
        var buffer = new System.Buffers.ArrayBufferWriter<byte>();
        using (var w = new Utf8JsonWriter(buffer))
        {
            w.WriteStartObject();
            foreach (var p in root.EnumerateObject())
            {
                if (p.NameEquals("post_processor")) { w.WriteNull(p.Name); continue; }
                w.WritePropertyName(p.Name);
                if (keepSpecials || !p.NameEquals("added_tokens") || p.Value.ValueKind != JsonValueKind.Array) { p.Value.WriteTo(w); continue; }
                // special entries keep their place (removing them would renumber later added tokens) under a content
                // that never occurs in text: two Unicode noncharacters around a name
                w.WriteStartArray();
                foreach (var a in p.Value.EnumerateArray())
                {
                    if (!TokenizerJsonFile.Flag(a, "special") || a.ValueKind != JsonValueKind.Object) { a.WriteTo(w); continue; }
                    w.WriteStartObject();
                    foreach (var f in a.EnumerateObject())
                    {
                        if (f.NameEquals("content")) w.WriteString(f.Name, $"\uFDD0rankfreq special {TokenizerJsonFile.Prop(a, "id")}\uFDD1");
                        else if (f.NameEquals("normalized")) w.WriteBoolean(f.Name, false);
                        else f.WriteTo(w);
                    }
                    w.WriteEndObject();
                }
                w.WriteEndArray();
            }
            w.WriteEndObject();
        }
        return buffer.WrittenSpan.ToArray();
    }

    /// <summary>The reference's ids for one text, without anything the empty text also encodes to.</summary>
    internal uint[] Reference(string text)
    {
        uint[] ids;
        try
        {
            ids = _reference.Encode(text);
        }
        catch (Exception e)
        {
            throw new TokenizerException($"{Spec[3..]}: the reference tokenizers library failed on a document ({OneLine(e.Message)})", e);
        }
        int skip = _empty.Length > 0 && ids.AsSpan().StartsWith(_empty) ? _empty.Length : 0;
        return skip == 0 ? ids : ids[skip..];
    }

    /// <inheritdoc/>
    public override ITokenizerSession CreateSession(ITokenSink sink) => new Session(this, sink);

    /// <inheritdoc/>
    public void Dispose() => _reference.Dispose();

    private sealed class Session(ReferenceJsonTokenizer owner, ITokenSink sink) : BufferingSession(owner.CutSafe)
    {
        protected override void Encode(ReadOnlySpan<char> text)
        {
            // text from our readers is valid UTF-16; a lone surrogate (which the library rejects) becomes U+FFFD as a
            // UTF-8 round trip would make it
            var s = text.ToString();
            if (text.IndexOfAnyInRange('\uD800', '\uDFFF') >= 0 && !System.Text.Unicode.Utf8.IsValid(System.Text.Encoding.UTF8.GetBytes(s)))
                s = System.Text.Encoding.UTF8.GetString(System.Text.Encoding.UTF8.GetBytes(s));
            foreach (uint id in owner.Reference(s)) sink.AddId((int)id);
        }
    }
}
