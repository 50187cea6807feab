using System.Text;
using HandLine.Formats;
using HandLine.Model;

namespace HandLine.Synthesis;

/// <summary>
/// Reads a word list (UTF-8, one word a line, such as Debian's <c>wbritish</c>
/// /usr/share/dict/british-english) for <see cref="TextMixture"/>.
/// </summary>
public static class WordList
{
    /// <summary>
    /// The distinct words (NFC, in file order) whose characters are all in <paramref name="symbols"/>.
    /// Possessives ("abbot's") are left out: the Debian list holds one for nearly every noun (29,220 of its
    /// 103,494 entries), so keeping them would make more than a quarter of drawn words end in 's, far more than
    /// in running text; the apostrophe is still learnt from words such as "o'clock" and from the phrase lines.
    /// Throws <see cref="InputException"/> naming the file when it is missing, unreadable, too large, not
    /// UTF-8, or has no usable word.
    /// </summary>
    public static IReadOnlyList<string> Load(string path, CharacterSet symbols, TextMixtureOptions? options = null)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        ArgumentNullException.ThrowIfNull(symbols);
        options ??= new TextMixtureOptions();
        string content;
        try
        {
            var length = new FileInfo(path).Length;
            if (length > options.MaxWordListBytes)
                throw new InputException(path, "read",
                    $"the word list has {length:N0} bytes, more than the limit of {options.MaxWordListBytes:N0}");
            content = File.ReadAllText(path, new UTF8Encoding(encoderShouldEmitUTF8Identifier: false, throwOnInvalidBytes: true));
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(path, "read", $"cannot read the word list: {e.Message}", e);
        }
        catch (DecoderFallbackException e)
        {
            throw new InputException(path, "read", "the word list is not valid UTF-8", e);
        }

        var seen = new HashSet<string>(StringComparer.Ordinal);
        var words = new List<string>();
        foreach (var line in content.Split('\n'))
        {
            var word = TextUnits.ToNfc(line.TrimStart('\uFEFF').Trim());
            if (word.Length == 0 || word.EndsWith("'s", StringComparison.Ordinal) || word.Any(char.IsWhiteSpace))
                continue;
            if (symbols.CanEncode(word) && seen.Add(word))
                words.Add(word);
        }
        if (words.Count == 0)
            throw new InputException(path, "read", "the word list has no word written only in the model's characters");
        return words;
    }
}
