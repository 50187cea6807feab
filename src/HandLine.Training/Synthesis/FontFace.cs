using System.Globalization;
using System.Text;
using HandLine.Model;
using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// One loaded face: an outline font file (owning its typeface) or a single-stroke Hershey face drawn as pen
/// paths. Safe to share between threads for reading: every render makes its own <see cref="SKFont"/>.
/// </summary>
public sealed class FontFace : IDisposable
{
    private readonly SKTypeface? _typeface;
    private readonly HersheyFont? _strokes;
    private readonly HashSet<int> _coveredDefault;

    /// <summary>The group of a font that is not laid out in group and family folders.</summary>
    public const string Ungrouped = "ungrouped";

    /// <param name="family">Style family; null for the file name without extension.</param>
    /// <param name="group">Style group; null for <see cref="Ungrouped"/>.</param>
    internal FontFace(string path, SKTypeface typeface, string? family = null, string? group = null)
    {
        Path = path;
        Name = System.IO.Path.GetFileName(path);
        Family = family ?? System.IO.Path.GetFileNameWithoutExtension(path);
        Group = group ?? Ungrouped;
        _typeface = typeface;
        using var font = new SKFont(typeface, 40);
        _coveredDefault = CoveredDefaultSymbols(rune => HasRealGlyph(font, rune));
    }

    internal FontFace(string path, HersheyFont strokes, string? family = null, string? group = null)
    {
        Path = path;
        Name = System.IO.Path.GetFileName(path);
        Family = family ?? System.IO.Path.GetFileNameWithoutExtension(path);
        Group = group ?? Ungrouped;
        _strokes = strokes;
        _coveredDefault = CoveredDefaultSymbols(rune => strokes.Glyph(rune.Value) is not null);
    }

    /// <summary>
    /// The code points of <see cref="CharacterSet.Default"/> the face can draw, computed once: line synthesis asks
    /// <c>Covers</c> for every line and every font.
    /// </summary>
    private static HashSet<int> CoveredDefaultSymbols(Func<Rune, bool> canDraw) =>
        CharacterSet.Default.Symbols.Select(s => Rune.GetRuneAt(s, 0)).Where(canDraw).Select(r => r.Value).ToHashSet();

    /// <summary>True for a single-stroke (Hershey) face, drawn with a pen rather than filled.</summary>
    public bool IsStrokeFace => _strokes is not null;

    /// <summary>The symbols of <see cref="CharacterSet.Default"/> this face cannot draw, in set order.</summary>
    public IReadOnlyList<string> MissingDefaultSymbols =>
        CharacterSet.Default.Symbols.Where(s => !_coveredDefault.Contains(Rune.GetRuneAt(s, 0).Value)).ToList();

    /// <summary>File name, e.g. "Humor-Sans.ttf".</summary>
    public string Name { get; }

    /// <summary>
    /// The style family the font belongs to, for scoring per family: its folder's name when fonts are laid out
    /// as <c>GROUP/FAMILY/file</c> (see <see cref="FontCatalog.Load"/>), otherwise the file name without extension.
    /// </summary>
    public string Family { get; }

    /// <summary>The style group of the family (its parent folder's name), or <see cref="Ungrouped"/>.</summary>
    public string Group { get; }

    /// <summary>
    /// Groups whose faces draw every letter as a capital (tools/fonts.tsv): a lowercase code point comes out as a
    /// capital or small capital, so a line drawn in them is labelled in capitals, as a reader would transcribe it.
    /// </summary>
    public static readonly IReadOnlySet<string> CapitalGroups = new HashSet<string>(StringComparer.Ordinal) { "capitals", "small-caps" };

    /// <summary>True when this face's group draws only capitals (see <see cref="CapitalGroups"/>).</summary>
    public bool DrawsOnlyCapitals => CapitalGroups.Contains(Group);

    /// <summary>Full path the font was loaded from.</summary>
    public string Path { get; }

    /// <summary>The outline typeface; null for a stroke face.</summary>
    internal SKTypeface? Typeface => _typeface;

    /// <summary>The single-stroke glyphs; null for an outline font.</summary>
    internal HersheyFont? StrokeFont => _strokes;

    /// <summary>Symbols of <see cref="CharacterSet.Default"/> this font can draw.</summary>
    public IReadOnlySet<int> CoveredDefaultCodePoints => _coveredDefault;

    /// <summary>
    /// True when every code point of the text maps to a real glyph (glyph id not 0 and, for
    /// non-whitespace, a non-empty outline). Whitespace always counts as covered.
    /// </summary>
    public bool Covers(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        SKFont? font = null;
        try
        {
            foreach (var rune in text.EnumerateRunes())
            {
                if (Rune.IsWhiteSpace(rune) || _coveredDefault.Contains(rune.Value))
                    continue;
                if (CharacterSet.Default.Contains(rune.ToString()))
                    return false; // already checked when loaded
                if (_strokes is not null)
                {
                    if (_strokes.Glyph(rune.Value) is null)
                        return false;
                    continue;
                }
                font ??= new SKFont(_typeface!, 40);
                if (!HasRealGlyph(font, rune))
                    return false;
            }
            return true;
        }
        finally
        {
            font?.Dispose();
        }
    }

    /// <summary>The code points of the text this font cannot draw, as "U+XXXX" labels.</summary>
    public IReadOnlyList<string> MissingCodePoints(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var missing = new List<string>();
        foreach (var rune in text.EnumerateRunes())
            if (!Covers(rune.ToString()))
                missing.Add(string.Create(CultureInfo.InvariantCulture, $"U+{rune.Value:X4}"));
        return missing;
    }

    // Glyph 0 is ".notdef" (the box). Some fonts also map unsupported characters to an empty
    // glyph, so a visible character must have an outline too.
    private static bool HasRealGlyph(SKFont font, Rune rune)
    {
        var glyph = font.GetGlyph(rune.Value);
        if (glyph == 0)
            return false;
        if (Rune.IsWhiteSpace(rune))
            return true;
        using var path = font.GetGlyphPath(glyph);
        return path is not null && !path.IsEmpty && !path.Bounds.IsEmpty;
    }

    public void Dispose() => _typeface?.Dispose();

    public override string ToString() => Name;
}
