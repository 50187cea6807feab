namespace HandLine.Tests.Synthesis;

/// <summary>
/// The project's shared list of font families and packages kept for an independent evaluation
/// (../shared/reserved-fonts.txt beside the repository). Entries are "family: NAME", "debian: PACKAGE" or
/// "npm: PACKAGE"; '#' starts a comment.
/// </summary>
internal sealed record ReservedFontList(
    IReadOnlySet<string> Families, IReadOnlySet<string> DebianPackages, IReadOnlySet<string> NpmPackages)
{
    public static string DefaultPath =>
        Path.GetFullPath(Path.Combine(TestPaths.RepoRoot, "..", "shared", "reserved-fonts.txt"));

    public static ReservedFontList Load(string path)
    {
        if (!File.Exists(path))
            throw new FileNotFoundException(
                $"The shared reserved-font list is missing: {path}. It lives in shared/ beside the repository " +
                "(CI lays it there); without it no font can be checked.", path);
        var families = new HashSet<string>(StringComparer.Ordinal);
        var debian = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        var npm = new HashSet<string>(StringComparer.OrdinalIgnoreCase);
        foreach (var raw in File.ReadLines(path))
        {
            var line = raw.Split('#')[0].Trim();
            if (line.Length == 0)
                continue;
            var colon = line.IndexOf(':');
            if (colon < 0)
                throw new InvalidDataException($"{path}: not a 'kind: value' entry: {raw}");
            var kind = line[..colon].Trim();
            var value = line[(colon + 1)..].Trim();
            switch (kind)
            {
                case "family": families.Add(FontFamilyName.Normalise(value)); break;
                case "debian": debian.Add(value); break;
                case "npm": npm.Add(value); break;
                default: throw new InvalidDataException($"{path}: unknown entry kind '{kind}': {raw}");
            }
        }
        return new ReservedFontList(families, debian, npm);
    }

    /// <summary>Why a catalogue row may not be used, or null when it names nothing reserved.</summary>
    public string? Conflict(FontPoolRow row)
    {
        ArgumentNullException.ThrowIfNull(row);
        if (Families.Contains(FontFamilyName.Normalise(row.Family)))
            return $"family '{row.Family}' is reserved";
        if (row.DebianPackage is { } deb && DebianPackages.Contains(deb))
            return $"Debian package {deb} is reserved";
        if (row.NpmPackage is { } npm)
        {
            if (NpmPackages.Contains(npm))
                return $"npm package {npm} is reserved";
            if (Families.Contains(FontFamilyName.Normalise(npm[(npm.LastIndexOf('/') + 1)..])))
                return $"npm package {npm} is a reserved family";
        }
        return null;
    }
}
