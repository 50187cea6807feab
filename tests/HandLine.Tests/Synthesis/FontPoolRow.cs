namespace HandLine.Tests.Synthesis;

/// <summary>One family of tools/fonts.tsv, the handwriting font pool that tools/fetch-fonts.sh gathers.</summary>
internal sealed record FontPoolRow(string Family, string Source, string Group, string Split, string Licence, int Line)
{
    public static string CataloguePath => Path.Combine(TestPaths.RepoRoot, "tools", "fonts.tsv");

    public string? DebianPackage => Source.StartsWith("debian:", StringComparison.Ordinal) ? Source["debian:".Length..] : null;

    /// <summary>The npm package name without its pinned version ("@fontsource/caveat").</summary>
    public string? NpmPackage
    {
        get
        {
            if (!Source.StartsWith("npm:", StringComparison.Ordinal))
                return null;
            var spec = Source["npm:".Length..];
            var at = spec.LastIndexOf('@');
            return at > 0 ? spec[..at] : spec;
        }
    }

    public static IReadOnlyList<FontPoolRow> Load(string path)
    {
        var rows = new List<FontPoolRow>();
        var number = 0;
        foreach (var line in File.ReadLines(path))
        {
            number++;
            if (line.Length == 0 || line.StartsWith('#'))
                continue;
            var f = line.Split('\t');
            if (f.Length < 6 || f.Take(6).Any(string.IsNullOrWhiteSpace))
                throw new InvalidDataException($"{path}:{number}: expected at least 6 tab-separated columns: {line}");
            rows.Add(new FontPoolRow(f[0], f[1], f[2], f[3], f[4], number));
        }
        return rows;
    }
}
