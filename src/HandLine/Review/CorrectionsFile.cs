using System.Globalization;
using System.Text;
using HandLine.Formats;

namespace HandLine.Review;

/// <summary>
/// The corrections TSV the review page exports: UTF-8, a header row <c>source line text machine illegible</c>, then
/// one row per checked line. In a field a backslash is written <c>\\</c>, a tab <c>\t</c>, a line feed <c>\n</c> and a
/// carriage return <c>\r</c>, so any file name fits in one row. Lines starting with '#' and blank lines are skipped.
/// </summary>
public static class CorrectionsFile
{
    public static readonly string[] Columns = ["source", "line", "text", "machine", "illegible"];

    private const string Stage = "corrections";

    /// <exception cref="InputException">Stage "corrections": unreadable file, wrong header, a malformed row, text
    /// holding a line break or tab, or one line corrected twice.</exception>
    public static IReadOnlyList<Correction> Read(string path)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or NotSupportedException)
        {
            throw new InputException(path, Stage, e is FileNotFoundException or DirectoryNotFoundException ? "no such file" : $"cannot read: {e.Message}", e);
        }

        var utf8 = new UTF8Encoding(false, throwOnInvalidBytes: true);
        var result = new List<Correction>();
        var seen = new HashSet<(string, int)>();
        var header = false;
        var number = 0;
        foreach (var raw in ByteLines.Split(bytes))
        {
            number++;
            string row;
            try
            {
                row = utf8.GetString(raw.Span);
            }
            catch (DecoderFallbackException e)
            {
                throw Error(path, number, "not valid UTF-8", e);
            }
            if (row.Trim().Length == 0 || row.StartsWith('#'))
                continue;
            var fields = row.Split('\t');
            if (!header)
            {
                if (!fields.SequenceEqual(Columns, StringComparer.Ordinal))
                    throw Error(path, number, $"expected the header '{string.Join("<TAB>", Columns)}'");
                header = true;
                continue;
            }
            if (fields.Length != Columns.Length)
                throw Error(path, number, $"expected {Columns.Length} tab-separated fields, found {fields.Length}");
            var source = Unescape(path, number, fields[0]);
            if (source.Length == 0)
                throw Error(path, number, "empty source");
            if (!int.TryParse(fields[1], NumberStyles.None, CultureInfo.InvariantCulture, out var line))
                throw Error(path, number, $"line '{fields[1]}' is not a whole number, 0 or more");
            var text = Unescape(path, number, fields[2]).Normalize(NormalizationForm.FormC);
            if (text.Any(c => c is '\t' or '\n' or '\r'))
                throw Error(path, number, "a line's text cannot hold a tab or line break");
            var illegible = fields[4] switch
            {
                "true" => true,
                "false" => false,
                _ => throw Error(path, number, $"illegible must be 'true' or 'false', not '{fields[4]}'"),
            };
            if (!seen.Add((source, line)))
                throw Error(path, number, $"source '{source}' line {line} is corrected twice");
            result.Add(new Correction(source, line, text, Unescape(path, number, fields[3]), illegible));
        }
        if (!header)
            throw new InputException(path, Stage, $"no header row '{string.Join("<TAB>", Columns)}': not a corrections file");
        return result;
    }

    /// <summary>The file's text for <paramref name="corrections"/> (as the review page writes it).</summary>
    public static string Write(IEnumerable<Correction> corrections)
    {
        ArgumentNullException.ThrowIfNull(corrections);
        var text = new StringBuilder(string.Join('\t', Columns)).Append('\n');
        foreach (var c in corrections)
            text.Append(Escape(c.Source)).Append('\t').Append(c.Line.ToString(CultureInfo.InvariantCulture)).Append('\t')
                .Append(Escape(c.Text)).Append('\t').Append(Escape(c.Machine)).Append('\t').Append(c.Illegible ? "true" : "false").Append('\n');
        return text.ToString();
    }

    public static string Escape(string field) =>
        field.Replace("\\", "\\\\").Replace("\t", "\\t").Replace("\n", "\\n").Replace("\r", "\\r");

    private static string Unescape(string path, int number, string field)
    {
        if (!field.Contains('\\'))
            return field;
        var text = new StringBuilder(field.Length);
        for (var i = 0; i < field.Length; i++)
        {
            if (field[i] != '\\')
            {
                text.Append(field[i]);
                continue;
            }
            if (++i == field.Length)
                throw Error(path, number, "a field ends with a lone backslash (write \\\\ for one backslash)");
            text.Append(field[i] switch
            {
                '\\' => '\\',
                't' => '\t',
                'n' => '\n',
                'r' => '\r',
                _ => throw Error(path, number, $"unknown escape '\\{field[i]}' (known: \\\\ \\t \\n \\r)"),
            });
        }
        return text.ToString();
    }

    private static InputException Error(string path, int number, string reason, Exception? inner = null) =>
        new(path, Stage, $"line {number}: {reason}", inner);
}
