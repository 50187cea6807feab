using System.Text;
using System.Text.RegularExpressions;

namespace HandLine.Tests.Synthesis;

/// <summary>
/// Font family names compared the way the project's shared reserved-font list says (its header:
/// "without regard to case, spaces, hyphens or weight/style suffixes (Klee One SemiBold is Klee One)").
/// tools/fetch-fonts.sh applies the same rule in bash; both must refuse the same names.
/// </summary>
internal static partial class FontFamilyName
{
    // Weight and style words that may trail a family name. A name is never cut down to nothing.
    private static readonly HashSet<string> StyleWords =
    [
        "thin", "hairline", "extralight", "ultralight", "light", "regular", "normal", "book", "roman", "medium",
        "semibold", "demibold", "bold", "extrabold", "ultrabold", "black", "heavy", "italic", "oblique",
        "semi", "demi", "extra", "ultra",
    ];

    public static string Normalise(string family)
    {
        ArgumentNullException.ThrowIfNull(family);
        var lower = family.Trim().ToLowerInvariant();
        // "KleeOne-SemiBold": a style word glued to the end of a word is split off first.
        lower = GluedStyle().Replace(lower, "$1 $2");
        var words = lower.Split([' ', '-', '_', '\t'], StringSplitOptions.RemoveEmptyEntries).ToList();
        while (words.Count > 1 && StyleWords.Contains(words[^1]))
            words.RemoveAt(words.Count - 1);
        var joined = new StringBuilder();
        foreach (var w in words)
            joined.Append(w);
        return joined.ToString();
    }

    [GeneratedRegex("([a-z])(thin|light|regular|medium|semibold|demibold|bold|black|heavy|italic|oblique)$")]
    private static partial Regex GluedStyle();
}
