using System.Text;

namespace HandLine.Synthesis;

/// <summary>
/// A single-stroke vector face in the Hershey format (.jhf), as the Debian package hershey-fonts-data
/// ships them. Each glyph is one record: a 5-character glyph number, a 3-character count of coordinate
/// pairs (the bounds pair included), the left and right bounds, then coordinate pairs; every coordinate is
/// a character whose offset from 'R' is the value (y grows downwards), and the pair " R" lifts the pen.
/// A record longer than a line continues on the next lines. Records are taken in file order as the
/// characters from U+0020 onward, which is how the package's Latin faces are laid out.
/// </summary>
public sealed class HersheyFont
{
    /// <summary>The code point of the first record.</summary>
    public const int FirstCodePoint = 32;

    private readonly HersheyGlyph[] _glyphs;

    private HersheyFont(HersheyGlyph[] glyphs) => _glyphs = glyphs;

    /// <summary>Glyphs in file order: glyph i draws code point <see cref="FirstCodePoint"/> + i.</summary>
    public IReadOnlyList<HersheyGlyph> Glyphs => _glyphs;

    /// <summary>The glyph for a code point, or null when the face has none (or only an empty one for a visible character).</summary>
    public HersheyGlyph? Glyph(int codePoint)
    {
        var i = codePoint - FirstCodePoint;
        if (i < 0 || i >= _glyphs.Length)
            return null;
        var g = _glyphs[i];
        return g.Strokes.Count == 0 && codePoint != ' ' ? null : g;
    }

    /// <summary>Reads a .jhf file; a malformed file is an <see cref="InputException"/> naming the record.</summary>
    public static HersheyFont Load(string path)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(path);
        string text;
        try
        {
            text = File.ReadAllText(path, Encoding.ASCII);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new InputException(path, "font", $"cannot read: {e.Message}", e);
        }
        try
        {
            return Parse(text);
        }
        catch (FormatException e)
        {
            throw new InputException(path, "font", $"not a Hershey (.jhf) face: {e.Message}", e);
        }
    }

    /// <summary>Parses the text of a .jhf file; throws <see cref="FormatException"/> when it is malformed.</summary>
    public static HersheyFont Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var lines = text.Replace("\r", "", StringComparison.Ordinal).Split('\n');
        var glyphs = new List<HersheyGlyph>();
        for (var i = 0; i < lines.Length; i++)
        {
            if (lines[i].Trim().Length == 0)
                continue;
            var record = lines[i];
            if (record.Length < 8 || !int.TryParse(record.AsSpan(5, 3), out var pairs) || pairs < 1)
                throw new FormatException($"record {glyphs.Count + 1} (line {i + 1}) has no vertex count in columns 6-8");
            var needed = 8 + 2 * pairs;
            // Long records wrap onto following lines.
            while (record.Length < needed && i + 1 < lines.Length)
                record += lines[++i];
            if (record.Length < needed)
                throw new FormatException($"record {glyphs.Count + 1} (line {i + 1}) ends before its {pairs} pairs");
            glyphs.Add(ParseRecord(record.AsSpan(8, 2 * pairs), glyphs.Count + 1));
        }
        if (glyphs.Count == 0)
            throw new FormatException("no glyph records");
        return new HersheyFont(glyphs.ToArray());
    }

    private static HersheyGlyph ParseRecord(ReadOnlySpan<char> body, int recordNumber)
    {
        var left = body[0] - 'R';
        var right = body[1] - 'R';
        var strokes = new List<IReadOnlyList<(int X, int Y)>>();
        var current = new List<(int X, int Y)>();
        for (var k = 2; k + 1 < body.Length; k += 2)
        {
            if (body[k] == ' ' && body[k + 1] == 'R')
            {
                if (current.Count > 0)
                    strokes.Add(current.ToArray());
                current.Clear();
                continue;
            }
            if (body[k] < ' ' || body[k + 1] < ' ')
                throw new FormatException($"record {recordNumber} has a control character among its coordinates");
            current.Add((body[k] - 'R', body[k + 1] - 'R'));
        }
        if (current.Count > 0)
            strokes.Add(current.ToArray());
        return new HersheyGlyph(left, right, strokes);
    }
}
