using SkiaSharp;

namespace HandLine.Synthesis;

/// <summary>
/// The fonts found under a set of files and folders, in path order so every run sees the same list.
/// Outline fonts (.ttf, .otf, .woff) and single-stroke Hershey faces (.jhf) are both faces.
/// A file that cannot be loaded is reported in <see cref="Errors"/> and the rest still load.
/// </summary>
public sealed class FontCatalog : IDisposable
{
    private static readonly string[] Extensions = [".ttf", ".otf", ".woff", StrokeExtension];

    private const string StrokeExtension = ".jhf";

    // Faces of hershey-fonts-data that a folder scan skips (an explicitly named file still loads): those whose
    // records, in file order, are not the ASCII characters from U+0020 (Greek, Cyrillic, Japanese and symbol
    // sets), where mapping them as ASCII would draw other letters than the transcript says; and the blackletter
    // faces, whose long s and Fraktur capitals read as other letters (seen on rendered lines).
    private static readonly HashSet<string> NonAsciiStrokeFaces = new(StringComparer.OrdinalIgnoreCase)
    {
        "astrology", "cyrilc_1", "cyrillic", "greek", "greekc", "greeks", "japanese", "markers", "mathlow",
        "mathupp", "meteorology", "music", "symbolic", "timesg",
        "gothgbt", "gothgrt", "gothiceng", "gothicger", "gothicita", "gothitt",
    };

    private FontCatalog(IReadOnlyList<FontFace> fonts, IReadOnlyList<InputException> errors)
    {
        Fonts = fonts;
        Errors = errors;
        // A family's files share its weight, and a group of n families gets a share growing as √n, not n: the
        // 59 upright print hands would otherwise draw 30 % of all lines and the 3 capitals-only hands 1.5 %. √n
        // keeps every family's share within a small factor of the others (common practice, no source).
        var filesPerFamily = fonts.GroupBy(f => (f.Group, f.Family)).ToDictionary(g => g.Key, g => g.Count());
        var familiesPerGroup = filesPerFamily.Keys.GroupBy(k => k.Group).ToDictionary(g => g.Key, g => g.Count());
        _weights = fonts.ToDictionary(f => f, f => 1.0 / (filesPerFamily[(f.Group, f.Family)] * Math.Sqrt(familiesPerGroup[f.Group])));
    }

    private readonly Dictionary<FontFace, double> _weights;

    /// <summary>How often a line should be drawn in this font, relative to the catalogue's other fonts.</summary>
    public double Weight(FontFace font) => _weights.TryGetValue(font, out var w) ? w : throw new ArgumentException("not a font of this catalogue", nameof(font));

    public IReadOnlyList<FontFace> Fonts { get; }

    public IReadOnlyList<InputException> Errors { get; }

    /// <summary>
    /// Loads font files and every .ttf/.otf/.woff/.jhf below the given folders (recursively; Hershey faces whose
    /// records are not ASCII letters are left out of folder scans). Fonts are expected
    /// at <c>ROOT/SPLIT/GROUP/FAMILY/file</c>: a font found two or more folders below a given folder takes
    /// its family from its parent folder's name and its group from its grandparent's. A font directly in a
    /// given folder or one folder below it, or a font file given by name, has no such layout to read: its
    /// family is its file name without extension and its group <see cref="FontFace.Ungrouped"/>.
    /// </summary>
    public static FontCatalog Load(IEnumerable<string> paths)
    {
        ArgumentNullException.ThrowIfNull(paths);
        var errors = new List<InputException>();
        // File -> (family, group) read from its folders, or nulls; the first given path that reaches a file decides.
        var files = new SortedDictionary<string, (string? Family, string? Group)>(StringComparer.Ordinal);
        foreach (var raw in paths)
        {
            ArgumentException.ThrowIfNullOrWhiteSpace(raw, nameof(paths));
            var full = System.IO.Path.GetFullPath(raw);
            if (Directory.Exists(full))
            {
                foreach (var f in Directory.EnumerateFiles(full, "*", SearchOption.AllDirectories))
                    if (IsFontFile(f) && !NonAsciiStrokeFaces.Contains(System.IO.Path.GetFileNameWithoutExtension(f)))
                        files.TryAdd(f, StyleFolders(full, f));
            }
            else if (File.Exists(full))
            {
                files.TryAdd(full, (null, null));
            }
            else
            {
                errors.Add(new InputException(raw, "font", "no such file or folder"));
            }
        }

        var fonts = new List<FontFace>();
        foreach (var (file, style) in files)
        {
            var face = TryLoad(file, style.Family, style.Group, errors);
            if (face is not null)
                fonts.Add(face);
        }
        return new FontCatalog(fonts, errors);
    }

    /// <summary>Parent and grandparent folder names when the file is at least two folders below the root.</summary>
    private static (string? Family, string? Group) StyleFolders(string root, string file)
    {
        var folders = System.IO.Path.GetRelativePath(root, System.IO.Path.GetDirectoryName(file)!)
            .Split(System.IO.Path.DirectorySeparatorChar, StringSplitOptions.RemoveEmptyEntries)
            .Where(s => s != ".")
            .ToArray();
        return folders.Length >= 2 ? (folders[^1], folders[^2]) : (null, null);
    }

    private static bool IsFontFile(string path) =>
        Extensions.Contains(System.IO.Path.GetExtension(path).ToLowerInvariant());

    private static FontFace? TryLoad(string file, string? family, string? group, List<InputException> errors)
    {
        if (!IsFontFile(file))
        {
            errors.Add(new InputException(file, "font", "not a .ttf, .otf, .woff or .jhf file"));
            return null;
        }
        if (System.IO.Path.GetExtension(file).Equals(StrokeExtension, StringComparison.OrdinalIgnoreCase))
            return TryLoadStrokeFace(file, family, group, errors);
        SKTypeface? typeface;
        try
        {
            typeface = SKTypeface.FromFile(file);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException)
        {
            errors.Add(new InputException(file, "font", "cannot be read", e));
            return null;
        }
        if (typeface is null)
        {
            errors.Add(new InputException(file, "font", "not a font the renderer can load"));
            return null;
        }
        var face = new FontFace(file, typeface, family, group);
        if (face.CoveredDefaultCodePoints.Count == 0)
        {
            face.Dispose();
            errors.Add(new InputException(file, "font", "has no glyphs for the character set"));
            return null;
        }
        return face;
    }

    private static FontFace? TryLoadStrokeFace(string file, string? family, string? group, List<InputException> errors)
    {
        HersheyFont strokes;
        try
        {
            strokes = HersheyFont.Load(file);
        }
        catch (InputException e)
        {
            errors.Add(e);
            return null;
        }
        var face = new FontFace(file, strokes, family, group);
        if (face.CoveredDefaultCodePoints.Count == 0)
        {
            errors.Add(new InputException(file, "font", "has no glyphs for the character set"));
            return null;
        }
        return face;
    }

    public void Dispose()
    {
        foreach (var f in Fonts)
            f.Dispose();
    }
}
