using System.Globalization;
using System.Text;
using System.Text.Json;
using System.Xml;
using SixLabors.ImageSharp;

namespace HandLine.Batch;

/// <summary>One page line as the ALTO file shows it: box, text and each character's confidence.</summary>
public sealed record AltoLine(int Entry, int Column, int X, int Y, int Width, int Height, string Text, IReadOnlyList<(string Symbol, double Confidence)> Chars);

/// <summary>
/// Writes a page's lines as ALTO XML version 4 (the open standard maintained by the Library of Congress), so a run
/// loads into digital-library systems: Description (measurement unit pixel, the image's file name, the software),
/// then Layout → Page (the image's size) → PrintSpace → one TextBlock per entry (ruled row) in reading order → one
/// TextLine per line, left to right → String elements (one per word, CONTENT and WC, the word's confidence: the mean
/// of its characters') with SP between them. Word positions are not measured: each word gets the share of its
/// line's width that its characters take of the line's text.
/// </summary>
public static class AltoWriter
{
    public const string Namespace = "http://www.loc.gov/standards/alto/ns-v4#";

    /// <summary>The ALTO file of a source: its path with the extension replaced by ".alto.xml".</summary>
    public static string RelativePathFor(string source) => Path.ChangeExtension(source, ".alto.xml");

