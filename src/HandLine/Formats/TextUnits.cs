using System.Text;

namespace HandLine.Formats;

/// <summary>
/// Splits text into the units that are scored: Unicode code points for CER, whitespace-separated
/// words for WER. Both apply NFC first, so a precomposed letter and its decomposed spelling score
/// as the same character.
/// </summary>
public static class TextUnits
{
    /// <summary>NFC-normalises <paramref name="s"/> and returns its Unicode code points.</summary>
    /// <remarks>A lone surrogate counts as one U+FFFD, so malformed text is scored, not rejected.</remarks>
    public static int[] CodePoints(string s)
    {
        ArgumentNullException.ThrowIfNull(s);
        var normal = ToNfc(s);
        var result = new List<int>(normal.Length);
        foreach (var rune in normal.EnumerateRunes())
            result.Add(rune.Value);
        return result.ToArray();
    }

    /// <summary>NFC-normalises <paramref name="s"/> and splits it on any Unicode white space; no empty words.</summary>
    public static string[] Words(string s)
    {
        ArgumentNullException.ThrowIfNull(s);
        var normal = ToNfc(s);
        var words = new List<string>();
        var start = -1;
        var i = 0;
        foreach (var rune in normal.EnumerateRunes())
        {
            if (Rune.IsWhiteSpace(rune))
            {
                if (start >= 0)
                    words.Add(normal[start..i]);
                start = -1;
            }
            else if (start < 0)
            {
                start = i;
            }
            i += rune.Utf16SequenceLength;
        }
        if (start >= 0)
            words.Add(normal[start..]);
        return words.ToArray();
    }

    /// <summary>
    /// NFC form of <paramref name="s"/> (ICU's tables; the project must not enable InvariantGlobalization, under
    /// which <see cref="string.Normalize()"/> does nothing); a lone surrogate becomes U+FFFD.
    /// </summary>
    public static string ToNfc(string s)
    {
        ArgumentNullException.ThrowIfNull(s);
        if (!IsWellFormed(s))
        {
            var repaired = new StringBuilder(s.Length);
            foreach (var rune in s.EnumerateRunes())
                repaired.Append(rune.ToString());
            s = repaired.ToString();
        }
        try
        {
            return s.Normalize(NormalizationForm.FormC);
        }
        catch (ArgumentException)
        {
            // .NET refuses noncharacters (U+FDD0..U+FDEF, U+xFFFE, U+xFFFF); score them as U+FFFD like broken surrogates.
            var repaired = new StringBuilder(s.Length);
            foreach (var rune in s.EnumerateRunes())
                repaired.Append(IsNoncharacter(rune.Value) ? "\uFFFD" : rune.ToString());
            return repaired.ToString().Normalize(NormalizationForm.FormC);
        }
    }

    private static bool IsNoncharacter(int cp) => cp is >= 0xFDD0 and <= 0xFDEF || (cp & 0xFFFE) == 0xFFFE;

    /// <summary>True when every surrogate is part of a pair.</summary>
    internal static bool IsWellFormed(string s)
    {
        for (var i = 0; i < s.Length; i++)
        {
            if (char.IsHighSurrogate(s[i]) && i + 1 < s.Length && char.IsLowSurrogate(s[i + 1]))
                i++;
            else if (char.IsSurrogate(s[i]))
                return false;
        }
        return true;
    }
}
