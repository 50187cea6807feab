namespace HandLine.Formats;

/// <summary>
/// The optional header that names a manifest's extra columns: <c>#columns&lt;TAB&gt;path&lt;TAB&gt;text&lt;TAB&gt;NAME...</c>.
/// Names are lowercase ASCII letters, digits, '_' and '-' (so they read the same in a shell, a CSV header and
/// a JSON key); <c>path</c> and <c>text</c> are the two fixed columns and cannot be reused.
/// </summary>
public static class ManifestColumns
{
    /// <summary>First field of the header line.</summary>
    public const string Marker = "#columns";

    public const string PathColumn = "path";
    public const string TextColumn = "text";

    /// <summary>Null when <paramref name="name"/> can name an extra column, otherwise why not.</summary>
    public static string? Problem(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        if (name.Length == 0)
            return "empty column name";
        if (name is PathColumn or TextColumn)
            return $"column name '{name}' is reserved";
        foreach (var c in name)
            if (c is not ((>= 'a' and <= 'z') or (>= '0' and <= '9') or '_' or '-'))
                return $"column name '{name}' may only use lowercase letters, digits, '_' and '-'";
        return null;
    }

    /// <summary>
    /// The extra column names of a header line, or a reason it is unusable. <paramref name="fieldCount"/> is the
    /// number of fields each entry must then have, also when the header is bad, so entries can still be checked.
    /// </summary>
    internal static bool TryParse(string line, out IReadOnlyList<string> names, out int fieldCount, out string reason)
    {
        var fields = line.Split('\t');
        fieldCount = Math.Max(2, fields.Length - 1);
        names = [];
        reason = "";
        if (fields.Length < 3 || fields[1] != PathColumn || fields[2] != TextColumn)
        {
            reason = $"a {Marker} header must begin '{Marker}<TAB>{PathColumn}<TAB>{TextColumn}'";
            return false;
        }
        var extra = fields[3..];
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var name in extra)
        {
            if (Problem(name) is { } problem)
            {
                reason = problem;
                return false;
            }
            if (!seen.Add(name))
            {
                reason = $"column name '{name}' appears twice";
                return false;
            }
        }
        names = extra;
        return true;
    }
}
