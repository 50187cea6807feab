namespace HandLine.Formats;

/// <summary>
/// Canonical form of a manifest path: '/' separators, no "." or empty segments, ".." resolved.
/// Both '/' and '\' count as separators so a manifest written on either kind of system reads the same.
/// </summary>
internal static class RelativePaths
{
    /// <summary>Canonicalises <paramref name="path"/>, or gives a plain-words reason it is unusable.</summary>
    public static bool TryCanonicalise(string path, out string canonical, out string reason)
    {
        canonical = "";
        if (path.Trim().Length == 0)
            return Fail("empty path", out reason);
        if (path.Any(char.IsControl))
            return Fail("path contains a control character", out reason);
        if (!TextUnits.IsWellFormed(path))
            return Fail("path is not valid Unicode", out reason);
        if (IsAbsolute(path))
            return Fail($"absolute path '{path}'; paths must be relative to the manifest's folder", out reason);
        if (path[^1] is '/' or '\\')
            return Fail($"path '{path}' ends with a separator, so it names a folder, not an image", out reason);

        var segments = new List<string>();
        foreach (var segment in path.Split('/', '\\'))
        {
            if (segment is "" or ".")
                continue;
            if (segment == "..")
            {
                if (segments.Count == 0)
                    return Fail($"path '{path}' leads outside the manifest's folder", out reason);
                segments.RemoveAt(segments.Count - 1);
                continue;
            }
            segments.Add(segment);
        }
        if (segments.Count == 0)
            return Fail($"path '{path}' names the manifest's folder, not an image", out reason);

        canonical = string.Join('/', segments);
        reason = "";
        return true;
    }

    /// <summary>Rooted on this system, or on the other kind (a Windows drive is not rooted on Linux).</summary>
    private static bool IsAbsolute(string path) =>
        Path.IsPathRooted(path)
        || path[0] is '/' or '\\'
        || (path.Length >= 2 && char.IsAsciiLetter(path[0]) && path[1] == ':');

    private static bool Fail(string why, out string reason)
    {
        reason = why;
        return false;
    }
}
