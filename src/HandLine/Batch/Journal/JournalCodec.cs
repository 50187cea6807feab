using System.Security.Cryptography;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using System.Text.Json.Serialization;

namespace HandLine.Batch.Journal;

/// <summary>
/// A journal line is <c>hl1 CHECK JSON\n</c>: a format tag, the first 16 hex digits of the SHA-256 of the JSON
/// bytes, and the record as one line of JSON (the serialiser escapes every control character, so the JSON never
/// holds a raw line feed). A line that was cut short by a kill, or damaged later, fails the check and is ignored.
/// </summary>
internal static class JournalCodec
{
    private static readonly byte[] Tag = "hl1 "u8.ToArray();
    private const int CheckHexDigits = 16;

    private static readonly JsonSerializerOptions Json = new()
    {
        Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping,
        DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
        // A model could in principle give NaN; the journal must still hold whatever the reports will show.
        NumberHandling = JsonNumberHandling.AllowNamedFloatingPointLiterals,
    };

    public static byte[] Encode(JournalRecord record)
    {
        ArgumentNullException.ThrowIfNull(record);
        var json = JsonSerializer.SerializeToUtf8Bytes(record, Json);
        var line = new byte[Tag.Length + CheckHexDigits + 1 + json.Length + 1];
        Tag.CopyTo(line, 0);
        Encoding.ASCII.GetBytes(Check(json), line.AsSpan(Tag.Length));
        line[Tag.Length + CheckHexDigits] = (byte)' ';
        json.CopyTo(line, Tag.Length + CheckHexDigits + 1);
        line[^1] = (byte)'\n';
        return line;
    }

    /// <summary>Decodes one line without its line feed; null when the tag, check, JSON or fields are wrong.</summary>
    public static JournalRecord? TryDecode(ReadOnlySpan<byte> line)
    {
        var head = Tag.Length + CheckHexDigits + 1;
        if (line.Length <= head || !line.StartsWith(Tag) || line[head - 1] != (byte)' ')
            return null;
        var json = line[head..];
        Span<char> expected = stackalloc char[CheckHexDigits];
        Check(json).CopyTo(expected);
        for (var i = 0; i < CheckHexDigits; i++)
            if (line[Tag.Length + i] != expected[i])
                return null;
        try
        {
            var record = JsonSerializer.Deserialize<JournalRecord>(json, Json);
            return record is { IsWellFormed: true } ? record : null;
        }
        catch (Exception e) when (e is JsonException or InvalidOperationException or NotSupportedException or ArgumentException)
        {
            // The check matched but the content does not fit this build's record shape: not ours to reuse.
            return null;
        }
    }

    private static string Check(ReadOnlySpan<byte> json) => Convert.ToHexStringLower(SHA256.HashData(json))[..CheckHexDigits];
}