    /// <summary>
    /// Writes an ALTO file beside each page's text file, for every source of the run whose lines carry boxes (taken as
    /// pages); reads the lines from the run's lines.jsonl and the page size from the image's header.
    /// </summary>
    public static int WriteRun(string outDir, IReadOnlyList<SourceImage> sources, string modelId)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(outDir);
        ArgumentNullException.ThrowIfNull(sources);
        var lines = ReadPageLines(outDir);
        var written = 0;
        foreach (var source in sources)
        {
            if (!lines.TryGetValue(source.Source, out var page) || page.Count == 0) continue;
            IImageInfo? info;
            try
            {
                info = Image.Identify(source.FullPath);
                if (info is null) continue;
            }
            catch (Exception e) when (e is IOException or UnknownImageFormatException or InvalidImageContentException or UnauthorizedAccessException)
            {
                continue; // the run could read it a moment ago; if it cannot be read now, its errors entry says so
            }
            var target = Path.Combine(outDir, RelativePathFor(source.Source).Replace('/', Path.DirectorySeparatorChar));
            AtomicFile.WriteAllText(target, Write(Path.GetFileName(source.Source), info.Width, info.Height, page, modelId));
            written++;
        }
        return written;
    }

    /// <summary>The ALTO document of one page.</summary>
    public static string Write(string fileName, int width, int height, IReadOnlyList<AltoLine> lines, string modelId)
    {
        ArgumentNullException.ThrowIfNull(fileName);
        ArgumentNullException.ThrowIfNull(lines);
        var text = new StringBuilder();
        var settings = new XmlWriterSettings { Indent = true, Encoding = new UTF8Encoding(false), OmitXmlDeclaration = false };
        using (var sw = new StringWriterUtf8(text))
        using (var x = XmlWriter.Create(sw, settings))
        {
            x.WriteStartDocument();
            x.WriteStartElement("alto", Namespace);
            x.WriteStartElement("Description", Namespace);
            x.WriteElementString("MeasurementUnit", Namespace, "pixel");
            x.WriteStartElement("sourceImageInformation", Namespace);
            x.WriteElementString("fileName", Namespace, fileName);
            x.WriteEndElement();
            x.WriteStartElement("Processing", Namespace);
            x.WriteAttributeString("ID", "processing1");
            x.WriteStartElement("processingSoftware", Namespace);
            x.WriteElementString("softwareName", Namespace, "HandLine");
            x.WriteElementString("softwareVersion", Namespace, "model " + modelId);
            x.WriteEndElement();
            x.WriteEndElement();
            x.WriteEndElement(); // Description

            x.WriteStartElement("Layout", Namespace);
            x.WriteStartElement("Page", Namespace);
            x.WriteAttributeString("ID", "page1");
            x.WriteAttributeString("PHYSICAL_IMG_NR", "1");
            Box(x, 0, 0, width, height, withPosition: false);
            x.WriteStartElement("PrintSpace", Namespace);
            Box(x, 0, 0, width, height);
            int block = 0, line = 0, word = 0;
            foreach (var entry in lines.GroupBy(l => l.Entry))
            {
                var members = entry.ToArray();
                int bx = members.Min(l => l.X), by = members.Min(l => l.Y);
                int br = members.Max(l => l.X + l.Width), bb = members.Max(l => l.Y + l.Height);
                x.WriteStartElement("TextBlock", Namespace);
                x.WriteAttributeString("ID", $"block{++block}");
                Box(x, bx, by, br - bx, bb - by);
                foreach (var l in members)
                {
                    x.WriteStartElement("TextLine", Namespace);
                    x.WriteAttributeString("ID", $"line{++line}");
                    Box(x, l.X, l.Y, l.Width, l.Height);
                    var words = Words(l);
                    for (var i = 0; i < words.Count; i++)
                    {
                        var (content, start, length, wc) = words[i];
                        if (i > 0) x.WriteElementString("SP", Namespace, null);
                        var total = Math.Max(1, l.Text.Length);
                        var hpos = l.X + (int)Math.Floor((double)l.Width * start / total);
                        var wpos = Math.Max(1, (int)Math.Round((double)l.Width * length / total));
                        wpos = Math.Min(wpos, l.X + l.Width - hpos);
                        x.WriteStartElement("String", Namespace);
                        x.WriteAttributeString("ID", $"string{++word}");
                        x.WriteAttributeString("CONTENT", content);
                        Box(x, hpos, l.Y, Math.Max(1, wpos), l.Height);
                        x.WriteAttributeString("WC", Math.Clamp(wc, 0, 1).ToString("0.####", CultureInfo.InvariantCulture));
                        x.WriteEndElement();
                    }
                    x.WriteEndElement();
                }
                x.WriteEndElement();
            }
            x.WriteEndElement(); // PrintSpace
            x.WriteEndElement(); // Page
            x.WriteEndElement(); // Layout
            x.WriteEndElement(); // alto
            x.WriteEndDocument();
        }
        return text.Append('\n').ToString();
    }

    private static void Box(XmlWriter x, int hpos, int vpos, int width, int height, bool withPosition = true)
    {
        var inv = CultureInfo.InvariantCulture;
        if (withPosition)
        {
            x.WriteAttributeString("HPOS", hpos.ToString(inv));
            x.WriteAttributeString("VPOS", vpos.ToString(inv));
        }
        x.WriteAttributeString("WIDTH", width.ToString(inv));
        x.WriteAttributeString("HEIGHT", height.ToString(inv));
    }

    /// <summary>The line's words: text, first character index, length, and the mean confidence of its characters.</summary>
    private static List<(string Content, int Start, int Length, double Confidence)> Words(AltoLine line)
    {
        var result = new List<(string, int, int, double)>();
        // The characters' symbols spell the text when the run recorded them all; otherwise the line's text alone.
        var chars = string.Concat(line.Chars.Select(c => c.Symbol)) == line.Text ? line.Chars : null;
        int pos = 0, charIndex = 0;
        foreach (var piece in line.Text.Split(' '))
        {
            if (piece.Length > 0)
            {
                double sum = 0;
                var n = 0;
                if (chars is not null)
                {
                    var covered = 0;
                    while (charIndex < chars.Count && covered < piece.Length)
                    {
                        covered += chars[charIndex].Symbol.Length;
                        sum += chars[charIndex].Confidence;
                        n++;
                        charIndex++;
                    }
                }
                result.Add((piece, pos, piece.Length, n == 0 ? 0 : sum / n));
            }
            pos += piece.Length + 1;
            // Skip the space's own character record.
            if (chars is not null && charIndex < chars.Count && chars[charIndex].Symbol == " ") charIndex++;
        }
        return result;
    }

    /// <summary>Page lines of a run, by source, in line order: those of lines.jsonl that carry a box.</summary>
    private static Dictionary<string, List<AltoLine>> ReadPageLines(string outDir)
    {
        var result = new Dictionary<string, List<AltoLine>>(StringComparer.Ordinal);
        var bytes = File.ReadAllBytes(Path.Combine(outDir, "lines.jsonl"));
        foreach (var raw in Encoding.UTF8.GetString(bytes).Split('\n'))
        {
            if (raw.Trim().Length == 0) continue;
            using var doc = JsonDocument.Parse(raw);
            var r = doc.RootElement;
            if (!r.TryGetProperty("box", out var box) || box.ValueKind != JsonValueKind.Array) continue;
            var b = box.EnumerateArray().Select(e => e.GetInt32()).ToArray();
            var chars = r.TryGetProperty("chars", out var cs) && cs.ValueKind == JsonValueKind.Array
                ? cs.EnumerateArray().Select(c => (c.GetProperty("char").GetString() ?? "", c.GetProperty("confidence").GetDouble())).ToArray()
                : [];
            var source = r.GetProperty("source").GetString()!;
            if (!result.TryGetValue(source, out var list)) result[source] = list = [];
            list.Add(new AltoLine(
                r.TryGetProperty("entry", out var e) ? e.GetInt32() : list.Count,
                r.TryGetProperty("column", out var c0) ? c0.GetInt32() : 0,
                b[0], b[1], b[2], b[3], r.GetProperty("text").GetString() ?? "", chars));
        }
        return result;
    }

    /// <summary>A StringWriter that declares UTF-8, so the XML declaration says what the file is.</summary>
    private sealed class StringWriterUtf8(StringBuilder sb) : StringWriter(sb, CultureInfo.InvariantCulture)
    {
        public override Encoding Encoding => new UTF8Encoding(false);
    }
}
